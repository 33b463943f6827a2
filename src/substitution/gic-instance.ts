/**
 * The two-op-amp GIC as a subcircuit of the realised circuit (A. Antoniou, "Realisation of gyrators
 * using operational amplifiers, and their use in RC-active-network synthesis", Proc. IEE 116(11), 1969;
 * the node numbering and input assignment of converter/gic-nonideal.ts): node 1 the port `p`, Z1 1-2,
 * Z2 2-3, Z3 3-4, Z4 4-5, op-amp UA drives node 2 (+ on 5, - on 3), UB drives node 4 (+ on 1, - on 3).
 *
 * Two uses:
 * - grounded one-port: Z5 from node 5 to ground; the port presents Zin = Z1 Z3 Z5 / (Z2 Z4);
 * - converter (two-port): no Z5, node 5 is a second port `q`; with ideal op-amps V(p) = V(q) and
 *   I(p) = I(q) Z2 Z4 / (Z1 Z3), so a network Z hung on q is seen at p as Z1 Z3 Z / (Z2 Z4)
 *   (the KCL of gic-nonideal.ts's Eq. (1) with Z5 replaced by whatever carries the current out of node 5).
 */
import { Subcircuit, type Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import { DEFAULT_GIC_INPUTS } from '../converter/gic-nonideal';
import type { GicPart, GicParts } from '../converter/configurations';
import type { Fraction } from '../algebra/rational';
import type { RealizedPart } from './realization';

export type GicPositionNumber = 1 | 2 | 3 | 4 | 5;

/** The nodes of the GIC by number; 1 is the port, 5 the converter port (or Z5's top). */
const node = (k: number, converter: boolean): string => (k === 1 ? 'p' : k === 5 && converter ? 'q' : `n${k}`);

/**
 * Adds a GIC instance `name` to `circuit` with its port at `port` and (converter) node 5 at
 * `converterNode`; `parts` from converter/configurations' designGic (z5 required for a one-port,
 * ignored for a converter).
 * Returns the instance's parts, labelled. `free[k]` says whether position k was a free choice.
 * `capacitorShuntOhms` puts a resistor `RP<k>` across the capacitor of position k (a converter's DC
 * reference, dc-reference.ts), labelled 'dc-path'.
 */
export function addGic(
  circuit: Circuit,
  name: string,
  port: string,
  parts: Omit<GicParts, 'z5'> & { readonly z5?: GicPart },
  opamp: OpampModel,
  label: { realises?: string; free: Partial<Record<GicPositionNumber, boolean>> },
  converterNode?: string,
  capacitorShuntOhms?: Fraction,
): RealizedPart[] {
  const converter = converterNode !== undefined;
  const def = new Subcircuit(`GIC_${name}`, converter ? ['p', 'q'] : ['p']);
  const out: RealizedPart[] = [];
  const positions: GicPositionNumber[] = converter ? [1, 2, 3, 4] : [1, 2, 3, 4, 5];
  for (const k of positions) {
    const part = k === 5 ? (parts.z5 as GicPart) : parts[`z${k}` as 'z1' | 'z2' | 'z3' | 'z4'];
    const a = node(k, converter);
    const b = k === 5 ? '0' : node(k + 1, converter);
    const element = `${part.kind}${k}`;
    if (part.kind === 'R') def.addResistor(element, a, b, part.value);
    else def.addCapacitor(element, a, b, part.value);
    if (part.kind === 'C' && capacitorShuntOhms !== undefined) {
      // A converter's DC reference (dc-reference.ts, Eq. (2)): R_p across its capacitor.
      def.addResistor(`RP${k}`, a, b, capacitorShuntOhms);
      out.push({ name: `${name}.RP${k}`, kind: 'R', exactValue: capacitorShuntOhms, role: { kind: 'dc-path', gic: name, position: k, realises: label.realises, free: true } });
    }
    out.push({
      name: `${name}.${element}`,
      kind: part.kind,
      exactValue: part.value,
      role: { kind: 'gic', gic: name, position: k, realises: label.realises, free: label.free[k] ?? false },
    });
  }
  const at = (k: 1 | 3 | 5) => node(k, converter);
  def.addOpamp('UA', { plus: at(DEFAULT_GIC_INPUTS.a.plus), minus: at(DEFAULT_GIC_INPUTS.a.minus), out: node(2, converter) }, opamp);
  def.addOpamp('UB', { plus: at(DEFAULT_GIC_INPUTS.b.plus), minus: at(DEFAULT_GIC_INPUTS.b.minus), out: node(4, converter) }, opamp);
  circuit.addSubcircuit(def, name, converter ? { p: port, q: converterNode } : { p: port });
  return out;
}
