/**
 * Cross-check of gicladder's AC response against ngspice (reference: ngspice in batch mode on the
 * netlist circuitToSpice exports). For a GIC simulated inductor in an RLC bandpass, a GIC FDNR in a
 * third-order Bruton lowpass and a 7th-order FDNR ladder (three GIC stages, six op-amps), each with
 * every op-amp model, both the exact transfer function and the compiled float engine must equal
 * ngspice's V(out) at every one of >= 50 frequencies within 1e-4 dB and 0.01 degree.
 *
 * Tolerances: the (1e-4 dB is 1.2e-5 relative). Both simulators solve the same linear
 * equations in double precision; the netlist's values are the circuit's correctly rounded doubles
 * (one more rounding in 1/wt), so the expected disagreement is a few ulps times the condition number,
 * far below the tolerance within the swept ranges (which stop before the deepest stopband, where
 * ngspice's absolute LU error becomes a large relative error).
 */
import { expect, it } from 'vitest';
import { describeWithNgspice } from '../helpers/ngspice-vitest';
import { runNgspiceAc } from '../helpers/ngspice';
import { fdnrLadder7, fdnrLowpassTerminations, gicFdnrLowpass, gicInductorBandpass } from '../helpers/gic-circuits';
import { circuitToSpice } from '../../src/export/spice';
import { compileAc, transferFunction } from '../../src/analysis/index';
import { Circuit, type OpampModel } from '../../src/netlist/index';

const MAX_DB_ERROR = 1e-4;
const MAX_DEG_ERROR = 0.01;
const MIN_POINTS = 50;

const MODELS: readonly OpampModel[] = [
  { model: 'ideal' },
  { model: 'finite-gain', gain: 2e5 },
  { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 },
  { model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100, secondPoleHz: 2e7 },
  { model: 'integrator', gainBandwidthHz: 1e6 },
];

const CIRCUITS: readonly { name: string; build: (m: OpampModel) => Circuit; startHz: number; stopHz: number }[] = [
  { name: 'GIC simulated inductor in an RLC bandpass', build: gicInductorBandpass, startHz: 100, stopHz: 1e5 },
  { name: 'GIC FDNR in a 3rd-order Bruton lowpass', build: gicFdnrLowpass, startHz: 10, stopHz: 1e4 },
  { name: '7th-order FDNR ladder, three GIC stages', build: fdnrLadder7, startHz: 10, stopHz: 5e3 },
];

const db = (re: number, im: number) => 20 * Math.log10(Math.hypot(re, im));
const deg = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;
/** Phase difference wrapped to (-180, 180]. */
const dPhase = (a: number, b: number) => {
  const d = (((a - b) % 360) + 540) % 360 - 180;
  return d;
};

describeWithNgspice('AC response equals ngspice', () => {
  for (const circuit of CIRCUITS) {
    for (const model of MODELS) {
      it(`${circuit.name}, ${model.model} op-amps: exact and compiled within ${MAX_DB_ERROR} dB / ${MAX_DEG_ERROR} deg of ngspice`, () => {
        const c = circuit.build(model);
        const netlist = circuitToSpice(c, { acSweep: { pointsPerDecade: 20, startHz: circuit.startHz, stopHz: circuit.stopHz } });
        const result = runNgspiceAc(netlist);
        if (result.status !== 'ok') throw new Error('ngspice vanished');
        expect(result.points.length).toBeGreaterThanOrEqual(MIN_POINTS);
        const exact = transferFunction(c, { input: 'in', output: 'out' });
        const engine = compileAc(c, { input: 'in', output: 'out' });
        let worstDb = 0;
        let worstDeg = 0;
        for (const p of result.points) {
          const ref = { db: db(p.re, p.im), deg: deg(p.re, p.im) };
          const h = exact.evaluateComplex({ re: 0, im: 2 * Math.PI * p.frequencyHz });
          const t = engine.transferAt(p.frequencyHz);
          for (const [re, im] of [
            [h.re, h.im],
            [t[0], t[1]],
          ]) {
            worstDb = Math.max(worstDb, Math.abs(db(re, im) - ref.db));
            worstDeg = Math.max(worstDeg, Math.abs(dPhase(deg(re, im), ref.deg)));
          }
        }
        expect(worstDb).toBeLessThan(MAX_DB_ERROR);
        expect(worstDeg).toBeLessThan(MAX_DEG_ERROR);
      });
    }
  }

  it('an FDNR D element, exported as its controlled-source equivalent, matches the exact response', () => {
    // the Bruton lowpass with the GIC replaced by the D element it realises: D = C1 C3 R2 R4 / R5
    const c = fdnrLowpassTerminations().addFdnr('D1', 'b', '0', '3.1831e-12');
    const result = runNgspiceAc(circuitToSpice(c, { acSweep: { pointsPerDecade: 20, startHz: 10, stopHz: 1e4 } }));
    if (result.status !== 'ok') throw new Error('ngspice vanished');
    expect(result.points.length).toBeGreaterThanOrEqual(MIN_POINTS);
    const exact = transferFunction(c, { input: 'in', output: 'out' });
    for (const p of result.points) {
      const h = exact.evaluateComplex({ re: 0, im: 2 * Math.PI * p.frequencyHz });
      expect(Math.abs(db(h.re, h.im) - db(p.re, p.im))).toBeLessThan(MAX_DB_ERROR);
      expect(Math.abs(dPhase(deg(h.re, h.im), deg(p.re, p.im)))).toBeLessThan(MAX_DEG_ERROR);
    }
  });
});
