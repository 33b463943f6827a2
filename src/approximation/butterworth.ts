/**
 * Butterworth lowpass prototype, -3.01 dB at 1 rad/s (same normalisation as scipy.signal.buttap).
 *
 * Poles on the unit circle, p_k = -sin(theta_k) + j cos(theta_k), theta_k = (2k - 1) pi / (2N),
 * k = 1..N [S. Butterworth, "On the theory of filter amplifiers", Wireless Engineer 7 (1930); e.g.
 * L. P. Huelsman, Active and Passive Analog Filter Design (1993), ch. 2]. The real part is taken
 * from the sine so that it keeps its relative accuracy for poles near the j axis.
 */

import type { Complex } from '../algebra/complex.js';
import { conjugateRootSet, type Zpk } from './zpk.js';

export function butterworthPrototype(order: number): Zpk {
  const upper: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    const theta = ((2 * k - 1) * Math.PI) / (2 * order);
    upper.push({ re: -Math.sin(theta), im: Math.cos(theta) });
  }
  return { zeros: [], poles: conjugateRootSet(upper, order % 2 === 1 ? [-1] : []), gain: 1 };
}
