/**
 * GIC embedding after J. Gorski-Popiel ("RC-active synthesis using positive-immittance converters",
 * Electronics Letters 3(8), 1967; from memory): the inductors of a ladder, floating or grounded, form an
 * inductive subnetwork N; scaled by 1/(s k) it becomes a resistor network N' (L -> R = L/k), and a GIC
 * converter at each terminal of N restores it exactly.
 *
 * The converter (gic-instance.ts, Z5 removed, node 5 the inner port q) has, with ideal op-amps,
 * V(p) = V(q) and I(p) = I(q) Z2 Z4 / (Z1 Z3) = I(q) / (s k), k = C4 R1 R3 / R2 (capacitor in position 4)
 * or C2 R1 R3 / R4 (position 2).                                                        Eq. (1)
 * With every terminal of N' behind such a converter (ground needs none: V = 0 on both sides), N' sees
 * the outer terminal voltages V, so its terminal currents are Y' V = s k Y V (Y the admittance matrix
 * of N, Y' = s k Y because every impedance of N' is that of N divided by s k), and the outer circuit
 * receives Y' V / (s k) = Y V: exactly N.                                               Eq. (2)
 * Nodes of N that touch only inductors are internal to N' and need no converter (their voltages are
 * unchanged too: scaling every impedance of a network by one factor keeps its voltage ratios).
 *
 * One converter per terminal, shared by all inductors there: a grounded inductor alone costs one GIC (and
 * is then the simulated inductor with R5 = L/k), a floating one two, and inductors meeting at a node
 * share its converter. Choices (gic-choices.ts): k = C * omega0 * (geometric mean of the inductances),
 * rounded, so the inner resistors sit near 1/(omega0 C), the level of the inductor optimum; the equal pair
 * R2 = R3 (or R3 = R4) = resistanceOhms, default the same 1/(omega0 C); R1 = k/C computed. Every converter
 * must have the same k: R1 is therefore marked computed (not free).
 */
import { fractionToNumber, type Fraction } from '../algebra/rational';
import type { RationalFunction } from '../algebra/rational-function';
import { Circuit } from '../netlist/circuit';
import { networkLadderTransferFunction } from '../transform/response';
import type { NetworkLadder } from '../transform/network';
import { addBuffers } from './buffers';
import { floatingInductorGroups, orderSeriesArmsForDcReference } from './embedding-order';
import { chooseDcReference, outerIslands, type DcReferenceChoice } from './dc-reference';
import { chooseConverterGic, ladderCharacteristicOmega, ladderResistanceLevel, roundToSignificant } from './gic-choices';
import { addGic } from './gic-instance';
import { ElementNames, GROUND, placeLadder } from './ladder-placement';
import type { ResolvedOptions } from './options';
import { addPassive } from './passive-parts';
import type { DcPathReport, Realization, RealizationDiagnostic, RealizedPart } from './realization';
import { UnrealizableError } from '../errors';

const formatOhms = (r: Fraction): string => `${fractionToNumber(r).toPrecision(3)} ohm`;

/** The suffix of a converter's inner node. */
const INNER = '_gic';

export function realizeGicEmbeddingResolved(ladder: NetworkLadder, o: ResolvedOptions): Realization {
  const circuit = new Circuit().addVoltageSource('VIN', 'in', GROUND);
  const ports = addBuffers(circuit, o.buffers === 'auto' ? 'none' : o.buffers, o.opamp);
  // Series arms ordered and shunt arms' inductors grounded so that the inductors reach ground (embedding-order.ts).
  const placed = placeLadder(orderSeriesArmsForDcReference(ladder), ports.ladderInput, ports.ladderOutput, (e) => e.kind === 'L');
  const inductors = placed.elements.filter((p) => p.element.kind === 'L');
  const others = placed.elements.filter((p) => p.element.kind !== 'L');
  const diagnostics: RealizationDiagnostic[] = [];
  const names = new ElementNames();
  const parts: RealizedPart[] = [];

  // Terminals of N: nodes an inductor shares with another element or with the ports.
  const outerNodes = new Set<string>([ports.ladderInput, ports.ladderOutput]);
  for (const p of others) {
    outerNodes.add(p.a);
    outerNodes.add(p.b);
  }
  const terminals: string[] = [];
  for (const p of inductors) {
    for (const n of [p.a, p.b]) if (n !== GROUND && outerNodes.has(n) && !terminals.includes(n)) terminals.push(n);
  }
  const inner = (n: string) => (n === GROUND ? GROUND : terminals.includes(n) ? `${n}${INNER}` : n);

  for (const p of others) {
    const e = p.element;
    if (e.kind === 'D') throw new UnrealizableError('UNREALIZABLE', 'options.method', 'gic-embedding', `ladder.${p.where}: an FDNR (${e.origin}) has no place in the embedding route (use method 'fdnr')`);
    parts.push(addPassive(circuit, names, p));
  }
  let dcReference: DcReferenceChoice | undefined;
  let h: RationalFunction | undefined;
  if (inductors.length > 0) {
    const logMean = inductors.reduce((acc, p) => acc + Math.log(fractionToNumber(p.element.value)), 0) / inductors.length;
    const c = o.capacitorF;
    const k = roundToSignificant(fractionToNumber(o.omega0) * Math.exp(logMean) * fractionToNumber(c)); // R(L) = L/k near 1/(omega0 C)
    const level = o.resistanceOhms ?? roundToSignificant(1 / (fractionToNumber(o.omega0) * fractionToNumber(c)));
    h = networkLadderTransferFunction(ladder);
    // Pieces of N with no DC reference (embedding-order.ts) get one (dc-reference.ts).
    const floating = floatingInductorGroups(placed.elements, ports.ladderInput);
    if (floating.length > 0 || outerIslands(placed.elements, ports.ladderInput, []).length > 0) {
      dcReference = chooseDcReference(
        placed.elements,
        { input: ports.ladderInput, output: ports.ladderOutput },
        floating,
        h,
        { k, capacitorF: c, omega0: ladderCharacteristicOmega(ladder), r0: fractionToNumber(ladderResistanceLevel(ladder)) },
        o.dcPathErrorDb,
        o.passbandEdgeHz,
      );
    }
    const lossy = new Map<string, Fraction>();
    for (const g of dcReference?.groups ?? []) {
      if (g.remedy === 'lossy-converters') for (const n of g.nodes) lossy.set(n, g.resistorOhms);
    }
    for (const p of inductors) {
      const name = names.make('R', p.element.origin);
      const r = p.element.value.div(k); // Eq. (2): L -> L/k
      circuit.addResistor(name, inner(p.a), inner(p.b), r);
      parts.push({ name, kind: 'R', exactValue: r, role: { kind: 'ladder', realises: p.element.origin, free: false } });
    }
    const { design, free } = chooseConverterGic(k, c, o.inductorCapacitorPosition, level);
    for (const t of terminals) {
      const gicName = names.make('X', t);
      const realises = inductors.filter((p) => p.a === t || p.b === t).map((p) => p.element.origin).join(',');
      const got = addGic(circuit, gicName, t, design.parts, o.opamp, { realises, free: { ...free, 1: false } }, inner(t), lossy.get(t));
      parts.push(...got);
    }
    for (const g of dcReference?.groups ?? []) {
      if (g.remedy === 'lossy-converters') continue;
      const name = names.make('RDC', g.node!);
      circuit.addResistor(name, g.remedy === 'dc-return' ? inner(g.node!) : g.node!, GROUND, g.resistorOhms);
      parts.push({ name, kind: 'R', exactValue: g.resistorOhms, role: { kind: 'dc-path', realises: g.inductors.length > 0 ? g.inductors.join(',') : g.node!, free: true } });
    }
    diagnostics.push({
      code: 'GIC_EMBEDDING',
      message: `${inductors.length} inductor(s) embedded behind ${terminals.length} GIC converter(s), k = ${fractionToNumber(k)} s, omega0 = ${fractionToNumber(o.omega0)} rad/s`,
    });
    if (dcReference) {
      for (const g of dcReference.groups) {
        if (g.remedy === 'shunt-resistor') {
          diagnostics.push({ code: 'DC_REFERENCE', message: `node(s) ${g.nodes.join(', ')} touch only capacitors: resistor ${formatOhms(g.resistorOhms)} from ${g.node} to ground` });
          continue;
        }
        const what =
          g.remedy === 'dc-return'
            ? `resistor ${formatOhms(g.resistorOhms)} from the inner node of ${g.node} to ground (a shunt inductor ${(fractionToNumber(k.mul(g.resistorOhms))).toPrecision(4)} H seen outside)`
            : `resistor ${formatOhms(g.resistorOhms)} across each converter capacitor at ${g.nodes.filter((n) => terminals.includes(n)).join(', ')} (each inductor gets Q = ${(ladderCharacteristicOmega(ladder) * fractionToNumber(c.mul(g.resistorOhms))).toPrecision(3)} at ${(ladderCharacteristicOmega(ladder) / (2 * Math.PI)).toPrecision(4)} Hz)`;
        diagnostics.push({ code: 'DC_REFERENCE', message: `inductors ${g.inductors.join(', ')} (nodes ${g.nodes.join(', ')}) have no DC path to ground behind their converters: ${what}` });
      }
      diagnostics.push({
        code: 'DC_PATH_ERROR',
        message: `DC references change the passband gain by at most ${dcReference.errorDb.toExponential(3)} dB (bound ${o.dcPathErrorDb} dB, ${dcReference.passbandHz[0].toPrecision(6)} to ${dcReference.passbandHz[1].toPrecision(6)} Hz)`,
      });
      if (dcReference.errorDb > o.dcPathErrorDb) diagnostics.push({ code: 'DC_PATH_ERROR_ABOVE_BOUND', message: 'no DC-reference level up to 1e9 meets the bound' });
    }
  } else diagnostics.push({ code: 'NO_INDUCTORS', message: 'the ladder has no inductors; no GIC needed' });
  const dcPath: DcPathReport | undefined = dcReference && { errorDb: dcReference.errorDb, boundDb: dcReference.boundDb, passbandEdgeHz: dcReference.passbandHz[1], passbandLowHz: dcReference.passbandHz[0] };
  return { method: 'gic-embedding', circuit, parts, reference: { ladder, transferFunction: h ?? networkLadderTransferFunction(ladder), ...(dcReference ? { withDcPath: dcReference.transferFunction } : {}) }, opamp: o.opamp, dcPath, diagnostics };
}
