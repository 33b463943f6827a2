/**
 * The exact voltage transfer function of a network ladder, V(output)/E(source), by chain (ABCD)
 * matrices: a series impedance Z is [[1, Z], [0, 1]], a shunt admittance Y is [[1, 0], [Y, 1]]; with
 * the load Z_L, V2/E = 1/(A + B/Z_L), and 1/A with the load open. This is the oracle the substitution
 * stage's proofs compare the active circuit with.
 */
import { RationalFunction } from '../algebra/rational-function';
import { impedanceOf, type NetworkLadder } from './network';

type Chain = [RationalFunction, RationalFunction, RationalFunction, RationalFunction]; // A B C D

const mulChain = (x: Chain, y: Chain): Chain => [
  x[0].mul(y[0]).add(x[1].mul(y[2])),
  x[0].mul(y[1]).add(x[1].mul(y[3])),
  x[2].mul(y[0]).add(x[3].mul(y[2])),
  x[2].mul(y[1]).add(x[3].mul(y[3])),
];

const ONE = RationalFunction.ONE;
const ZERO = RationalFunction.ZERO;

export function networkLadderTransferFunction(l: NetworkLadder): RationalFunction {
  let t: Chain = [ONE, ZERO, ZERO, ONE];
  if (l.source) t = mulChain(t, [ONE, impedanceOf(l.source), ZERO, ONE]);
  for (const b of l.branches) {
    const z = impedanceOf(b.network);
    t = mulChain(t, b.placement === 'series' ? [ONE, z, ZERO, ONE] : [ONE, ZERO, z.inverse(), ONE]);
  }
  if (l.load === 'open') return t[0].inverse();
  return t[0].add(t[1].div(impedanceOf(l.load))).inverse();
}
