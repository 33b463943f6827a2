/**
 * The DC reference of an embedded inductive subnetwork, and the ordering of series arms that gives one.
 *
 * Why it matters (gic-embedding.ts, Eq. (1)): with ideal op-amps a converter has V(q) = V(p) and
 * I(q) = s k I(p), so at s = 0 it passes the voltage but no current into the resistor network N'. At DC
 * N' therefore carries no current, and each connected piece of N' settles at one common voltage; a piece
 * that contains ground (or the ladder's input node, whose voltage the ideal source or the input buffer
 * fixes) sits at that voltage, but a piece that contains neither has a common voltage nothing determines:
 * the MNA matrix is singular at s = 0 (a natural frequency at the origin even with ideal op-amps), and on
 * a board its op-amp inputs float and the op-amps saturate. The pieces of N' are those of N, the
 * inductors alone: every connected piece of the inductor graph must reach ground (or the input) through
 * inductors. The passive ladder's own DC path through the terminations does not count; it lies outside.
 *
 * A series arm with a capacitor (the series L-C arm of a bandpass ladder) cuts the inductor graph. Its
 * parts may be placed in either order (the arm's impedance is a sum), and the order decides which ladder
 * node the arm's inductor joins. Put it at the end whose node already reaches ground through inductors
 * (the shunt L || C tank of a bandpass ladder), and it joins that grounded piece; put it at the other end
 * and it may form a piece of its own with no reference: in the series-first bandpass ladder
 * Rs - [L1 + C1] - (L2 || C2 to ground) - [L3 + C3] - Rl, the order L1 then C1 leaves L1 alone between
 * the first ladder node and the L1-C1 junction, both behind converters and floating at DC.
 * {@link orderSeriesArmsForDcReference} applies the rule; it changes no impedance, so the ladder's transfer
 * function is unchanged exactly. It also saves converters: the arm's inductor then shares the converter
 * of the grounded node.
 */
import { elementsOf, isElement, type Network, type NetworkLadder } from '../transform/network';
import { GROUND, type PlacedElement } from './ladder-placement';

/** True when the network conducts at DC through inductors alone (L; series of such; parallel with one). */
export function conductsThroughInductors(n: Network): boolean {
  if (isElement(n)) return n.kind === 'L';
  return n.kind === 'series' ? n.parts.every(conductsThroughInductors) : n.parts.some(conductsThroughInductors);
}

const holdsInductor = (n: Network): boolean => elementsOf(n).some((e) => e.kind === 'L');

function flattenSeries(n: Network): Network[] {
  return isElement(n) || n.kind !== 'series' ? [n] : n.parts.flatMap(flattenSeries);
}

/**
 * The ladder with each series arm that has a capacitor in its path reordered so that its inductive parts
 * sit at the end whose ladder node reaches ground (or the input) through inductors; arms with both or
 * neither end referenced keep their order. Same impedances, same transfer function.
 */
export function orderSeriesArmsForDcReference(l: NetworkLadder): NetworkLadder {
  // Ladder nodes by index: 0 the input; each series element (source, series branch) starts a new node.
  const edges: { a: number; b: number | 'ground'; network: Network; branch?: number }[] = [];
  let node = 0;
  let count = 1;
  if (l.source) {
    edges.push({ a: 0, b: count, network: l.source });
    node = count++;
  }
  l.branches.forEach((br, i) => {
    if (br.placement === 'shunt') edges.push({ a: node, b: 'ground', network: br.network, branch: i });
    else {
      edges.push({ a: node, b: count, network: br.network, branch: i });
      node = count++;
    }
  });
  if (l.load !== 'open') edges.push({ a: node, b: 'ground', network: l.load });

  // Nodes referenced through inductors: the input and ground's neighbours, to a fixed point.
  const referenced = new Set<number>([0]);
  let changed = true;
  while (changed) {
    changed = false;
    for (const e of edges) {
      if (!conductsThroughInductors(e.network)) continue;
      const ends = e.b === 'ground' ? [e.a] : [e.a, e.b];
      const hit = e.b === 'ground' || ends.some((n) => referenced.has(n));
      for (const n of ends) {
        if (hit && !referenced.has(n)) {
          referenced.add(n);
          changed = true;
        }
      }
    }
  }

  const branches = l.branches.map((br, i) => {
    const e = edges.find((x) => x.branch === i)!;
    if (br.placement !== 'series' || e.b === 'ground' || conductsThroughInductors(br.network)) return br;
    const atA = referenced.has(e.a);
    const atB = referenced.has(e.b);
    if (atA === atB) return br;
    const parts = flattenSeries(br.network);
    if (parts.length < 2) return br;
    const inductive = parts.filter(holdsInductor);
    const rest = parts.filter((p) => !holdsInductor(p));
    const ordered = atB ? [...rest, ...inductive] : [...inductive, ...rest];
    return { placement: br.placement, network: { kind: 'series' as const, parts: ordered } };
  });
  return { source: l.source, load: l.load, branches };
}

/** A connected piece of the inductor graph with no DC reference. */
export interface FloatingInductorGroup {
  /** Its circuit nodes (outer names), sorted. */
  readonly nodes: readonly string[];
  /** The origins of its inductors, in placement order. */
  readonly inductors: readonly string[];
}

/**
 * The pieces of the placed ladder's inductor graph that reach neither ground nor `pinned` (the node the
 * ideal source or the input buffer drives) through inductors.
 */
export function floatingInductorGroups(placed: readonly PlacedElement[], pinned: string): FloatingInductorGroup[] {
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let r = x;
    while (parent.has(r) && parent.get(r) !== r) r = parent.get(r)!;
    parent.set(x, r);
    return r;
  };
  const union = (a: string, b: string) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  const inductors = placed.filter((p) => p.element.kind === 'L');
  for (const p of inductors) union(p.a, p.b);
  const groups = new Map<string, { nodes: Set<string>; inductors: string[] }>();
  for (const p of inductors) {
    const root = find(p.a);
    if (root === find(GROUND) || root === find(pinned)) continue;
    const g = groups.get(root) ?? { nodes: new Set<string>(), inductors: [] };
    g.nodes.add(p.a).add(p.b);
    g.inductors.push(p.element.origin);
    groups.set(root, g);
  }
  return [...groups.values()].map((g) => ({ nodes: [...g.nodes].sort(), inductors: g.inductors }));
}
