/**
 * Checking measured boards against a production-test plan: a verdict per board and per test point, with
 * the margin to each limit, and a summary.
 *
 * The plan ({@link ProductionPlan}) is the minimal input: test points with their frequency, nominal
 * gain and phase and acceptance limits (already guard-banded by the decision rule, see limits.ts). The
 * design pipeline builds it from the design result.
 *
 * Matching rows to test points: a measured frequency f matches test point f0 when
 * |f - f0| <= frequencyTolerance * f0 (default {@link DEFAULT_FREQUENCY_TOLERANCE}). A row that matches
 * no test point is refused (CsvError, code 'INVALID_CSV', with its line) unless the plan's
 * interpolation is 'log-frequency': then, between the first and the last test point, its nominal values
 * and limits are interpolated linearly in log f between the neighbouring test points (an open limit on
 * either side stays open) and it is checked as an extra point of the board.
 *
 * Streaming and memory: rows are read one at a time and aggregated per board in a map keyed by board
 * id, so rows of a board may be interleaved with others; memory is bounded by (boards x test points),
 * not by the number of rows. With `contiguousBoards: true` a board is finished as soon as the next
 * board's first row arrives (a board id seen again later is an error), `onBoard` receives it, and with
 * `retainBoards: false` nothing per board is kept: memory is then independent of the file length.
 *
 * A board passes when every test point was measured and is inside its limits (phase only where both
 * the plan and the row have it). A point measured twice keeps the last row, with a diagnostic.
 */
import { InvalidInputError, requireFinite } from '../errors';
import { inInterval, type Interval } from './interval';
import { CsvError, linesOfText, MeasurementReader, type MeasurementRow } from './csv';

/** Relative frequency match: 1 ppm, far below any instrument's frequency setting error (common practice, no source). */
export const DEFAULT_FREQUENCY_TOLERANCE = 1e-6;

/** One test point of the plan: what a measured row is compared with. */
export interface PlanTestPoint {
  /** A name for reports ('passband-centre', 'trim', ...); default `f${index}`. */
  readonly id?: string;
  readonly frequencyHz: number;
  readonly nominalGainDb: number;
  readonly nominalPhaseDeg?: number;
  /** Acceptance limits of the measured gain (dB); an open side is +-Infinity. */
  readonly gainLimitsDb: Interval;
  /** Acceptance limits of the measured phase (degrees), when phase is tested. */
  readonly phaseLimitsDeg?: Interval;
}

/** What checkMeasurements needs from a design. */
export interface ProductionPlan {
  readonly testPoints: readonly PlanTestPoint[];
  /** Relative tolerance of the frequency match; default {@link DEFAULT_FREQUENCY_TOLERANCE}. */
  readonly frequencyTolerance?: number;
  /** 'none' (default): a frequency that is not a test point is refused. */
  readonly interpolation?: 'none' | 'log-frequency';
}

export type PointStatus = 'pass' | 'fail' | 'missing';

export interface LimitMargins {
  /** measured - lower (positive inside; Infinity for an open lower limit). */
  readonly lower: number;
  /** upper - measured. */
  readonly upper: number;
}

export interface PointVerdict {
  readonly id: string;
  readonly frequencyHz: number;
  readonly status: PointStatus;
  /** The measured frequency (may differ from the test point's within the tolerance). */
  readonly measuredFrequencyHz?: number;
  readonly gainDb?: number;
  readonly gainPass?: boolean;
  readonly gainMarginDb?: LimitMargins;
  readonly phaseDeg?: number;
  readonly phasePass?: boolean;
  readonly phaseMarginDeg?: LimitMargins;
  /** True for an extra point checked against interpolated limits. */
  readonly interpolated?: boolean;
  /** Line of the row used. */
  readonly line?: number;
}

export interface BoardVerdict {
  readonly board: string;
  readonly pass: boolean;
  /** One per plan test point, in plan order. */
  readonly points: readonly PointVerdict[];
  /** Rows at other frequencies, checked against interpolated limits (log-frequency plans only). */
  readonly interpolatedPoints: readonly PointVerdict[];
}

export interface CheckDiagnostic {
  readonly code: 'DUPLICATE_MEASUREMENT' | 'NO_PHASE_COLUMN';
  readonly message: string;
  readonly line?: number;
}

export interface CheckSummary {
  readonly boards: number;
  readonly passed: number;
  readonly failed: number;
  readonly rows: number;
  /** Per plan test point (plan order): boards failing it (out of limits) and boards missing it. */
  readonly pointFailures: readonly { readonly id: string; readonly frequencyHz: number; readonly failed: number; readonly missing: number }[];
  /** Boards failing only interpolated points. */
  readonly interpolatedFailures: number;
}

export interface CheckResult {
  readonly pass: boolean;
  readonly summary: CheckSummary;
  /** In order of first appearance (empty with retainBoards: false). */
  readonly boards: readonly BoardVerdict[];
  readonly diagnostics: readonly CheckDiagnostic[];
}

export interface CheckOptions {
  /** Rows of a board are contiguous: finish each board when the next begins (default false). */
  readonly contiguousBoards?: boolean;
  /** Called with each finished board (at its end with contiguousBoards, else at the end of input). */
  readonly onBoard?: (board: BoardVerdict) => void;
  /** Keep the board verdicts in the result (default true). */
  readonly retainBoards?: boolean;
}

interface ResolvedPoint {
  readonly id: string;
  readonly frequencyHz: number;
  readonly nominalGainDb: number;
  readonly gain: Interval;
  readonly phase: Interval | null;
}

interface BoardState {
  readonly board: string;
  readonly rows: (MeasurementRow | null)[];
  readonly extra: PointVerdict[];
}

function validateInterval(i: unknown, path: string): Interval {
  if (typeof i !== 'object' || i === null) throw new InvalidInputError('INVALID_ARGUMENT', path, i, 'must be { lower, upper }');
  const { lower, upper } = i as Interval;
  if (typeof lower !== 'number' || Number.isNaN(lower) || lower === Infinity) throw new InvalidInputError('INVALID_NUMBER', `${path}.lower`, lower, 'must be a number or -Infinity');
  if (typeof upper !== 'number' || Number.isNaN(upper) || upper === -Infinity) throw new InvalidInputError('INVALID_NUMBER', `${path}.upper`, upper, 'must be a number or Infinity');
  return { lower, upper };
}

/** Validates a plan (throws InvalidInputError naming the field); test points sorted by frequency. */
function resolvePlan(plan: ProductionPlan): { points: ResolvedPoint[]; order: number[]; tol: number; interpolate: boolean } {
  if (typeof plan !== 'object' || plan === null || !Array.isArray(plan.testPoints) || plan.testPoints.length === 0) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'plan.testPoints', plan?.testPoints, 'must be a non-empty array of test points');
  }
  const tol = plan.frequencyTolerance === undefined ? DEFAULT_FREQUENCY_TOLERANCE : requireFinite(plan.frequencyTolerance, 'plan.frequencyTolerance');
  if (!(tol >= 0 && tol < 0.5)) throw new InvalidInputError('OUT_OF_RANGE', 'plan.frequencyTolerance', tol, 'must be from 0 to 0.5');
  const interp = plan.interpolation ?? 'none';
  if (interp !== 'none' && interp !== 'log-frequency') throw new InvalidInputError('INVALID_ARGUMENT', 'plan.interpolation', interp, "must be 'none' or 'log-frequency'");
  const points = plan.testPoints.map((p, i) => {
    const path = `plan.testPoints[${i}]`;
    if (typeof p !== 'object' || p === null) throw new InvalidInputError('INVALID_ARGUMENT', path, p, 'must be a test point object');
    const f = requireFinite(p.frequencyHz, `${path}.frequencyHz`);
    if (!(f > 0)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.frequencyHz`, f, 'must be greater than zero');
    return {
      id: p.id ?? `f${i}`,
      frequencyHz: f,
      nominalGainDb: requireFinite(p.nominalGainDb, `${path}.nominalGainDb`),
      gain: validateInterval(p.gainLimitsDb, `${path}.gainLimitsDb`),
      phase: p.phaseLimitsDeg === undefined ? null : validateInterval(p.phaseLimitsDeg, `${path}.phaseLimitsDeg`),
    };
  });
  const order = points.map((_, i) => i).sort((a, b) => points[a].frequencyHz - points[b].frequencyHz);
  for (let k = 1; k < order.length; k++) {
    const a = points[order[k - 1]].frequencyHz;
    const b = points[order[k]].frequencyHz;
    if (b - a <= tol * (a + b)) {
      throw new InvalidInputError('INVALID_ARGUMENT', `plan.testPoints[${order[k]}].frequencyHz`, b, `is within the frequency tolerance of test point ${order[k - 1]} (${a} Hz)`);
    }
  }
  return { points, order, tol, interpolate: interp === 'log-frequency' };
}

function margins(x: number, i: Interval): LimitMargins {
  return { lower: x - i.lower, upper: i.upper - x };
}

/** Linear interpolation (t in [0, 1], t linear in log f) of one limit; open on either side gives `open`. */
function lerpLimit(a: number, b: number, t: number, open: number): number {
  return Number.isFinite(a) && Number.isFinite(b) ? a + t * (b - a) : open;
}

function lerpInterval(a: Interval, b: Interval, t: number): Interval {
  return { lower: lerpLimit(a.lower, b.lower, t, -Infinity), upper: lerpLimit(a.upper, b.upper, t, Infinity) };
}

function verdictOf(id: string, f0: number, gain: Interval, phase: Interval | null, row: MeasurementRow, interpolated: boolean): PointVerdict {
  const gainPass = inInterval(row.gainDb, gain);
  const phaseTested = phase !== null && row.phaseDeg !== undefined;
  const phasePass = phaseTested ? inInterval(row.phaseDeg!, phase!) : undefined;
  return {
    id,
    frequencyHz: f0,
    status: gainPass && phasePass !== false ? 'pass' : 'fail',
    measuredFrequencyHz: row.frequencyHz,
    gainDb: row.gainDb,
    gainPass,
    gainMarginDb: margins(row.gainDb, gain),
    ...(phaseTested ? { phaseDeg: row.phaseDeg, phasePass, phaseMarginDeg: margins(row.phaseDeg!, phase!) } : {}),
    ...(interpolated ? { interpolated: true } : {}),
    line: row.line,
  };
}

/**
 * The checker as a push interface: {@link MeasurementChecker.line} for each line, then
 * {@link MeasurementChecker.finish}. checkMeasurements and checkMeasurementsStream are built on it.
 */
export class MeasurementChecker {
  private readonly reader = new MeasurementReader();
  private readonly points: ResolvedPoint[];
  private readonly order: number[];
  private readonly tol: number;
  private readonly interpolate: boolean;
  private readonly boards = new Map<string, BoardState>();
  private readonly finished = new Set<string>();
  private readonly retained: BoardVerdict[] = [];
  private readonly diagnostics: CheckDiagnostic[] = [];
  private readonly failedAt: number[];
  private readonly missingAt: number[];
  private current: BoardState | null = null;
  private rows = 0;
  private passed = 0;
  private failed = 0;
  private interpolatedFailures = 0;

  constructor(
    plan: ProductionPlan,
    private readonly options: CheckOptions = {},
  ) {
    const r = resolvePlan(plan);
    this.points = r.points;
    this.order = r.order;
    this.tol = r.tol;
    this.interpolate = r.interpolate;
    this.failedAt = r.points.map(() => 0);
    this.missingAt = r.points.map(() => 0);
  }

  /** Reads one line (header, comment, blank or a row). Throws CsvError. */
  line(text: string): void {
    const row = this.reader.read(text);
    if (!row) return;
    this.rows++;
    let state: BoardState | undefined;
    if (this.options.contiguousBoards) {
      if (this.current && this.current.board !== row.board) {
        this.finishBoard(this.current);
        this.finished.add(this.current.board);
        this.current = null;
      }
      if (!this.current) {
        if (this.finished.has(row.board)) throw new CsvError(row.line, 'board', row.board, 'this board appeared earlier: with contiguousBoards its rows must be together');
        this.current = { board: row.board, rows: this.points.map(() => null), extra: [] };
      }
      state = this.current;
    } else {
      state = this.boards.get(row.board);
      if (!state) {
        state = { board: row.board, rows: this.points.map(() => null), extra: [] };
        this.boards.set(row.board, state);
      }
    }
    const k = this.match(row.frequencyHz);
    if (k >= 0) {
      const prev = state.rows[k];
      if (prev) this.diagnostics.push({ code: 'DUPLICATE_MEASUREMENT', message: `board ${row.board} test point ${this.points[k].id} measured again on line ${row.line} (line ${prev.line} replaced)`, line: row.line });
      state.rows[k] = row;
      return;
    }
    const extra = this.interpolated(row);
    if (!extra) {
      const list = this.points.map((p) => p.frequencyHz).join(', ');
      throw new CsvError(row.line, 'frequency', row.frequencyHz, `is not a test point (test points: ${list} Hz, relative tolerance ${this.tol})`);
    }
    state.extra.push(extra);
  }

  /** Ends the input; returns the result. */
  finish(): CheckResult {
    if (!this.reader.hasHeader) throw new CsvError(this.reader.linesRead + 1, '', '', 'no header row: the input is empty or only comments');
    if (this.current) this.finishBoard(this.current);
    for (const state of this.boards.values()) this.finishBoard(state);
    if (!this.reader.hasPhase && this.points.some((p) => p.phase)) {
      this.diagnostics.push({ code: 'NO_PHASE_COLUMN', message: 'the plan has phase limits but the file has no phase column: phase was not checked' });
    }
    const boards = this.passed + this.failed;
    return {
      pass: this.failed === 0 && boards > 0,
      summary: {
        boards,
        passed: this.passed,
        failed: this.failed,
        rows: this.rows,
        pointFailures: this.points.map((p, i) => ({ id: p.id, frequencyHz: p.frequencyHz, failed: this.failedAt[i], missing: this.missingAt[i] })),
        interpolatedFailures: this.interpolatedFailures,
      },
      boards: this.retained,
      diagnostics: this.diagnostics,
    };
  }

  /** Index of the test point the frequency matches, or -1 (binary search on the sorted order). */
  private match(f: number): number {
    const { order, points, tol } = this;
    let lo = 0;
    let hi = order.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const f0 = points[order[mid]].frequencyHz;
      if (Math.abs(f - f0) <= tol * f0) return order[mid];
      if (f < f0) hi = mid - 1;
      else lo = mid + 1;
    }
    return -1;
  }

  private interpolated(row: MeasurementRow): PointVerdict | null {
    if (!this.interpolate) return null;
    const { order, points } = this;
    const f = row.frequencyHz;
    for (let k = 0; k + 1 < order.length; k++) {
      const a = points[order[k]];
      const b = points[order[k + 1]];
      if (f < a.frequencyHz || f > b.frequencyHz) continue;
      const t = Math.log(f / a.frequencyHz) / Math.log(b.frequencyHz / a.frequencyHz); // linear in log f
      const gain = lerpInterval(a.gain, b.gain, t);
      const phase = a.phase && b.phase ? lerpInterval(a.phase, b.phase, t) : null;
      return verdictOf(`${a.id}~${b.id}@${f}`, f, gain, phase, row, true);
    }
    return null;
  }

  private finishBoard(state: BoardState): void {
    const points = this.points.map((p, i): PointVerdict => {
      const row = state.rows[i];
      if (!row) {
        this.missingAt[i]++;
        return { id: p.id, frequencyHz: p.frequencyHz, status: 'missing' };
      }
      const v = verdictOf(p.id, p.frequencyHz, p.gain, p.phase, row, false);
      if (v.status === 'fail') this.failedAt[i]++;
      return v;
    });
    const mainPass = points.every((p) => p.status === 'pass');
    const extraPass = state.extra.every((p) => p.status === 'pass');
    if (mainPass && !extraPass) this.interpolatedFailures++;
    const verdict: BoardVerdict = { board: state.board, pass: mainPass && extraPass, points, interpolatedPoints: state.extra };
    if (verdict.pass) this.passed++;
    else this.failed++;
    this.options.onBoard?.(verdict);
    if (this.options.retainBoards !== false) this.retained.push(verdict);
  }
}

/**
 * Checks a whole CSV text (see csv.ts for the format). Throws CsvError for malformed input.
 *
 * @example
 * const plan = { testPoints: [{ id: 'edge', frequencyHz: 1000, nominalGainDb: -3, gainLimitsDb: { lower: -3.5, upper: -2.5 } }] };
 * const r = checkMeasurements(plan, 'board,frequency_hz,gain_db\nA1,1000,-3.1\nA2,1000,-3.9\n');
 * r.summary.passed; // 1
 * r.boards[1].points[0].gainMarginDb.lower; // -0.4: 0.4 dB below the lower limit
 */
export function checkMeasurements(plan: ProductionPlan, csvText: string, options: CheckOptions = {}): CheckResult {
  if (typeof csvText !== 'string') throw new InvalidInputError('INVALID_ARGUMENT', 'csvText', csvText, 'must be a string');
  const checker = new MeasurementChecker(plan, options);
  for (const line of linesOfText(csvText)) checker.line(line);
  return checker.finish();
}

/**
 * Checks lines as they arrive (each item one line; use linesOfChunks for arbitrary text blocks).
 * Memory: see the module comment.
 */
export async function checkMeasurementsStream(plan: ProductionPlan, lines: AsyncIterable<string> | Iterable<string>, options: CheckOptions = {}): Promise<CheckResult> {
  const checker = new MeasurementChecker(plan, options);
  for await (const line of lines) checker.line(line);
  return checker.finish();
}
