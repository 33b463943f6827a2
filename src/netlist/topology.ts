/**
 * Topology checks: what makes the nodal equations singular (errors) and what makes a circuit
 * suspicious or unbiased (warnings), with the nodes and elements involved. Graph reasoning after
 * L. O. Chua and P.-M. Lin, "Computer-Aided Analysis of Electronic Circuits", Prentice-Hall 1975, ch. 2
 * and 4: a node set with no connection to ground leaves its common voltage undetermined, a loop of
 * voltage-defining branches (or of nullators) makes their constraint rows dependent.
 *
 * Errors (the MNA matrix is singular for every s):
 * - FLOATING_NODE: a node no element connects (only sensed, or only current sources);
 * - NO_PATH_TO_GROUND: a group of connected nodes with no connection to ground at all;
 * - VOLTAGE_SOURCE_LOOP: a loop (or a self-loop) of independent voltage sources and VCVS outputs;
 * - OUTPUTS_TIED: such a loop through an op-amp output (two op-amp outputs, or an op-amp output and a
 *   voltage source, on one node; an output on ground);
 * - NULLATOR_LOOP: ideal op-amp inputs shorted, or a loop of ideal-op-amp inputs and voltage sources.
 * Warnings:
 * - NO_DC_PATH: nodes reached from ground only through capacitors or FDNRs (fine for AC analysis, the
 *   matrix is singular only at s = 0, but a real circuit is not biased);
 * - DANGLING_NODE: a node touched by a single element terminal.
 */
import type { Circuit } from './circuit';
import { GROUND_NAME, type CircuitElement } from './elements';
import { SingularCircuitError } from './errors';

export type TopologyCode =
  | 'FLOATING_NODE'
  | 'NO_PATH_TO_GROUND'
  | 'VOLTAGE_SOURCE_LOOP'
  | 'OUTPUTS_TIED'
  | 'NULLATOR_LOOP'
  | 'NO_DC_PATH'
  | 'DANGLING_NODE';

export interface TopologyDiagnostic {
  readonly severity: 'error' | 'warning';
  readonly code: TopologyCode;
  readonly message: string;
  readonly nodes: readonly string[];
  readonly elements: readonly string[];
}

export interface TopologyReport {
  /** True when there is no error-level finding. */
  readonly ok: boolean;
  readonly diagnostics: readonly TopologyDiagnostic[];
}

/** Runs every check; never throws. Diagnostics are sorted errors first, in a deterministic order. */
export function checkTopology(circuit: Circuit): TopologyReport {
  const out: TopologyDiagnostic[] = [];
  const elements = circuit.elements;
  const nodes = circuit.nodes;
  const all = [GROUND_NAME, ...nodes];

  // Terminal counts and current-carrying connections.
  const touches = new Map<string, Set<string>>();
  const terminals = new Map<string, number>();
  const connected = new Set<string>();
  for (const e of elements) {
    for (const n of e.nodes) terminals.set(n, (terminals.get(n) ?? 0) + 1);
    for (const edge of e.topology().edges) {
      for (const n of [edge.a, edge.b]) {
        connected.add(n);
        if (!touches.has(n)) touches.set(n, new Set());
        touches.get(n)!.add(e.name);
      }
    }
  }
  const byNode = (n: string) => elements.filter((e) => e.nodes.includes(n)).map((e) => e.name);

  for (const n of nodes) {
    if (!connected.has(n)) {
      out.push(diag('error', 'FLOATING_NODE', `node '${n}' is only sensed or fed by current sources; no element connects it`, [n], byNode(n)));
    } else if ((terminals.get(n) ?? 0) === 1) {
      out.push(diag('warning', 'DANGLING_NODE', `node '${n}' is touched by one element terminal only`, [n], byNode(n)));
    }
  }

  // Connectivity to ground, through any connection and through DC-conducting ones.
  const any = new UnionFind(all);
  const dc = new UnionFind(all);
  for (const e of elements) {
    for (const edge of e.topology().edges) {
      any.union(edge.a, edge.b);
      if (edge.dc) dc.union(edge.a, edge.b);
    }
  }
  const groups = new Map<string, string[]>();
  for (const n of nodes) {
    if (!connected.has(n) || any.same(n, GROUND_NAME)) continue;
    const r = any.find(n);
    if (!groups.has(r)) groups.set(r, []);
    groups.get(r)!.push(n);
  }
  for (const g of groups.values()) {
    out.push(diag('error', 'NO_PATH_TO_GROUND', `nodes ${list(g)} have no connection to ground`, g, elementsOn(elements, g)));
  }
  const noDc: string[] = nodes.filter((n) => connected.has(n) && any.same(n, GROUND_NAME) && !dc.same(n, GROUND_NAME));
  if (noDc.length > 0) {
    out.push(
      diag('warning', 'NO_DC_PATH', `nodes ${list(noDc)} reach ground only through capacitors or FDNRs (not biased; singular at DC)`, noDc, elementsOn(elements, noDc)),
    );
  }

  // Loops of voltage-defining branches.
  const vsrc = new LoopFinder(all);
  const nullors = new LoopFinder(all);
  for (const e of elements) {
    const t = e.topology();
    for (const v of t.voltageDefined) {
      const loop = vsrc.add(v.plus, v.minus, e.name);
      if (loop) {
        const viaOpamp = loop.elements.some((name) => circuit.element(name)?.kind === 'OPAMP');
        out.push(
          viaOpamp
            ? diag('error', 'OUTPUTS_TIED', `op-amp outputs tied to each other, to a voltage source or to ground: ${list(loop.elements)}`, loop.nodes, loop.elements)
            : diag('error', 'VOLTAGE_SOURCE_LOOP', `loop of voltage sources: ${list(loop.elements)}`, loop.nodes, loop.elements),
        );
      }
      if (e.kind === 'V') {
        const l2 = nullors.add(v.plus, v.minus, e.name);
        if (l2 && l2.elements.some((name) => circuit.element(name)?.kind === 'OPAMP')) {
          out.push(diag('error', 'NULLATOR_LOOP', `ideal op-amp inputs in a loop with voltage sources: ${list(l2.elements)}`, l2.nodes, l2.elements));
        }
      }
    }
    for (const z of t.nullators ?? []) {
      const loop = nullors.add(z.plus, z.minus, e.name);
      if (loop) {
        const msg = z.plus === z.minus ? `ideal op-amp '${e.name}' has its inputs shorted` : `ideal op-amp inputs form a loop: ${list(loop.elements)}`;
        out.push(diag('error', 'NULLATOR_LOOP', msg, loop.nodes, loop.elements));
      }
    }
  }

  out.sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'error' ? -1 : 1));
  return { ok: !out.some((d) => d.severity === 'error'), diagnostics: out };
}

/**
 * Runs {@link checkTopology} and throws {@link SingularCircuitError} (code SINGULAR_CIRCUIT, listing
 * the nodes and elements) when it finds an error; returns the warnings otherwise.
 */
export function assertTopology(circuit: Circuit, path = 'circuit'): readonly TopologyDiagnostic[] {
  const r = checkTopology(circuit);
  const errors = r.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0) throw new SingularCircuitError(path, errors, errors.map((d) => d.message).join('; '));
  return r.diagnostics;
}

function diag(severity: 'error' | 'warning', code: TopologyCode, message: string, nodes: readonly string[], elements: readonly string[]): TopologyDiagnostic {
  return { severity, code, message, nodes: [...nodes], elements: [...elements] };
}

function list(xs: readonly string[]): string {
  return xs.map((x) => `'${x}'`).join(', ');
}

function elementsOn(elements: readonly CircuitElement[], nodes: readonly string[]): string[] {
  const s = new Set(nodes);
  return elements.filter((e) => e.nodes.some((n) => s.has(n))).map((e) => e.name);
}

class UnionFind {
  private readonly parent = new Map<string, string>();
  constructor(items: readonly string[]) {
    for (const i of items) this.parent.set(i, i);
  }
  find(x: string): string {
    let r = x;
    while (this.parent.get(r) !== r) r = this.parent.get(r)!;
    let y = x;
    while (y !== r) {
      const next = this.parent.get(y)!;
      this.parent.set(y, r);
      y = next;
    }
    return r;
  }
  union(a: string, b: string): void {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent.set(ra, rb);
  }
  same(a: string, b: string): boolean {
    return this.find(a) === this.find(b);
  }
}

/** A spanning forest of branches; adding a branch that closes a loop returns the loop. */
class LoopFinder {
  private readonly uf: UnionFind;
  private readonly adj = new Map<string, { to: string; element: string }[]>();
  constructor(items: readonly string[]) {
    this.uf = new UnionFind(items);
  }
  add(a: string, b: string, element: string): { nodes: string[]; elements: string[] } | null {
    if (this.uf.same(a, b)) {
      const path = this.path(a, b);
      return { nodes: path.nodes, elements: [element, ...path.elements] };
    }
    this.uf.union(a, b);
    for (const [x, y] of [
      [a, b],
      [b, a],
    ]) {
      if (!this.adj.has(x)) this.adj.set(x, []);
      this.adj.get(x)!.push({ to: y, element });
    }
    return null;
  }
  /** The tree path from a to b (breadth-first; the forest has exactly one). */
  private path(a: string, b: string): { nodes: string[]; elements: string[] } {
    if (a === b) return { nodes: [a], elements: [] };
    const prev = new Map<string, { from: string; element: string }>();
    const queue = [a];
    const seen = new Set([a]);
    while (queue.length > 0) {
      const x = queue.shift()!;
      if (x === b) break;
      for (const { to, element } of this.adj.get(x) ?? []) {
        if (seen.has(to)) continue;
        seen.add(to);
        prev.set(to, { from: x, element });
        queue.push(to);
      }
    }
    const nodes = [b];
    const elements: string[] = [];
    let x = b;
    while (x !== a) {
      const p = prev.get(x)!;
      elements.push(p.element);
      nodes.push(p.from);
      x = p.from;
    }
    return { nodes: nodes.reverse(), elements: elements.reverse() };
  }
}
