/**
 * Straight-line kernels for a fixed sparse LU plan: the fill of A(j w) from the term weights, the
 * factorisation and the substitutions, generated once as JavaScript source with every array index a
 * literal, then compiled with `new Function`. The operations and their order are exactly those of the
 * interpreted kernels in sparse-lu.ts (the results are bit-for-bit the same); only the index loads and
 * loop control disappear, which is most of the time for the small dense-ish fronts of MNA matrices.
 *
 * The generated text contains only numeric literals derived from the plan (no user strings). Where
 * `new Function` is unavailable (a Content-Security-Policy without 'unsafe-eval'), or the plan is too
 * large for straight-line code to pay off, {@link generateLuKernels} returns null and the engine keeps
 * the interpreted kernels.
 */
import type { SparseLuPlan } from './sparse-lu';

/** Above this many elementary updates the code size outweighs the gain; the interpreted loop is used. */
export const MAX_GENERATED_OPERATIONS = 20_000;

/** One term group of the fill: weight index, matrix slot and power of s. */
export interface FillGroup {
  readonly weight: number;
  readonly slot: number;
  readonly power: number;
}

export interface LuKernels {
  /** Writes A(j w) into vr/vi from the group weights, factorises, returns false at a zero pivot. */
  readonly fillFactor: (w: number, gw: Float64Array, vr: Float64Array, vi: Float64Array, ir: Float64Array, ii: Float64Array) => boolean;
  /** Solves with the factors: b (row-indexed, used as scratch) -> x (column-indexed). */
  readonly solve: (vr: Float64Array, vi: Float64Array, ir: Float64Array, ii: Float64Array, br: Float64Array, bi: Float64Array, xr: Float64Array, xi: Float64Array) => void;
}

/**
 * Generates the kernels; `groups` must be in the order the interpreted fill adds them (by class of
 * j^k, then slot, then power) so the sums round identically.
 */
export function generateLuKernels(plan: SparseLuPlan, groups: readonly FillGroup[]): LuKernels | null {
  if (plan.target.length + plan.uSlot.length + plan.lSlot.length > MAX_GENERATED_OPERATIONS) return null;
  try {
    const fill = fillSource(plan, groups);
    const factor = factorSource(plan);
    const fillFactor = new Function('w', 'gw', 'vr', 'vi', 'ir', 'ii', `${fill}\n${factor}`) as LuKernels['fillFactor'];
    const solve = new Function('vr', 'vi', 'ir', 'ii', 'br', 'bi', 'xr', 'xi', solveSource(plan)) as LuKernels['solve'];
    return { fillFactor, solve };
  } catch {
    return null;
  }
}

function fillSource(plan: SparseLuPlan, groups: readonly FillGroup[]): string {
  const maxPow = groups.reduce((m, g) => Math.max(m, g.power), 0);
  const lines: string[] = ['const w1 = w;'];
  for (let k = 2; k <= maxPow; k++) lines.push(`const w${k} = w${k - 1} * w;`);
  const re = new Map<number, string>();
  const im = new Map<number, string>();
  // the interpreted fill starts from 0 and adds in group order; 0 + x is x, so start from the first term
  for (const g of groups) {
    const term = g.power === 0 ? `gw[${g.weight}]` : `gw[${g.weight}] * w${g.power}`;
    const cls = g.power & 3;
    const target = cls === 0 || cls === 2 ? re : im;
    const sign = cls === 0 || cls === 1 ? '+' : '-';
    const prev = target.get(g.slot);
    target.set(g.slot, prev === undefined ? (sign === '+' ? term : `0 - ${term}`) : `${prev} ${sign} ${term}`);
  }
  for (let s = 0; s < plan.slotCount; s++) {
    lines.push(`vr[${s}] = ${re.get(s) ?? '0'};`);
    lines.push(`vi[${s}] = ${im.get(s) ?? '0'};`);
  }
  return lines.join('\n');
}

function factorSource(plan: SparseLuPlan): string {
  const { n, pivotSlot, lStart, lSlot, uStart, uSlot, tStart, target } = plan;
  const lines: string[] = ['let ok = true; let ar, ai, r, d, pr, pi, xr, xi, lr, li, ur, ui;'];
  for (let k = 0; k < n; k++) {
    const ps = pivotSlot[k];
    lines.push(
      `ar = vr[${ps}]; ai = vi[${ps}];`,
      // Smith's scaled reciprocal, as in factorSparseLu
      `if (Math.abs(ar) >= Math.abs(ai)) { r = ai / ar; d = ar + ai * r; pr = 1 / d; pi = -r / d; } else { r = ar / ai; d = ar * r + ai; pr = r / d; pi = -1 / d; }`,
      `if (pr - pr !== 0 || pi - pi !== 0) ok = false;`,
      `ir[${k}] = pr; ii[${k}] = pi;`,
    );
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      lines.push(`xr = vr[${ls}]; xi = vi[${ls}]; lr = xr * pr - xi * pi; li = xr * pi + xi * pr; vr[${ls}] = lr; vi[${ls}] = li;`);
      let t = tStart[e];
      for (let m = uStart[k]; m < uStart[k + 1]; m++, t++) {
        const us = uSlot[m];
        const ts = target[t];
        lines.push(`ur = vr[${us}]; ui = vi[${us}]; vr[${ts}] -= lr * ur - li * ui; vi[${ts}] -= lr * ui + li * ur;`);
      }
    }
  }
  lines.push('return ok;');
  return lines.join('\n');
}

function solveSource(plan: SparseLuPlan): string {
  const { n, pivotRow, pivotCol, lStart, lSlot, lRow, uStart, uSlot, uCol } = plan;
  const lines: string[] = ['let yr, yi, ar, ai;'];
  for (let k = 0; k < n; k++) {
    if (lStart[k] === lStart[k + 1]) continue;
    const pr = pivotRow[k];
    const body: string[] = [];
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      const r = lRow[e];
      body.push(`br[${r}] -= vr[${ls}] * yr - vi[${ls}] * yi; bi[${r}] -= vr[${ls}] * yi + vi[${ls}] * yr;`);
    }
    lines.push(`yr = br[${pr}]; yi = bi[${pr}];`, `if (yr !== 0 || yi !== 0) { ${body.join(' ')} }`);
  }
  for (let k = n - 1; k >= 0; k--) {
    const pr = pivotRow[k];
    lines.push(`ar = br[${pr}]; ai = bi[${pr}];`);
    for (let m = uStart[k]; m < uStart[k + 1]; m++) {
      const s = uSlot[m];
      const c = uCol[m];
      lines.push(`ar -= vr[${s}] * xr[${c}] - vi[${s}] * xi[${c}]; ai -= vr[${s}] * xi[${c}] + vi[${s}] * xr[${c}];`);
    }
    const c = pivotCol[k];
    lines.push(`xr[${c}] = ar * ir[${k}] - ai * ii[${k}]; xi[${c}] = ar * ii[${k}] + ai * ir[${k}];`);
  }
  return lines.join('\n');
}
