/**
 * The correctness part of the side-by-side benchmark (bench/harness.ts), so CI notices when the
 * harness stops working: gicladder and ngspice must agree on the benchmark circuits. No timing here.
 * Reference: ngspice (batch mode on gicladder's circuitToSpice export).
 */
import { expect, it } from 'vitest';
import { compileAc } from '../../src/analysis/ac-engine';
import { benchCircuits } from '../../bench/circuits';
import { runMonteCarlo } from '../../src/tolerance/monte-carlo';
import {
  benchToleranceSpec,
  compareGainStatistics,
  compareMonteCarlo,
  crossCheckSweep,
  drawMonteCarloBoards,
  engineMonteCarlo,
  exportNetlist,
  monteCarloScript,
  ngspiceMonteCarlo,
  partSlots,
  spiceElementNames,
  TRANSFER,
} from '../../bench/harness';
import { describeWithNgspice } from '../helpers/ngspice-vitest';

/** The benchmark's target for the response difference (issue 10): both sides solve the same linear equations in Float64. */
const MAX_DIFFERENCE_DB = 1e-4;
/** A phase counterpart of the same order (issue 3's cross-check tolerance). */
const MAX_DIFFERENCE_DEG = 0.01;

describeWithNgspice('bench harness: gicladder and ngspice agree on the benchmark circuits', () => {
  for (const bc of benchCircuits()) {
    it(`${bc.id}: a 61-point sweep (20 per decade) agrees within 1e-4 dB`, () => {
      const d = crossCheckSweep(bc.circuit, bc.sweep, 20);
      expect(d.points).toBe(61);
      expect(d.maxGainDb, `worst at ${d.worstFrequencyHz} Hz`).toBeLessThanOrEqual(MAX_DIFFERENCE_DB);
      expect(d.maxPhaseDeg).toBeLessThanOrEqual(MAX_DIFFERENCE_DEG);
    });

    it(`${bc.id}: a 5-trial Monte Carlo at 16 frequencies gives the same boards' responses`, () => {
      const netlist = exportNetlist(bc.circuit, 'harness test');
      const spec = benchToleranceSpec(bc.circuit);
      const boards = drawMonteCarloBoards(bc.circuit, spec, 5, 7);
      const names = spiceElementNames(bc.circuit, netlist);
      const { points } = ngspiceMonteCarlo(netlist, boards, names, bc.monteCarlo, 15);
      expect(points).toHaveLength(5 * 16);
      const engine = compileAc(bc.circuit, TRANSFER);
      const frequencies = Float64Array.from(points.slice(0, 16), (p) => p.frequencyHz);
      const re = new Float64Array(points.length);
      const im = new Float64Array(points.length);
      engineMonteCarlo(engine, partSlots(engine, boards), boards, frequencies, re, im);
      const d = compareMonteCarlo(points, re, im);
      expect(d.maxGainDb).toBeLessThanOrEqual(MAX_DIFFERENCE_DB);
      // the trials differ from each other (the alter lines took effect): the gain at the band edge spreads
      const edge = Array.from({ length: 5 }, (_, t) => 20 * Math.log10(Math.hypot(re[t * 16 + 8], im[t * 16 + 8])));
      expect(Math.max(...edge) - Math.min(...edge)).toBeGreaterThan(1e-3);
      // the library's Monte Carlo with the same seed simulated these boards: its statistics are ngspice's
      const result = runMonteCarlo(bc.circuit, TRANSFER, spec, { frequenciesHz: frequencies, trials: 5, seed: 7 });
      expect(compareGainStatistics(points, result)).toBeLessThanOrEqual(MAX_DIFFERENCE_DB);
      // and another seed's boards do not match (the comparison can fail)
      const other = runMonteCarlo(bc.circuit, TRANSFER, spec, { frequenciesHz: frequencies, trials: 5, seed: 8 });
      expect(compareGainStatistics(points, other)).toBeGreaterThan(MAX_DIFFERENCE_DB);
    });
  }

  it('the Monte Carlo script alters every R and C once per trial, with round-trip values', () => {
    const bc = benchCircuits()[0];
    const netlist = exportNetlist(bc.circuit, 'harness test');
    const boards = drawMonteCarloBoards(bc.circuit, benchToleranceSpec(bc.circuit), 3, 1);
    const script = monteCarloScript(boards, spiceElementNames(bc.circuit, netlist), bc.monteCarlo, 15);
    const alters = script.filter((l) => l.startsWith('alter '));
    expect(alters).toHaveLength(3 * boards.names.length);
    alters.forEach((line, i) => expect(Number(line.split(' = ')[1])).toBe(boards.values[i]));
  });
});
