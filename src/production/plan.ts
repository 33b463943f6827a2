/**
 * The production-test plan of a design: test points, their nominal gain and phase, their Monte Carlo
 * distributions, the acceptance limits by the decision rule, and per point the predicted yield, the
 * false-accept and false-reject probabilities and Cpk; plus the {@link ProductionPlan} that
 * checkMeasurements reads.
 *
 * The distributions come from Monte Carlo boards (boards.ts: the trials of tolerance's runMonteCarlo),
 * evaluated at the test points; the phase of each board is continued from the nominal unwrapped phase
 * (the convention of tolerance/monte-carlo.ts). Overall figures: the share of boards whose true
 * response is inside every tolerance, and the expected share the test accepts (the average over boards
 * of the product over points of P(accept | true value), measurement errors independent between points).
 */
import { InvalidInputError } from '../errors';
import { maskLimits, wilsonInterval, type ProportionInterval, type SpecMask } from '../tolerance/yield';
import { summarizeSamples, type SampleSummary } from './statistics';
import type { BoardSample } from './boards';
import type { PlanTestPoint, ProductionPlan } from './check';
import type { DecisionRule, MeasurementUncertainty } from './decision-rules';
import { inInterval } from './interval';
import { quantityLimits, type LimitSource, type QuantityLimits } from './limits';
import { acceptanceGivenTrue } from './risk';
import { automaticTestPoints, explicitTestPoints, type TestPoint } from './test-points';
import { createResponseRecorder, type BoardResponses } from './responses';
import { simulateTrim, type TrimSimulation, type TrimSimulationOptions, type TrimSpec } from './trim';

/** A limit source for planning: 'mask' takes the window from the plan's mask at each point. */
export type PlanLimitSource = 'mask' | Exclude<LimitSource, { kind: 'mask' }>;

export interface QuantityPlanOptions {
  readonly source: PlanLimitSource;
  readonly rule: DecisionRule;
  readonly uncertainty: MeasurementUncertainty;
}

export interface ProductionTestOptions {
  /** 'auto' (default; needs the mask) or explicit frequencies in Hz. */
  readonly testPoints?: 'auto' | readonly (number | { readonly frequencyHz: number; readonly id?: string })[];
  readonly mask?: SpecMask;
  /** Added as a test point (role 'trim'). */
  readonly trimFrequencyHz?: number;
  readonly gain: QuantityPlanOptions;
  /** Phase is tested only when given ('mask' is not a phase source). */
  readonly phase?: QuantityPlanOptions;
  readonly interpolation?: ProductionPlan['interpolation'];
  readonly frequencyTolerance?: number;
  /**
   * When the boards are trimmed before the final test: the trim, simulated on every board (trim.ts),
   * and the distributions, limits and yields are those of the trimmed boards. The trim's own yield
   * check uses the gain tolerance limits of the plan's points.
   */
  readonly trim?: { readonly spec: TrimSpec; readonly options?: TrimSimulationOptions };
}

export interface TestPointAnalysis extends TestPoint {
  readonly gain: QuantityLimits;
  /** Phase limits, when phase is tested. */
  readonly phase: QuantityLimits | null;
  /** The nominal phase and its Monte Carlo distribution, tested or not. */
  readonly nominalPhaseDeg: number;
  readonly phaseDistribution: SampleSummary;
}

export interface PlanDiagnostic {
  readonly code: 'NO_LIMIT' | 'EMPTY_ACCEPTANCE' | 'UNSOLVED_BOARDS';
  readonly message: string;
}

export interface ProductionTestDesign {
  readonly points: readonly TestPointAnalysis[];
  /** What checkMeasurements reads. */
  readonly plan: ProductionPlan;
  /** Share of boards with every tested quantity inside its tolerance (true values). */
  readonly conformingShare: number;
  /** Its 95 % Wilson score interval (the boards are a sample of the production). */
  readonly conformingShareInterval: ProportionInterval;
  /** Expected share of boards the test accepts (measurement errors included). */
  readonly expectedAcceptedShare: number;
  readonly boards: number;
  /** The trim simulation, when the plan has a trim. */
  readonly trim: TrimSimulation | null;
  readonly diagnostics: readonly PlanDiagnostic[];
}

/** Gain and phase of every board at the frequencies (untrimmed). Leaves the engine nominal. */
export function boardResponses(boards: BoardSample, frequenciesHz: readonly number[]): BoardResponses {
  boards.restoreNominal();
  const rec = createResponseRecorder(boards.engine, frequenciesHz, boards.count);
  for (let b = 0; b < boards.count; b++) {
    boards.apply(b);
    rec.record(b);
  }
  boards.restoreNominal();
  return rec.responses;
}

/** The production-test design on Monte Carlo boards (see the module comment). */
export function planProductionTest(boards: BoardSample, options: ProductionTestOptions): ProductionTestDesign {
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an options object');
  const spec = options.testPoints ?? 'auto';
  let points: TestPoint[];
  if (spec === 'auto') {
    if (!options.mask) throw new InvalidInputError('INVALID_ARGUMENT', 'options.mask', options.mask, "automatic test points need the spec mask");
    points = automaticTestPoints(options.mask, options.trimFrequencyHz);
  } else {
    points = explicitTestPoints(options.trimFrequencyHz === undefined ? spec : [...spec, { frequencyHz: options.trimFrequencyHz, id: 'trim-1' }]);
  }
  const freqs = points.map((p) => p.frequencyHz);
  const mask = options.mask ? maskLimits(options.mask, freqs) : null;
  if ((options.gain?.source === 'mask' || options.phase?.source === 'mask') && !mask) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'options.mask', options.mask, "limits from 'mask' need the spec mask");
  }
  if (options.phase?.source === 'mask') throw new InvalidInputError('INVALID_ARGUMENT', 'options.phase.source', 'mask', 'the mask has no phase window');
  let resp: BoardResponses;
  let trim: TrimSimulation | null = null;
  if (options.trim) {
    // The trim's own yields are counted against the plan's gain tolerance where it is known before the
    // distributions are (mask, nominal +- tolerance); statistical limits follow from the trimmed boards.
    const g = options.gain?.source;
    boards.restoreNominal();
    const tol = points.map((p, i) => {
      let gainLimitsDb = { lower: -Infinity, upper: Infinity };
      if (g === 'mask') gainLimitsDb = { lower: mask!.minGainDb[i], upper: mask!.maxGainDb[i] };
      else if (g?.kind === 'nominal') {
        const h = boards.engine.transferAt(p.frequencyHz);
        const n = 10 * Math.log10(h[0] * h[0] + h[1] * h[1]);
        gainLimitsDb = { lower: n - g.tolerance, upper: n + g.tolerance };
      }
      return { frequencyHz: p.frequencyHz, gainLimitsDb };
    });
    trim = simulateTrim(boards, options.trim.spec, tol, { ...options.trim.options, recordFrequenciesHz: freqs });
    resp = trim.responses!;
  } else {
    resp = boardResponses(boards, freqs);
  }
  const diagnostics: PlanDiagnostic[] = [];
  const sourceAt = (s: PlanLimitSource, i: number): LimitSource => {
    if (s === 'mask') return { kind: 'mask', limits: { lower: mask!.minGainDb[i], upper: mask!.maxGainDb[i] } };
    if (s.kind === 'statistical' && s.oneSided === undefined && mask) {
      const lo = Number.isFinite(mask.minGainDb[i]);
      const hi = Number.isFinite(mask.maxGainDb[i]);
      if (hi && !lo) return { ...s, oneSided: 'upper' }; // a stopband ceiling: no lower limit
    }
    return s;
  };
  const analyses = points.map((p, i): TestPointAnalysis => {
    const gain = quantityLimits(
      { nominal: resp.nominalGainDb[i], samples: resp.gainDb[i], source: sourceAt(options.gain?.source, i), rule: options.gain?.rule, uncertainty: options.gain?.uncertainty },
      `options.gain`,
    );
    const phase = options.phase
      ? quantityLimits({ nominal: resp.nominalPhaseDeg[i], samples: resp.phaseDeg[i], source: options.phase.source as LimitSource, rule: options.phase.rule, uncertainty: options.phase.uncertainty }, 'options.phase')
      : null;
    for (const [what, q] of [['gain', gain], ['phase', phase]] as const) {
      if (!q) continue;
      if (q.tolerance.lower === -Infinity && q.tolerance.upper === Infinity) diagnostics.push({ code: 'NO_LIMIT', message: `${p.id} (${p.frequencyHz} Hz): no ${what} limit (the point is in no band of the mask)` });
      if (q.acceptance.lower > q.acceptance.upper) diagnostics.push({ code: 'EMPTY_ACCEPTANCE', message: `${p.id} (${p.frequencyHz} Hz): the guard band leaves no ${what} acceptance interval: every board fails` });
    }
    return { ...p, gain, phase, nominalPhaseDeg: resp.nominalPhaseDeg[i], phaseDistribution: summarizeSamples(resp.phaseDeg[i]) };
  });
  // Overall shares over the boards.
  let conforming = 0;
  let accepted = 0;
  let unsolved = 0;
  for (let b = 0; b < boards.count; b++) {
    let ok = true;
    let pAccept = 1;
    analyses.forEach((a, i) => {
      const g = resp.gainDb[i][b];
      if (!Number.isFinite(g)) unsolved++;
      ok &&= inInterval(g, a.gain.tolerance);
      pAccept *= acceptanceGivenTrue(g, a.gain.acceptance, options.gain.uncertainty.standardUncertainty) || 0;
      if (a.phase && options.phase) {
        const ph = resp.phaseDeg[i][b];
        ok &&= inInterval(ph, a.phase.tolerance);
        pAccept *= acceptanceGivenTrue(ph, a.phase.acceptance, options.phase.uncertainty.standardUncertainty) || 0;
      }
    });
    if (ok) conforming++;
    accepted += pAccept;
  }
  if (unsolved > 0) diagnostics.push({ code: 'UNSOLVED_BOARDS', message: `${unsolved} board responses could not be solved (counted as failing)` });
  const testPoints: PlanTestPoint[] = analyses.map((a, i) => ({
    id: a.id,
    frequencyHz: a.frequencyHz,
    nominalGainDb: a.gain.nominal,
    nominalPhaseDeg: resp.nominalPhaseDeg[i],
    gainLimitsDb: a.gain.acceptance,
    ...(a.phase ? { phaseLimitsDeg: a.phase.acceptance } : {}),
  }));
  return {
    points: analyses,
    plan: { testPoints, ...(options.interpolation ? { interpolation: options.interpolation } : {}), ...(options.frequencyTolerance !== undefined ? { frequencyTolerance: options.frequencyTolerance } : {}) },
    conformingShare: conforming / boards.count,
    conformingShareInterval: wilsonInterval(conforming, boards.count),
    expectedAcceptedShare: accepted / boards.count,
    boards: boards.count,
    trim,
    diagnostics,
  };
}
