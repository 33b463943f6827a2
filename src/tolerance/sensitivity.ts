/**
 * Relative sensitivities of the response to every part value and op-amp gain-bandwidth, at each
 * frequency, by the adjoint method (adjoint.ts): with S_p = d ln H / d ln p = (p / H) dH/dp,
 *
 *   gain:  d(gain dB) / d(p/p0) = (20 / ln 10) Re S_p,   reported per 1 % change: times 0.01
 *   phase: d(phase rad) / d(p/p0) = Im S_p,              reported in degrees per 1 %: times 0.01 * 180/pi
 *
 * (the classical network sensitivity, e.g. J. Vlach, K. Singhal, "Computer Methods for Circuit Analysis
 * and Design", ch. 9; from memory). Since d ln H = d ln|H| + j d arg H, the real part is the magnitude
 * sensitivity and the imaginary part the phase sensitivity.
 *
 * The matrix derivative is exact: a term w = coef * prod p_i^e_i of A(s) has d w / d ln p_k = e_k w,
 * so dA/d ln p_k is assembled from the same MNA terms the engines use (analysis/mna-system.ts).
 * For a ratio H = (c.x)/(r.x) (node input with the circuit's own sources),
 * S = d ln(c.x) - d ln(r.x), each by its own adjoint solve.
 *
 * Float boundary: component values become doubles here (fractionToNumber, correctly rounded).
 */
import { fractionToNumber, jwPower } from '../algebra/index';
import { InvalidInputError, requireFinite } from '../errors';
import { resolveTransfer, type Combination, type MnaProblem, type TransferSpec } from '../analysis/index';
import { assertTopology, type Circuit } from '../netlist/index';
import { createDenseComplexMatrix, factorDenseComplex, solveDenseComplex, solveTransposeDenseComplex } from './adjoint';

/** 20 / ln 10: d(20 log10 |H|) = (20 / ln 10) d ln|H|. */
export const DB_PER_NEPER = 20 / Math.LN10;
/** Degrees per radian. */
export const DEG_PER_RAD = 180 / Math.PI;
/** One per cent as a relative change. */
const PERCENT = 0.01;

/** Sensitivities of one parameter, per frequency. */
export interface ParameterSensitivity {
  /** The element name, or `${opamp}.gainBandwidth`. */
  readonly name: string;
  /** The compiled parameter it acts on. */
  readonly parameter: string;
  /** Gain change in dB per +1 % of the value (first order). */
  readonly gainDbPerPercent: Float64Array;
  /** Phase change in degrees per +1 % of the value (first order). */
  readonly phaseDegPerPercent: Float64Array;
  /** S = d ln H / d ln p, real and imaginary parts. */
  readonly relativeRe: Float64Array;
  readonly relativeIm: Float64Array;
}

export interface SensitivityResult {
  readonly frequencyHz: Float64Array;
  /** Nominal gain and phase (phase in (-180, 180], not unwrapped). */
  readonly gainDb: Float64Array;
  readonly phaseDeg: Float64Array;
  readonly parameters: readonly ParameterSensitivity[];
}

export interface SensitivityOptions {
  /**
   * What to differentiate by: element names (R, C, L, D) and op-amp names (their gain-bandwidth).
   * Default: every passive element and every op-amp that has a gain-bandwidth product.
   */
  readonly parameters?: readonly string[];
}

/** A parameter to differentiate by: its display name and compiled name. */
export interface SensitivityTarget {
  readonly name: string;
  readonly parameter: string;
}

/**
 * Relative sensitivities of V(output)/V(input) (see {@link TransferSpec}) at each frequency.
 *
 * @example
 * const c = new Circuit().addVoltageSource('V', 'in', '0').addResistor('R1', 'in', 'out', 1000).addCapacitor('C1', 'out', '0', '1e-6');
 * computeSensitivities(c, { input: 'V', output: 'out' }, [1000 / (2 * Math.PI)]).parameters[0].gainDbPerPercent[0]; // about -0.0434 (at the pole: -1/2 * 8.686 * 0.01)
 */
export function computeSensitivities(
  circuit: Circuit,
  transfer: TransferSpec,
  frequenciesHz: ArrayLike<number>,
  options: SensitivityOptions = {},
): SensitivityResult {
  assertTopology(circuit);
  const problem = resolveTransfer(circuit, transfer);
  const targets = resolveSensitivityTargets(circuit, options.parameters);
  return sensitivitiesOfProblem(problem, targets, validateFrequencies(frequenciesHz));
}

/** Element and op-amp names to parameters; throws InvalidInputError for anything else. */
export function resolveSensitivityTargets(circuit: Circuit, names?: readonly string[]): SensitivityTarget[] {
  const all = names ?? circuit.elements.filter((e) => 'R C L D'.includes(e.kind) || (e.kind === 'OPAMP' && 'gainBandwidthHz' in e.model)).map((e) => e.name);
  if (!Array.isArray(all)) throw new InvalidInputError('INVALID_ARGUMENT', 'options.parameters', names, 'must be an array of element names');
  return all.map((name, i) => {
    const el = circuit.element(name);
    const path = `options.parameters[${i}]`;
    if (!el) throw new InvalidInputError('INVALID_ARGUMENT', path, name, 'is not an element of the circuit');
    if (el.kind === 'R' || el.kind === 'C' || el.kind === 'L' || el.kind === 'D') return { name, parameter: name };
    if (el.kind === 'OPAMP' && 'gainBandwidthHz' in el.model) return { name: `${name}.gainBandwidth`, parameter: `${name}.unityGainRadPerS` };
    throw new InvalidInputError('INVALID_ARGUMENT', path, name, 'must be a passive part or an op-amp with a gain-bandwidth product');
  });
}

export function validateFrequencies(frequenciesHz: ArrayLike<number>, path = 'frequenciesHz'): Float64Array {
  if (frequenciesHz === null || typeof frequenciesHz !== 'object' || typeof frequenciesHz.length !== 'number' || frequenciesHz.length === 0) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, frequenciesHz, 'must be a non-empty array of frequencies in Hz');
  }
  const f = new Float64Array(frequenciesHz.length);
  for (let i = 0; i < f.length; i++) {
    f[i] = requireFinite(frequenciesHz[i], `${path}[${i}]`);
    if (!(f[i] >= 0)) throw new InvalidInputError('OUT_OF_RANGE', `${path}[${i}]`, f[i], 'must not be negative');
  }
  return f;
}


function combination(c: Combination, n: number): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(n);
  for (const { index, weight } of c) re[index] += weight;
  return { re, im: new Float64Array(n) };
}

function dot(c: Combination, xr: Float64Array, xi: Float64Array): [number, number] {
  let r = 0;
  let i = 0;
  for (const { index, weight } of c) {
    r += weight * xr[index];
    i += weight * xi[index];
  }
  return [r, i];
}

/** The sensitivities for a resolved problem (the core of {@link computeSensitivities}). */
export function sensitivitiesOfProblem(problem: MnaProblem, targets: readonly SensitivityTarget[], frequencyHz: Float64Array): SensitivityResult {
  const sys = problem.system;
  const n = sys.size;
  const values = sys.parameterValues.map((v) => fractionToNumber(v));
  const weights = sys.terms.map((t) => t.factors.reduce((w, f) => w * values[f.slot] ** f.exponent, t.coefficient));
  const slots = targets.map((t) => {
    const s = sys.parameterIndex.get(t.parameter);
    if (s === undefined) throw new InvalidInputError('INVALID_ARGUMENT', 'parameters', t.parameter, 'is not a parameter of the circuit');
    return s;
  });
  // terms of each target with their exponent
  const termsOf = slots.map((slot) => {
    const list: { term: number; exponent: number }[] = [];
    sys.terms.forEach((t, i) => {
      const e = t.factors.filter((f) => f.slot === slot).reduce((a, f) => a + f.exponent, 0);
      if (e !== 0) list.push({ term: i, exponent: e });
    });
    return list;
  });
  const m = frequencyHz.length;
  const gainDb = new Float64Array(m);
  const phaseDeg = new Float64Array(m);
  const out = targets.map((t) => ({
    name: t.name,
    parameter: t.parameter,
    gainDbPerPercent: new Float64Array(m),
    phaseDegPerPercent: new Float64Array(m),
    relativeRe: new Float64Array(m),
    relativeIm: new Float64Array(m),
  }));
  const br = new Float64Array(n);
  const bi = new Float64Array(n);
  for (const r of problem.rhs) br[r.row] += fractionToNumber(r.value);
  const cOut = combination(problem.output, n);
  const cRef = problem.reference ? combination(problem.reference, n) : null;
  const a = createDenseComplexMatrix(n);
  for (let p = 0; p < m; p++) {
    const w = 2 * Math.PI * frequencyHz[p];
    a.re.fill(0);
    a.im.fill(0);
    const tr = new Float64Array(sys.terms.length);
    const ti = new Float64Array(sys.terms.length);
    sys.terms.forEach((t, i) => {
      const [cr, ci] = jwPower(w, t.sPower);
      tr[i] = weights[i] * cr;
      ti[i] = weights[i] * ci;
      a.re[t.row * n + t.col] += tr[i];
      a.im[t.row * n + t.col] += ti[i];
    });
    const lu = factorDenseComplex(a);
    const x = solveDenseComplex(lu, br, bi);
    const yOut = solveTransposeDenseComplex(lu, cOut.re, cOut.im);
    const yRef = cRef ? solveTransposeDenseComplex(lu, cRef.re, cRef.im) : null;
    const [hr0, hi0] = dot(problem.output, x.re, x.im);
    let hr = hr0;
    let hi = hi0;
    let rr = 1;
    let ri = 0;
    if (problem.reference) {
      [rr, ri] = dot(problem.reference, x.re, x.im);
      const d = rr * rr + ri * ri;
      hr = (hr0 * rr + hi0 * ri) / d;
      hi = (hi0 * rr - hr0 * ri) / d;
    }
    gainDb[p] = 20 * Math.log10(Math.hypot(hr, hi));
    phaseDeg[p] = Math.atan2(hi, hr) * DEG_PER_RAD;
    targets.forEach((_, k) => {
      // d(c.x)/d ln p = -y^T (dA/d ln p) x
      let gr = 0;
      let gi = 0;
      let qr = 0;
      let qi = 0;
      for (const { term, exponent } of termsOf[k]) {
        const t = sys.terms[term];
        const ar = exponent * tr[term];
        const ai = exponent * ti[term];
        const vr = ar * x.re[t.col] - ai * x.im[t.col]; // (dA x)_row contribution
        const vi = ar * x.im[t.col] + ai * x.re[t.col];
        gr -= yOut.re[t.row] * vr - yOut.im[t.row] * vi;
        gi -= yOut.re[t.row] * vi + yOut.im[t.row] * vr;
        if (yRef) {
          qr -= yRef.re[t.row] * vr - yRef.im[t.row] * vi;
          qi -= yRef.re[t.row] * vi + yRef.im[t.row] * vr;
        }
      }
      // S = (d c.x)/(c.x) - (d r.x)/(r.x)
      let d = hr0 * hr0 + hi0 * hi0;
      let sr = (gr * hr0 + gi * hi0) / d;
      let si = (gi * hr0 - gr * hi0) / d;
      if (yRef) {
        d = rr * rr + ri * ri;
        sr -= (qr * rr + qi * ri) / d;
        si -= (qi * rr - qr * ri) / d;
      }
      const o = out[k];
      o.relativeRe[p] = sr;
      o.relativeIm[p] = si;
      o.gainDbPerPercent[p] = DB_PER_NEPER * sr * PERCENT;
      o.phaseDegPerPercent[p] = DEG_PER_RAD * si * PERCENT;
    });
  }
  return { frequencyHz, gainDb, phaseDeg, parameters: out };
}
