/**
 * Test points: the frequencies a production tester measures, explicit or chosen from the spec mask
 * (tolerance/yield.ts SpecMask: passbands with gain windows, stopbands with a ceiling).
 *
 * Automatic choice (one of each kind that the mask defines; duplicates within 1e-6 relative merged,
 * the first kind kept):
 * - 'passband-centre' of each passband [f1, f2]: the geometric centre sqrt(f1 f2) (the centre of a
 *   bandpass on a log axis); for a band starting at 0 Hz (a lowpass), f2 / 10, a decade below the
 *   edge, where the gain is the passband reference (common practice, no source);
 * - 'passband-edge': each non-zero end of each passband (where the response is most sensitive to the
 *   parts, so the most informative point);
 * - 'stopband': of each stopband, the end nearer (in log f) to a passband edge: the hardest point of
 *   the stopband;
 * - 'trim': the trim frequency, when given.
 * Output sorted by frequency.
 */
import { InvalidInputError, requireFinite } from '../errors';
import { validateMask, type SpecMask } from '../tolerance/yield';

export type TestPointRole = 'passband-centre' | 'passband-edge' | 'stopband' | 'trim' | 'explicit';

export interface TestPoint {
  readonly id: string;
  readonly frequencyHz: number;
  readonly role: TestPointRole;
}

/** The lowpass reference point sits this factor below the edge (a decade). */
export const LOWPASS_CENTRE_RATIO = 10;
/** Test points closer than this (relative) are one point. */
const MERGE_TOLERANCE = 1e-6;

/** Test points from the mask (see the module comment). */
export function automaticTestPoints(mask: SpecMask, trimFrequencyHz?: number): TestPoint[] {
  validateMask(mask);
  const out: TestPoint[] = [];
  const add = (frequencyHz: number, role: TestPointRole) => {
    if (!(frequencyHz > 0) || !Number.isFinite(frequencyHz)) return;
    if (out.some((p) => Math.abs(p.frequencyHz - frequencyHz) <= MERGE_TOLERANCE * frequencyHz)) return;
    out.push({ id: '', frequencyHz, role });
  };
  const edges: number[] = [];
  for (const b of mask.passband) {
    add(b.fromHz > 0 ? Math.sqrt(b.fromHz * b.toHz) : b.toHz / LOWPASS_CENTRE_RATIO, 'passband-centre');
    for (const e of [b.fromHz, b.toHz]) if (e > 0) edges.push(e);
  }
  for (const e of edges) add(e, 'passband-edge');
  for (const s of mask.stopband) {
    const ends = [s.fromHz, s.toHz].filter((f) => f > 0);
    if (ends.length === 0) continue;
    const distance = (f: number) => (edges.length ? Math.min(...edges.map((e) => Math.abs(Math.log(f / e)))) : 0);
    add(ends.reduce((a, b) => (distance(b) < distance(a) ? b : a)), 'stopband');
  }
  if (trimFrequencyHz !== undefined) {
    const f = requireFinite(trimFrequencyHz, 'trimFrequencyHz');
    if (!(f > 0)) throw new InvalidInputError('OUT_OF_RANGE', 'trimFrequencyHz', f, 'must be greater than zero');
    add(f, 'trim');
  }
  return name(out);
}

/** Explicit test points (frequencies in Hz, optional ids); validated, sorted. */
export function explicitTestPoints(points: readonly (number | { readonly frequencyHz: number; readonly id?: string })[]): TestPoint[] {
  if (!Array.isArray(points) || points.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', 'testPoints', points, 'must be a non-empty array');
  const out = points.map((p, i): TestPoint => {
    const f = requireFinite(typeof p === 'number' ? p : p?.frequencyHz, `testPoints[${i}]${typeof p === 'number' ? '' : '.frequencyHz'}`);
    if (!(f > 0)) throw new InvalidInputError('OUT_OF_RANGE', `testPoints[${i}]`, p, 'frequency must be greater than zero');
    const id = typeof p === 'number' ? '' : (p.id ?? '');
    return { id, frequencyHz: f, role: 'explicit' };
  });
  const sorted = [...out].sort((a, b) => a.frequencyHz - b.frequencyHz);
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i].frequencyHz - sorted[i - 1].frequencyHz <= MERGE_TOLERANCE * sorted[i].frequencyHz) {
      throw new InvalidInputError('INVALID_ARGUMENT', 'testPoints', sorted[i].frequencyHz, 'has the same frequency twice');
    }
  }
  return name(out);
}

/** Sorts by frequency and gives unnamed points an id from their role ('passband-edge-2'). */
function name(points: TestPoint[]): TestPoint[] {
  const sorted = [...points].sort((a, b) => a.frequencyHz - b.frequencyHz);
  const count = new Map<string, number>();
  return sorted.map((p) => {
    if (p.id) return p;
    const k = (count.get(p.role) ?? 0) + 1;
    count.set(p.role, k);
    return { ...p, id: `${p.role}-${k}` };
  });
}
