/**
 * The 'search' strategy: capacitors-first applied to several candidate realisations (the capacitor the
 * circuit is built around taken among neighbouring preferred values of its series: on the FDNR route it
 * sets the level of the whole circuit, on the others the GICs' capacitors and resistors), keeping the one whose worst passband error after rounding (ideal op-amps, against the
 * exact realisation) is smallest. Bounded: at most `maxEvaluations` candidates, in order of distance
 * from the starting choice. Common practice, no source: it replaces the trial and error of picking a
 * capacitor value by hand.
 */
import type { Fraction } from '../algebra/rational';
import { UnrealizableError } from '../errors';
import { nextPreferredDownExact, nextPreferredUpExact, type ESeriesName } from '../units/eseries';
import type { Realization } from '../substitution/realization';
import { selectParts } from './select-parts';
import type { Selection, SelectionOptions } from './selected-part';

/** Neighbouring capacitor values tried on each side of the starting one. */
export const SEARCH_CAPACITOR_NEIGHBOURS = 2;

export interface SearchCandidate {
  readonly capacitorF: Fraction;
  /** Worst passband error after rounding, dB (Infinity when the candidate could not be built). */
  readonly errorDb: number;
}

export interface SearchResult {
  readonly realization: Realization;
  readonly selection: Selection;
  readonly best: SearchCandidate;
  readonly candidates: readonly SearchCandidate[];
}

/** The capacitor values around `c` in `series`: c, then one step down and up, two steps... */
export function neighbouringValues(c: Fraction, series: ESeriesName, steps: number): Fraction[] {
  const out: Fraction[] = [c];
  let down = c;
  let up = c;
  for (let i = 0; i < steps; i++) {
    down = nextPreferredDownExact(down.mul(999).div(1000), series);
    up = nextPreferredUpExact(up.mul(1001).div(1000), series);
    out.push(down, up);
  }
  return out;
}

/**
 * Runs the search. `realize(c)` builds a candidate (throwing for one that cannot be built);
 * `errorDb(realization, selection)` scores it. Returns the best; ties keep the earlier candidate.
 */
export function searchParts(
  start: Fraction,
  options: Omit<SelectionOptions, 'strategy'>,
  maxEvaluations: number,
  realize: (capacitorF: Fraction) => Realization,
  errorDb: (realization: Realization, selection: Selection) => number,
): SearchResult {
  const caps = neighbouringValues(start, options.capacitors.series, SEARCH_CAPACITOR_NEIGHBOURS);
  const candidates: SearchCandidate[] = [];
  let best: SearchResult | undefined;
  for (const c of caps.slice(0, Math.max(1, maxEvaluations))) {
    let realization: Realization;
    try {
      realization = realize(c);
    } catch {
      candidates.push({ capacitorF: c, errorDb: Infinity });
      continue;
    }
    const selection = { ...selectParts(realization, { ...options, strategy: 'capacitors-first' }), strategy: 'search' as const };
    const e = errorDb(realization, selection);
    const candidate = { capacitorF: c, errorDb: e };
    candidates.push(candidate);
    if (best === undefined || e < best.best.errorDb) best = { realization, selection, best: candidate, candidates };
  }
  if (best === undefined) throw realizeFailure(start);
  return { ...best, candidates };
}

function realizeFailure(start: Fraction): UnrealizableError {
  return new UnrealizableError('UNREALIZABLE', 'realization.capacitorF', start.toString(), 'no search candidate around this capacitor could be realised');
}
