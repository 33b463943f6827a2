/**
 * DC references for the pieces of an embedded inductive subnetwork that have none after the ordering of
 * embedding-order.ts (why they float: see there). Two remedies, one per kind of piece, each a large
 * resistor whose effect on the response is computed exactly and bounded like the FDNR route's DC-path
 * resistors (dc-path.ts):
 *
 * - 'dc-return' (an island: a piece the passive ladder itself reaches only through capacitors, e.g. the
 *   ladder nodes of an elliptic bandpass ladder, whose shunt arms hold a series capacitor): a resistor
 *   R_dc from one inner node of the piece to ground. Behind the converters every impedance of N' is that
 *   of N divided by s k (gic-embedding.ts, Eq. (2)), so R_dc is seen outside as an inductor
 *   L_dc = k R_dc from that node to ground.                                               Eq. (1)
 *   Such a ladder has no transmission at DC anyway (a bandpass); L_dc only adds a zero there.
 * - 'lossy-converters' (a chain: a piece the passive ladder reaches ground through resistors, e.g. the
 *   series inductors of a lowpass or bandstop ladder, grounded only through the terminations): a
 *   resistor R_p across the capacitor of every converter of the piece. The converter's Z4 (or Z2) becomes
 *   R_p || C, so Zin = (R1 R3 / R2)(1/R_p + s C) Z = k (s + 1/tau) Z with tau = C R_p, and each inductor
 *   of the piece is seen as L in series with r = L / tau (one quality factor omega tau for all of them).
 *                                                                                         Eq. (2)
 *   At DC the converters then pass current, and the piece is biased through the terminations like the
 *   passive ladder. (A shunt L_dc would short the DC passband of these ladders, so it is not an option.)
 * - 'shunt-resistor' (an outer island: a ladder node that touches capacitors only, no inductor and no
 *   resistor, such as the node between two series capacitors of an elliptic bandpass ladder): a resistor
 *   R from it to ground, R = a R0 (the op-amp-free side: it biases nothing but the capacitors' junction,
 *   which the converters' ports beside it would otherwise see floating).
 *
 * The level: omega0 L_dc = a R0 or omega0 tau = a (R0 the ladder's resistance level, omega0 its working
 * characteristic frequency, gic-choices.ts's ladderCharacteristicOmega), a from the 1-2-5 sequence from 10 up, the smallest a for which the exact transfer function
 * of the passive equivalent (the placed ladder with Eq. (1) and (2) applied) stays within the bound of
 * the ladder's over the checked passband. The passband checked: 0 .. passbandEdgeHz when given (a
 * lowpass), else every frequency where the ladder's gain is within 3.01 dB of its peak (a logarithmic
 * grid refined linearly across each band, {@link embeddingPassbandGrid}). The errors are Float64 evaluations of exact RationalFunctions
 * (the stage's float boundary, toFloatPassbandErrorDb).
 */
import { Fraction, fractionToNumber } from '../algebra/rational';
import type { RationalFunction } from '../algebra/rational-function';
import { transferFunction } from '../analysis/transfer-function';
import { Circuit } from '../netlist/circuit';
import { toFloatPassbandErrorDb } from './dc-path';
import type { FloatingInductorGroup } from './embedding-order';
import { roundToSignificant } from './gic-choices';
import { oneTwoFiveLevels } from './level-sequence';
import { ElementNames, GROUND, type PlacedElement } from './ladder-placement';

/** Significant digits of the free DC-reference resistors (values the next stage rounds anyway). */
const DC_REFERENCE_DIGITS = 3;
/** Grid points per decade of the passband search grid: a narrow band (Q = 10) still gets ~40 points. */
const POINTS_PER_DECADE = 400;
/** Linear points across each passband run (and its neighbouring log steps): a 2 % band still gets 500. */
const LINEAR_REFINEMENT = 500;
/** Decades either side of omega0 searched for the passband. */
const GRID_DECADES = 4;
/** 10 log10(2): the passband is where the gain is within this of its peak. */
const HALF_POWER_DB = 10 * Math.log10(2);

export type DcReferenceRemedy = 'dc-return' | 'lossy-converters' | 'shunt-resistor';

export interface DcReferenceGroup extends FloatingInductorGroup {
  readonly remedy: DcReferenceRemedy;
  /** dc-return: the node whose inner image gets R_dc to ground; shunt-resistor: the outer node. */
  readonly node?: string;
  /** dc-return: R_dc (ohms); lossy-converters: R_p across each converter capacitor; shunt-resistor: R to ground. */
  readonly resistorOhms: Fraction;
}

export interface DcReferenceChoice {
  readonly groups: readonly DcReferenceGroup[];
  /** The largest |gain change| over the checked passband, dB. */
  readonly errorDb: number;
  readonly boundDb: number;
  /** The band checked, Hz (low 0 for a lowpass check). */
  readonly passbandHz: readonly [number, number];
  /** The exact V(out)/V(in) of the passive equivalent with the references in. */
  readonly transferFunction: RationalFunction;
}

/**
 * The check grid, rad/s: 0 .. omegaEdge (linear and logarithmic) when an edge is given, else the
 * points of a logarithmic grid around omega0 where |h| is within 3.01 dB of its largest value there.
 */
export function embeddingPassbandGrid(h: RationalFunction, omega0: number, omegaEdge?: number): number[] {
  const log: number[] = [];
  const n = 2 * GRID_DECADES * POINTS_PER_DECADE;
  for (let i = 0; i <= n; i++) log.push(omega0 * 10 ** (-GRID_DECADES + i / POINTS_PER_DECADE));
  if (omegaEdge !== undefined) return [0, ...log.filter((w) => w <= omegaEdge), omegaEdge];
  const gains = log.map((w) => h.gainDb(w));
  const peak = Math.max(...gains.filter(Number.isFinite), fractionToNumber(h.evaluate(0)) === 0 ? -Infinity : h.gainDb(0));
  const inBand = (w: number) => h.gainDb(w) >= peak - HALF_POWER_DB;
  // Each run of in-band log points, refined linearly out to its neighbours (a narrow band gets few log points).
  const band: number[] = [];
  for (let i = 0; i <= n; i++) {
    if (!(gains[i] >= peak - HALF_POWER_DB) || (i > 0 && gains[i - 1] >= peak - HALF_POWER_DB)) continue;
    let j = i;
    while (j < n && gains[j + 1] >= peak - HALF_POWER_DB) j++;
    const lo = i === 0 ? 0 : log[i - 1];
    const hi = j === n ? log[n] : log[j + 1];
    for (let m = 0; m <= LINEAR_REFINEMENT; m++) band.push(lo + ((hi - lo) * m) / LINEAR_REFINEMENT);
    band.push(...log.slice(i, j + 1));
  }
  return band.filter(inBand).sort((a, b) => a - b);
}

/** True when the passive ladder at DC (L and R conducting, C and D open) links the group to ground or `pinned`. */
function reachesGroundAtDc(placed: readonly PlacedElement[], group: FloatingInductorGroup, pinned: string): boolean {
  const seen = new Set<string>(group.nodes);
  const queue = [...group.nodes];
  while (queue.length > 0) {
    const x = queue.pop()!;
    if (x === GROUND || x === pinned) return true;
    for (const p of placed) {
      if (p.element.kind !== 'L' && p.element.kind !== 'R') continue;
      const other = p.a === x ? p.b : p.b === x ? p.a : undefined;
      if (other !== undefined && !seen.has(other)) {
        seen.add(other);
        queue.push(other);
      }
    }
  }
  return false;
}

/**
 * The passive equivalent of the embedded ladder with the DC references in (Eq. (1), (2)): VIN drives
 * `input`, V(out)/V(in) taken at `output`.
 */
export function passiveEquivalent(
  placed: readonly PlacedElement[],
  input: string,
  output: string,
  groups: readonly DcReferenceGroup[],
  k: Fraction,
  capacitorF: Fraction,
): Circuit {
  const c = new Circuit().addVoltageSource('VIN', input, GROUND);
  const names = new ElementNames();
  const lossOf = new Map<string, Fraction>();
  for (const g of groups) if (g.remedy === 'lossy-converters') for (const o of g.inductors) lossOf.set(o, capacitorF.mul(g.resistorOhms));
  let internal = 0;
  for (const p of placed) {
    const e = p.element;
    const name = names.make(e.kind, e.origin);
    const tau = e.kind === 'L' ? lossOf.get(e.origin) : undefined;
    if (e.kind === 'R') c.addResistor(name, p.a, p.b, e.value);
    else if (e.kind === 'C') c.addCapacitor(name, p.a, p.b, e.value);
    else if (e.kind === 'D') c.addFdnr(name, p.a, p.b, e.value);
    else if (tau === undefined) c.addInductor(name, p.a, p.b, e.value);
    else {
      const mid = `loss${++internal}`;
      c.addInductor(name, p.a, mid, e.value);
      c.addResistor(`${name}_loss`, mid, p.b, e.value.div(tau)); // Eq. (2): r = L / tau
    }
  }
  for (const g of groups) {
    if (g.remedy === 'dc-return') c.addInductor(names.make('LDC', g.node!), g.node!, GROUND, k.mul(g.resistorOhms)); // Eq. (1)
    if (g.remedy === 'shunt-resistor') c.addResistor(names.make('RDC', g.node!), g.node!, GROUND, g.resistorOhms);
  }
  return c;
}

/**
 * Outer islands: ladder nodes that no resistor or inductor links (through others) to ground or `pinned`
 * once every inductor group has its reference (the inductors conduct at DC, a dc-return grounds its
 * node). One group per island, its nodes sorted; `inductors` empty.
 */
export function outerIslands(placed: readonly PlacedElement[], pinned: string, grounded: readonly string[]): FloatingInductorGroup[] {
  const nodes = [...new Set(placed.flatMap((p) => [p.a, p.b]))].filter((n) => n !== GROUND).sort();
  const reached = new Set<string>([GROUND, pinned, ...grounded]);
  const conducting = placed.filter((p) => p.element.kind === 'R' || p.element.kind === 'L');
  let changed = true;
  while (changed) {
    changed = false;
    for (const p of conducting) {
      if (reached.has(p.a) !== reached.has(p.b)) {
        reached.add(p.a).add(p.b);
        changed = true;
      }
    }
  }
  const left = nodes.filter((n) => !reached.has(n));
  const islands: FloatingInductorGroup[] = [];
  const done = new Set<string>();
  for (const n of left) {
    if (done.has(n)) continue;
    const island = new Set<string>([n]);
    for (let grew = true; grew; ) {
      grew = false;
      for (const p of conducting) {
        if (island.has(p.a) !== island.has(p.b)) {
          island.add(p.a).add(p.b);
          grew = true;
        }
      }
    }
    for (const x of island) done.add(x);
    islands.push({ nodes: [...island].sort(), inductors: [] });
  }
  return islands;
}

/**
 * Chooses the DC references of the floating groups of a placed embedding ladder realising
 * `h`. `omega0` rad/s, `r0` ohms; k the conversion constant, capacitorF the converters' capacitor.
 */
export function chooseDcReference(
  placed: readonly PlacedElement[],
  ports: { readonly input: string; readonly output: string },
  floating: readonly FloatingInductorGroup[],
  h: RationalFunction,
  levels: { readonly k: Fraction; readonly capacitorF: Fraction; readonly omega0: number; readonly r0: number },
  boundDb: number,
  passbandEdgeHz?: number,
): DcReferenceChoice {
  const grid = embeddingPassbandGrid(h, levels.omega0, passbandEdgeHz === undefined ? undefined : 2 * Math.PI * passbandEdgeHz);
  const kinds = floating.map((g) => (reachesGroundAtDc(placed, g, ports.input) ? 'lossy-converters' : 'dc-return') as DcReferenceRemedy);
  const islands = outerIslands(placed, ports.input, floating.filter((_, i) => kinds[i] === 'dc-return').map((g) => g.nodes[0]));
  const k = fractionToNumber(levels.k);
  const cF = fractionToNumber(levels.capacitorF);
  let last: DcReferenceChoice | undefined;
  for (const a of oneTwoFiveLevels()) {
    const groups: DcReferenceGroup[] = floating.map((g, i) =>
      kinds[i] === 'dc-return'
        ? { ...g, remedy: 'dc-return', node: g.nodes[0], resistorOhms: roundToSignificant((a * levels.r0) / (levels.omega0 * k), DC_REFERENCE_DIGITS) } // omega0 k R_dc = a R0
        : { ...g, remedy: 'lossy-converters', resistorOhms: roundToSignificant(a / (levels.omega0 * cF), DC_REFERENCE_DIGITS) }, // omega0 C R_p = a
    );
    for (const g of islands) groups.push({ ...g, remedy: 'shunt-resistor', node: g.nodes[0], resistorOhms: roundToSignificant(a * levels.r0, DC_REFERENCE_DIGITS) });
    const hWith = transferFunction(passiveEquivalent(placed, ports.input, ports.output, groups, levels.k, levels.capacitorF), { input: 'VIN', output: ports.output });
    const errorDb = toFloatPassbandErrorDb(hWith, h, grid);
    last = { groups, errorDb, boundDb, transferFunction: hWith, passbandHz: [grid[0] / (2 * Math.PI), grid[grid.length - 1] / (2 * Math.PI)] };
    if (errorDb <= boundDb) return last;
  }
  return last as DcReferenceChoice;
}
