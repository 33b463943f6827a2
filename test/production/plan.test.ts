/**
 * Test points from masks, limits per quantity (sources, rules, risks, capability), and the whole plan on
 * Monte Carlo boards, checked end to end against simulated measurements of the same boards.
 */
import { describe, expect, it } from 'vitest';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { gicInductorBandpass } from '../helpers/gic-circuits';
import { sampleBoards } from '../../src/production/boards';
import { automaticTestPoints, explicitTestPoints } from '../../src/production/test-points';
import { quantityLimits } from '../../src/production/limits';
import { boardResponses, planProductionTest } from '../../src/production/plan';
import { checkMeasurements } from '../../src/production/check';
import { sampleStandardNormal } from '../../src/tolerance/distributions';
import { GicladderError } from '../../src/errors';
import type { SpecMask } from '../../src/tolerance/yield';

const bandpassMask: SpecMask = {
  passband: [{ fromHz: 7340, toHz: 13620, minGainDb: -3.4, maxGainDb: 0.1 }],
  stopband: [
    { fromHz: 0, toHz: 2000, maxGainDb: -12 },
    { fromHz: 50000, toHz: 1e6, maxGainDb: -12 },
  ],
};

describe('test points', () => {
  it('lowpass: a decade below the edge, the edge, the stopband edge, the trim frequency', () => {
    const mask: SpecMask = { passband: [{ fromHz: 0, toHz: 1000, minGainDb: -0.5, maxGainDb: 0 }], stopband: [{ fromHz: 2000, toHz: 1e5, maxGainDb: -40 }] };
    expect(automaticTestPoints(mask, 500)).toEqual([
      { id: 'passband-centre-1', frequencyHz: 100, role: 'passband-centre' },
      { id: 'trim-1', frequencyHz: 500, role: 'trim' },
      { id: 'passband-edge-1', frequencyHz: 1000, role: 'passband-edge' },
      { id: 'stopband-1', frequencyHz: 2000, role: 'stopband' },
    ]);
  });
  it('bandpass: the geometric centre, both edges, the nearer end of each stopband; a trim point at an edge merges', () => {
    const pts = automaticTestPoints(bandpassMask, 7340);
    expect(pts.map((p) => [p.role, p.frequencyHz])).toEqual([
      ['stopband', 2000],
      ['passband-edge', 7340],
      ['passband-centre', Math.sqrt(7340 * 13620)],
      ['passband-edge', 13620],
      ['stopband', 50000],
    ]);
  });
  it('explicit points: sorted, named, duplicates and bad values refused', () => {
    expect(explicitTestPoints([2000, { frequencyHz: 1000, id: 'ref' }]).map((p) => p.id)).toEqual(['ref', 'explicit-1']);
    expect(() => explicitTestPoints([1000, 1000])).toThrow(GicladderError);
    expect(() => explicitTestPoints([-1])).toThrow(GicladderError);
    expect(() => explicitTestPoints([])).toThrow(GicladderError);
  });
});

describe('limits of one quantity', () => {
  const u = { standardUncertainty: 0.05 };
  it('nominal +- tolerance, guarded acceptance w = U: limits, the accounting identity, Cpk', () => {
    const q = quantityLimits({ nominal: -3, normal: { mean: -3.02, sd: 0.1 }, source: { kind: 'nominal', tolerance: 0.4 }, rule: { rule: 'guarded-acceptance' }, uncertainty: u });
    expect(q.tolerance).toEqual({ lower: -3.4, upper: -2.6 });
    expect(q.acceptance.lower).toBeCloseTo(-3.3, 14);
    expect(q.acceptance.upper).toBeCloseTo(-2.7, 14);
    expect(Math.abs(q.predictedYield - (q.conformance - q.falseReject + q.falseAccept))).toBeLessThan(1e-12);
    // The nearer limit is -3.4: Cpk = (3.4 - 3.02) / (3 * 0.1); Cp = 0.8 / 0.6.
    expect(q.capability.cpk).toBeCloseTo(0.38 / 0.3, 12);
    expect(q.capability.cp).toBeCloseTo(0.8 / 0.6, 12);
  });
  it('statistical 99.73 % of a normal model is mean +- 3.0 sd and covers 99.73 % (common practice, no source)', () => {
    const q = quantityLimits({ nominal: 0, normal: { mean: 1, sd: 2 }, source: { kind: 'statistical', coverage: 0.9973 }, rule: { rule: 'simple-acceptance' }, uncertainty: { standardUncertainty: 0 } });
    expect(q.tolerance.upper).toBeCloseTo(1 + 2 * 3.0, 2);
    expect(q.conformance).toBeCloseTo(0.9973, 12);
    expect(q.falseAccept).toBe(0);
  });
  it('statistical limits from samples are their type-7 quantiles; one-sided takes the upper quantile', () => {
    const samples = Float64Array.from({ length: 1001 }, (_, i) => i / 1000); // 0, 0.001, ..., 1
    const two = quantityLimits({ nominal: 0.5, samples, source: { kind: 'statistical', coverage: 0.9, method: 'quantile' }, rule: { rule: 'simple-acceptance' }, uncertainty: { standardUncertainty: 0 } });
    expect(two.tolerance.lower).toBeCloseTo(0.05, 12);
    expect(two.tolerance.upper).toBeCloseTo(0.95, 12);
    expect(two.conformance).toBeCloseTo(901 / 1001, 12);
    const one = quantityLimits({ nominal: 0.5, samples, source: { kind: 'statistical', coverage: 0.9, oneSided: 'upper' }, rule: { rule: 'simple-acceptance' }, uncertainty: { standardUncertainty: 0 } });
    expect(one.tolerance).toEqual({ lower: -Infinity, upper: 0.9 });
  });
  it('rejects missing distributions and bad sources with the field named', () => {
    const base = { nominal: 0, rule: { rule: 'simple-acceptance' } as const, uncertainty: u };
    const bad: [unknown, string][] = [
      [{ ...base, source: { kind: 'nominal', tolerance: 1 } }, 'limits'],
      [{ ...base, normal: { mean: 0, sd: 1 }, source: { kind: 'nominal', tolerance: -1 } }, 'limits.source.tolerance'],
      [{ ...base, normal: { mean: 0, sd: 1 }, source: { kind: 'statistical', coverage: 1 } }, 'limits.source.coverage'],
      [{ ...base, normal: { mean: 0, sd: 1 }, source: { kind: 'statistical', coverage: 0.9, method: 'quantile' } }, 'limits.source.method'],
      [{ ...base, normal: { mean: 0, sd: 1 }, source: { kind: 'spline' } }, 'limits.source.kind'],
      [{ ...base, normal: { mean: 0, sd: 1 }, source: { kind: 'mask', limits: { lower: 1, upper: 0 } } }, 'limits.source.limits'],
      [{ ...base, samples: [1], source: { kind: 'nominal', tolerance: 1 } }, 'limits.samples'],
    ];
    for (const [input, path] of bad) {
      try {
        quantityLimits(input as never);
        throw new Error(`no throw for ${path}`);
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).path).toBe(path);
      }
    }
  });
});

describe('the production-test plan on Monte Carlo boards', () => {
  const circuit = gicInductorBandpass({ model: 'ideal' });
  const spec = { parts: ['RS', 'CP', 'G1_R1', 'G1_R2', 'G1_R3', 'G1_C4', 'G1_R5'].map((e) => ({ element: e, tolerance: e.includes('C') ? 0.01 : 0.005 })) };
  const boards = sampleBoards(circuit, { input: 'in', output: 'out' }, spec, { trials: 2000, seed: 17 });
  const gainU = { standardUncertainty: 0.03 };

  it('mask limits with guarded acceptance: five points, guard band 2u, risks and Cpk per point', () => {
    const d = planProductionTest(boards, { mask: bandpassMask, trimFrequencyHz: 7340, gain: { source: 'mask', rule: { rule: 'guarded-acceptance' }, uncertainty: gainU } });
    expect(d.points.length).toBe(5);
    const edge = d.points[1];
    expect(edge.role).toBe('passband-edge');
    expect(edge.gain.tolerance).toEqual({ lower: -3.4, upper: 0.1 });
    expect(edge.gain.acceptance.lower).toBeCloseTo(-3.34, 12);
    const stop = d.points[0];
    expect(stop.gain.tolerance).toEqual({ lower: -Infinity, upper: -12 });
    expect(stop.gain.capability.cp).toBeNaN();
    for (const p of d.points) {
      expect(p.gain.falseAccept).toBeGreaterThanOrEqual(0);
      expect(p.gain.distribution!.count).toBe(2000);
    }
    expect(d.plan.testPoints.map((p) => p.gainLimitsDb)).toEqual(d.points.map((p) => p.gain.acceptance));
    // Phase is not tested here, but its distribution is reported; at the centre it sits near 0 degrees.
    expect(d.points[2].phase).toBeNull();
    expect(Math.abs(d.points[2].nominalPhaseDeg)).toBeLessThan(1);
    expect(d.points[2].phaseDistribution.count).toBe(2000);
    expect(d.conformingShareInterval.low).toBeLessThanOrEqual(d.conformingShare);
    expect(d.conformingShareInterval.high).toBeGreaterThanOrEqual(d.conformingShare);
    expect(d.expectedAcceptedShare).toBeLessThanOrEqual(d.conformingShare + 1e-12 + d.points.reduce((s, p) => s + p.gain.falseAccept, 0));
  });

  it('statistical limits: at a stopband point one-sided (the mask has only a ceiling there)', () => {
    const d = planProductionTest(boards, { mask: bandpassMask, gain: { source: { kind: 'statistical', coverage: 0.99 }, rule: { rule: 'simple-acceptance' }, uncertainty: gainU } });
    expect(d.points[0].gain.tolerance.lower).toBe(-Infinity);
    expect(d.points[2].gain.tolerance.lower).toBeGreaterThan(-Infinity);
    // 99 % of the boards inside each two-sided statistical interval, by construction (type-7, 2000 samples).
    expect(Math.abs(d.points[2].gain.conformance - 0.99)).toBeLessThanOrEqual(2 / 2000);
  });

  it('end to end: simulated measurements of the boards pass the checker at the predicted rate', () => {
    const d = planProductionTest(boards, {
      testPoints: [2000, 7340, 10000, 13620],
      gain: { source: { kind: 'nominal', tolerance: 0.25 }, rule: { rule: 'guarded-acceptance' }, uncertainty: gainU },
      phase: { source: { kind: 'nominal', tolerance: 3 }, rule: { rule: 'simple-acceptance' }, uncertainty: { standardUncertainty: 0.2 } },
    });
    const resp = boardResponses(boards, [2000, 7340, 10000, 13620]);
    const rng = xoroshiro128plus(99);
    const lines = ['board,frequency_hz,gain_db,phase_deg'];
    for (let b = 0; b < boards.count; b++) {
      [2000, 7340, 10000, 13620].forEach((f, i) => {
        const g = resp.gainDb[i][b] + gainU.standardUncertainty * sampleStandardNormal(rng);
        const ph = resp.phaseDeg[i][b] + 0.2 * sampleStandardNormal(rng);
        lines.push(`B${b},${f},${g},${ph}`);
      });
    }
    const r = checkMeasurements(d.plan, lines.join('\n'));
    expect(r.summary.boards).toBe(2000);
    const p = d.expectedAcceptedShare;
    const sigma = Math.sqrt((p * (1 - p)) / 2000);
    // The passed share is a binomial draw around the predicted share: within 4 sigma (fails 1 in 16000).
    expect(Math.abs(r.summary.passed / 2000 - p)).toBeLessThan(4 * sigma + 1e-9);
    expect(p).toBeGreaterThan(0.05);
    expect(p).toBeLessThan(0.99);
  });

  it('with a trim, the distributions and yields are those of the trimmed boards', () => {
    const wide = sampleBoards(circuit, { input: 'in', output: 'out' }, { parts: spec.parts.map((p) => ({ ...p, tolerance: p.tolerance * 2 })) }, { trials: 1000, seed: 8 });
    const options = { mask: bandpassMask, trimFrequencyHz: 7340, gain: { source: 'mask' as const, rule: { rule: 'guarded-acceptance' } as const, uncertainty: gainU } };
    const plain = planProductionTest(wide, options);
    const trimmed = planProductionTest(wide, {
      ...options,
      trim: { spec: { device: { kind: 'rheostat', endToEndOhms: 2000, steps: 256, wiperOhms: 75, tolerance: 0.2 }, targets: [{ element: 'G1_R5', placement: 'replace' }], frequencyHz: 7340 }, options: { measurementUncertaintyDb: 0.03 } },
    });
    expect(plain.trim).toBeNull();
    const sim = trimmed.trim!;
    const edge = trimmed.points.findIndex((p) => p.frequencyHz === 7340);
    // The recorded trimmed responses are the simulation's own trimmed gains at the trim frequency.
    expect(Array.from(sim.responses!.gainDb[edge])).toEqual(Array.from(sim.trimmedGainDb));
    expect(trimmed.points[edge].gain.sd).toBeLessThan(plain.points[edge].gain.sd / 2);
    expect(trimmed.expectedAcceptedShare).toBeGreaterThan(plain.expectedAcceptedShare);
    expect(trimmed.conformingShare).toBeCloseTo(sim.trimmedYield, 12);
    // Untrimmed, the device's own +-20 % makes boards worse than with the 1 % resistor it replaces.
    expect(sim.untrimmedYield).toBeLessThan(plain.conformingShare);
  });

  it('needs the mask for automatic points and mask limits', () => {
    const g = { source: 'mask' as const, rule: { rule: 'simple-acceptance' } as const, uncertainty: gainU };
    expect(() => planProductionTest(boards, { gain: g })).toThrow(GicladderError);
    expect(() => planProductionTest(boards, { testPoints: [1000], gain: g })).toThrow(GicladderError);
  });
});
