/**
 * Complex sparse LU with a pivot order fixed once: planning (ordering and symbolic fill) happens at
 * compile time, each later factorisation is a replay of a precomputed operation list on preallocated
 * Float64Arrays (real and imaginary parts apart), with no allocation and no searching.
 *
 * Ordering: Markowitz's rule with threshold pivoting (I. S. Duff, A. M. Erisman, J. K. Reid, "Direct
 * Methods for Sparse Matrices", Oxford 1986, sections 7.2 and 7.8): among structurally nonzero entries
 * whose magnitude is at least {@link PIVOT_THRESHOLD} times the largest in their column, at every sample
 * matrix given (the system at several frequencies), take the one of least (r - 1)(c - 1). Kernels never
 * throw: a zero pivot at run time gives NaN/Infinity, which the caller detects.
 */
import { divideParts as cdiv } from '../algebra/complex';

/** Threshold u of threshold pivoting; 0.1 is the usual compromise between sparsity and stability (Duff et al., section 7.8). */
export const PIVOT_THRESHOLD = 0.1;

export interface SparseLuPlan {
  readonly n: number;
  /** Number of value slots (original entries first, then fill-ins). */
  readonly slotCount: number;
  /** Slot of entry (row, col), or -1: row-major n*n. */
  readonly slotOf: Int32Array;
  readonly pivotRow: Int32Array;
  readonly pivotCol: Int32Array;
  readonly pivotSlot: Int32Array;
  /** L entries of step k: lStart[k] .. lStart[k+1]. */
  readonly lStart: Int32Array;
  readonly lSlot: Int32Array;
  readonly lRow: Int32Array;
  /** U row of step k (entries right of the pivot): uStart[k] .. uStart[k+1]. */
  readonly uStart: Int32Array;
  readonly uSlot: Int32Array;
  readonly uCol: Int32Array;
  /** For L entry e, the targets of its row update, aligned with the U row of its step: tStart[e] .. */
  readonly tStart: Int32Array;
  readonly target: Int32Array;
}

/** A dense complex sample matrix: re and im, row-major n*n. */
export interface ComplexSample {
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/**
 * Plans the factorisation of matrices with the given structure (`entries` as row*n+col keys, original
 * slots numbered in that order). Returns null when some step finds no nonzero pivot at all (the matrix
 * is structurally or numerically singular at every sample), with the rows and columns left over.
 */
export function planSparseLu(
  n: number,
  entries: readonly number[],
  samples: readonly ComplexSample[],
): { plan: SparseLuPlan } | { plan: null; rows: number[]; cols: number[] } {
  const structure = new Uint8Array(n * n);
  for (const e of entries) structure[e] = 1;
  const work = samples.map((s) => ({ re: Float64Array.from(s.re), im: Float64Array.from(s.im) }));
  const rowActive = new Uint8Array(n).fill(1);
  const colActive = new Uint8Array(n).fill(1);
  const pivotRow = new Int32Array(n);
  const pivotCol = new Int32Array(n);
  const rowCount = new Int32Array(n);
  const colCount = new Int32Array(n);
  const colMax = new Float64Array(n * samples.length);
  for (let k = 0; k < n; k++) {
    rowCount.fill(0);
    colCount.fill(0);
    colMax.fill(0);
    for (let i = 0; i < n; i++) {
      if (!rowActive[i]) continue;
      for (let j = 0; j < n; j++) {
        if (!colActive[j] || !structure[i * n + j]) continue;
        rowCount[i]++;
        colCount[j]++;
        for (let s = 0; s < work.length; s++) {
          const m = Math.hypot(work[s].re[i * n + j], work[s].im[i * n + j]);
          if (m > colMax[s * n + j]) colMax[s * n + j] = m;
        }
      }
    }
    let bi = -1;
    let bj = -1;
    let bestCost = Infinity;
    let bestRatio = -1;
    let fi = -1;
    let fj = -1;
    let fallbackRatio = 0;
    for (let i = 0; i < n; i++) {
      if (!rowActive[i]) continue;
      for (let j = 0; j < n; j++) {
        if (!colActive[j] || !structure[i * n + j]) continue;
        let ratio = 1;
        for (let s = 0; s < work.length; s++) {
          const cm = colMax[s * n + j];
          const m = Math.hypot(work[s].re[i * n + j], work[s].im[i * n + j]);
          const r = cm > 0 ? m / cm : 0;
          if (r < ratio) ratio = r;
        }
        if (ratio > fallbackRatio) {
          fallbackRatio = ratio;
          fi = i;
          fj = j;
        }
        if (ratio < PIVOT_THRESHOLD) continue;
        const cost = (rowCount[i] - 1) * (colCount[j] - 1);
        if (cost < bestCost || (cost === bestCost && ratio > bestRatio)) {
          bestCost = cost;
          bestRatio = ratio;
          bi = i;
          bj = j;
        }
      }
    }
    if (bi < 0) {
      if (fi < 0) {
        const rows: number[] = [];
        const cols: number[] = [];
        for (let i = 0; i < n; i++) if (rowActive[i]) rows.push(i);
        for (let j = 0; j < n; j++) if (colActive[j]) cols.push(j);
        return { plan: null, rows, cols };
      }
      bi = fi; // no entry passes the threshold at every sample: take the best one
      bj = fj;
    }
    pivotRow[k] = bi;
    pivotCol[k] = bj;
    rowActive[bi] = 0;
    colActive[bj] = 0;
    // Symbolic and numeric elimination on the samples.
    for (let r = 0; r < n; r++) {
      if (!rowActive[r] || !structure[r * n + bj]) continue;
      for (let c = 0; c < n; c++) if (colActive[c] && structure[bi * n + c]) structure[r * n + c] = 1;
      for (const w of work) {
        const [lr, li] = cdiv(w.re[r * n + bj], w.im[r * n + bj], w.re[bi * n + bj], w.im[bi * n + bj]);
        for (let c = 0; c < n; c++) {
          if (!colActive[c]) continue;
          const ur = w.re[bi * n + c];
          const ui = w.im[bi * n + c];
          if (ur === 0 && ui === 0) continue;
          w.re[r * n + c] -= lr * ur - li * ui;
          w.im[r * n + c] -= lr * ui + li * ur;
        }
      }
    }
  }

  // Slots: the original entries first (in the caller's order), then fill-ins.
  const slotOf = new Int32Array(n * n).fill(-1);
  let slotCount = 0;
  for (const e of entries) if (slotOf[e] < 0) slotOf[e] = slotCount++;
  for (let e = 0; e < n * n; e++) if (structure[e] && slotOf[e] < 0) slotOf[e] = slotCount++;

  // The operation lists, replaying the elimination order.
  const eliminated = new Uint8Array(n); // columns
  const doneRow = new Uint8Array(n);
  const pivotSlot = new Int32Array(n);
  const lStart: number[] = [0];
  const lSlot: number[] = [];
  const lRow: number[] = [];
  const uStart: number[] = [0];
  const uSlot: number[] = [];
  const uCol: number[] = [];
  const tStart: number[] = [0];
  const target: number[] = [];
  for (let k = 0; k < n; k++) {
    const pr = pivotRow[k];
    const pc = pivotCol[k];
    pivotSlot[k] = slotOf[pr * n + pc];
    eliminated[pc] = 1;
    doneRow[pr] = 1;
    const ucols: number[] = [];
    for (let c = 0; c < n; c++) {
      if (!eliminated[c] && structure[pr * n + c]) {
        ucols.push(c);
        uSlot.push(slotOf[pr * n + c]);
        uCol.push(c);
      }
    }
    uStart.push(uSlot.length);
    for (let r = 0; r < n; r++) {
      if (doneRow[r] || !structure[r * n + pc]) continue;
      lSlot.push(slotOf[r * n + pc]);
      lRow.push(r);
      for (const c of ucols) target.push(slotOf[r * n + c]);
      tStart.push(target.length);
    }
    lStart.push(lSlot.length);
  }
  return {
    plan: {
      n,
      slotCount,
      slotOf,
      pivotRow,
      pivotCol,
      pivotSlot,
      lStart: Int32Array.from(lStart),
      lSlot: Int32Array.from(lSlot),
      lRow: Int32Array.from(lRow),
      uStart: Int32Array.from(uStart),
      uSlot: Int32Array.from(uSlot),
      uCol: Int32Array.from(uCol),
      tStart: Int32Array.from(tStart),
      target: Int32Array.from(target),
    },
  };
}

/**
 * Factorises in place: on return the value arrays hold L (unit diagonal, multipliers in the L slots)
 * and U, and invRe/invIm the reciprocal pivots. Returns false if a pivot is zero or not finite.
 */
export function factorSparseLu(p: SparseLuPlan, vr: Float64Array, vi: Float64Array, invRe: Float64Array, invIm: Float64Array): boolean {
  const { n, pivotSlot, lStart, lSlot, uStart, uSlot, tStart, target } = p;
  let ok = true;
  for (let k = 0; k < n; k++) {
    const ps = pivotSlot[k];
    const ar = vr[ps];
    const ai = vi[ps];
    // 1/(ar + j ai), scaled as in Smith's division
    let ir: number;
    let ii: number;
    if (Math.abs(ar) >= Math.abs(ai)) {
      const t = ai / ar;
      const d = ar + ai * t;
      ir = 1 / d;
      ii = -t / d;
    } else {
      const t = ar / ai;
      const d = ar * t + ai;
      ir = t / d;
      ii = -1 / d;
    }
    if (ir - ir !== 0 || ii - ii !== 0) ok = false; // NaN or Infinity (x - x is 0 only for finite x)
    invRe[k] = ir;
    invIm[k] = ii;
    const u0 = uStart[k];
    const u1 = uStart[k + 1];
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      const xr = vr[ls];
      const xi = vi[ls];
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      vr[ls] = lr;
      vi[ls] = li;
      let t = tStart[e];
      for (let m = u0; m < u1; m++, t++) {
        const us = uSlot[m];
        const ur = vr[us];
        const ui = vi[us];
        const ts = target[t];
        vr[ts] -= lr * ur - li * ui;
        vi[ts] -= lr * ui + li * ur;
      }
    }
  }
  return ok;
}

/**
 * Solves with the factors: b (row-indexed, overwritten as scratch) -> x (column-indexed).
 */
export function solveSparseLu(
  p: SparseLuPlan,
  vr: Float64Array,
  vi: Float64Array,
  invRe: Float64Array,
  invIm: Float64Array,
  br: Float64Array,
  bi: Float64Array,
  xr: Float64Array,
  xi: Float64Array,
): void {
  const { n, pivotRow, pivotCol, lStart, lSlot, lRow, uStart, uSlot, uCol } = p;
  for (let k = 0; k < n; k++) {
    const pr = pivotRow[k];
    const yr = br[pr];
    const yi = bi[pr];
    if (yr === 0 && yi === 0) continue;
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      const r = lRow[e];
      br[r] -= vr[ls] * yr - vi[ls] * yi;
      bi[r] -= vr[ls] * yi + vi[ls] * yr;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const pr = pivotRow[k];
    let ar = br[pr];
    let ai = bi[pr];
    for (let m = uStart[k]; m < uStart[k + 1]; m++) {
      const s = uSlot[m];
      const c = uCol[m];
      ar -= vr[s] * xr[c] - vi[s] * xi[c];
      ai -= vr[s] * xi[c] + vi[s] * xr[c];
    }
    const c = pivotCol[k];
    xr[c] = ar * invRe[k] - ai * invIm[k];
    xi[c] = ar * invIm[k] + ai * invRe[k];
  }
}

