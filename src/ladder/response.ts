/**
 * The exact voltage transfer V(load)/V(source) of a ladder, by chain (ABCD) matrices over Q[s]: each
 * branch is (1/d) [[d, n], [0, d]] (series impedance n/d) or (1/d) [[d, 0], [n, d]] (shunt admittance
 * n/d), the product is kept as a polynomial matrix over one denominator, and the terminations close it:
 * T = RL / (A RL + B + Rs (C RL + D)), T = 1/(A + Rs C) for an open load. One reduction at the end.
 * Element values are taken exactly (every double is a rational). The next stages use this as an oracle.
 */
import { Poly } from '../algebra/poly';
import { RationalFunction } from '../algebra/rational-function';
import { Fraction, Q0, Q1, toFraction } from '../algebra/rational';
import { InvalidInputError } from '../errors';
import type { ExactLadder, Ladder } from './types';

interface ChainMatrix {
  a: Poly;
  b: Poly;
  c: Poly;
  d: Poly;
  den: Poly;
}

/** The impedance (series) or admittance (shunt) of a branch as num/den in s. */
function branchImmittance(
  b: { placement: string; inductanceH?: number | Fraction; capacitanceF?: number | Fraction; arrangement?: string },
  i: number,
): { num: Poly; den: Poly } {
  const path = `ladder.branches[${i}]`;
  const L = b.inductanceH === undefined ? undefined : toFraction(b.inductanceH, `${path}.inductanceH`);
  const C = b.capacitanceF === undefined ? undefined : toFraction(b.capacitanceF, `${path}.capacitanceF`);
  if ((L && L.compare(Q0) <= 0) || (C && C.compare(Q0) <= 0)) throw new InvalidInputError('OUT_OF_RANGE', path, b, 'element values must be positive');
  const series = b.placement === 'series';
  if (!series && b.placement !== 'shunt') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.placement`, b.placement, "must be 'series' or 'shunt'");
  if (L && C) {
    const lc = L.mul(C);
    if (b.arrangement === 'parallel') {
      // Z = sL / (1 + s^2 LC); as an admittance (1 + s^2 LC) / (sL).
      const zn = Poly.fromCoefficients([Q0, L]);
      const zd = Poly.fromCoefficients([Q1, Q0, lc]);
      return series ? { num: zn, den: zd } : { num: zd, den: zn };
    }
    if (b.arrangement === 'series') {
      // Z = (1 + s^2 LC) / (sC); as an admittance sC / (1 + s^2 LC).
      const zn = Poly.fromCoefficients([Q1, Q0, lc]);
      const zd = Poly.fromCoefficients([Q0, C]);
      return series ? { num: zn, den: zd } : { num: zd, den: zn };
    }
    throw new InvalidInputError('INVALID_ARGUMENT', `${path}.arrangement`, b.arrangement, "must be 'parallel' or 'series' when both parts are given");
  }
  if (L) return series ? { num: Poly.fromCoefficients([Q0, L]), den: Poly.ONE } : { num: Poly.ONE, den: Poly.fromCoefficients([Q0, L]) };
  if (C) return series ? { num: Poly.ONE, den: Poly.fromCoefficients([Q0, C]) } : { num: Poly.fromCoefficients([Q0, C]), den: Poly.ONE };
  throw new InvalidInputError('INVALID_ARGUMENT', path, b, 'needs inductanceH, capacitanceF or both');
}

/**
 * V(load)/V(source) of the ladder as an exact reduced rational function of s.
 *
 * @example
 * ladderTransferFunction({ sourceOhms: 1, loadOhms: 1, branches: [{ placement: 'shunt', capacitanceF: 2 }] })
 * // (1/2) / (s + 1): a 2 F shunt capacitor between 1 ohm terminations
 */
export function ladderTransferFunction(ladder: Ladder | ExactLadder): RationalFunction {
  if (typeof ladder !== 'object' || ladder === null || !Array.isArray(ladder.branches)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'ladder', ladder, 'must be { sourceOhms, loadOhms, branches }');
  }
  const Rs = toFraction(ladder.sourceOhms as number | Fraction, 'ladder.sourceOhms');
  if (Rs.compare(Q0) < 0) throw new InvalidInputError('OUT_OF_RANGE', 'ladder.sourceOhms', ladder.sourceOhms, 'must be zero or positive');
  let m: ChainMatrix = { a: Poly.ONE, b: Poly.ZERO, c: Poly.ZERO, d: Poly.ONE, den: Poly.ONE };
  ladder.branches.forEach((branch, i) => {
    const { num, den } = branchImmittance(branch as never, i);
    if (branch.placement === 'series') {
      // [a b; c d] * [den num; 0 den]
      m = { a: m.a.mul(den), b: m.a.mul(num).add(m.b.mul(den)), c: m.c.mul(den), d: m.c.mul(num).add(m.d.mul(den)), den: m.den.mul(den) };
    } else {
      // [a b; c d] * [den 0; num den]
      m = { a: m.a.mul(den).add(m.b.mul(num)), b: m.b.mul(den), c: m.c.mul(den).add(m.d.mul(num)), d: m.d.mul(den), den: m.den.mul(den) };
    }
  });
  if (ladder.loadOhms === 'open') {
    return RationalFunction.fromPolys(m.den, m.a.add(m.c.scale(Rs)));
  }
  const RL = toFraction(ladder.loadOhms as number | Fraction, 'ladder.loadOhms');
  if (RL.compare(Q0) <= 0) throw new InvalidInputError('OUT_OF_RANGE', 'ladder.loadOhms', ladder.loadOhms, "must be positive or 'open'");
  const bottom = m.a.scale(RL).add(m.b).add(m.c.scale(RL.mul(Rs))).add(m.d.scale(Rs));
  return RationalFunction.fromPolys(m.den.scale(RL), bottom);
}
