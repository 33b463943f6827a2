/**
 * Preferred values (IEC 60063 E-series) for a realised circuit, by strategy:
 * - 'exact': every part keeps its computed value (for simulation and for proofs);
 * - 'round': every part rounded to the nearest value of its series (log scale);
 * - 'capacitors-first': capacitors rounded to their (coarse) series first; then in each GIC the part the
 *   realisation computed (role.free false) is recomputed exactly so that the GIC presents its element
 *   value again with the rounded capacitors; then every resistor is rounded to its (fine) series. Parts
 *   outside GICs are rounded directly. Common practice, no source: capacitors come in coarse steps and
 *   resistors in fine ones, so a capacitor's rounding is moved into a resistor, where it is small.
 * - 'search' is 'capacitors-first' applied to each candidate realisation of search.ts.
 *
 * The GIC identity (converter/configurations.ts): Zin = K s^p with K = prod_odd k_i / prod_even k_i,
 * k_i = R_i or 1/C_i. Recomputing position j keeps K: k_j = K / K_rest (j odd) or K_rest / K (j even),
 * with K_rest the product with k_j = 1. A converter GIC has no part in position 5; its k_5 is 1.
 */
import { Fraction, Q1, fractionToNumber } from '../algebra/rational';
import { InvalidInputError, requireOneOf } from '../errors';
import { nearestPreferredExact } from '../units/eseries';
import type { Realization, RealizedPart } from '../substitution/realization';
import { SELECTION_STRATEGIES, type PartFamily, type SelectedPart, type Selection, type SelectionDiagnostic, type SelectionOptions } from './selected-part';

const kOf = (kind: 'R' | 'C', value: Fraction): Fraction => (kind === 'R' ? value : Q1.div(value));

/** K of a GIC's parts with position `skip` (if any) counted as k = 1. */
function gicCoefficient(parts: readonly { part: RealizedPart; value: Fraction }[], skip?: number): Fraction {
  let k = Q1;
  for (const { part, value } of parts) {
    const position = part.role.position!;
    if (position === skip) continue;
    const ki = kOf(part.kind, value);
    k = position % 2 === 1 ? k.mul(ki) : k.div(ki);
  }
  return k;
}

/**
 * Chooses preferred values for every part of `realization`. Throws InvalidInputError for an unknown
 * strategy ('options.strategy') or series.
 *
 * @example
 * // const s = selectParts(realization, { strategy: 'capacitors-first',
 * //   resistors: { series: 'E96', tolerancePercent: 1, temperatureCoefficientPpmPerK: 50 },
 * //   capacitors: { series: 'E12', tolerancePercent: 5, temperatureCoefficientPpmPerK: 30 } });
 * // s.parts[i].value is the chosen value of s.parts[i].name
 */
export function selectParts(realization: Realization, options: SelectionOptions): Selection {
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an object');
  const strategy = requireOneOf(options.strategy, 'options.strategy', SELECTION_STRATEGIES);
  const family = (kind: 'R' | 'C'): PartFamily => (kind === 'R' ? options.resistors : options.capacitors);
  const diagnostics: SelectionDiagnostic[] = [];
  const chosen = new Map<string, Fraction>();
  const recomputed = new Map<string, Fraction>();
  const round = (p: RealizedPart, value: Fraction): Fraction => nearestPreferredExact(value, family(p.kind).series);

  if (strategy === 'exact') for (const p of realization.parts) chosen.set(p.name, p.exactValue);
  else if (strategy === 'round') for (const p of realization.parts) chosen.set(p.name, round(p, p.exactValue));
  else {
    // capacitors-first (and each candidate of 'search')
    for (const p of realization.parts) if (p.kind === 'C') chosen.set(p.name, round(p, p.exactValue));
    const gics = new Map<string, RealizedPart[]>();
    for (const p of realization.parts) {
      if (p.role.kind === 'gic' && p.role.gic !== undefined && p.role.position !== undefined) {
        const list = gics.get(p.role.gic) ?? [];
        list.push(p);
        gics.set(p.role.gic, list);
      }
    }
    for (const [gic, parts] of gics) {
      const computed = parts.filter((p) => !p.role.free && p.kind === 'R');
      if (computed.length !== 1) {
        if (parts.some((p) => p.kind === 'C' && !chosen.get(p.name)!.equals(p.exactValue))) {
          diagnostics.push({ code: 'GIC_NOT_RECOMPUTED', message: `${gic}: ${computed.length} computed resistors (expected 1); its resistors were rounded without recomputation` });
        }
        continue;
      }
      const solved = computed[0];
      const position = solved.role.position!;
      const exactK = gicCoefficient(parts.map((part) => ({ part, value: part.exactValue })));
      const restK = gicCoefficient(
        parts.map((part) => ({ part, value: chosen.get(part.name) ?? part.exactValue })),
        position,
      );
      const k = position % 2 === 1 ? exactK.div(restK) : restK.div(exactK);
      recomputed.set(solved.name, k);
    }
    for (const p of realization.parts) if (p.kind === 'R') chosen.set(p.name, round(p, recomputed.get(p.name) ?? p.exactValue));
  }

  const parts: SelectedPart[] = realization.parts.map((p) => {
    const f = family(p.kind);
    const chosenValue = chosen.get(p.name)!;
    return {
      name: p.name,
      kind: p.kind,
      role: p.role,
      exactValue: p.exactValue,
      chosenValue,
      value: fractionToNumber(chosenValue),
      series: strategy === 'exact' ? undefined : f.series,
      tolerancePercent: f.tolerancePercent,
      temperatureCoefficientPpmPerK: f.temperatureCoefficientPpmPerK,
      deviation: fractionToNumber(chosenValue.div(p.exactValue)) - 1,
      ...(recomputed.has(p.name) ? { recomputedValue: recomputed.get(p.name)! } : {}),
    };
  });
  const values: Record<string, Fraction> = Object.create(null);
  for (const p of parts) values[p.name] = p.chosenValue;
  return { strategy, parts, values, diagnostics };
}
