/**
 * Adaptive Gauss-Legendre quadrature for the smooth one-dimensional integrals of the risk
 * computations. The nodes and weights are computed here, once, by Newton's method on the Legendre
 * recurrence (G. H. Golub and J. H. Welsch, "Calculation of Gauss quadrature rules", Math. Comp. 23,
 * 1969, give the theory; the Newton form is Numerical Recipes, 3rd ed., section 4.6, gauleg), so no
 * table is copied. Each panel is compared with its two halves; a panel is accepted when they agree to
 * the tolerance, otherwise both halves recurse. Kernel: NaN in the integrand gives NaN, no throw.
 */

/** Points per panel: exact for polynomials of degree 19; a panel spanning a few u of a Phi step converges at once. */
const POINTS = 10;
/** Recursion depth cap: 2^-40 of the initial panel is far below any u or sd the caller passes. */
const MAX_DEPTH = 40;
/** Panel budget per call: a guard against integrands that never settle (noise, subnormals); about 1 ms each 1000. */
const MAX_PANELS = 50_000;
/**
 * The absolute floor is this share of relTol times the first coarse estimate: parts of the range that
 * contribute less than a thousandth of the asked accuracy need not converge on their own.
 */
const COARSE_SHARE = 1e-3;
/** Below this the integrand is subnormal noise; nothing to resolve. */
const TINY = 1e-290;

const { nodes: NODES, weights: WEIGHTS } = gaussLegendre(POINTS);

/** Nodes and weights of the n-point Gauss-Legendre rule on [-1, 1]. */
export function gaussLegendre(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5)); // the usual starting guess for the i-th root
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k; // Bonnet's recurrence
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1); // P_n'(x)
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    const w = 2 / ((1 - x * x) * dp * dp);
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = w;
    weights[n - 1 - i] = w;
  }
  return { nodes, weights };
}

function panel(f: (x: number) => number, a: number, b: number): number {
  const half = 0.5 * (b - a);
  const mid = 0.5 * (a + b);
  let s = 0;
  for (let i = 0; i < POINTS; i++) s += WEIGHTS[i] * f(mid + half * NODES[i]);
  return s * half;
}

interface Budget {
  panels: number;
}

function adapt(f: (x: number) => number, a: number, b: number, whole: number, relTol: number, absTol: number, depth: number, budget: Budget): number {
  const m = 0.5 * (a + b);
  const left = panel(f, a, m);
  const right = panel(f, m, b);
  budget.panels += 2;
  const both = left + right;
  const settled = Math.abs(both - whole) <= Math.max(absTol, relTol * Math.abs(both));
  if (settled || depth >= MAX_DEPTH || budget.panels > MAX_PANELS || !Number.isFinite(both)) return both;
  return adapt(f, a, m, left, relTol, absTol / 2, depth + 1, budget) + adapt(f, m, b, right, relTol, absTol / 2, depth + 1, budget);
}

/**
 * The integral of f over [a, b] split at `breaks` (points where f bends sharply: start panels there),
 * to `relTol` relative per panel or `absTol` absolute overall.
 */
export function integrate(f: (x: number) => number, a: number, b: number, breaks: readonly number[] = [], relTol = 1e-12, absTol = 0): number {
  if (!(b > a)) return 0;
  const cuts = [a, ...breaks.filter((x) => x > a && x < b).sort((x, y) => x - y), b];
  const coarse = cuts.slice(1).map((b2, i) => (b2 > cuts[i] ? panel(f, cuts[i], b2) : 0));
  const total = coarse.reduce((x, y) => x + Math.abs(y), 0);
  const share = Math.max(absTol, COARSE_SHARE * relTol * total, TINY) / coarse.length;
  const budget: Budget = { panels: 0 };
  let sum = 0;
  for (let i = 0; i < coarse.length; i++) {
    if (cuts[i + 1] > cuts[i]) sum += adapt(f, cuts[i], cuts[i + 1], coarse[i], relTol, share, 0, budget);
  }
  return sum;
}
