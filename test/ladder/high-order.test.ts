import { describe, expect, it } from 'vitest';
import { lowpassCharacteristic, lowpassPrototype, type LowpassPrototypeParams } from '../../src/approximation/index';
import { designLadderPrototype } from '../../src/ladder/ladder-prototype';
import { synthesizeLadder } from '../../src/ladder/darlington';
import { UnrealizableError } from '../../src/errors';
import type { Branch } from '../../src/ladder/types';
import oracle from '../fixtures/mpmath/elliptic-ladders.json';
import { responseError } from './helpers';

/**
 * Elliptic and inverse Chebyshev ladders, equal 1-ohm terminations, orders 3 to 15, both forms, against
 * test/fixtures/mpmath/elliptic-ladders.json (scripts/fixtures/elliptic_ladders.py: the synthesis
 * redone in mpmath at 50 digits from the characteristic function, by its own route to k, the zeros and
 * E). Tolerances are the issue's targets, 1e-9 relative to order 11 and 1e-6 to 15; measured: below
 * 1e-13 at every order (the double rounding of the prototype's zeros, see darlington.ts).
 */
const tolerance = (n: number): number => (n <= 11 ? 1e-9 : 1e-6);

interface OracleBranch {
  placement: 'series' | 'shunt';
  inductanceH?: number;
  capacitanceF?: number;
  arrangement?: 'parallel' | 'series';
}
interface OracleCase {
  family: 'elliptic' | 'inverse-chebyshev';
  order: number;
  passbandRippleDb?: number;
  stopbandAttenuationDb: number;
  form: 'series-first' | 'shunt-first';
  realizable: boolean;
  tankOrder?: number[];
  loadOhms?: number;
  branches?: OracleBranch[];
}

const cases = oracle.cases as OracleCase[];
const label = (c: OracleCase): string =>
  `${c.family} ${c.passbandRippleDb === undefined ? '' : `${c.passbandRippleDb} dB / `}${c.stopbandAttenuationDb} dB, order ${c.order}, ${c.form}`;
const params = (c: OracleCase): LowpassPrototypeParams => ({
  family: c.family,
  order: c.order,
  passbandRippleDb: c.passbandRippleDb,
  stopbandAttenuationDb: c.stopbandAttenuationDb,
});

/** Largest relative difference of element values, branch by branch; Infinity when the shapes differ. */
function elementError(got: Branch[], want: OracleBranch[]): number {
  if (got.length !== want.length) return Infinity;
  let worst = 0;
  got.forEach((b, i) => {
    const w = want[i];
    if (b.placement !== w.placement || b.arrangement !== w.arrangement) worst = Infinity;
    for (const key of ['inductanceH', 'capacitanceF'] as const) {
      if ((b[key] === undefined) !== (w[key] === undefined)) worst = Infinity;
      else if (b[key] !== undefined) worst = Math.max(worst, Math.abs((b[key] as number) / (w[key] as number) - 1));
    }
  });
  return worst;
}

describe('equally terminated elliptic and inverse Chebyshev ladders against mpmath (50 digits)', () => {
  it.each(cases.filter((c) => c.realizable).map((c) => [label(c), c] as const))('%s', (_, c) => {
    const s = designLadderPrototype({ ...params(c), form: c.form });
    expect(s.tankOrder).toEqual(c.tankOrder);
    expect(s.ladder.loadOhms).toBe(1);
    const error = elementError(s.ladder.branches, c.branches!);
    expect(error, `element values, worst relative difference ${error} > ${tolerance(c.order)}`).toBeLessThan(tolerance(c.order));
    // The self-check of the issue (common practice, no source): the exact ladder response against the
    // realised prototype and, for odd orders (no modification), against the approximation's own zpk.
    expect(responseError(s)).toBeLessThan(tolerance(c.order));
    if (c.order % 2 === 1) expect(responseError(s, s.prototype)).toBeLessThan(tolerance(c.order));
  });
});

describe('refusals the oracle agrees with (no positive ladder in the tank orders searched)', () => {
  // mpmath finds no positive ladder for these either (realizable: false in the fixture); the fast ones
  // are checked here, the rest are listed in the fixture. Low attenuation puts the lowest zero too close
  // to the passband for the zero shifting of this structure.
  const refused = cases.filter((c) => !c.realizable && c.order <= 11 && c.form === 'series-first');
  it.each(refused.map((c) => [label(c), c] as const))('%s', (_, c) => {
    let error: unknown;
    try {
      designLadderPrototype({ ...params(c), form: c.form });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).code).toBe('UNREALIZABLE');
    expect((error as UnrealizableError).path).toBe('prototype');
  });
  it('the fixture refuses only inverse Chebyshev at low attenuation and odd high orders (guards the oracle itself)', () => {
    const list = cases.filter((c) => !c.realizable).map((c) => `${c.family} ${c.stopbandAttenuationDb} ${c.order}`);
    expect(list.every((x) => x.startsWith('inverse-chebyshev'))).toBe(true);
  });
});

describe('a raw zpk (no characteristic given): the reflection zeros inferred from the maxima of |H|', () => {
  it.each([
    [{ family: 'elliptic', order: 15, passbandRippleDb: 0.5, stopbandAttenuationDb: 60 }],
    [{ family: 'elliptic', order: 14, passbandRippleDb: 1, stopbandAttenuationDb: 80 }],
    [{ family: 'chebyshev', order: 14, passbandRippleDb: 0.5 }],
  ] as const)('%j gives the ladder of the analytic route', (p) => {
    const prototype = lowpassPrototype(p as LowpassPrototypeParams);
    const analytic = synthesizeLadder(prototype, { characteristic: lowpassCharacteristic(p as LowpassPrototypeParams) });
    const inferred = synthesizeLadder(prototype);
    // Both polish to ~1e-30; what is left is the double rounding of the two sets of zeros (1e-13 measured).
    expect(elementError(inferred.ladder.branches, analytic.ladder.branches as OracleBranch[])).toBeLessThan(1e-9);
    expect(responseError(inferred)).toBeLessThan(1e-9);
  });
  it('refuses a characteristic of the wrong degree, naming the option', () => {
    const prototype = lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 0.5, stopbandAttenuationDb: 40 });
    let error: unknown;
    try {
      synthesizeLadder(prototype, { characteristic: { originMultiplicity: 1, reflectionOmegasRadPerS: [0.5] } });
    } catch (e) {
      error = e;
    }
    expect((error as { path?: string }).path).toBe('characteristic');
  });
});

describe('unequal terminations at high order (numerical reflection zeros, simple and off the axis)', () => {
  it.each([
    [{ family: 'elliptic', order: 15, passbandRippleDb: 1, stopbandAttenuationDb: 80 }, 2, 'series-first'],
    [{ family: 'elliptic', order: 13, passbandRippleDb: 0.5, stopbandAttenuationDb: 60 }, 0.5, 'shunt-first'],
    [{ family: 'inverse-chebyshev', order: 11, stopbandAttenuationDb: 80 }, 2, 'series-first'],
  ] as const)('%j with RL = %d, %s', (p, loadOhms, form) => {
    const s = designLadderPrototype({ ...(p as LowpassPrototypeParams), sourceOhms: 1, loadOhms, form });
    expect(s.ladder.loadOhms).toBe(loadOhms);
    expect(responseError(s)).toBeLessThan(1e-6);
    expect(responseError(s, s.prototype)).toBeLessThan(1e-6);
  });
});
