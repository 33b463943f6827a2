/**
 * The adjoint (transpose) solve for sensitivities: one LU factorisation of the MNA matrix A(j w)
 * serves both A x = b (the response) and A^T y = c (the adjoint, c selecting the output), and then
 * every parameter's derivative costs one sparse product:
 *
 *   dH/dp = c^T dx/dp = -c^T A^-1 (dA/dp) x = -y^T (dA/dp) x
 *
 * (S. W. Director, R. A. Rohrer, "The generalized adjoint network and network sensitivities", IEEE
 * Trans. Circuit Theory CT-16(3), 1969; in matrix form e.g. J. Vlach, K. Singhal, "Computer Methods
 * for Circuit Analysis and Design", 2nd ed., 1994, ch. 9, from memory).
 *
 * Why a dense LU of its own: the compiled engine (analysis/ac-engine.ts) replays a sparse LU whose
 * factors it keeps private and which has no transpose solve. Sensitivities are not the Monte Carlo
 * hot path, and MNA systems of filters have tens of unknowns, so a dense complex LU with partial
 * pivoting (G. H. Golub, C. F. Van Loan, "Matrix Computations", 4th ed., algorithm 3.4.1) is cheap
 * (n = 31: about 10^4 complex multiply-adds per frequency) and gives both solves from one factorisation.
 * Kernels return NaN for a singular matrix, never throw.
 */

/** A dense complex matrix, row-major n*n, real and imaginary parts apart. */
export interface DenseComplexMatrix {
  readonly n: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/** The LU factors of P A = L U in place (L unit lower, U upper) and the row permutation. */
export interface DenseComplexLu {
  readonly n: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
  /** perm[i] = the row of A that became row i. */
  readonly perm: Int32Array;
  /** False when a pivot was exactly zero (the solves then give NaN). */
  readonly ok: boolean;
}

export function createDenseComplexMatrix(n: number): DenseComplexMatrix {
  return { n, re: new Float64Array(n * n), im: new Float64Array(n * n) };
}

/** Factorises a copy of `a` with partial pivoting (largest modulus in the column). */
export function factorDenseComplex(a: DenseComplexMatrix): DenseComplexLu {
  const { n } = a;
  const re = Float64Array.from(a.re);
  const im = Float64Array.from(a.im);
  const perm = Int32Array.from({ length: n }, (_, i) => i);
  let ok = true;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const m = Math.hypot(re[i * n + k], im[i * n + k]);
      if (m > best) {
        best = m;
        p = i;
      }
    }
    if (!(best > 0)) {
      ok = false;
      continue;
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        swap(re, k * n + j, p * n + j);
        swap(im, k * n + j, p * n + j);
      }
      const t = perm[k];
      perm[k] = perm[p];
      perm[p] = t;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const d = pr * pr + pi * pi; // |pivot| is the column maximum: no overflow concern at circuit scales
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k];
      const ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      const lr = (ar * pr + ai * pi) / d;
      const li = (ai * pr - ar * pi) / d;
      re[i * n + k] = lr;
      im[i * n + k] = li;
      for (let j = k + 1; j < n; j++) {
        const ur = re[k * n + j];
        const ui = im[k * n + j];
        re[i * n + j] -= lr * ur - li * ui;
        im[i * n + j] -= lr * ui + li * ur;
      }
    }
  }
  return { n, re, im, perm, ok };
}

/** Solves A x = b (b given as re/im vectors); returns x. */
export function solveDenseComplex(lu: DenseComplexLu, br: ArrayLike<number>, bi: ArrayLike<number>): { re: Float64Array; im: Float64Array } {
  const { n, re, im, perm } = lu;
  const xr = new Float64Array(n);
  const xi = new Float64Array(n);
  if (!lu.ok) return { re: xr.fill(NaN), im: xi.fill(NaN) };
  for (let i = 0; i < n; i++) {
    xr[i] = br[perm[i]];
    xi[i] = bi[perm[i]];
  }
  for (let i = 0; i < n; i++) {
    // forward: L z = P b (unit diagonal)
    let sr = xr[i];
    let si = xi[i];
    for (let j = 0; j < i; j++) {
      const lr = re[i * n + j];
      const li = im[i * n + j];
      sr -= lr * xr[j] - li * xi[j];
      si -= lr * xi[j] + li * xr[j];
    }
    xr[i] = sr;
    xi[i] = si;
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = xr[i];
    let si = xi[i];
    for (let j = i + 1; j < n; j++) {
      const ur = re[i * n + j];
      const ui = im[i * n + j];
      sr -= ur * xr[j] - ui * xi[j];
      si -= ur * xi[j] + ui * xr[j];
    }
    divideInto(sr, si, re[i * n + i], im[i * n + i], xr, xi, i);
  }
  return { re: xr, im: xi };
}

/**
 * Solves A^T y = c with the factors of A (plain transpose, no conjugation): A^T = U^T L^T P, so
 * U^T w = c (forward), L^T v = w (backward), y = P^T v.
 */
export function solveTransposeDenseComplex(lu: DenseComplexLu, cr: ArrayLike<number>, ci: ArrayLike<number>): { re: Float64Array; im: Float64Array } {
  const { n, re, im, perm } = lu;
  const wr = Float64Array.from(cr);
  const wi = Float64Array.from(ci);
  const yr = new Float64Array(n);
  const yi = new Float64Array(n);
  if (!lu.ok) return { re: yr.fill(NaN), im: yi.fill(NaN) };
  for (let i = 0; i < n; i++) {
    let sr = wr[i];
    let si = wi[i];
    for (let j = 0; j < i; j++) {
      const ur = re[j * n + i]; // (U^T)_{ij} = U_{ji}
      const ui = im[j * n + i];
      sr -= ur * wr[j] - ui * wi[j];
      si -= ur * wi[j] + ui * wr[j];
    }
    divideInto(sr, si, re[i * n + i], im[i * n + i], wr, wi, i);
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = wr[i];
    let si = wi[i];
    for (let j = i + 1; j < n; j++) {
      const lr = re[j * n + i]; // (L^T)_{ij} = L_{ji}
      const li = im[j * n + i];
      sr -= lr * wr[j] - li * wi[j];
      si -= lr * wi[j] + li * wr[j];
    }
    wr[i] = sr;
    wi[i] = si;
  }
  for (let i = 0; i < n; i++) {
    yr[perm[i]] = wr[i];
    yi[perm[i]] = wi[i];
  }
  return { re: yr, im: yi };
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/** (ar + j ai) / (br + j bi) into xr[k], xi[k] by Smith's scaled division (R. L. Smith, CACM 5(8), 1962). */
function divideInto(ar: number, ai: number, br: number, bi: number, xr: Float64Array, xi: Float64Array, k: number): void {
  if (Math.abs(br) >= Math.abs(bi)) {
    const t = bi / br;
    const d = br + bi * t;
    xr[k] = (ar + ai * t) / d;
    xi[k] = (ai - ar * t) / d;
  } else {
    const t = br / bi;
    const d = br * t + bi;
    xr[k] = (ar * t + ai) / d;
    xi[k] = (ai * t - ar) / d;
  }
}
