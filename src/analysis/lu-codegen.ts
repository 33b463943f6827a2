/**
 * Straight-line kernels for a fixed sparse LU plan: the fill of A(j w) from the term weights, the
 * factorisation and the substitutions, generated once as JavaScript source with every array index a
 * literal, then compiled with `new Function`. The operations and their order are exactly those of the
 * interpreted kernels in sparse-lu.ts (the results are bit-for-bit the same); only the index loads and
 * loop control disappear, which is most of the time for the small dense-ish fronts of MNA matrices.
 *
 * Compiled kernels are kept in a small cache keyed by their source text: every engine compiled for
 * the same circuit structure (each Monte Carlo run, each worker's setup, each trim step) then calls the
 * very same function objects, which the JavaScript engine has already optimised, instead of fresh
 * closures that start in the interpreter and make their call sites polymorphic (measured: a fresh
 * pair per run cost a worker thread about twice the time per trial of a warm one).
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
    const fillFactor = cachedFunction(['w', 'gw', 'vr', 'vi', 'ir', 'ii'], `${fillSource(plan, groups)}\n${factorSource(plan)}`) as LuKernels['fillFactor'];
    const solve = cachedFunction(['vr', 'vi', 'ir', 'ii', 'br', 'bi', 'xr', 'xi'], solveSource(plan)) as LuKernels['solve'];
    return { fillFactor, solve };
  } catch {
    return null;
  }
}

/**
 * A double as source text that evaluates to exactly it: String() round-trips every double; negatives
 * (and -0) are parenthesised so the literal is safe next to any operator (`a - (-1)`, `(-2) ** 2`).
 */
export function numberLiteral(x: number): string {
  return Object.is(x, -0) ? '(-0)' : x < 0 ? `(${String(x)})` : String(x);
}

/** Compiled kernels by parameter list and body, oldest first (a Map keeps insertion order). */
const kernelCache = new Map<string, Function>();
let cachedChars = 0;

/** Kernels kept compiled: a few circuit structures in use at once (design, trim, production) with room to spare. */
export const KERNEL_CACHE_SIZE = 64;
/**
 * And at most this many characters of kernel text (the keys, about 2 bytes each): a large circuit's
 * kernels run to a megabyte of text, so a long-running process that compiles many circuits keeps a
 * bounded few of them.
 */
export const KERNEL_CACHE_CHARS = 4_000_000;

/**
 * `new Function(...params, body)`, reused for an identical text. The functions are pure (all state in
 * their array arguments), so sharing one between engines is safe.
 */
export function cachedFunction(params: readonly string[], body: string): Function {
  const key = `${params.join(',')}\n${body}`;
  let f = kernelCache.get(key);
  if (f) {
    kernelCache.delete(key); // refresh its place
  } else {
    f = new Function(...params, body);
    cachedChars += key.length;
    while (kernelCache.size > 0 && (kernelCache.size >= KERNEL_CACHE_SIZE || cachedChars > KERNEL_CACHE_CHARS)) {
      const oldest = kernelCache.keys().next().value!;
      kernelCache.delete(oldest);
      cachedChars -= oldest.length;
    }
  }
  kernelCache.set(key, f);
  return f;
}

function fillSource(plan: SparseLuPlan, groups: readonly FillGroup[]): string {
  const { powers, re, im } = fillExpressions(plan, groups);
  const lines = [...powers];
  for (let s = 0; s < plan.slotCount; s++) lines.push(`vr[${s}] = ${re[s]};`, `vi[${s}] = ${im[s]};`);
  return lines.join('\n');
}

/**
 * The fill of A(j w) as source text: `powers` declares w1 = w, w2 = w1 * w, ...; `re[s]` and `im[s]`
 * are the expressions of slot s's parts, the terms added in group order as the interpreted fill adds
 * them (so the sums round identically).
 */
export function fillExpressions(plan: SparseLuPlan, groups: readonly FillGroup[]): { powers: string[]; re: string[]; im: string[] } {
  const maxPow = groups.reduce((m, g) => Math.max(m, g.power), 0);
  const powers: string[] = ['const w1 = w;'];
  for (let k = 2; k <= maxPow; k++) powers.push(`const w${k} = w${k - 1} * w;`);
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
  return {
    powers,
    re: Array.from({ length: plan.slotCount }, (_, s) => re.get(s) ?? '0'),
    im: Array.from({ length: plan.slotCount }, (_, s) => im.get(s) ?? '0'),
  };
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
