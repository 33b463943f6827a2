import { describe, expect, it } from 'vitest';
import { transferFunction } from '../../src/analysis/index';
import { Fraction } from '../../src/algebra/index';
import { inputCovariance, propagateUncertainty } from '../../src/tolerance/propagation';
import { resolveTolerances, type ToleranceSpec } from '../../src/tolerance/spec';
import { circuitFromJson, circuitToJson, withValues } from '../../src/tolerance/circuit-json';
import { fdnrLadder7, gicFdnrLowpass } from '../helpers/gic-circuits';

const circuit = gicFdnrLowpass({ model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 });
const transfer = { input: 'in', output: 'out' };
const freqs = [300, 1000, 2000];
const names = circuit.elements.filter((e) => e.kind === 'R' || e.kind === 'C').map((e) => e.name);

describe('propagateUncertainty', () => {
  it('uncorrelated inputs: u_c^2 is the sum of the squared budget lines (GUM eq. (10))', () => {
    const r = propagateUncertainty(circuit, transfer, { parts: names.map((element, i) => ({ element, tolerance: 0.01 * (1 + (i % 3)) })) }, freqs);
    freqs.forEach((_, p) => {
      const sum = r.budget.reduce((s, b) => s + b.gainDb[p] ** 2, 0);
      expect(Math.abs(Math.sqrt(sum) / r.gainDbStandardUncertainty[p] - 1)).toBeLessThan(1e-12);
      const sumPhase = r.budget.reduce((s, b) => s + b.phaseDeg[p] ** 2, 0);
      expect(Math.abs(Math.sqrt(sumPhase) / r.phaseDegStandardUncertainty[p] - 1)).toBeLessThan(1e-12);
    });
  });

  it('a shared group offset and a common temperature: eq. (13) equals the sum of own, group and temperature lines', () => {
    const spec: ToleranceSpec = {
      parts: names.map((element) => ({ element, tolerance: 0.002, tempcoPpmPerK: element.includes('C') ? -200 : 100, group: element.includes('C') ? 'reel' : undefined })),
      groups: [{ name: 'reel', tolerance: 0.05, distribution: 'gaussian', sigmaK: 2 }],
      temperature: { referenceC: 20, minC: -40, maxC: 85 },
    };
    const r = propagateUncertainty(circuit, transfer, spec, freqs);
    freqs.forEach((_, p) => {
      const sum = r.budget.reduce((s, b) => s + b.gainDb[p] ** 2, 0);
      expect(Math.abs(Math.sqrt(sum) / r.gainDbStandardUncertainty[p] - 1)).toBeLessThan(1e-12);
    });
    // the covariance matrix is symmetric with the stated diagonal
    const tol = resolveTolerances(circuit, spec);
    const v = inputCovariance(tol);
    const n = tol.inputs.length;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(v[i * n + j]).toBe(v[j * n + i]);
    const uT = 125 / Math.sqrt(12);
    const isC = names[0].includes('C');
    expect(Math.abs(v[0] - ((0.002 / Math.sqrt(3)) ** 2 + ((isC ? -200e-6 : 100e-6) * uT) ** 2 + (isC ? 0.025 ** 2 : 0)))).toBeLessThan(1e-18);
    // T_ref = 20 C against a range centred on 22.5 C: a first-order shift
    expect(Math.max(...Array.from(r.gainDbMeanShift, Math.abs))).toBeGreaterThan(0);
  });

  it('one group offset on every R and C is a pure frequency shift (checked exactly), and its budget line is the whole uncertainty', () => {
    const ideal = gicFdnrLowpass({ model: 'ideal' });
    const all = ideal.elements.filter((e) => e.kind === 'R' || e.kind === 'C').map((e) => e.name);
    const r = propagateUncertainty(ideal, transfer, { parts: all.map((element) => ({ element, tolerance: 0, group: 'all' })), groups: [{ name: 'all', tolerance: 0.01 }] }, [1000]);
    // with ideal op-amps H depends on s only through s R C products, so every R and C times (1 + d) is H at w (1 + d)^2
    const d = new Fraction(1, 1000);
    const scaled = withValues(ideal, new Map(all.map((n) => {
      const e = ideal.element(n) as { ohms?: Fraction; farads?: Fraction };
      return [n, (e.ohms ?? e.farads)!.mul(new Fraction(1).add(d))] as [string, Fraction];
    })));
    const w = new Fraction(2 * Math.PI * 1000);
    const h1 = transferFunction(scaled, transfer).evaluateGaussian({ re: 0, im: w });
    const w2 = w.mul(new Fraction(1).add(d).pow(2));
    const h2 = transferFunction(ideal, transfer).evaluateGaussian({ re: 0, im: w2 });
    expect(h1.re.equals(h2.re) && h1.im.equals(h2.im)).toBe(true);
    expect(r.budget.at(-1)!.name).toBe('group:all');
    expect(Math.abs(r.budget.at(-1)!.gainDb[0] / r.gainDbStandardUncertainty[0] - 1)).toBeLessThan(1e-12);
  });
});

describe('circuit-json', () => {
  it('round-trips a circuit exactly (same exact transfer function), and overrides replace values', () => {
    const c = fdnrLadder7({ model: 'two-pole', gainBandwidthHz: 3e6, openLoopGainDb: 110, secondPoleHz: 2e7 });
    const back = circuitFromJson(JSON.parse(JSON.stringify(circuitToJson(c))));
    expect(back.elements.map((e) => e.name)).toEqual(c.elements.map((e) => e.name));
    const small = gicFdnrLowpass({ model: 'integrator', gainBandwidthHz: 1e6 });
    const again = circuitFromJson(JSON.parse(JSON.stringify(circuitToJson(small))));
    expect(transferFunction(again, transfer).equals(transferFunction(small, transfer))).toBe(true);
    const changed = withValues(small, new Map([['R1', new Fraction(20_000)]]));
    expect((changed.element('R1') as { ohms: Fraction }).ohms.equals(20_000)).toBe(true);
    expect(transferFunction(changed, transfer).equals(transferFunction(small, transfer))).toBe(false);
  });
});
