/**
 * Test helper: random linear circuits with exact rational values, driven by VIN at node 'in', and the
 * GIC building blocks used by several tests. Values are small-denominator rationals scaled to around
 * 1 (ohm, farad, henry), so responses are interesting near 1 rad/s.
 */
import { Circuit, Subcircuit, type OpampModel } from '../../src/netlist/index';

/** mulberry32: a small deterministic PRNG (common practice, no source), seeded per fast-check run. */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random rational 'p/q' with p in [1, 99], q in [10, 99]: between about 0.01 and 9.9. */
export function randomValue(r: () => number): string {
  const p = 1 + Math.floor(r() * 99);
  const q = 10 + Math.floor(r() * 90);
  return `${p}/${q}`;
}

const MODELS: OpampModel[] = [
  { model: 'ideal' },
  { model: 'finite-gain', gain: 1000 },
  { model: 'single-pole', gainBandwidthHz: 10, openLoopGainDb: 60 },
  { model: 'two-pole', gainBandwidthHz: 20, openLoopGainDb: 40, secondPoleHz: 50 },
  { model: 'integrator', gainBandwidthHz: 5 },
];

/**
 * A random circuit: nodes n1..nk each connected to an earlier node (or 'in'/ground) by a random R, C or
 * L (so it is connected), extra random passive branches, and some op-amp stages (a follower or a
 * non-inverting amplifier with a random model reading a random node and driving a new node that the
 * rest of the circuit loads). Every node has a resistive path to ground, so the matrix is regular.
 */
export function randomCircuit(seed: number, size = 6): { circuit: Circuit; nodes: string[] } {
  const r = rng(seed);
  const c = new Circuit().addVoltageSource('VIN', 'in', '0');
  const nodes = ['in'];
  let count = 0;
  const passive = (a: string, b: string) => {
    const kind = r();
    const name = `${kind < 0.5 ? 'R' : kind < 0.8 ? 'C' : 'L'}${++count}`;
    if (kind < 0.5) c.addResistor(name, a, b, randomValue(r));
    else if (kind < 0.8) c.addCapacitor(name, a, b, randomValue(r));
    else c.addInductor(name, a, b, randomValue(r));
  };
  const pick = () => nodes[Math.floor(r() * nodes.length)];
  for (let i = 1; i <= size; i++) {
    const node = `n${i}`;
    if (r() < 0.3 && nodes.length > 1) {
      // op-amp stage
      const model = MODELS[Math.floor(r() * MODELS.length)];
      const src = pick();
      if (r() < 0.5) {
        c.addOpamp(`U${i}`, { plus: src, minus: node, out: node }, model);
      } else {
        const fb = `f${i}`;
        c.addOpamp(`U${i}`, { plus: src, minus: fb, out: node }, model);
        c.addResistor(`RF${i}`, node, fb, randomValue(r));
        c.addResistor(`RG${i}`, fb, '0', randomValue(r));
      }
    } else {
      passive(pick(), node);
    }
    nodes.push(node);
    c.addResistor(`RB${i}`, node, '0', randomValue(r)); // the resistive path to ground
  }
  const extra = Math.floor(r() * size);
  for (let i = 0; i < extra; i++) {
    const a = pick();
    let b = pick();
    if (a === b) b = '0';
    if (a === 'in' && b === '0') continue;
    passive(a, b);
  }
  return { circuit: c, nodes };
}

/** The two-op-amp GIC (DESIGN.md node numbering) as a subcircuit with port 'p'; Z's are given as element adders. */
export type Adder = (c: Circuit, name: string, a: string, b: string) => void;
export const resistor = (ohms: string): Adder => (c, name, a, b) => void c.addResistor(name, a, b, ohms);
export const capacitor = (farads: string): Adder => (c, name, a, b) => void c.addCapacitor(name, a, b, farads);

/**
 * Op-amp a drives node 2, + on 5, - on 3; b drives node 4, + on 1, - on 3; Z1 1-2, Z2 2-3, Z3 3-4,
 * Z4 4-5, Z5 5-ground.
 */
export function gicSubcircuit(z: [Adder, Adder, Adder, Adder, Adder], model: OpampModel = { model: 'ideal' }): Subcircuit {
  const s = new Subcircuit('gic', ['p']);
  const nodes = ['p', 'n2', 'n3', 'n4', 'n5', '0'];
  z.forEach((add, i) => add(s, `Z${i + 1}`, nodes[i], nodes[i + 1]));
  s.addOpamp('UA', { plus: 'n5', minus: 'n3', out: 'n2' }, model);
  s.addOpamp('UB', { plus: 'p', minus: 'n3', out: 'n4' }, model);
  return s;
}
