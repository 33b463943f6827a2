/**
 * Preferred values (IEC 60063 E-series) for a realised circuit, by strategy:
 * - 'exact': every part keeps its computed value (for simulation and for proofs);
 * - 'round': every part rounded to the nearest value of its series (log scale);
 * - 'capacitors-first' (capacitors-first.ts): capacitors rounded to their (coarse) series, the resistors
 *   that set element values (each GIC's computed resistor, the embedding route's inductor resistors)
 *   computed exactly for them, keeping each resonator's L C, then rounded to their (fine) series;
 * - 'search' is 'capacitors-first' applied to each candidate realisation of search.ts.
 */
import { type Fraction, fractionToNumber } from '../algebra/rational';
import { InvalidInputError, requireOneOf } from '../errors';
import { nearestPreferredExact } from '../units/eseries';
import type { Realization, RealizedPart } from '../substitution/realization';
import { chooseCapacitorsFirst } from './capacitors-first';
import { SELECTION_STRATEGIES, type PartFamily, type SelectedPart, type Selection, type SelectionDiagnostic, type SelectionOptions } from './selected-part';

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
  const round = (p: RealizedPart, value: Fraction): Fraction => nearestPreferredExact(value, family(p.kind).series);
  let chosen = new Map<string, Fraction>();
  let recomputed: ReadonlyMap<string, Fraction> = new Map();
  let diagnostics: readonly SelectionDiagnostic[] = [];
  if (strategy === 'exact') for (const p of realization.parts) chosen.set(p.name, p.exactValue);
  else if (strategy === 'round') for (const p of realization.parts) chosen.set(p.name, round(p, p.exactValue));
  else {
    // capacitors-first (and each candidate of 'search')
    const c = chooseCapacitorsFirst(realization, round);
    chosen = new Map(c.chosen);
    recomputed = c.recomputed;
    diagnostics = c.diagnostics;
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
