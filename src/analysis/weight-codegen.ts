/**
 * A straight-line kernel that recomputes every term weight and every group weight of a compiled
 * circuit from its parameter vector: what a Monte Carlo trial or a trim step needs after changing many
 * values at once (CompiledAc.setParameters), instead of one incremental update per changed value
 * (each of which re-sums the groups it touches).
 *
 * The operations and their order are those of the engine's updateTerm (coefficient, then each factor
 * in order: * v, / v or * v ** e) and updateGroup (0, then + each term in order), so the weights are
 * the same bit for bit. Literals only: coefficients printed with String() (exact round trip).
 */
import { cachedFunction, MAX_GENERATED_OPERATIONS, numberLiteral } from './lu-codegen';

/** (parameters, term weights out, group weights out). */
export type WeightKernel = (p: Float64Array, tw: Float64Array, gw: Float64Array) => void;

export interface WeightStructure {
  readonly coefficient: Float64Array;
  /** Factors of term t: factorStart[t] .. factorStart[t + 1]. */
  readonly factorStart: Int32Array;
  readonly factorParameter: Int32Array;
  readonly factorExponent: Int32Array;
  /** Terms of group g: groupStart[g] .. groupStart[g + 1], indices into the term list. */
  readonly groupStart: Int32Array;
  readonly groupTerms: Int32Array;
}

/** The kernel, or null where `new Function` is unavailable or the structure is too large. */
export function generateWeightKernel(s: WeightStructure): WeightKernel | null {
  if (s.factorParameter.length + s.groupTerms.length > MAX_GENERATED_OPERATIONS) return null;
  try {
    return cachedFunction(['p', 'tw', 'gw'], weightSource(s)) as WeightKernel;
  } catch {
    return null;
  }
}

function weightSource(s: WeightStructure): string {
  const lines: string[] = [];
  const terms = s.coefficient.length;
  for (let t = 0; t < terms; t++) {
    let e = numberLiteral(s.coefficient[t]);
    for (let f = s.factorStart[t]; f < s.factorStart[t + 1]; f++) {
      const x = s.factorExponent[f];
      const v = `p[${s.factorParameter[f]}]`;
      e = x === 1 ? `${e} * ${v}` : x === -1 ? `${e} / ${v}` : `${e} * ${v} ** ${x}`;
    }
    lines.push(`const t${t} = ${e}; tw[${t}] = t${t};`);
  }
  for (let g = 0; g + 1 < s.groupStart.length; g++) {
    let e = '0';
    for (let i = s.groupStart[g]; i < s.groupStart[g + 1]; i++) e += ` + t${s.groupTerms[i]}`;
    lines.push(`gw[${g}] = ${e};`);
  }
  return lines.join('\n');
}
