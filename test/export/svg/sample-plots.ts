/**
 * The four plots of a 5th-order elliptic lowpass at 2.5 kHz (from src/approximation, evaluated in
 * zeros/poles/gain form), with a spec mask, a stand-in +-1 dB envelope, three test points and two
 * op-amp swing curves: data for the SVG tests.
 */
import { lowpassPrototype } from '../../../src/approximation/prototype';
import { evaluateZpk } from '../../../src/approximation/zpk';
import { gainPlot, groupDelayPlot, phasePlot, swingPlot } from '../../../src/export/svg/plots';
import type { PlotModel } from '../../../src/export/svg/plot-model';

const EDGE_HZ = 2500;
const w = 2 * Math.PI * EDGE_HZ;
const proto = lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 0.1, stopbandAttenuationDb: 60 });
const zpk = {
  zeros: proto.zeros.map((z) => ({ re: z.re * w, im: z.im * w })),
  poles: proto.poles.map((z) => ({ re: z.re * w, im: z.im * w })),
  gain: proto.gain * w ** (proto.poles.length - proto.zeros.length),
};
export const FREQUENCY_HZ = Array.from({ length: 400 }, (_, i) => 10 * 10 ** ((i * 4) / 399));
const h = FREQUENCY_HZ.map((f) => evaluateZpk(zpk, { re: 0, im: 2 * Math.PI * f }));
export const GAIN_DB = h.map((c) => 20 * Math.log10(Math.hypot(c.re, c.im)));
/** Unwrapped by steps of 360 degrees along the sweep. */
export const PHASE_DEG = (() => {
  let offset = 0;
  let prev = 0;
  return h.map((c, i) => {
    const a = (Math.atan2(c.im, c.re) * 180) / Math.PI;
    if (i > 0) offset -= 360 * Math.round((a + offset - prev) / 360);
    prev = a + offset;
    return prev;
  });
})();
/** -d(phase)/d(omega) by central differences of the unwrapped phase. */
export const GROUP_DELAY_S = FREQUENCY_HZ.map((f, i) => {
  const j0 = Math.max(0, i - 1);
  const j1 = Math.min(FREQUENCY_HZ.length - 1, i + 1);
  return (-(PHASE_DEG[j1] - PHASE_DEG[j0]) * (Math.PI / 180)) / (2 * Math.PI * (FREQUENCY_HZ[j1] - FREQUENCY_HZ[j0]));
});

export function samplePlots(title = 'shaker_lowpass'): Record<'gain' | 'phase' | 'groupDelay' | 'swing', PlotModel> {
  return {
    gain: gainPlot({
      title: `${title}: gain`,
      frequencyHz: FREQUENCY_HZ,
      gainDb: GAIN_DB,
      mask: [
        { fromHz: 0, toHz: EDGE_HZ, minDb: -0.1, maxDb: 0.5 },
        { fromHz: 3500, toHz: 1e5, maxDb: -60 },
      ],
      envelope: { label: 'Monte Carlo 0.5 .. 99.5 %', frequencyHz: FREQUENCY_HZ, lower: GAIN_DB.map((g) => g - 1), upper: GAIN_DB.map((g) => g + 1) },
      testLimits: [
        { frequencyHz: 100, gainDb: 0, lowDb: -0.5, highDb: 0.5 },
        { frequencyHz: 2000, gainDb: -0.05, lowDb: -0.6, highDb: 0.4 },
        { frequencyHz: 10000, gainDb: -70, lowDb: -200, highDb: -60 },
      ],
    }),
    phase: phasePlot({ title: `${title}: phase`, frequencyHz: FREQUENCY_HZ, phaseDeg: PHASE_DEG }),
    groupDelay: groupDelayPlot({ title: `${title}: group delay`, frequencyHz: FREQUENCY_HZ, groupDelayS: GROUP_DELAY_S }),
    swing: swingPlot({
      title: `${title}: op-amp output swing`,
      frequencyHz: FREQUENCY_HZ,
      outputs: [
        { label: 'U1 (GIC 1)', peakV: FREQUENCY_HZ.map((f) => 1 + 1.5 / (1 + 10 * (f / EDGE_HZ - 1) ** 2)) },
        { label: 'U2 (GIC 1)', peakV: FREQUENCY_HZ.map((f) => 2 / (1 + (f / 3000) ** 2)) },
      ],
      clippingV: 2.2,
    }),
  };
}
