import { describe, expect, it } from 'vitest';
import { Q1, type Fraction } from '../../src/algebra/rational';
import { ladderPrototype } from '../../src/ladder/index';
import { fromLadder, lowpassToHighpass, scaleImpedance } from '../../src/transform/index';
import { realizeLadder } from '../../src/substitution/realize';
import { selectParts } from '../../src/selection/select-parts';
import { neighbouringValues, searchParts } from '../../src/selection/search';
import { GicladderError } from '../../src/errors';
import type { RealizedPart } from '../../src/substitution/realization';

const families = {
  resistors: { series: 'E96', tolerancePercent: 1, temperatureCoefficientPpmPerK: 50 },
  capacitors: { series: 'E12', tolerancePercent: 5, temperatureCoefficientPpmPerK: 30 },
} as const;

// A 5th-order Chebyshev highpass at 1 kHz, 1 kOhm, simulated inductors built around 12 nF x 1.1 (not preferred).
const ladder = scaleImpedance(lowpassToHighpass(fromLadder(ladderPrototype({ family: 'chebyshev', order: 5, passbandRippleDb: 0.5 })), 2 * Math.PI * 1000), 1000);
const realization = realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: '13.2n' });

/** K = prod_odd k / prod_even k of a GIC (k = R or 1/C), with the given values. */
function gicK(parts: readonly RealizedPart[], value: (p: RealizedPart) => Fraction): Fraction {
  let k = Q1;
  for (const p of parts) {
    const ki = p.kind === 'R' ? value(p) : Q1.div(value(p));
    k = p.role.position! % 2 === 1 ? k.mul(ki) : k.div(ki);
  }
  return k;
}

describe('selectParts', () => {
  it("'exact' keeps every value; 'round' rounds every part to its series", () => {
    const exact = selectParts(realization, { strategy: 'exact', ...families });
    expect(exact.parts.every((p) => p.chosenValue.equals(p.exactValue) && p.series === undefined)).toBe(true);
    const round = selectParts(realization, { strategy: 'round', ...families });
    expect(round.parts.every((p) => Math.abs(p.deviation) < (p.kind === 'C' ? 0.1 : 0.013))).toBe(true); // half an E12 / E96 step
  });

  it("'capacitors-first' recomputes each GIC's computed resistor so the GIC's element is exact with the rounded capacitors and free resistors", () => {
    const s = selectParts(realization, { strategy: 'capacitors-first', ...families });
    const byName = new Map(s.parts.map((p) => [p.name, p]));
    const gics = new Set(realization.parts.filter((p) => p.role.kind === 'gic').map((p) => p.role.gic!));
    expect(gics.size).toBe(2);
    for (const g of gics) {
      const parts = realization.parts.filter((p) => p.role.gic === g);
      const recomputed = parts.filter((p) => byName.get(p.name)!.recomputedValue !== undefined);
      expect(recomputed.length).toBe(1);
      // The free parts are rounded first; with them and the recomputed resistor (before its own rounding)
      // K is exactly the designed K (a highpass: no resonator capacitor shares the inductor's origin).
      expect(parts.some((p) => p.role.free && p.kind === 'R' && !byName.get(p.name)!.chosenValue.equals(p.exactValue))).toBe(true); // not the trivial case
      const value = (p: RealizedPart) => byName.get(p.name)!.recomputedValue ?? byName.get(p.name)!.chosenValue;
      expect(gicK(parts, value).equals(gicK(parts, (p) => p.exactValue))).toBe(true);
    }
  });

  it('refuses an unknown strategy by class and code', () => {
    try {
      selectParts(realization, { strategy: 'nearest' as never, ...families });
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(GicladderError);
      expect((e as GicladderError).code).toBe('INVALID_ARGUMENT');
    }
  });
});

describe('searchParts', () => {
  it('lists neighbouring preferred values and keeps the best candidate, never worse than the start', () => {
    const start = neighbouringValues(Q1.div(100_000_000), 'E12', 1);
    expect(start.map((c) => c.valueOf())).toEqual([1e-8, 8.2e-9, 1.2e-8]);
    const score = (r: typeof realization) => Math.abs(r.parts.length); // any deterministic score
    const found = searchParts(start[0], families, 3, (c) => realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: c }), (r, s) =>
      s.parts.reduce((m, p) => Math.max(m, Math.abs(p.deviation)), 0) + 0 * score(r),
    );
    expect(found.candidates.length).toBe(3);
    expect(found.best.errorDb).toBe(Math.min(...found.candidates.map((c) => c.errorDb)));
    expect(found.selection.strategy).toBe('search');
  });
});
