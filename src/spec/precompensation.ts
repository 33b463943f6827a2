/**
 * Pre-compensation for finite op-amp gain-bandwidth: in each grounded GIC (simulated inductor or FDNR)
 * the resistor the realisation computed is adjusted so that, with the stated op-amp model, the element
 * the GIC presents has its nominal value at one frequency (the passband edge by default). The first-order
 * error of converter/gic-nonideal.ts (Eq. (2): Zin = Zideal (1 + eps(s))) makes the effective element
 * frequency dependent; matching it at the edge, where a ladder is most sensitive, removes most of the
 * error near the edge (common practice, no source). Converter GICs of the embedding route are left as
 * they are (their element is the network behind them).
 *
 * Method: the effective element of the GIC alone, L_eff = Im Z(jw)/w or D_eff = -1/(w^2 Re Z(jw)), from
 * the exact non-ideal Zin (gicImpedanceNonideal) evaluated in Float64; the solved resistor enters the
 * element as a power +-1 (K = prod_odd k / prod_even k, configurations.ts), so it is scaled by the ratio
 * of nominal to effective, repeated {@link PRECOMPENSATION_ITERATIONS} times (the error itself depends
 * weakly on the resistor). The adjusted values are exact decimals of {@link ADJUSTED_DIGITS} digits and
 * are not E-series values.
 */
import { Fraction, fractionToNumber, toFraction } from '../algebra/rational';
import { compileAc } from '../analysis/ac-engine';
import { gicImpedanceNonideal } from '../converter/gic-nonideal';
import { capacitorImpedance, resistorImpedance } from '../converter/impedances';
import type { Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import type { SelectedPart, Selection } from '../selection/selected-part';
import type { Realization } from '../substitution/realization';
import { evaluationGrid } from './evaluation-grid';
import { opampNames } from './evaluation';
import type { DesignSpec } from './parse-spec';
import type { Edge } from './pipeline-stages';

/** Fixed-point iterations: the correction changes the error by a second-order amount; 4 steps settle it to < 1e-9. */
export const PRECOMPENSATION_ITERATIONS = 4;
/** Significant digits of an adjusted resistor: 1e-8 relative, far below any tolerance. */
export const ADJUSTED_DIGITS = 9;

export interface PrecompensationReport {
  readonly frequencyHz: number;
  /** The resistors changed: name, value before (preferred) and after (ohms). */
  readonly adjusted: readonly { readonly name: string; readonly gic: string; readonly beforeOhms: number; readonly afterOhms: number }[];
  /** The largest |gain(real op-amps) - gain(ideal op-amps)| over the passband, dB, before and after. */
  readonly passbandErrorDb: { readonly before: number; readonly after: number };
}

type Kind = 'L' | 'D';

/** Effective L (H) or D (F s) of an impedance value at w. */
function effective(kind: Kind, z: { re: number; im: number }, w: number): number {
  return kind === 'L' ? z.im / w : -1 / (w * w * z.re);
}

export function precompensate(
  realization: Realization,
  selection: Selection,
  chosenIdeal: Circuit,
  opamp: OpampModel,
  spec: DesignSpec,
): { selection: Selection; report: PrecompensationReport } {
  const frequencyHz = spec.evaluation.precompensationFrequencyHz;
  const w = 2 * Math.PI * frequencyHz;
  const values: Record<string, Fraction> = { ...selection.values };
  const adjusted: PrecompensationReport['adjusted'][number][] = [];
  const groups = new Map<string, SelectedPart[]>();
  for (const p of selection.parts) if (p.role.kind === 'gic' && p.role.gic) groups.set(p.role.gic, [...(groups.get(p.role.gic) ?? []), p]);
  for (const [gic, parts] of groups) {
    const byPos = new Map<number, SelectedPart>(parts.map((p) => [p.role.position!, p]));
    if (!byPos.has(5)) continue; // a converter
    const solved = parts.filter((p) => p.kind === 'R' && !p.role.free);
    if (solved.length !== 1) continue;
    const target = solved[0];
    const position = target.role.position!;
    const z = (val: (p: SelectedPart) => Fraction) => {
      const zk = (k: number) => {
        const p = byPos.get(k)!;
        return p.kind === 'R' ? resistorImpedance(val(p)) : capacitorImpedance(val(p));
      };
      return { z1: zk(1), z2: zk(2), z3: zk(3), z4: zk(4), z5: zk(5) };
    };
    const capsEven = parts.filter((p) => p.kind === 'C' && p.role.position! % 2 === 0).length;
    const capsOdd = parts.filter((p) => p.kind === 'C' && p.role.position! % 2 === 1).length;
    const power = capsEven - capsOdd; // Zin = K s^power
    if (power !== 1 && power !== -2) continue;
    const kind: Kind = power === 1 ? 'L' : 'D';
    const nominalZ = gicImpedanceNonideal(z((p) => values[p.name]), { opamps: { model: 'ideal' } }).evaluateComplex({ re: 0, im: w });
    const nominal = effective(kind, nominalZ, w);
    // Element exponent in the solved resistor: L = K, D = 1/K; K has k_j^(+1) for odd j, ^(-1) for even j.
    const exponent = (kind === 'L' ? 1 : -1) * (position % 2 === 1 ? 1 : -1);
    const before = values[target.name];
    let r = fractionToNumber(before);
    for (let i = 0; i < PRECOMPENSATION_ITERATIONS; i++) {
      const trial = { ...values, [target.name]: toFraction(r.toPrecision(ADJUSTED_DIGITS)) };
      const zr = gicImpedanceNonideal(z((p) => trial[p.name]), { opamps: opamp }).evaluateComplex({ re: 0, im: w });
      const ratio = nominal / effective(kind, zr, w);
      if (!Number.isFinite(ratio) || ratio <= 0) break;
      r *= ratio ** (1 / exponent);
    }
    values[target.name] = toFraction(r.toPrecision(ADJUSTED_DIGITS));
    adjusted.push({ name: target.name, gic, beforeOhms: fractionToNumber(before), afterOhms: r });
  }

  const grid = evaluationGrid(spec.response.type, spec.response.passbandEdgeHz as Edge, undefined, spec.evaluation.sweepPoints);
  const f = grid.frequencyHz.filter((_, i) => grid.passband[i]);
  const names = opampNames(realization.circuit);
  const models = Object.fromEntries(names.map((n) => [n, opamp]));
  const transfer = { input: 'VIN', output: 'out' } as const;
  const ref = compileAc(chosenIdeal, transfer).sweep(f, { nodes: 'none' }).gainDb;
  const err = (vals: Record<string, Fraction>) => {
    const g = compileAc(realization.circuit.withValues(vals, models), transfer).sweep(f, { nodes: 'none' }).gainDb;
    let m = 0;
    for (let i = 0; i < f.length; i++) m = Math.max(m, Math.abs(g[i] - ref[i]));
    return m;
  };
  const report: PrecompensationReport = { frequencyHz, adjusted, passbandErrorDb: { before: err(selection.values), after: err(values) } };
  const parts = selection.parts.map((p) => {
    if (!adjusted.some((a) => a.name === p.name)) return p;
    const chosenValue = values[p.name];
    return { ...p, chosenValue, value: fractionToNumber(chosenValue), series: undefined, deviation: fractionToNumber(chosenValue.div(p.exactValue)) - 1 };
  });
  return { selection: { ...selection, parts, values }, report };
}


