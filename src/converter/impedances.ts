/**
 * Exact impedances of the two-terminal elements a GIC is built from and simulates, as RationalFunctions
 * of s (Laplace variable, rad/s), and their series and parallel combinations:
 *   resistor  Z = R            capacitor  Z = 1/(sC)          inductor  Z = sL
 *   FDNR ("D element", Bruton 1969)  Z = 1/(s^2 D), D in F*s    (negative resistance -1/(w^2 D) at s = jw)
 *   FDNC (its dual)                  Z = s^2 E,     E in ohm*s^2 (negative resistance -w^2 E at s = jw)
 * L. T. Bruton, "Network transfer functions using the concept of frequency-dependent negative
 * resistance", IEEE Trans. Circuit Theory 16(3), 1969, defines the D element.
 */
import { InvalidInputError } from '../errors';
import { Poly } from '../algebra/poly';
import { RationalFunction } from '../algebra/rational-function';
import { Q0, type RationalLike } from '../algebra/rational';
import { toPositiveValue } from './component-value';

/** Z = R. */
export function resistorImpedance(ohms: RationalLike, path = 'ohms'): RationalFunction {
  return RationalFunction.constant(toPositiveValue(ohms, path, 'ohm'));
}

/** Z = 1/(sC). */
export function capacitorImpedance(farads: RationalLike, path = 'farads'): RationalFunction {
  const c = toPositiveValue(farads, path, 'F');
  return RationalFunction.fromPolys(Poly.ONE, Poly.fromCoefficients([Q0, c]));
}

/** Z = sL. */
export function inductorImpedance(henries: RationalLike, path = 'henries'): RationalFunction {
  const l = toPositiveValue(henries, path, 'H');
  return RationalFunction.fromPolys(Poly.fromCoefficients([Q0, l]), Poly.ONE);
}

/** Z = 1/(s^2 D): the frequency-dependent negative resistor (D element), D in farad-seconds. */
export function fdnrImpedance(d: RationalLike, path = 'd'): RationalFunction {
  const v = toPositiveValue(d, path);
  return RationalFunction.fromPolys(Poly.ONE, Poly.fromCoefficients([Q0, Q0, v]));
}

/** Z = s^2 E: the frequency-dependent negative conductance (FDNC), E in ohm-seconds squared. */
export function fdncImpedance(e: RationalLike, path = 'e'): RationalFunction {
  const v = toPositiveValue(e, path);
  return RationalFunction.fromPolys(Poly.fromCoefficients([Q0, Q0, v]), Poly.ONE);
}

/** The element kinds a part list may name: R, C, L, D (FDNR), E (FDNC). */
export type ElementKind = 'R' | 'C' | 'L' | 'D' | 'E';
export const ELEMENT_KINDS: readonly ElementKind[] = Object.freeze(['R', 'C', 'L', 'D', 'E']);

/** The impedance of one element given by kind and value. */
export function elementImpedance(kind: ElementKind, value: RationalLike, path = 'element'): RationalFunction {
  const valuePath = `${path}.value`;
  switch (kind) {
    case 'R':
      return resistorImpedance(value, valuePath);
    case 'C':
      return capacitorImpedance(value, valuePath);
    case 'L':
      return inductorImpedance(value, valuePath);
    case 'D':
      return fdnrImpedance(value, valuePath);
    case 'E':
      return fdncImpedance(value, valuePath);
    default:
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.kind`, kind, `must be one of ${ELEMENT_KINDS.join(', ')}`);
  }
}

/** Z1 + Z2 + ...: elements in series. Needs at least one impedance. */
export function seriesImpedance(...zs: RationalFunction[]): RationalFunction {
  requireImpedances(zs, 'seriesImpedance');
  return zs.reduce((acc, z) => acc.add(z));
}

/**
 * 1 / (1/Z1 + 1/Z2 + ...): elements in parallel. A zero impedance (a short) shorts the whole
 * combination. Throws ArithmeticError 'DIVISION_BY_ZERO' if the admittances cancel identically.
 */
export function parallelImpedance(...zs: RationalFunction[]): RationalFunction {
  requireImpedances(zs, 'parallelImpedance');
  if (zs.some((z) => z.isZero())) return RationalFunction.ZERO;
  return zs.map((z) => z.inverse()).reduce((acc, y) => acc.add(y)).inverse();
}

function requireImpedances(zs: unknown[], name: string): void {
  if (zs.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', name, zs, 'needs at least one impedance');
  zs.forEach((z, i) => {
    if (!(z instanceof RationalFunction)) throw new InvalidInputError('INVALID_ARGUMENT', `${name}[${i}]`, z, 'must be a RationalFunction');
  });
}
