/**
 * DC-path resistors for the Bruton-transformed (FDNR) ladder. After the transform the source and load
 * resistors are capacitors, so no DC current reaches the op-amp inputs of the GICs (a real circuit is not
 * biased) and the DC gain is set by the capacitor ratio only. The standard remedy (L. T. Bruton, "RC-Active
 * Circuits: Theory and Design", Prentice-Hall 1980, ch. on FDNR filters; from memory) puts a resistor Rs'
 * across the source capacitor and Rl' across the load capacitor. At DC the FDNRs are open circuits and
 * the Bruton images of the series inductors are resistors, so the DC circuit is a resistive ladder.
 *
 * Choice, exact: Rs' is the free level; Rl' is solved so that the DC gain equals the prototype's exactly.
 * With the DC chain matrix [A B; C D] of Rs' and the series branches (shunt arms with an FDNR carry no DC
 * current), V(out)/V(in) at DC is 1/(A + B/Rl'), so Rl' = B / (1/H(0) - A); for equal terminations and
 * series resistors Sum R this is Rl' = (Rs' + Sum R) Rl / Rs, nearly the ratio of the terminations.
 * With a zero-impedance source the prototype's H(0) = 1 cannot be met by any finite Rl' (the series
 * resistors drop some voltage): Rl' is then the same multiple of the load capacitor's reactance as Rs'
 * would be, and the DC gain error is reported.
 *
 * Level: Rs' = a / (omega_e Cs) with a from the 1-2-5 sequence, the smallest a whose passband error
 * max |20 log10 |H_dc(j w)| - 20 log10 |H(j w)|| over the check grid (w in 0 .. omega_e) is within the
 * bound. The search evaluates the chain matrices in Float64 at the grid points; the reported error is
 * the float evaluation of the exact RationalFunctions with and without the resistors (the stage's float
 * boundary, {@link toFloatPassbandErrorDb}).
 */
import { Fraction, Q0, Q1, fractionToNumber } from '../algebra/rational';
import { cAbs, cAdd, cDiv, cMul, type Complex } from '../algebra/complex';
import type { RationalFunction } from '../algebra/rational-function';
import { element, impedanceOf, type Network, type NetworkLadder } from '../transform/network';
import { roundToSignificant } from './gic-choices';
import { MAX_LEVEL, oneTwoFiveLevels } from './level-sequence';

/** Significant digits of the free DC-path resistor (a value the next stage will round anyway). */
const DC_PATH_DIGITS = 3;
/** Linear check points on 0 .. omega_e. */
const LINEAR_POINTS = 200;
/** Logarithmic check points per decade below omega_e, where the DC resistors act. */
const LOG_POINTS_PER_DECADE = 20;

/** The check grid, rad/s: linear on [0, omega_e] and logarithmic from omega_e / (100 MAX_LEVEL). */
export function passbandGrid(omegaEdge: number): number[] {
  const grid: number[] = [];
  for (let i = 0; i <= LINEAR_POINTS; i++) grid.push((omegaEdge * i) / LINEAR_POINTS);
  const decades = Math.log10(100 * MAX_LEVEL);
  const n = Math.ceil(decades * LOG_POINTS_PER_DECADE);
  for (let i = 0; i < n; i++) grid.push(omegaEdge * 10 ** (-decades + i / LOG_POINTS_PER_DECADE));
  return grid.sort((a, b) => a - b);
}

/**
 * max over the grid of |gain(hWith) - gain(hWithout)| in dB (Float64 evaluation of the exact functions).
 * The magnitude is taken from the ratio hWith/hWithout, which is better conditioned than two gains.
 */
export function toFloatPassbandErrorDb(hWith: RationalFunction, hWithout: RationalFunction, grid: readonly number[]): number {
  let worst = 0;
  for (const w of grid) {
    const s = { re: 0, im: w };
    const ratio = cDiv(hWith.evaluateComplex(s), hWithout.evaluateComplex(s));
    worst = Math.max(worst, Math.abs(20 * Math.log10(cAbs(ratio))));
  }
  return worst;
}

/** The -3.01 dB frequency of a lowpass H, rad/s (Float64 scan and bisection); NaN when not found. */
export function toFloatHalfPowerOmega(h: RationalFunction, omegaGuess: number): number {
  const g0 = h.gainDb(0);
  const below = (w: number) => h.gainDb(w) < g0 - 10 * Math.log10(2);
  let lo = omegaGuess * 1e-3;
  if (below(lo)) return NaN;
  let hi = lo;
  while (!below(hi)) {
    lo = hi;
    hi *= 1.25;
    if (hi > omegaGuess * 1e6) return NaN;
  }
  for (let i = 0; i < 60; i++) {
    const mid = Math.sqrt(lo * hi);
    if (below(mid)) hi = mid;
    else lo = mid;
  }
  return Math.sqrt(lo * hi);
}

export interface DcPathChoice {
  /** Across the source capacitor (null with a zero-impedance source). */
  readonly sourceOhms: Fraction | null;
  /** Across the load capacitor (null with an open load). */
  readonly loadOhms: Fraction | null;
  /** The ladder with the resistors in (source and load networks C || R). */
  readonly ladder: NetworkLadder;
  /** Float estimate from the search; the caller reports the exact-function figure. */
  readonly estimatedErrorDb: number;
  /** DC gain with the resistors / the prototype's, minus 1 (0 when solved exactly). */
  readonly dcGainError: number;
}

type C2 = [Complex, Complex, Complex, Complex];
const cm = (x: C2, y: C2): C2 => [
  cAdd(cMul(x[0], y[0]), cMul(x[1], y[2])),
  cAdd(cMul(x[0], y[1]), cMul(x[1], y[3])),
  cAdd(cMul(x[2], y[0]), cMul(x[3], y[2])),
  cAdd(cMul(x[2], y[1]), cMul(x[3], y[3])),
];
const ONE: Complex = { re: 1, im: 0 };
const ZERO: Complex = { re: 0, im: 0 };

/**
 * Chooses the DC-path resistors of a Bruton ladder `b` (source and load single capacitors, or null /
 * open) realising `h` (its exact H), whose prototype DC gain is h(0), checking 0 .. omegaEdge.
 */
export function chooseDcPath(b: NetworkLadder, h: RationalFunction, omegaEdge: number, boundDb: number): DcPathChoice {
  const cs = b.source && 'value' in b.source ? b.source.value : null;
  const cl = b.load !== 'open' && 'value' in b.load ? b.load.value : null;
  const h0 = h.evaluate(0);
  const grid = passbandGrid(omegaEdge);
  // Float chain matrix of the branches at each grid point (the source and load vary in the search).
  const immittances = b.branches.map((br) => {
    const z = impedanceOf(br.network);
    return { series: br.placement === 'series', f: br.placement === 'series' ? z : z.inverse() };
  });
  const branchChains = grid.map((w) => {
    let t: C2 = [ONE, ZERO, ZERO, ONE];
    const s = { re: 0, im: w };
    for (const m of immittances) t = cm(t, m.series ? [ONE, m.f.evaluateComplex(s), ZERO, ONE] : [ONE, ZERO, m.f.evaluateComplex(s), ONE]);
    return t;
  });
  const href = grid.map((w) => h.evaluateComplex({ re: 0, im: w }));
  const level = (a: number, c: Fraction) => roundToSignificant(a / (omegaEdge * fractionToNumber(c)), DC_PATH_DIGITS);

  let last: DcPathChoice | undefined;
  for (const a of oneTwoFiveLevels()) {
    const rs = cs ? level(a, cs) : null;
    let rl: Fraction | null = null;
    let dcGainError = 0;
    if (cl) {
      const { a: A, b: B } = dcChainWithSource(b, rs);
      const denom = Q1.div(h0).sub(A);
      if (denom.s > 0n && denom.n > 0n) rl = B.div(denom);
      else {
        rl = level(a, cl);
        const gain = Q1.div(A.add(B.div(rl)));
        dcGainError = fractionToNumber(gain.div(h0)) - 1;
      }
    } else if (cs) {
      const gain = Q1.div(dcChainWithSource(b, rs).a);
      dcGainError = fractionToNumber(gain.div(h0)) - 1;
    }
    const zs = cs ? parallelRc(cs, rs) : null;
    const zl = cl ? parallelRc(cl, rl) : null;
    let worst = 0;
    grid.forEach((w, i) => {
      const t = branchChains[i];
      const zsw = zs ? zs(w) : ZERO;
      const A = cAdd(t[0], cMul(zsw, t[2]));
      const B = cAdd(t[1], cMul(zsw, t[3]));
      const hw = cDiv(ONE, zl ? cAdd(A, cDiv(B, zl(w))) : A);
      worst = Math.max(worst, Math.abs(20 * Math.log10(cAbs(cDiv(hw, href[i])))));
    });
    const ladder: NetworkLadder = {
      source: cs && rs ? { kind: 'parallel', parts: [b.source as Network, element('R', rs, originOf(b.source as Network))] } : b.source,
      load: cl && rl ? { kind: 'parallel', parts: [b.load as Network, element('R', rl, originOf(b.load as Network))] } : b.load,
      branches: b.branches,
    };
    last = { sourceOhms: rs, loadOhms: rl, ladder, estimatedErrorDb: worst, dcGainError };
    if (worst <= boundDb) return last;
  }
  return last as DcPathChoice;
}

function originOf(n: Network): string {
  return 'origin' in n ? n.origin : 'dc';
}

/** Z(j w) of C || R (R null: the capacitor alone). */
function parallelRc(c: Fraction, r: Fraction | null): (w: number) => Complex {
  const cf = fractionToNumber(c);
  const rf = r ? fractionToNumber(r) : Infinity;
  return (w) => cDiv(ONE, { re: 1 / rf, im: w * cf });
}

/** The exact DC chain entries A, B from the source (Rs' in series, or nothing) through the branches. */
function dcChainWithSource(b: NetworkLadder, rs: Fraction | null): { a: Fraction; b: Fraction } {
  let A = Q1;
  let B = rs ?? Q0;
  // The first row [A B] of the chain product: [A B][1 Z; 0 1] = [A, A Z + B], [A B][1 0; Y 1] = [A + B Y, B].
  for (const br of b.branches) {
    if (br.placement === 'series') B = A.mul(impedanceOf(br.network).evaluate(0)).add(B);
    else A = A.add(B.mul(impedanceOf(br.network).inverse().evaluate(0)));
  }
  return { a: A, b: B };
}
