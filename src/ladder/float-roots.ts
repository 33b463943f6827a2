/**
 * All complex roots of a real polynomial in Float64 by the Aberth-Ehrlich simultaneous iteration
 * (O. Aberth, Math. Comp. 27 (1973) 339-344), guarded for the near-double roots of Feldtkeller
 * polynomials: a correction that is not finite (two iterates met, or p' vanished) is replaced by a
 * small random-free nudge, and starting points lie on circles of the Cauchy-bound radius estimate with
 * an irrational angular offset so no two start as conjugates. Near-double roots converge linearly; the
 * caller pairs and polishes them in extended precision (precise-roots.ts).
 *
 * A kernel: no throws; a polynomial it cannot solve gives NaN roots.
 */
import type { Complex } from '../algebra/complex';

/** Sweeps allowed: near-double roots converge linearly (one bit per sweep or so), 500 is ample. */
const MAX_SWEEPS = 500;
/** Relative step under which an iterate has converged. */
const STEP_TOLERANCE = 4 * Number.EPSILON;

export function floatPolynomialRoots(ascending: readonly number[]): Complex[] {
  let c = ascending.slice();
  while (c.length > 1 && c[c.length - 1] === 0) c.pop();
  const n = c.length - 1;
  if (n < 1) return [];
  const lead = c[n];
  c = c.map((x) => x / lead);
  // Radius: geometric mean of the root moduli when the constant is nonzero, else a Cauchy-type bound.
  const radius = c[0] !== 0 ? Math.abs(c[0]) ** (1 / n) : Math.max(...c.slice(0, n).map((x, i) => Math.abs(x) ** (1 / (n - i))));
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const angle = (2 * Math.PI * i) / n + 0.4;
    re[i] = radius * Math.cos(angle);
    im[i] = radius * Math.sin(angle);
  }
  const done = new Uint8Array(n);
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let active = 0;
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const zr = re[i];
      const zi = im[i];
      // p and p' by Horner
      let pr = 1;
      let pi = 0;
      let dr = 0;
      let di = 0;
      for (let k = n - 1; k >= 0; k--) {
        const ndr = dr * zr - di * zi + pr;
        di = dr * zi + di * zr + pi;
        dr = ndr;
        const npr = pr * zr - pi * zi + c[k];
        pi = pr * zi + pi * zr;
        pr = npr;
      }
      if (pr === 0 && pi === 0) {
        done[i] = 1;
        continue;
      }
      // ratio = p / p'
      const dd = dr * dr + di * di;
      const qr = (pr * dr + pi * di) / dd;
      const qi = (pi * dr - pr * di) / dd;
      // sum 1/(z_i - z_j)
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const ur = zr - re[j];
        const ui = zi - im[j];
        const uu = ur * ur + ui * ui;
        if (uu === 0) continue;
        sr += ur / uu;
        si += -ui / uu;
      }
      // step = ratio / (1 - ratio * sum)
      const br = 1 - (qr * sr - qi * si);
      const bi = -(qr * si + qi * sr);
      const bb = br * br + bi * bi;
      let stepR = (qr * br + qi * bi) / bb;
      let stepI = (qi * br - qr * bi) / bb;
      if (!Number.isFinite(stepR) || !Number.isFinite(stepI)) {
        stepR = Number.isFinite(qr) ? qr : 1e-8 * (radius || 1);
        stepI = Number.isFinite(qi) ? qi : 1e-8 * (radius || 1);
      }
      re[i] = zr - stepR;
      im[i] = zi - stepI;
      const size = Math.hypot(re[i], im[i]);
      if (Math.hypot(stepR, stepI) <= STEP_TOLERANCE * Math.max(size, Number.MIN_VALUE)) done[i] = 1;
      else active++;
    }
    if (active === 0) break;
  }
  const out: Complex[] = [];
  for (let i = 0; i < n; i++) out.push({ re: re[i], im: im[i] });
  return out;
}
