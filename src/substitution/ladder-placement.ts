/**
 * Puts a network ladder's elements onto circuit nodes: the source network from the input node to the
 * first ladder node, each series branch from one ladder node to the next, each shunt branch from its
 * node to ground, the load from the output node to ground. A series combination gets internal nodes;
 * when it ends at ground, its parts are ordered so that the parts holding a "grounded" element (an
 * inductor for the simulated-inductor route, an FDNR for the FDNR route) come last, at the ground end:
 * a series L-C arm to ground has the same impedance in either order, and this order grounds the L.
 */
import { UnrealizableError } from '../errors';
import { elementsOf, isElement, type Network, type NetworkElement, type NetworkLadder } from '../transform/network';

export const GROUND = '0';

/** One element with its two nodes (b may be ground, '0'). `where` names the ladder position. */
export interface PlacedElement {
  readonly element: NetworkElement;
  readonly a: string;
  readonly b: string;
  /** 'source', 'load' or 'branches[i]'. */
  readonly where: string;
}

export interface PlacedLadder {
  readonly elements: readonly PlacedElement[];
  /** The node the source network starts from. */
  readonly input: string;
  /** The node the load hangs on. */
  readonly output: string;
}

/**
 * Places the ladder between `input` and `output`. `groundLast(e)` marks the elements a series
 * combination to ground should put at its ground end. Throws UnrealizableError (path 'ladder') for a
 * ladder whose output would be its input (no source network and no series branch).
 */
export function placeLadder(l: NetworkLadder, input: string, output: string, groundLast: (e: NetworkElement) => boolean = () => false): PlacedLadder {
  const seriesCount = l.branches.filter((b) => b.placement === 'series').length + (l.source ? 1 : 0);
  if (seriesCount === 0) throw new UnrealizableError('UNREALIZABLE', 'ladder', 'no series element', 'a ladder without a source network or a series branch has its output at the ideal source');
  const placed: PlacedElement[] = [];
  let internal = 0;
  let ladderNode = 0;
  let remaining = seriesCount;
  const nextNode = (): string => {
    remaining -= 1;
    ladderNode += 1;
    return remaining === 0 ? output : `n${ladderNode}`;
  };
  const place = (n: Network, a: string, b: string, where: string): void => {
    if (isElement(n)) {
      placed.push({ element: n, a, b, where });
      return;
    }
    if (n.kind === 'parallel') {
      for (const p of n.parts) place(p, a, b, where);
      return;
    }
    let parts = flattenSeries(n);
    if (b === GROUND) {
      const holds = (p: Network) => elementsOf(p).some(groundLast);
      parts = [...parts.filter((p) => !holds(p)), ...parts.filter(holds)];
    }
    let from = a;
    parts.forEach((p, i) => {
      const to = i === parts.length - 1 ? b : `m${++internal}`;
      place(p, from, to, where);
      from = to;
    });
  };
  let node = input;
  if (l.source) {
    const next = nextNode();
    place(l.source, node, next, 'source');
    node = next;
  }
  l.branches.forEach((br, i) => {
    if (br.placement === 'shunt') place(br.network, node, GROUND, `branches[${i}]`);
    else {
      const next = nextNode();
      place(br.network, node, next, `branches[${i}]`);
      node = next;
    }
  });
  if (l.load !== 'open') place(l.load, output, GROUND, 'load');
  return { elements: placed, input, output };
}

function flattenSeries(n: Network): Network[] {
  if (isElement(n) || n.kind !== 'series') return [n];
  return n.parts.flatMap(flattenSeries);
}

/** Unique element names `${prefix}_${origin}`, with `_2`, `_3`... when an origin repeats. */
export class ElementNames {
  private readonly used = new Set<string>();
  make(prefix: string, origin: string): string {
    const base = `${prefix}_${origin.replace(/[^A-Za-z0-9_]/g, '_')}`;
    let name = base;
    for (let k = 2; this.used.has(name); k++) name = `${base}_${k}`;
    this.used.add(name);
    return name;
  }
}
