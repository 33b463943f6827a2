/** Shared by the approximation tests: root-multiset comparison with a stated tolerance. */

import type { Complex } from '../../src/algebra/complex.js';

export type Pair = [number, number];

/** Relative tolerance the brief sets: 1e-10 up to order 10, 1e-8 up to 15 (relative to max(|root|, 1)). */
export function rootTolerance(order: number): number {
  return order <= 10 ? 1e-10 : 1e-8;
}

/**
 * Matches each expected root to the nearest unused computed root and returns the worst error relative
 * to max(|expected|, 1), with a description of the worst pair for the failure message.
 */
export function worstRootError(expected: readonly Pair[], got: readonly Complex[]): { error: number; detail: string } {
  if (expected.length !== got.length) {
    return { error: Number.POSITIVE_INFINITY, detail: `count: expected ${expected.length}, got ${got.length}` };
  }
  const used = new Array<boolean>(got.length).fill(false);
  let worst = 0;
  let detail = 'all roots match';
  for (const [re, im] of expected) {
    let best = -1;
    let bestDistance = Number.POSITIVE_INFINITY;
    for (let i = 0; i < got.length; i++) {
      if (used[i]) continue;
      const d = Math.hypot(got[i].re - re, got[i].im - im);
      if (d < bestDistance) {
        bestDistance = d;
        best = i;
      }
    }
    used[best] = true;
    const error = bestDistance / Math.max(Math.hypot(re, im), 1);
    if (error > worst) {
      worst = error;
      detail = `expected ${re} ${im >= 0 ? '+' : '-'} ${Math.abs(im)}j, got ${got[best].re} ${
        got[best].im >= 0 ? '+' : '-'
      } ${Math.abs(got[best].im)}j, relative error ${error.toExponential(2)}`;
    }
  }
  return { error: worst, detail };
}
