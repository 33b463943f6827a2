/**
 * The transform stage's data: a ladder whose branches are two-terminal networks of exact elements.
 * After the frequency transformations a branch can hold several resonators, and after the Bruton
 * transform resistors and FDNRs appear, so the ladder stage's two-part {@link Branch} no longer suffices.
 *
 * Element values are exact rationals in SI base units: R in ohm, L in henry, C in farad, and the FDNR
 * constant D in farad-seconds with Z = 1/(s^2 D).
 */
import { Fraction, fractionFromDouble, toFraction, type RationalLike } from '../algebra/rational';
import { RationalFunction } from '../algebra/rational-function';
import { Poly } from '../algebra/poly';
import type { Branch, BranchPlacement, ExactLadder, Ladder } from '../ladder/types';
import { InvalidInputError } from '../errors';

export type NetworkElementKind = 'R' | 'L' | 'C' | 'D';

/** One two-terminal element. */
export interface NetworkElement {
  readonly kind: NetworkElementKind;
  readonly value: Fraction;
  /** Which prototype element this one came from (e.g. 'L2', 'C3', 'Rs'), kept through every transform. */
  readonly origin: string;
}

/** A series or parallel combination of networks. */
export interface NetworkCombination {
  readonly kind: 'series' | 'parallel';
  readonly parts: readonly Network[];
}

export type Network = NetworkElement | NetworkCombination;

export interface NetworkBranch {
  readonly placement: BranchPlacement;
  readonly network: Network;
}

/**
 * A ladder of networks between a source and a load. `source` is the network in series with the ideal
 * voltage source (null for a zero-impedance source); `load` is the network from the output node to
 * ground, or 'open'. The output node is the far end of the last branch.
 */
export interface NetworkLadder {
  readonly source: Network | null;
  readonly load: Network | 'open';
  readonly branches: readonly NetworkBranch[];
}

export const element = (kind: NetworkElementKind, value: RationalLike, origin: string): NetworkElement => ({ kind, value: toFraction(value, origin), origin });

export const isElement = (n: Network): n is NetworkElement => n.kind === 'R' || n.kind === 'L' || n.kind === 'C' || n.kind === 'D';

/** The exact impedance of a network as a rational function of s. */
export function impedanceOf(n: Network): RationalFunction {
  if (isElement(n)) {
    switch (n.kind) {
      case 'R':
        return RationalFunction.constant(n.value);
      case 'L':
        return RationalFunction.fromPolys(Poly.fromCoefficients([0, n.value]), Poly.ONE);
      case 'C':
        return RationalFunction.fromPolys(Poly.ONE, Poly.fromCoefficients([0, n.value]));
      case 'D':
        return RationalFunction.fromPolys(Poly.ONE, Poly.fromCoefficients([0, 0, n.value]));
    }
  }
  const zs = n.parts.map(impedanceOf);
  if (n.kind === 'series') return zs.reduce((a, b) => a.add(b));
  return zs.map((z) => z.inverse()).reduce((a, b) => a.add(b)).inverse();
}

/** Every element of a network, depth first. */
export function elementsOf(n: Network): NetworkElement[] {
  return isElement(n) ? [n] : n.parts.flatMap(elementsOf);
}

/** Every element of a ladder: source, branches in order, load. */
export function ladderElements(l: NetworkLadder): NetworkElement[] {
  return [
    ...(l.source ? elementsOf(l.source) : []),
    ...l.branches.flatMap((b) => elementsOf(b.network)),
    ...(l.load === 'open' ? [] : elementsOf(l.load)),
  ];
}

/** Rebuilds a network with every element replaced by `f(element)` (which may return a network). */
export function mapNetwork(n: Network, f: (e: NetworkElement) => Network): Network {
  if (isElement(n)) return f(n);
  return { kind: n.kind, parts: n.parts.map((p) => mapNetwork(p, f)) };
}

/** Applies `f` to every element of the ladder, terminations included. */
export function mapLadder(l: NetworkLadder, f: (e: NetworkElement) => Network): NetworkLadder {
  return {
    source: l.source ? mapNetwork(l.source, f) : null,
    load: l.load === 'open' ? 'open' : mapNetwork(l.load, f),
    branches: l.branches.map((b) => ({ placement: b.placement, network: mapNetwork(b.network, f) })),
  };
}

const exact = (x: number | Fraction, path: string): Fraction => (x instanceof Fraction ? x : fractionFromDouble(x, path));

/**
 * The ladder stage's ladder (float or exact) as a network ladder. Float values are taken exactly
 * (every double is a rational); element origins are named from the prototype position: the k-th
 * branch's inductor is `L${k}`, its capacitor `C${k}` (k from 1 at the source end), the terminations
 * `Rs` and `Rl`.
 */
export function fromLadder(ladder: Ladder | ExactLadder): NetworkLadder {
  const rs = exact(ladder.sourceOhms, 'ladder.sourceOhms');
  if (rs.s < 0n) throw new InvalidInputError('OUT_OF_RANGE', 'ladder.sourceOhms', ladder.sourceOhms, 'must not be negative');
  const branches = ladder.branches.map((b, i) => ({ placement: b.placement, network: branchNetwork(b, i + 1) }));
  let load: Network | 'open';
  if (ladder.loadOhms === 'open') load = 'open';
  else {
    const rl = exact(ladder.loadOhms, 'ladder.loadOhms');
    if (!(rl.s > 0n && rl.n > 0n)) throw new InvalidInputError('OUT_OF_RANGE', 'ladder.loadOhms', ladder.loadOhms, 'must be greater than zero');
    load = element('R', rl, 'Rl');
  }
  return { source: rs.n === 0n ? null : element('R', rs, 'Rs'), load, branches };
}

function branchNetwork(b: Branch | ExactLadder['branches'][number], k: number): Network {
  const path = `ladder.branches[${k - 1}]`;
  const parts: NetworkElement[] = [];
  if (b.inductanceH !== undefined) parts.push(element('L', positiveExact(b.inductanceH, `${path}.inductanceH`), `L${k}`));
  if (b.capacitanceF !== undefined) parts.push(element('C', positiveExact(b.capacitanceF, `${path}.capacitanceF`), `C${k}`));
  if (parts.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', path, b, 'a branch needs an inductance or a capacitance');
  if (parts.length === 1) return parts[0];
  const arrangement = b.arrangement ?? 'parallel';
  if (arrangement !== 'parallel' && arrangement !== 'series') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.arrangement`, b.arrangement, "must be 'parallel' or 'series'");
  return { kind: arrangement, parts };
}

function positiveExact(x: number | Fraction, path: string): Fraction {
  const f = exact(x, path);
  if (!(f.s > 0n && f.n > 0n)) throw new InvalidInputError('OUT_OF_RANGE', path, x instanceof Fraction ? x.toString() : x, 'must be greater than zero');
  return f;
}

