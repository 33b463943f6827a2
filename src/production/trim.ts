/**
 * Firmware trim: a programmable resistance on one code, its trim table, the firmware's trim procedure
 * simulated on every Monte Carlo board, and the sizing of the trim device.
 *
 * Devices (resistance R(code), code an integer):
 * - 'rheostat': a digital potentiometer in rheostat mode, R(code) = Rw + Rab code / N, code 0..N
 *   (Rab the end-to-end resistance, N the number of steps, Rw the wiper resistance). Each board's Rab
 *   deviates by a relative amount drawn uniformly within +-tolerance (often 20 %); the ratio code / N is
 *   taken as exact (the steps of a potentiometer track each other far better than Rab does).
 * - 'resistor-bank': a binary-weighted string of `bits` resistors LSB 2^i in series, each bridged by a
 *   switch; bit i set opens the switch. R(code) = sum over set bits of LSB 2^i (1 + delta_i) + sum over
 *   clear bits of Ron, code 0..2^bits - 1; each delta_i is drawn uniformly within +-bitTolerance.
 * Placement of each trimmed resistor (its design value R0): 'replace' (the device is the resistor),
 * 'series' (a fixed part Rf = R0 - R(centre) in series) or 'parallel' (a fixed part Rf with
 * Rf || R(centre) = R0), where centre = the middle code (N/2 rounded down, or 2^(bits-1)), so that the
 * nominal board sits at mid-range. The fixed part carries the board's Monte Carlo deviation of R0's
 * element (same relative deviation). Several targets may be ganged: one code moves all of them (each
 * its own device instance, with its own tolerance draw).
 *
 * The trim table: T[c] = the gain (dB) at the trim frequency of the nominal board with code c (nominal
 * device). The default code c0 is the code whose T[c] is nearest the target gain G* (default: the
 * design's nominal gain at the trim frequency, with the untrimmed R0).
 *
 * The firmware's procedure (what the simulation does on each board, and what the C header's table is
 * for): with code c0 set, measure the gain g_m at the trim frequency; take the board's deviation as an
 * offset independent of the code, d = g_m - T[c0]; choose c1 = argmin_c |T[c] + d - G*| (the code whose
 * tabulated response, shifted by the measured offset, is nearest the target; ties go to the code
 * nearer c0, then to the lower code); set c1. A further pass repeats this from c1 (measure, d = g_m -
 * T[c1], choose c2, set), and so on for `passes` passes (default 2: the table is for the nominal
 * device, so with Rab off by 20 % one pass leaves about 20 % of the correction). Each measurement
 * carries an independent normal error of standard uncertainty u (dB).
 *
 * Float boundary: everything here is Float64 (the compiled engine's values).
 */
import { InvalidInputError, requireFinite, requireInteger, UnrealizableError } from '../errors';
import type { CompiledAc } from '../analysis/index';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { sampleStandardNormal } from '../tolerance/distributions';
import { BlockStreams } from '../tolerance/random';
import type { BoardSample } from './boards';
import { inInterval, type Interval } from './interval';
import { summarizeSamples, type SampleSummary } from './statistics';
import { createResponseRecorder, type BoardResponses } from './responses';

export type TrimDevice =
  | {
      readonly kind: 'rheostat';
      /** Rab, ohms. */
      readonly endToEndOhms: number;
      /** N: codes 0..N. */
      readonly steps: number;
      /** Rw, ohms (default 0). */
      readonly wiperOhms?: number;
      /** Relative half-width of Rab's tolerance (default 0.2). */
      readonly tolerance?: number;
    }
  | {
      readonly kind: 'resistor-bank';
      readonly bits: number;
      /** The least significant resistor, ohms. */
      readonly lsbOhms: number;
      /** Relative half-width of each bit resistor's tolerance (default 0.01). */
      readonly bitTolerance?: number;
      /** On-resistance of a closed switch, ohms (default 0). */
      readonly switchOnOhms?: number;
    };

/** A digital potentiometer's Rab is often specified to +-20 % (common practice, no source). */
export const DEFAULT_RHEOSTAT_TOLERANCE = 0.2;
/** 1 % bit resistors. */
export const DEFAULT_BIT_TOLERANCE = 0.01;
/** Codes above this are not tabulated (a 12-bit device is the finest a trim needs; the table goes to the header). */
const MAX_CODES = 4097;

export interface TrimTarget {
  /** A resistor of the circuit. */
  readonly element: string;
  readonly placement: 'replace' | 'series' | 'parallel';
}

export interface TrimSpec {
  readonly device: TrimDevice;
  /** One or more resistors on the same code (ganged). */
  readonly targets: readonly TrimTarget[];
  readonly frequencyHz: number;
  /** G*; default the nominal design gain at the trim frequency. */
  readonly targetGainDb?: number;
}

/** A test point for yield: the limits the true (not measured) gain must satisfy. */
export interface TrimTestPoint {
  readonly frequencyHz: number;
  readonly gainLimitsDb: Interval;
}

export interface TrimSimulationOptions {
  /** Standard uncertainty of the firmware's gain measurement at the trim frequency, dB (default 0). */
  readonly measurementUncertaintyDb?: number;
  /** Seed of the device-tolerance and measurement-noise stream (default 1). */
  readonly seed?: number;
  /** Stop once more boards than this have failed after trimming (sizing uses it; default no limit). */
  readonly maxFailures?: number;
  /** Measure-choose-set passes of the firmware (default {@link DEFAULT_TRIM_PASSES}). */
  readonly passes?: number;
  /** Record every board's trimmed gain and phase at these frequencies (TrimSimulation.responses). */
  readonly recordFrequenciesHz?: readonly number[];
}

export interface TrimTableEntry {
  readonly code: number;
  readonly gainDb: number;
  readonly phaseDeg: number;
}

export interface TrimTable {
  readonly frequencyHz: number;
  readonly targetGainDb: number;
  readonly defaultCode: number;
  readonly entries: readonly TrimTableEntry[];
  /** Per target: the fixed resistor to fit (NaN for 'replace'). */
  readonly fixedOhms: readonly { readonly element: string; readonly placement: TrimTarget['placement']; readonly ohms: number }[];
}

export interface TrimSimulation {
  readonly table: TrimTable;
  readonly boards: number;
  /** Share of boards inside every test point's limits with the default code. */
  readonly untrimmedYield: number;
  /** The same after the firmware's trim. */
  readonly trimmedYield: number;
  /** Gain error at the trim frequency, true gain - G*, before and after. */
  readonly untrimmedError: SampleSummary;
  readonly trimmedError: SampleSummary;
  /** Per board: the chosen code, the true gain at the trim frequency after trimming, and T[c*] + d (the firmware's prediction). */
  readonly codes: Int32Array;
  readonly trimmedGainDb: Float64Array;
  readonly predictedGainDb: Float64Array;
  /** Boards whose chosen code is the first or the last (the range ran out). */
  readonly atRangeEnd: number;
  /** Per test point: the gain error against the nominal design gain there, before and after the trim. */
  readonly pointErrors: readonly { readonly frequencyHz: number; readonly untrimmed: SampleSummary; readonly trimmed: SampleSummary }[];
  /**
   * Boards simulated: all of them, unless sizing stopped a candidate early once more boards had failed
   * than the share allows (then the yields are over the boards simulated, and the candidate fails).
   */
  readonly simulatedBoards: number;
  /** The trimmed boards' responses at options.recordFrequenciesHz (null when not asked). */
  readonly responses: BoardResponses | null;
  readonly diagnostics: readonly TrimDiagnostic[];
}

export interface TrimDiagnostic {
  readonly code: 'TRIM_RANGE_EXHAUSTED' | 'TRIM_TABLE_NOT_MONOTONE' | 'TRIM_DEFAULT_AT_END';
  readonly message: string;
}

/** Warn when more boards than this share end at the first or last code (the range is too small for them). */
const RANGE_END_WARNING_SHARE = 0.005;

/** A validated device: its code count, centre code and R(code, deviations). */
export interface ResolvedDevice {
  readonly device: TrimDevice;
  readonly codes: number;
  readonly centre: number;
  /** Random deviation count per instance. */
  readonly draws: number;
  readonly tolerance: number;
  /** Resistance of code c with deviations d (length draws). */
  resistance(code: number, d: ArrayLike<number>): number;
}

/** Validates a device; throws InvalidInputError naming the field. */
export function resolveTrimDevice(device: TrimDevice, path = 'trim.device'): ResolvedDevice {
  if (typeof device !== 'object' || device === null) throw new InvalidInputError('INVALID_ARGUMENT', path, device, 'must be a trim device');
  if (device.kind === 'rheostat') {
    const rab = positive(device.endToEndOhms, `${path}.endToEndOhms`);
    const n = requireInteger(device.steps, `${path}.steps`, 1, MAX_CODES - 1);
    const rw = nonNegative(device.wiperOhms ?? 0, `${path}.wiperOhms`);
    const tol = relative(device.tolerance ?? DEFAULT_RHEOSTAT_TOLERANCE, `${path}.tolerance`);
    return { device, codes: n + 1, centre: Math.floor(n / 2), draws: 1, tolerance: tol, resistance: (c, d) => rw + (rab * (1 + d[0]) * c) / n };
  }
  if (device.kind === 'resistor-bank') {
    const bits = requireInteger(device.bits, `${path}.bits`, 1, Math.log2(MAX_CODES - 1));
    const lsb = positive(device.lsbOhms, `${path}.lsbOhms`);
    const ron = nonNegative(device.switchOnOhms ?? 0, `${path}.switchOnOhms`);
    const tol = relative(device.bitTolerance ?? DEFAULT_BIT_TOLERANCE, `${path}.bitTolerance`);
    return {
      device,
      codes: 2 ** bits,
      centre: 2 ** (bits - 1),
      draws: bits,
      tolerance: tol,
      resistance: (c, d) => {
        let r = 0;
        for (let i = 0; i < bits; i++) r += (c >> i) & 1 ? lsb * 2 ** i * (1 + d[i]) : ron;
        return r;
      },
    };
  }
  throw new InvalidInputError('INVALID_ARGUMENT', `${path}.kind`, (device as { kind?: unknown }).kind, "must be 'rheostat' or 'resistor-bank'");
}

/** The resistance range of a device (R(last) - R(0), nominal) and its smallest step. */
export function trimRange(device: TrimDevice): { readonly rangeOhms: number; readonly stepOhms: number; readonly codes: number } {
  const d = resolveTrimDevice(device);
  const zero = new Float64Array(d.draws);
  const step = device.kind === 'rheostat' ? device.endToEndOhms / device.steps : device.lsbOhms;
  return { rangeOhms: d.resistance(d.codes - 1, zero) - d.resistance(0, zero), stepOhms: step, codes: d.codes };
}

function positive(x: unknown, path: string): number {
  const v = requireFinite(x, path);
  if (!(v > 0)) throw new InvalidInputError('OUT_OF_RANGE', path, x, 'must be greater than zero');
  return v;
}
function nonNegative(x: unknown, path: string): number {
  const v = requireFinite(x, path);
  if (!(v >= 0)) throw new InvalidInputError('OUT_OF_RANGE', path, x, 'must not be negative');
  return v;
}
function relative(x: unknown, path: string): number {
  const v = requireFinite(x, path);
  if (!(v >= 0 && v < 1)) throw new InvalidInputError('OUT_OF_RANGE', path, x, 'must be a relative tolerance from 0 to below 1');
  return v;
}

interface Target {
  readonly element: string;
  readonly placement: TrimTarget['placement'];
  readonly slot: number;
  /** The design value R0. */
  readonly designOhms: number;
  /** Index in the board values, or -1 when the element does not vary. */
  readonly boardIndex: number;
  readonly fixedOhms: number;
}

/** Effective resistance of one target: device r (this board), fixed part scaled by the board's deviation. */
function effective(t: Target, r: number, boardScale: number): number {
  if (t.placement === 'replace') return r;
  const rf = t.fixedOhms * boardScale;
  return t.placement === 'series' ? rf + r : (rf * r) / (rf + r);
}

function gainPhaseAt(engine: CompiledAc, f: number, h: Float64Array): [number, number] {
  engine.transferAt(f, h);
  return [10 * Math.log10(h[0] * h[0] + h[1] * h[1]), (Math.atan2(h[1], h[0]) * 180) / Math.PI];
}

function resolveTargets(boards: BoardSample, spec: TrimSpec, device: ResolvedDevice): Target[] {
  if (!Array.isArray(spec.targets) || spec.targets.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', 'trim.targets', spec.targets, 'must list at least one resistor');
  const seen = new Set<string>();
  const zero = new Float64Array(device.draws);
  const rc = device.resistance(device.centre, zero);
  return spec.targets.map((t, i) => {
    const path = `trim.targets[${i}]`;
    const el = boards.circuit.element(t?.element);
    if (!el || el.kind !== 'R') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, t?.element, 'must be a resistor of the circuit');
    if (seen.has(t.element)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, t.element, 'is listed twice');
    seen.add(t.element);
    if (t.placement !== 'replace' && t.placement !== 'series' && t.placement !== 'parallel') {
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.placement`, t.placement, "must be 'replace', 'series' or 'parallel'");
    }
    const slot = boards.engine.parameterIndex(t.element);
    const boardIndex = boards.parameters.indexOf(t.element);
    const designOhms = boardIndex >= 0 ? boards.nominal[boardIndex] : boards.engine.parameters[slot];
    let fixedOhms = NaN;
    if (t.placement === 'series') fixedOhms = designOhms - rc;
    if (t.placement === 'parallel') fixedOhms = 1 / (1 / designOhms - 1 / rc);
    if (t.placement !== 'replace' && !(fixedOhms > 0)) {
      throw new UnrealizableError('UNREALIZABLE', `${path}.placement`, t.placement, `the device's mid-range ${rc} ohm leaves no positive fixed resistor for ${designOhms} ohm`);
    }
    return { element: t.element, placement: t.placement, slot, designOhms, boardIndex, fixedOhms };
  });
}

/** The trim table of `spec` on the nominal board (see the module comment). Leaves the engine nominal. */
export function trimTable(boards: BoardSample, spec: TrimSpec): TrimTable {
  const device = resolveTrimDevice(spec?.device);
  const targets = resolveTargets(boards, spec, device);
  const f = positive(spec.frequencyHz, 'trim.frequencyHz');
  return buildTable(boards, spec, device, targets, f);
}

function buildTable(boards: BoardSample, spec: TrimSpec, device: ResolvedDevice, targets: Target[], f: number): TrimTable {
  const e = boards.engine;
  const h = new Float64Array(2);
  boards.restoreNominal();
  for (const t of targets) e.setParameter(t.slot, t.designOhms);
  const target = spec.targetGainDb === undefined ? gainPhaseAt(e, f, h)[0] : requireFinite(spec.targetGainDb, 'trim.targetGainDb');
  const zero = new Float64Array(device.draws);
  const entries: TrimTableEntry[] = [];
  for (let c = 0; c < device.codes; c++) {
    const r = device.resistance(c, zero);
    for (const t of targets) e.setParameter(t.slot, effective(t, r, 1));
    const [gainDb, phaseDeg] = gainPhaseAt(e, f, h);
    entries.push({ code: c, gainDb, phaseDeg });
  }
  for (const t of targets) e.setParameter(t.slot, t.designOhms);
  const defaultCode = chooseCode(entries, target, Math.floor(device.codes / 2));
  return { frequencyHz: f, targetGainDb: target, defaultCode, entries, fixedOhms: targets.map((t) => ({ element: t.element, placement: t.placement, ohms: t.fixedOhms })) };
}

/** argmin_c |T[c] - wanted|; ties to the code nearer `near`, then the lower code. NaN entries are never chosen. */
export function chooseCode(entries: readonly TrimTableEntry[], wanted: number, near: number): number {
  let best = -1;
  let bestErr = Infinity;
  for (const en of entries) {
    const err = Math.abs(en.gainDb - wanted);
    if (!(err <= bestErr)) continue;
    if (err === bestErr && best >= 0 && Math.abs(en.code - near) >= Math.abs(best - near)) continue;
    best = en.code;
    bestErr = err;
  }
  return best;
}

/** The firmware's choice for a gain measured with code `atCode` set (default: the default code); see the module comment. */
export function firmwareCode(table: TrimTable, measuredGainDb: number, atCode: number = table.defaultCode): number {
  const offset = measuredGainDb - table.entries[atCode].gainDb;
  return chooseCode(table.entries, table.targetGainDb - offset, atCode);
}

/**
 * Two passes: the first pass's error is about the device tolerance times the correction (the table
 * assumes the nominal Rab), the second removes most of it; more passes gain little (each shrinks the
 * error by that same factor, about 0.2 for a +-20 % part).
 */
export const DEFAULT_TRIM_PASSES = 2;
/** A production trim loop that has not settled in 10 passes is not going to. */
const MAX_TRIM_PASSES = 10;

/** Trim-stream salt: the device and noise draws come from a stream apart from the boards' (seed XOR this). */
const TRIM_STREAM_SALT = 0x7452494d; // 'TRIM'

/** Simulates the firmware's trim on every board (see the module comment). */
export function simulateTrim(boards: BoardSample, spec: TrimSpec, testPoints: readonly TrimTestPoint[], options: TrimSimulationOptions = {}): TrimSimulation {
  const device = resolveTrimDevice(spec?.device);
  const targets = resolveTargets(boards, spec, device);
  const f = positive(spec.frequencyHz, 'trim.frequencyHz');
  const u = nonNegative(options.measurementUncertaintyDb ?? 0, 'options.measurementUncertaintyDb');
  const seed = requireInteger(options.seed ?? 1, 'options.seed', -(2 ** 31), 2 ** 31 - 1);
  if (!Array.isArray(testPoints)) throw new InvalidInputError('INVALID_ARGUMENT', 'testPoints', testPoints, 'must be an array');
  testPoints.forEach((p, i) => positive(p?.frequencyHz, `testPoints[${i}].frequencyHz`));
  const table = buildTable(boards, spec, device, targets, f);
  const rng = new BlockStreams(seed ^ TRIM_STREAM_SALT).generatorFor(0);
  const maxFailures = options.maxFailures ?? Infinity;
  const iterations = requireInteger(options.passes ?? DEFAULT_TRIM_PASSES, 'options.passes', 1, MAX_TRIM_PASSES);
  const record = options.recordFrequenciesHz;
  if (record !== undefined) {
    if (!Array.isArray(record)) throw new InvalidInputError('INVALID_ARGUMENT', 'options.recordFrequenciesHz', record, 'must be an array of frequencies');
    record.forEach((x, i) => positive(x, `options.recordFrequenciesHz[${i}]`));
  }
  try {
    return runTrim(boards, table, device, targets, testPoints, u, rng, maxFailures, record ?? null, iterations);
  } finally {
    boards.restoreNominal();
    for (const t of targets) boards.engine.setParameter(t.slot, t.designOhms);
  }
}

function runTrim(
  boards: BoardSample,
  table: TrimTable,
  device: ResolvedDevice,
  targets: Target[],
  points: readonly TrimTestPoint[],
  u: number,
  rng: RandomGenerator,
  maxFailures: number,
  record: readonly number[] | null,
  iterations: number,
): TrimSimulation {
  const e = boards.engine;
  const n = boards.count;
  const q = boards.parameters.length;
  const h = new Float64Array(2);
  const dev = targets.map(() => new Float64Array(device.draws));
  const scale = new Float64Array(targets.length);
  const codes = new Int32Array(n);
  const trimmedGainDb = new Float64Array(n);
  const predictedGainDb = new Float64Array(n);
  const before = new Float64Array(n);
  const after = new Float64Array(n);
  let passBefore = 0;
  let passAfter = 0;
  let atEnd = 0;
  const setCode = (c: number) => {
    targets.forEach((t, k) => e.setParameter(t.slot, effective(t, device.resistance(c, dev[k]), scale[k])));
  };
  // Nominal design gain at each test point (engine nominal here: buildTable restored it).
  boards.restoreNominal();
  const nominalAt = points.map((p) => gainPhaseAt(e, p.frequencyHz, h)[0]);
  const recorder = record ? createResponseRecorder(e, record, n) : null;
  const errBefore = points.map(() => new Float64Array(n));
  const errAfter = points.map(() => new Float64Array(n));
  const passes = (b: number, into: Float64Array[]) => {
    let ok = true;
    points.forEach((p, i) => {
      const g = gainPhaseAt(e, p.frequencyHz, h)[0];
      into[i][b] = g - nominalAt[i];
      if (!inInterval(g, p.gainLimitsDb)) ok = false;
    });
    return ok;
  };
  const f = table.frequencyHz;
  let done = 0;
  for (let b = 0; b < n && done - passAfter <= maxFailures; b++, done++) {
    boards.apply(b);
    targets.forEach((t, k) => {
      scale[k] = t.boardIndex >= 0 ? boards.values[b * q + t.boardIndex] / t.designOhms : 1;
      for (let i = 0; i < device.draws; i++) dev[k][i] = device.tolerance * (2 * uniformFloat64(rng) - 1); // uniform within +-tolerance
    });
    setCode(table.defaultCode);
    const g0 = gainPhaseAt(e, f, h)[0];
    before[b] = g0 - table.targetGainDb;
    if (passes(b, errBefore)) passBefore++;
    // The firmware's passes: measure at the current code, choose, set (module comment).
    let c = table.defaultCode;
    let g = g0;
    for (let it = 0; it < iterations; it++) {
      const measured = g + (u > 0 ? u * sampleStandardNormal(rng) : 0);
      const next = firmwareCode(table, measured, c);
      predictedGainDb[b] = table.entries[next].gainDb + (measured - table.entries[c].gainDb);
      c = next;
      setCode(c);
      g = gainPhaseAt(e, f, h)[0];
    }
    codes[b] = c;
    if (c === 0 || c === device.codes - 1) atEnd++;
    const g1 = g;
    trimmedGainDb[b] = g1;
    after[b] = g1 - table.targetGainDb;
    if (passes(b, errAfter)) passAfter++;
    recorder?.record(b);
  }
  const upTo = (a: Float64Array) => (done === n ? a : a.slice(0, done));
  return {
    table,
    boards: n,
    untrimmedYield: passBefore / done,
    trimmedYield: passAfter / done,
    untrimmedError: summarizeSamples(upTo(before)),
    trimmedError: summarizeSamples(upTo(after)),
    codes: done === n ? codes : codes.slice(0, done),
    trimmedGainDb: upTo(trimmedGainDb),
    predictedGainDb: upTo(predictedGainDb),
    atRangeEnd: atEnd,
    pointErrors: points.map((p, i) => ({ frequencyHz: p.frequencyHz, untrimmed: summarizeSamples(upTo(errBefore[i])), trimmed: summarizeSamples(upTo(errAfter[i])) })),
    simulatedBoards: done,
    responses: recorder ? recorder.responses : null,
    diagnostics: trimDiagnostics(table, atEnd, done, done === n ? codes : codes.slice(0, done)),
  };
}

function trimDiagnostics(table: TrimTable, atEnd: number, boards: number, codes: Int32Array): TrimDiagnostic[] {
  const out: TrimDiagnostic[] = [];
  if (atEnd > RANGE_END_WARNING_SHARE * boards) {
    out.push({ code: 'TRIM_RANGE_EXHAUSTED', message: `${atEnd} of ${boards} boards ended at the first or last code: the trim range is too small for them` });
  }
  // Monotone over the codes the boards use (and the default): where the firmware works.
  let lo = table.defaultCode;
  let hi = table.defaultCode;
  for (const c of codes) {
    lo = Math.min(lo, c);
    hi = Math.max(hi, c);
  }
  const g = table.entries.slice(lo, hi + 1).map((e) => e.gainDb);
  const rising = g.every((x, i) => i === 0 || x >= g[i - 1]);
  const falling = g.every((x, i) => i === 0 || x <= g[i - 1]);
  if (!rising && !falling) {
    out.push({ code: 'TRIM_TABLE_NOT_MONOTONE', message: `the gain at the trim frequency is not monotone in the code over the codes used (${lo}..${hi}): a measured offset may have two answers` });
  }
  const last = table.entries.length - 1;
  if (table.defaultCode === 0 || table.defaultCode === last) {
    out.push({ code: 'TRIM_DEFAULT_AT_END', message: `the default code ${table.defaultCode} is at the end of the range: the device cannot reach the design value from both sides` });
  }
  return out;
}

export interface TrimSizingOptions extends TrimSimulationOptions {
  /** The share of boards that must end inside the limits (e.g. 0.995). */
  readonly requiredShare: number;
}

export interface TrimSizingCandidate {
  readonly device: TrimDevice;
  readonly rangeOhms: number;
  readonly stepOhms: number;
  readonly codes: number;
  /**
   * Post-trim yield over the boards simulated; NaN when the candidate cannot be fitted. A candidate
   * stopped early (simulatedBoards < boards) has failed the share whatever this value says.
   */
  readonly trimmedYield: number;
  readonly simulatedBoards: number;
  readonly feasible: boolean;
}

export interface TrimSizing {
  /** The chosen device, or null when no candidate reaches the share. */
  readonly chosen: TrimDevice | null;
  readonly simulation: TrimSimulation | null;
  /** The candidates in the order tried (smallest range first, then fewest codes). */
  readonly candidates: readonly TrimSizingCandidate[];
}

/**
 * The smallest trim device from `candidates` that brings at least `requiredShare` of the boards inside
 * the test points' limits after the firmware's trim, device tolerance included. "Smallest": the least
 * resistance range, then the fewest codes (the coarsest step that suffices). Candidates are tried in
 * that order and the first that reaches the share is chosen; each candidate's yield does not depend on
 * the share (same boards, same seed), so the choice is monotone in the share. Candidates that cannot
 * be fitted (no positive fixed resistor) are skipped.
 */
export function sizeTrim(boards: BoardSample, base: Omit<TrimSpec, 'device'>, candidates: readonly TrimDevice[], testPoints: readonly TrimTestPoint[], options: TrimSizingOptions): TrimSizing {
  const share = requireFinite(options?.requiredShare, 'options.requiredShare');
  if (!(share > 0 && share <= 1)) throw new InvalidInputError('OUT_OF_RANGE', 'options.requiredShare', share, 'must be a share in (0, 1]');
  if (!Array.isArray(candidates) || candidates.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', 'candidates', candidates, 'must list at least one device');
  const ordered = candidates
    .map((device, i) => ({ device, ...trimRange(resolveTrimDevice(device, `candidates[${i}]`).device), i }))
    .sort((a, b) => a.rangeOhms - b.rangeOhms || a.codes - b.codes || a.i - b.i);
  const tried: TrimSizingCandidate[] = [];
  // A candidate fails the share as soon as more than (1 - share) n boards fail: stop it there.
  const maxFailures = Math.floor((1 - share) * boards.count + 1e-9 * boards.count);
  for (const c of ordered) {
    let sim: TrimSimulation | null = null;
    try {
      sim = simulateTrim(boards, { ...base, device: c.device }, testPoints, { ...options, maxFailures });
    } catch (err) {
      if (!(err instanceof UnrealizableError)) throw err;
    }
    const complete = sim !== null && sim.simulatedBoards === boards.count;
    tried.push({
      device: c.device,
      rangeOhms: c.rangeOhms,
      stepOhms: c.stepOhms,
      codes: c.codes,
      trimmedYield: sim ? sim.trimmedYield : NaN,
      simulatedBoards: sim ? sim.simulatedBoards : 0,
      feasible: sim !== null,
    });
    if (sim && complete && sim.trimmedYield >= share) return { chosen: c.device, simulation: sim, candidates: tried };
  }
  return { chosen: null, simulation: null, candidates: tried };
}

/** Standard options for sizing: common digital-potentiometer values and resolutions (common practice, no source). */
export const STANDARD_RHEOSTATS: readonly TrimDevice[] = [1e3, 2e3, 5e3, 1e4, 2e4, 5e4, 1e5].flatMap((rab) =>
  [32, 64, 128, 256].map((steps): TrimDevice => ({ kind: 'rheostat', endToEndOhms: rab, steps, wiperOhms: 75, tolerance: DEFAULT_RHEOSTAT_TOLERANCE })),
);

/** Resistor-bank candidates: every LSB with every bit count (for sizing), with the given part options. */
export function resistorBankOptions(
  lsbOhms: readonly number[],
  bits: readonly number[],
  parts: { readonly bitTolerance?: number; readonly switchOnOhms?: number } = {},
): TrimDevice[] {
  return lsbOhms.flatMap((lsb) => bits.map((b): TrimDevice => ({ kind: 'resistor-bank', bits: b, lsbOhms: lsb, ...parts })));
}
