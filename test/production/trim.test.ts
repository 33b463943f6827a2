/**
 * Trim devices, tables, the firmware's procedure simulated on Monte Carlo boards, and sizing; and the
 * board sampler against tolerance's runMonteCarlo (the same trials for the same seed).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gicInductorBandpass } from '../helpers/gic-circuits';
import { sampleBoards } from '../../src/production/boards';
import { chooseCode, resistorBankOptions, resolveTrimDevice, simulateTrim, sizeTrim, trimRange, trimTable, type TrimDevice, type TrimSpec } from '../../src/production/trim';
import { runMonteCarlo } from '../../src/tolerance/monte-carlo';
import { GicladderError } from '../../src/errors';

// The GIC-inductor bandpass (centre 10 kHz, Q about 1.6; -3 dB edges near 7.34 kHz and 13.62 kHz).
const circuit = gicInductorBandpass({ model: 'ideal' });
const transfer = { input: 'in', output: 'out' };
const spec = { parts: ['RS', 'CP', 'G1_R1', 'G1_R2', 'G1_R3', 'G1_C4', 'G1_R5'].map((e) => ({ element: e, tolerance: e.includes('C') ? 0.02 : 0.01 })) };
const points = [
  { frequencyHz: 7340, gainLimitsDb: { lower: -3.26, upper: -2.76 } },
  { frequencyHz: 10000, gainLimitsDb: { lower: -0.2, upper: 0.2 } },
  { frequencyHz: 13620, gainLimitsDb: { lower: -3.26, upper: -2.76 } },
];
const rheostat: TrimDevice = { kind: 'rheostat', endToEndOhms: 2000, steps: 256, wiperOhms: 75, tolerance: 0.2 };
const trim: TrimSpec = { device: rheostat, targets: [{ element: 'G1_R5', placement: 'replace' }], frequencyHz: 7340 };

describe('board sampler', () => {
  it('draws the trials of runMonteCarlo (same seed and block size): gain mean and sd agree', () => {
    const freqs = [7340, 10000];
    const boards = sampleBoards(circuit, transfer, spec, { trials: 3000, seed: 11, blockSize: 512 });
    const mc = runMonteCarlo(circuit, transfer, spec, { frequenciesHz: freqs, trials: 3000, seed: 11, blockSize: 512 });
    const h = new Float64Array(2);
    freqs.forEach((f, k) => {
      const g = new Float64Array(boards.count);
      for (let b = 0; b < boards.count; b++) {
        boards.apply(b);
        boards.engine.transferAt(f, h);
        g[b] = 10 * Math.log10(h[0] ** 2 + h[1] ** 2);
      }
      const mean = g.reduce((a, x) => a + x, 0) / g.length;
      const sd = Math.sqrt(g.reduce((a, x) => a + (x - mean) ** 2, 0) / (g.length - 1));
      // Same samples, different summation order: agreement to rounding, not to sampling error.
      expect(Math.abs(mean - mc.gainDb.mean[k])).toBeLessThan(1e-12);
      expect(Math.abs(sd - mc.gainDb.standardDeviation[k])).toBeLessThan(1e-10);
    });
    boards.restoreNominal();
  });
});

describe('trim devices', () => {
  it('rheostat R(code) = Rw + Rab (1 + d) code / N; bank sums set bits and Ron for clear ones', () => {
    const r = resolveTrimDevice(rheostat);
    expect(r.codes).toBe(257);
    expect(r.resistance(128, [0])).toBe(75 + 1000);
    expect(r.resistance(256, [-0.2])).toBe(75 + 1600);
    const bank = resolveTrimDevice({ kind: 'resistor-bank', bits: 4, lsbOhms: 10, switchOnOhms: 1, bitTolerance: 0 });
    expect(bank.codes).toBe(16);
    expect(bank.resistance(0b1011, [0, 0, 0, 0])).toBe(10 + 20 + 1 + 80);
    expect(bank.resistance(0b0001, [0.1, 0, 0, 0])).toBeCloseTo(11 + 3, 12);
    expect(trimRange(rheostat)).toEqual({ rangeOhms: 2000, stepOhms: 2000 / 256, codes: 257 });
    expect(trimRange({ kind: 'resistor-bank', bits: 4, lsbOhms: 10, switchOnOhms: 1 })).toEqual({ rangeOhms: 150 - 4, stepOhms: 10, codes: 16 });
  });
  it('rejects bad devices and targets with the field named', () => {
    const boards = sampleBoards(circuit, transfer, spec, { trials: 4, seed: 1 });
    const bad: [() => unknown, string][] = [
      [() => resolveTrimDevice({ kind: 'rheostat', endToEndOhms: -1, steps: 64 }), 'trim.device.endToEndOhms'],
      [() => resolveTrimDevice({ kind: 'rheostat', endToEndOhms: 1e4, steps: 0.5 }), 'trim.device.steps'],
      [() => resolveTrimDevice({ kind: 'rheostat', endToEndOhms: 1e4, steps: 64, tolerance: 1.5 }), 'trim.device.tolerance'],
      [() => resolveTrimDevice({ kind: 'resistor-bank', bits: 20, lsbOhms: 1 }), 'trim.device.bits'],
      [() => resolveTrimDevice({ kind: 'fuse' } as never), 'trim.device.kind'],
      [() => trimTable(boards, { ...trim, targets: [{ element: 'CP', placement: 'replace' }] }), 'trim.targets[0].element'],
      [() => trimTable(boards, { ...trim, targets: [{ element: 'G1_R5', placement: 'diagonal' as never }] }), 'trim.targets[0].placement'],
      [() => trimTable(boards, { ...trim, targets: [] }), 'trim.targets'],
      [() => trimTable(boards, { ...trim, targets: [{ element: 'G1_R5', placement: 'series' }] }), 'trim.targets[0].placement'], // 1075 ohm mid-range > 1000
      [() => trimTable(boards, { ...trim, frequencyHz: 0 }), 'trim.frequencyHz'],
    ];
    for (const [f, path] of bad) {
      try {
        f();
        throw new Error(`no throw for ${path}`);
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).path).toBe(path);
      }
    }
  });
});

describe('trim table', () => {
  const boards = sampleBoards(circuit, transfer, spec, { trials: 600, seed: 3 });
  it('one entry per code; the default code is the one nearest the design gain', () => {
    const t = trimTable(boards, trim);
    expect(t.entries.length).toBe(257);
    const err = (c: number) => Math.abs(t.entries[c].gainDb - t.targetGainDb);
    for (const e of t.entries) expect(err(t.defaultCode)).toBeLessThanOrEqual(err(e.code));
    // R(c0) nearest 1000 ohm: c0 = round((1000 - 75) / 2000 * 256) = 118 for a gain monotone in R5.
    expect(t.defaultCode).toBe(118);
  });
  it('series and parallel: the fixed part puts the mid-range code at the design value', () => {
    const small: TrimDevice = { kind: 'rheostat', endToEndOhms: 200, steps: 64, wiperOhms: 50, tolerance: 0.2 };
    const series = trimTable(boards, { ...trim, device: small, targets: [{ element: 'G1_R5', placement: 'series' }] });
    expect(series.fixedOhms[0].ohms).toBeCloseTo(1000 - 150, 9);
    expect(series.entries[32].gainDb).toBeCloseTo(series.targetGainDb, 10);
    const big: TrimDevice = { kind: 'rheostat', endToEndOhms: 20000, steps: 64, wiperOhms: 50, tolerance: 0.2 };
    const parallel = trimTable(boards, { ...trim, device: big, targets: [{ element: 'G1_R5', placement: 'parallel' }] });
    expect(1 / (1 / parallel.fixedOhms[0].ohms + 1 / 10050)).toBeCloseTo(1000, 9);
    expect(parallel.entries[32].gainDb).toBeCloseTo(parallel.targetGainDb, 10);
  });
  it('ganged targets move together: an entry equals setting every target to R(code) by hand', () => {
    const t = trimTable(boards, { ...trim, targets: [{ element: 'G1_R1', placement: 'replace' }, { element: 'G1_R3', placement: 'replace' }] });
    const e = boards.engine;
    e.setValue('G1_R1', 75 + (2000 * 100) / 256);
    e.setValue('G1_R3', 75 + (2000 * 100) / 256);
    const h = e.transferAt(7340);
    expect(t.entries[100].gainDb).toBeCloseTo(10 * Math.log10(h[0] ** 2 + h[1] ** 2), 12);
    e.setValue('G1_R1', 1000);
    e.setValue('G1_R3', 1000);
  });
  it('chooseCode: nearest, ties to the code nearer the default, NaN never chosen', () => {
    const entries = [0, 1, 2, 3].map((code) => ({ code, gainDb: [NaN, -1, 1, -1][code], phaseDeg: 0 }));
    expect(chooseCode(entries, 0, 3)).toBe(3);
    expect(chooseCode(entries, 0, 0)).toBe(1);
    expect(chooseCode(entries, 5, 0)).toBe(2);
  });
});

describe('the firmware trim on Monte Carlo boards', () => {
  const boards = sampleBoards(circuit, transfer, spec, { trials: 1000, seed: 5 });
  it('post-trim yield >= untrimmed yield, and the residual at the trim frequency shrinks', () => {
    const sim = simulateTrim(boards, trim, points, { measurementUncertaintyDb: 0.02, seed: 9 });
    expect(sim.trimmedYield).toBeGreaterThanOrEqual(sim.untrimmedYield);
    expect(sim.trimmedYield).toBeGreaterThan(0.5); // the trim is worth it here: untrimmed about 13 %
    expect(sim.trimmedError.sd).toBeLessThan(sim.untrimmedError.sd / 3);
    expect(sim.atRangeEnd).toBe(0);
    expect(sim.diagnostics).toEqual([]);
    expect(sim.simulatedBoards).toBe(1000);
    // At the trim point itself (7340 Hz) the spread about the design gain shrinks as at the trim frequency.
    expect(sim.pointErrors[0].trimmed.sd).toBeLessThan(sim.pointErrors[0].untrimmed.sd / 3);
    expect(sim.pointErrors.map((p) => p.frequencyHz)).toEqual([7340, 10000, 13620]);
  });
  it('a second pass removes most of what the device tolerance leaves after the first', () => {
    const one = simulateTrim(boards, trim, points, { measurementUncertaintyDb: 0, passes: 1 });
    const two = simulateTrim(boards, trim, points, { measurementUncertaintyDb: 0, passes: 2 });
    expect(two.trimmedError.sd).toBeLessThan(one.trimmedError.sd / 2);
    expect(two.trimmedYield).toBeGreaterThanOrEqual(one.trimmedYield);
  });
  it('noise-free, exact device: the chosen code reproduces the board response within one step', () => {
    const exactDevice: TrimDevice = { ...rheostat, tolerance: 0 };
    const sim = simulateTrim(boards, { ...trim, device: exactDevice }, points, { measurementUncertaintyDb: 0 });
    const t = sim.table.entries;
    for (let b = 0; b < boards.count; b++) {
      const c = sim.codes[b];
      const step = Math.max(Math.abs(t[Math.min(c + 1, t.length - 1)].gainDb - t[c].gainDb), Math.abs(t[c].gainDb - t[Math.max(c - 1, 0)].gainDb));
      expect(Math.abs(sim.trimmedGainDb[b] - sim.predictedGainDb[b])).toBeLessThanOrEqual(step);
      expect(Math.abs(sim.trimmedGainDb[b] - sim.table.targetGainDb)).toBeLessThanOrEqual(step);
    }
  });
  it('a binary resistor bank in series with a reduced fixed part trims too (sized from bank options)', () => {
    const banks = resistorBankOptions([2, 5, 10], [5, 6, 7], { bitTolerance: 0.01, switchOnOhms: 0.5 });
    const s = sizeTrim(boards, { targets: [{ element: 'G1_R5', placement: 'series' }], frequencyHz: 7340 }, banks, points, { requiredShare: 0.99, measurementUncertaintyDb: 0.02 });
    expect(s.chosen?.kind).toBe('resistor-bank');
    const sim = s.simulation!;
    expect(sim.trimmedYield).toBeGreaterThanOrEqual(sim.untrimmedYield);
    expect(sim.table.fixedOhms[0].ohms).toBeGreaterThan(0);
    expect(sim.table.fixedOhms[0].ohms).toBeLessThan(1000);
  });
  it('warns when the range runs out and the default code sits at an end', () => {
    const tiny: TrimDevice = { kind: 'rheostat', endToEndOhms: 900, steps: 64, wiperOhms: 75, tolerance: 0.2 }; // R(64) = 975 < 1000
    const sim = simulateTrim(boards, { ...trim, device: tiny }, points);
    expect(sim.diagnostics.map((d) => d.code)).toEqual(['TRIM_RANGE_EXHAUSTED', 'TRIM_DEFAULT_AT_END']);
  });
  it('warns when the table is not monotone where the boards use it (trimming near the bandpass peak)', () => {
    // At 9.5 kHz the codes the boards need move the centre across the trim frequency: the gain there
    // rises, peaks and falls along the codes.
    const sim = simulateTrim(boards, { ...trim, frequencyHz: 9500 }, points);
    expect(sim.diagnostics.map((d) => d.code)).toContain('TRIM_TABLE_NOT_MONOTONE');
  });
  it('is deterministic for a seed and leaves the engine nominal', () => {
    const a = simulateTrim(boards, trim, points, { measurementUncertaintyDb: 0.05, seed: 4 });
    const b = simulateTrim(boards, trim, points, { measurementUncertaintyDb: 0.05, seed: 4 });
    expect(Array.from(b.codes)).toEqual(Array.from(a.codes));
    expect(boards.engine.getValue('G1_R5')).toBe(1000);
    expect(boards.engine.getValue('RS')).toBe(1000);
  });
});

describe('trim sizing', () => {
  const boards = sampleBoards(circuit, transfer, spec, { trials: 200, seed: 21 });
  const catalogue: TrimDevice[] = [500, 1000, 2000, 5000].flatMap((rab) => [16, 64].map((steps): TrimDevice => ({ kind: 'rheostat', endToEndOhms: rab, steps, wiperOhms: 75, tolerance: 0.2 })));
  const base = { targets: [{ element: 'G1_R5', placement: 'replace' as const }], frequencyHz: 7340 };
  it('chooses the first candidate (smallest range, then fewest codes) that reaches the share', () => {
    const s = sizeTrim(boards, base, catalogue, points, { requiredShare: 0.8, measurementUncertaintyDb: 0.02 });
    expect(s.chosen).not.toBeNull();
    expect(s.simulation!.trimmedYield).toBeGreaterThanOrEqual(0.8);
    for (const c of s.candidates.slice(0, -1)) expect(c.feasible ? c.trimmedYield : 0).toBeLessThan(0.8);
    const ranges = s.candidates.map((c) => c.rangeOhms);
    expect([...ranges].sort((a, b) => a - b)).toEqual(ranges);
    // A 500-ohm range cannot replace a 1000-ohm resistor: the range runs out, and the candidate is
    // stopped as soon as more than 20 % of the boards have failed.
    expect(s.candidates[0].rangeOhms).toBe(500);
    expect(s.candidates[0].simulatedBoards).toBeLessThan(200);
    expect(s.simulation!.simulatedBoards).toBe(200);
  });
  it('is monotone in the requested share (fast-check)', () => {
    const order = (d: TrimDevice | null) => {
      if (d === null) return Infinity;
      const r = trimRange(d);
      return r.rangeOhms * 1e4 + r.codes;
    };
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 1, noNaN: true }), fc.double({ min: 0.05, max: 1, noNaN: true }), (s1, s2) => {
        const [lo, hi] = s1 <= s2 ? [s1, s2] : [s2, s1];
        const a = sizeTrim(boards, base, catalogue, points, { requiredShare: lo, measurementUncertaintyDb: 0.02 });
        const b = sizeTrim(boards, base, catalogue, points, { requiredShare: hi, measurementUncertaintyDb: 0.02 });
        expect(order(a.chosen)).toBeLessThanOrEqual(order(b.chosen));
      }),
      { numRuns: 8 },
    );
  });
  it('early stopping changes nothing: the choice equals the first candidate whose full simulation reaches the share', () => {
    const ordered = [...catalogue].sort((a, b) => trimRange(a).rangeOhms - trimRange(b).rangeOhms || trimRange(a).codes - trimRange(b).codes);
    const full = ordered.map((device) => {
      try {
        return simulateTrim(boards, { ...base, device }, points, { measurementUncertaintyDb: 0.02 }).trimmedYield;
      } catch {
        return NaN;
      }
    });
    // Shares at each candidate's exact yield (the boundary) and just above it.
    for (const share of full.filter((y) => y > 0).flatMap((y) => [y, Math.min(1, y + 1e-6)])) {
      const want = ordered.find((_, i) => full[i] >= share) ?? null;
      expect(sizeTrim(boards, base, catalogue, points, { requiredShare: share, measurementUncertaintyDb: 0.02 }).chosen).toBe(want);
    }
  });
  it('rejects a share outside (0, 1] and an empty catalogue', () => {
    expect(() => sizeTrim(boards, base, catalogue, points, { requiredShare: 0 })).toThrow(GicladderError);
    expect(() => sizeTrim(boards, base, [], points, { requiredShare: 0.5 })).toThrow(GicladderError);
  });
});
