/**
 * The two-op-amp GIC with real op-amps, exactly: the circuit is built as a netlist and solved by the
 * exact analysis, so every op-amp model (finite gain, integrator, single and two poles) and every
 * assignment of the op-amp inputs gives its exact Zin(s) as a RationalFunction.
 *
 * The circuit (A. Antoniou, "Realisation of gyrators using operational amplifiers, and their use in
 * RC-active-network synthesis", Proc. IEE 116(11), 1969; node numbering from memory): node 1 the port,
 * Z1 1-2, Z2 2-3, Z3 3-4, Z4 4-5, Z5 5-ground; op-amp a drives node 2, op-amp b drives node 4. Default
 * inputs (DESIGN.md): a: + on 5, - on 3; b: + on 1, - on 3. With ideal op-amps V1 = V3 = V5, and
 * KCL at nodes 5, 3 and 1 gives
 *   Zin = Z1 Z3 Z5 / (Z2 Z4).                                                          Eq. (1)
 * That identity holds for every assignment whose two nullators join two different pairs of the nodes
 * {1, 3, 5} (then V1 = V3 = V5 again): 3 pairs for a, 2 left for b, 2 x 2 orientations, 24 assignments
 * ({@link gicIdealAssignments} finds them by exact analysis, not by this argument).
 *
 * First-order op-amp error. With 1/A_a, 1/A_b -> 0 the exact Zin expands as
 *   Zin = Zideal * (1 + E_a(s)/A_a(s) + E_b(s)/A_b(s) + O(1/A^2)),                       Eq. (2)
 * E_a, E_b rational in the Z's. For the default inputs, solving the nodal equations by hand
 * (V2 = A_a (V5 - V3), V4 = A_b (V1 - V3), KCL at 3 and 5) and keeping first-order terms gives
 *   E_a = -(Z4 + Z5)(Z3 Z5 - Z2 Z4) Z2 / (Z2 Z3 Z4 Z5),
 *   E_b = -(Z4 + Z5)(Z3 Z5 - Z2 Z4) Z3 / (Z2 Z3 Z4 Z5).                                Eq. (3)
 * {@link gicFirstOrderError} computes E_a and E_b exactly for any assignment from the netlist (see
 * there), and the tests check Eq. (3) against it.
 *
 * The resistor choice for the simulated inductor (Z1 = R1, Z2 = R2, Z3 = R3, Z4 = 1/(sC4), Z5 = R5,
 * L = C4 R1 R3 R5 / R2) with integrator op-amps 1/A = s/wt. Eq. (3) at s = j w, x = w C4 R5:
 *   eps = E_a/A_a + E_b/A_b
 *       = [(R2 + w^2 C4^2 R3 R5^2) - j w C4 R5 (R3 - R2)] (R2/w_a + R3/w_b) / (C4 R2 R3 R5).    Eq. (4)
 * Zin = j w L (1 + eps): Im(eps) becomes a series resistance (the loss that limits Q) and Re(eps) an
 * inductance error. So (i) R2 = R3 cancels the first-order loss, for any mismatch of w_a and w_b; and
 * (ii) then eps = (1 + x^2)(1/w_a + 1/w_b)/(C4 R5), i.e. (w/w_a + w/w_b)(x + 1/x), which is smallest at
 * x = w C4 R5 = 1, the capacitor's reactance equal to R5: eps = 2 w (1/w_a + 1/w_b), 4 w/wt when
 * matched. The published optimum for this circuit is the equal-resistor design with the capacitor's
 * reactance equal to the resistors at the working frequency (Antoniou 1969, as above; from memory):
 * the same two conditions. The tests check (i) and (ii) on the exact Zin.
 *
 * Stability ({@link gicStability}): the characteristic polynomial is the determinant of the MNA
 * matrix of the GIC with the port open, shorted, or loaded by a resistor, so modes cancelled in Zin
 * are still seen; the exact Routh-Hurwitz count says where its roots are.
 */
import { Fraction, Poly, RationalFunction, Q1, cAbs, fractionToNumber, routhHurwitz, toFraction, type Complex, type RouthHurwitzResult } from '../algebra/index';
import { InvalidInputError, UnrealizableError, requirePositive } from '../errors';
import { Circuit, IDEAL_OPAMP, validateOpampModel, type OpampModel } from '../netlist/index';
import { buildMnaSystem, drivingPointImpedance, type MnaSystem } from '../analysis/index';

/** A node an op-amp input may sit on. */
export type GicInputNode = 1 | 3 | 5;
export interface GicOpampInputs {
  readonly plus: GicInputNode;
  readonly minus: GicInputNode;
}
/** Where the inputs of op-amp a (driving node 2) and op-amp b (driving node 4) connect. */
export interface GicInputs {
  readonly a: GicOpampInputs;
  readonly b: GicOpampInputs;
}
export interface GicImpedances {
  readonly z1: RationalFunction;
  readonly z2: RationalFunction;
  readonly z3: RationalFunction;
  readonly z4: RationalFunction;
  readonly z5: RationalFunction;
}
export interface GicNonidealOptions {
  /** One model for both op-amps, or [a, b]. */
  readonly opamps: OpampModel | readonly [OpampModel, OpampModel];
  readonly inputs?: GicInputs;
}

/** DESIGN.md's default: a: + on 5, - on 3; b: + on 1, - on 3. */
export const DEFAULT_GIC_INPUTS: GicInputs = Object.freeze({ a: Object.freeze({ plus: 5, minus: 3 }), b: Object.freeze({ plus: 1, minus: 3 }) });

const INPUT_NODES: readonly GicInputNode[] = [1, 3, 5];
const Z_KEYS = ['z1', 'z2', 'z3', 'z4', 'z5'] as const;
/** Z_k connects node ENDS[k][0] to ENDS[k][1] (0 is ground). */
const ENDS: readonly (readonly [number, number])[] = [
  [1, 2],
  [2, 3],
  [3, 4],
  [4, 5],
  [5, 0],
];

function validateInputs(inputs: unknown, path: string): GicInputs {
  if (typeof inputs !== 'object' || inputs === null) throw new InvalidInputError('INVALID_ARGUMENT', path, inputs, 'must be { a: { plus, minus }, b: { plus, minus } }');
  const r = inputs as Record<string, unknown>;
  for (const amp of ['a', 'b'] as const) {
    const x = r[amp] as Record<string, unknown> | undefined;
    if (typeof x !== 'object' || x === null) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${amp}`, x, 'must be { plus, minus }');
    for (const t of ['plus', 'minus'] as const) {
      if (!INPUT_NODES.includes(x[t] as GicInputNode)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.${amp}.${t}`, x[t], 'must be 1, 3 or 5');
    }
    if (x.plus === x.minus) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${amp}`, x, 'the two inputs must be on different nodes');
  }
  return inputs as GicInputs;
}

function validateImpedances(z: unknown): GicImpedances {
  if (typeof z !== 'object' || z === null) throw new InvalidInputError('INVALID_ARGUMENT', 'z', z, 'must be { z1, z2, z3, z4, z5 }');
  for (const k of Z_KEYS) {
    const v = (z as Record<string, unknown>)[k];
    if (!(v instanceof RationalFunction)) throw new InvalidInputError('INVALID_ARGUMENT', `z.${k}`, v, 'must be a RationalFunction');
    if (v.isZero()) throw new InvalidInputError('OUT_OF_RANGE', `z.${k}`, '0', 'must not be zero');
  }
  return z as GicImpedances;
}

function opampPair(opamps: unknown): [OpampModel, OpampModel] {
  if (Array.isArray(opamps)) {
    if (opamps.length !== 2) throw new InvalidInputError('INVALID_ARGUMENT', 'options.opamps', opamps, 'must be one model or [a, b]');
    return [validateOpampModel(opamps[0], 'options.opamps[0]'), validateOpampModel(opamps[1], 'options.opamps[1]')];
  }
  const m = validateOpampModel(opamps, 'options.opamps');
  return [m, m];
}

/**
 * Adds impedance z between a and b as netlist elements. Z = k s^n with n in {1, 0, -1, -2} is an
 * inductor, resistor, capacitor or FDNR; a sum of such terms with positive coefficients is their
 * series chain, and an admittance of such terms (1/Z = G + sC + 1/(sL) + s^2 D) is their parallel
 * combination. Anything else has no element to stand for it: UnrealizableError.
 */
function addImpedance(c: Circuit, name: string, a: string, b: string, z: RationalFunction, path: string): void {
  const series = laurentTerms(z);
  if (series && series.every((t) => t.c.s > 0n)) {
    let from = a;
    series.forEach((t, i) => {
      const to = i === series.length - 1 ? b : `${name}_s${i + 1}`;
      addMonomial(c, `${name}${series.length > 1 ? `_${i + 1}` : ''}`, from, to, t.power, t.c, 'impedance');
      from = to;
    });
    return;
  }
  const parallel = laurentTerms(z.inverse());
  if (parallel && parallel.every((t) => t.c.s > 0n)) {
    parallel.forEach((t, i) => addMonomial(c, `${name}${parallel.length > 1 ? `_${i + 1}` : ''}`, a, b, t.power, t.c, 'admittance'));
    return;
  }
  throw new UnrealizableError(
    'UNREALIZABLE',
    path,
    z.toString(),
    'non-ideal GIC analysis builds each Z from R, L, C and FDNR elements: give a sum of R, sL, 1/(sC), 1/(s^2 D) terms or their parallel combination',
  );
}

/** The terms c s^p (p from -2 to 1) of f when f is such a Laurent polynomial, else null. */
function laurentTerms(f: RationalFunction): { power: number; c: Fraction }[] | null {
  const den = f.den;
  // den must be s^k (monic): all coefficients zero but the leading one.
  if (den.coefficients.slice(0, -1).some((x) => x.n !== 0n)) return null;
  const k = den.degree;
  const out: { power: number; c: Fraction }[] = [];
  f.num.coefficients.forEach((x, i) => {
    if (x.n !== 0n) out.push({ power: i - k, c: x });
  });
  if (out.some((t) => t.power < -2 || t.power > 1)) return null;
  return out.sort((p, q) => q.power - p.power);
}

function addMonomial(c: Circuit, name: string, a: string, b: string, power: number, k: Fraction, as: 'impedance' | 'admittance'): void {
  if (as === 'impedance') {
    if (power === 1) c.addInductor(`L${name}`, a, b, k); // Z = sL
    else if (power === 0) c.addResistor(`R${name}`, a, b, k); // Z = R
    else if (power === -1) c.addCapacitor(`C${name}`, a, b, Q1.div(k)); // Z = 1/(sC)
    else c.addFdnr(`D${name}`, a, b, Q1.div(k)); // Z = 1/(s^2 D)
  } else {
    if (power === 2) c.addFdnr(`D${name}`, a, b, k); // Y = s^2 D
    else if (power === 1) c.addCapacitor(`C${name}`, a, b, k); // Y = sC
    else if (power === 0) c.addResistor(`R${name}`, a, b, Q1.div(k)); // Y = 1/R
    else if (power === -1) c.addInductor(`L${name}`, a, b, Q1.div(k)); // Y = 1/(sL)
    else throw new UnrealizableError('UNREALIZABLE', name, power, 'an admittance term 1/s^2 has no element');
  }
}

/**
 * The GIC as a netlist: nodes '1' (the port) to '5', impedances named Z1..Z5 (with the element letter
 * in front: 'RZ1', 'CZ4', ...), op-amps 'UA' (output 2) and 'UB' (output 4).
 */
export function gicCircuit(z: GicImpedances, options: GicNonidealOptions): Circuit {
  validateImpedances(z);
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be { opamps, inputs? }');
  const [ma, mb] = opampPair(options.opamps);
  const inputs = validateInputs(options.inputs ?? DEFAULT_GIC_INPUTS, 'options.inputs');
  const c = new Circuit();
  Z_KEYS.forEach((k, i) => addImpedance(c, `Z${i + 1}`, String(ENDS[i][0]), String(ENDS[i][1]), z[k], `z.${k}`));
  c.addOpamp('UA', { plus: String(inputs.a.plus), minus: String(inputs.a.minus), out: '2' }, ma);
  c.addOpamp('UB', { plus: String(inputs.b.plus), minus: String(inputs.b.minus), out: '4' }, mb);
  return c;
}

/**
 * Exact Zin(s) of the GIC with the given op-amp models and input assignment. Throws InvalidInputError
 * for bad arguments, UnrealizableError for an impedance with no element form (see gicCircuit) and
 * SingularCircuitError when the assignment leaves the equations singular.
 *
 * @example
 * const r = RationalFunction.constant(1000);
 * const c4 = RationalFunction.fromCoefficients([1], [0, '1e-8']); // 1/(s * 10 nF)
 * gicImpedanceNonideal({ z1: r, z2: r, z3: r, z4: c4, z5: r }, { opamps: { model: 'ideal' } }).toString(); // '1/100*s'
 */
export function gicImpedanceNonideal(z: GicImpedances, options: GicNonidealOptions): RationalFunction {
  return drivingPointImpedance(gicCircuit(z, options), '1');
}

/** Eq. (1): Z1 Z3 Z5 / (Z2 Z4). */
export function gicIdealImpedance(z: GicImpedances): RationalFunction {
  validateImpedances(z);
  return z.z1.mul(z.z3).mul(z.z5).div(z.z2.mul(z.z4));
}

/** All 36 ways to put each op-amp's + and - on two of the nodes 1, 3, 5. */
export function allGicInputAssignments(): GicInputs[] {
  const pairs: GicOpampInputs[] = [];
  for (const plus of INPUT_NODES) for (const minus of INPUT_NODES) if (plus !== minus) pairs.push({ plus, minus });
  const out: GicInputs[] = [];
  for (const a of pairs) for (const b of pairs) out.push({ a, b });
  return out;
}

/**
 * The assignments for which ideal op-amps give Eq. (1), found by exact analysis of each of the 36 with
 * the given impedances (use generic values: special ones can make a wrong assignment agree by chance).
 * Singular assignments (both nullators across the same pair) are left out.
 */
export function gicIdealAssignments(z: GicImpedances): GicInputs[] {
  const ideal = gicIdealImpedance(z);
  return allGicInputAssignments().filter((inputs) => {
    try {
      return gicImpedanceNonideal(z, { opamps: IDEAL_OPAMP, inputs }).equals(ideal);
    } catch (e) {
      if ((e as { code?: string }).code === 'SINGULAR_CIRCUIT') return false;
      throw e;
    }
  });
}

/**
 * E_a and E_b of Eq. (2), exactly, for any assignment. The MNA determinant is affine in each op-amp's
 * 1/A entry, so with op-amp a at finite gain 1/e (b ideal) f(e) = Zin(e)/Zideal = (1 + e n)/(1 + e d)
 * with n, d independent of e, and E_a = f'(0) = n - d. Two exact solves at e1 and e2 give the 2x2
 * linear system e n - f e d = f - 1 for n and d. Likewise for b.
 */
export function gicFirstOrderError(z: GicImpedances, inputs: GicInputs = DEFAULT_GIC_INPUTS): { a: RationalFunction; b: RationalFunction } {
  validateInputs(inputs, 'inputs');
  const ideal = gicIdealImpedance(z);
  const coefficient = (which: 0 | 1): RationalFunction => {
    // Small gains 1/e keep the two probe points generic; any two distinct nonzero values are exact.
    const e1 = RationalFunction.constant('1/1000');
    const e2 = RationalFunction.constant('1/3000');
    const f = (e: RationalFunction): RationalFunction => {
      const model: OpampModel = { model: 'finite-gain', gain: fractionToNumber(Q1.div(e.num.coefficient(0))) };
      const opamps: [OpampModel, OpampModel] = which === 0 ? [model, IDEAL_OPAMP] : [IDEAL_OPAMP, model];
      return gicImpedanceNonideal(z, { opamps, inputs }).div(ideal);
    };
    const f1 = f(e1);
    const f2 = f(e2);
    if (f1.equals(f2)) return RationalFunction.ZERO;
    const one = RationalFunction.ONE;
    const det = e1.mul(e2).mul(f1.sub(f2)); // of [[e1, -f1 e1], [e2, -f2 e2]]
    const n = f1.sub(one).mul(f2.mul(e2).neg()).add(f1.mul(e1).mul(f2.sub(one))).div(det);
    const d = e1.mul(f2.sub(one)).sub(e2.mul(f1.sub(one))).div(det);
    return n.sub(d);
  };
  return { a: coefficient(0), b: coefficient(1) };
}

/** How the port is terminated for a stability test. */
export type GicPortCondition = { readonly port: 'open' } | { readonly port: 'short' } | { readonly port: 'load'; readonly loadOhms: number };

/**
 * The characteristic polynomial of the GIC with the port open, shorted, or loaded by a resistor to
 * ground: det of its MNA matrix (its zeros are the natural frequencies), made primitive with a positive
 * leading coefficient so equal circuits give equal polynomials.
 */
export function gicCharacteristicPolynomial(z: GicImpedances, options: GicNonidealOptions, condition: GicPortCondition): Poly {
  const c = gicCircuit(z, options);
  if (typeof condition !== 'object' || condition === null) throw new InvalidInputError('INVALID_ARGUMENT', 'condition', condition, "must be { port: 'open' | 'short' | 'load' }");
  if (condition.port === 'short') c.addVoltageSource('VSHORT', '1', '0', 0);
  else if (condition.port === 'load') c.addResistor('RLOAD', '1', '0', requirePositive(condition.loadOhms, 'condition.loadOhms'));
  else if (condition.port !== 'open') {
    const port = (condition as { port: unknown }).port;
    throw new InvalidInputError('INVALID_ARGUMENT', 'condition.port', port, "must be 'open', 'short' or 'load'");
  }
  const p = mnaDeterminant(buildMnaSystem(c)).primitive();
  return p.leading.s < 0n ? p.neg() : p;
}

export interface GicPortStability extends RouthHurwitzResult {
  /** Roots at s = 0 (part of imaginaryAxis): the ideal element's own, e.g. a shorted inductor's constant current. */
  readonly originRoots: number;
  /** No right-half-plane roots and no imaginary-axis roots other than at s = 0. */
  readonly stableExceptOrigin: boolean;
}

export interface GicStability {
  readonly open: GicPortStability;
  readonly shorted: GicPortStability;
  readonly loaded: GicPortStability;
  /** stableExceptOrigin in all three conditions: no growing and no oscillating natural mode. */
  readonly stable: boolean;
}

function portStability(p: Poly): GicPortStability {
  const r = routhHurwitz(p);
  let originRoots = 0;
  while (p.coefficient(originRoots).n === 0n) originRoots++;
  return { ...r, originRoots, stableExceptOrigin: r.rightHalfPlane === 0 && r.imaginaryAxis === originRoots };
}

/**
 * Exact Routh-Hurwitz counts of the characteristic polynomial with the port open, shorted and loaded.
 * Roots at s = 0 are reported apart: a simulated inductor has one with the port shorted, an FDNR two
 * with it open, as the ideal elements themselves do; they are not the GIC's instability.
 */
export function gicStability(z: GicImpedances, options: GicNonidealOptions, loadOhms: number): GicStability {
  const open = portStability(gicCharacteristicPolynomial(z, options, { port: 'open' }));
  const shorted = portStability(gicCharacteristicPolynomial(z, options, { port: 'short' }));
  const loaded = portStability(gicCharacteristicPolynomial(z, options, { port: 'load', loadOhms }));
  return { open, shorted, loaded, stable: open.stableExceptOrigin && shorted.stableExceptOrigin && loaded.stableExceptOrigin };
}

/**
 * det of an MNA matrix over Q[s], by fraction-free (Bareiss) elimination with exact polynomial
 * division (E. H. Bareiss, Math. Comp. 22(103), 1968, eq. (2.5)); pivots are the first nonzero entry
 * in the column, with the row swaps' sign. Small circuits only (the GIC): dense, O(n^3) polynomial
 * operations.
 */
export function mnaDeterminant(system: MnaSystem): Poly {
  const n = system.size;
  const a: Poly[][] = Array.from({ length: n }, () => new Array<Poly>(n).fill(Poly.ZERO));
  for (const t of system.terms) {
    let c = toFraction(t.coefficient);
    for (const f of t.factors) c = c.mul(system.parameterValues[f.slot].pow(f.exponent));
    a[t.row][t.col] = a[t.row][t.col].add(Poly.monomial(c, t.sPower));
  }
  let sign = 1;
  let prev: Poly = Poly.ONE;
  for (let k = 0; k < n; k++) {
    let p = k;
    while (p < n && a[p][k].isZero()) p++;
    if (p === n) return Poly.ZERO;
    if (p !== k) {
      [a[p], a[k]] = [a[k], a[p]];
      sign = -sign;
    }
    for (let i = k + 1; i < n; i++) {
      for (let j = k + 1; j < n; j++) {
        const v = a[k][k].mul(a[i][j]).sub(a[i][k].mul(a[k][j]));
        a[i][j] = v.divmod(prev).quotient; // exact: Sylvester's identity
      }
      a[i][k] = Poly.ZERO;
    }
    prev = a[k][k];
  }
  return sign < 0 ? a[n - 1][n - 1].neg() : a[n - 1][n - 1];
}

/** Float figures of a simulated inductor at one frequency. */
export interface InductorFigures {
  /** Im Zin(jw) / w. */
  readonly inductanceH: number;
  /** Re Zin(jw): the series loss resistance (negative: the GIC adds energy). */
  readonly lossOhms: number;
  /** w L / R_loss (Infinity when lossless; negative when the loss is negative). */
  readonly q: number;
}

/**
 * L_eff, R_loss and Q of an impedance at omega (the float boundary of this module: Zin evaluated in
 * Float64 by RationalFunction.evaluateComplex).
 */
export function toFloatInductorFigures(zin: RationalFunction, omegaRadPerS: number): InductorFigures {
  requirePositive(omegaRadPerS, 'omegaRadPerS');
  const v: Complex = zin.evaluateComplex({ re: 0, im: omegaRadPerS });
  const inductanceH = v.im / omegaRadPerS;
  return { inductanceH, lossOhms: v.re, q: (omegaRadPerS * inductanceH) / v.re };
}

/** Float figures of an FDNR at one frequency: ideally Zin(jw) = -1/(w^2 D), real and negative. */
export interface FdnrFigures {
  /** -1 / (w^2 Re Zin(jw)), in F*s. */
  readonly dFaradSeconds: number;
  /** Im Zin(jw): the reactive error in ohms. */
  readonly reactanceOhms: number;
  /** |Re Zin / Im Zin| (Infinity when the reactive error vanishes). */
  readonly q: number;
}

/** D_eff, the reactive error and Q of an FDNR impedance at omega (Float64, as toFloatInductorFigures). */
export function toFloatFdnrFigures(zin: RationalFunction, omegaRadPerS: number): FdnrFigures {
  requirePositive(omegaRadPerS, 'omegaRadPerS');
  const v = zin.evaluateComplex({ re: 0, im: omegaRadPerS });
  return { dFaradSeconds: -1 / (omegaRadPerS * omegaRadPerS * v.re), reactanceOhms: v.im, q: Math.abs(v.re / v.im) };
}

/** |Zin/Zideal - 1| at omega, in Float64: the relative error of the realised impedance. */
export function toFloatRelativeError(zin: RationalFunction, ideal: RationalFunction, omegaRadPerS: number): number {
  const s = { re: 0, im: omegaRadPerS };
  const a = zin.evaluateComplex(s);
  const b = ideal.evaluateComplex(s);
  return cAbs({ re: a.re - b.re, im: a.im - b.im }) / cAbs(b);
}
