/**
 * What the production stage adds to a design's outputs: the header's test points and trim table, the
 * gain plot's Monte Carlo envelope and test limits, and the report's production section. The envelope
 * is a streamed Monte Carlo (tolerance/monte-carlo.ts) on a coarser grid than the evaluation.
 */
import { runMonteCarlo } from '../tolerance/index';
import { renderCsv, type HeaderTestPoint, type HeaderTrim } from '../export/index';
import type { FilterDesign } from './design-filter';
import type { HeaderExtras, PlotExtras } from './outputs';
import { planDesignProduction, type DesignProduction } from './production';

const TRANSFER = { input: 'VIN', output: 'out' } as const;

/**
 * Stands for "no lower limit" in the C header's test-limit table (a stopband point has only an upper
 * limit): far below any measurable gain, and a valid float, where -INFINITY would not be portable C89.
 */
export const NO_LOWER_LIMIT_DB = -400;
/** Likewise "no upper limit". */
export const NO_UPPER_LIMIT_DB = 400;
/** Points of the envelope sweep: enough for a smooth band on a plot. */
const ENVELOPE_POINTS = 80;
/** Trials of the envelope sweep at most (the plot needs the quantiles, not the tails to 1e-4). */
const ENVELOPE_TRIALS = 4000;
/** The envelope is the central 99 % of the boards. */
const ENVELOPE_QUANTILES = [0.005, 0.995];

export interface ProductionOutputs {
  readonly production: DesignProduction;
  readonly headerExtras: HeaderExtras;
  readonly plotExtras: PlotExtras;
  /** The report's `production` and `trim` sections. */
  readonly report: Record<string, unknown>;
  /** Lines for the CLI summary. */
  readonly summary: string;
  /** The Monte Carlo gain quantiles on the envelope grid, as CSV. */
  readonly monteCarloCsv: string;
}

const clampLimit = (x: number, fallback: number): number => (Number.isFinite(x) ? x : fallback);

export function productionOutputs(design: FilterDesign, onProgress?: (done: number, total: number) => void): ProductionOutputs | null {
  const production = planDesignProduction(design);
  if (!production) return null;
  const test = production.test;
  const testPoints: HeaderTestPoint[] = test.points.map((p) => ({
    frequencyHz: p.frequencyHz,
    gainDb: p.gain.nominal,
    phaseDeg: p.nominalPhaseDeg,
    lowDb: clampLimit(p.gain.acceptance.lower, NO_LOWER_LIMIT_DB),
    highDb: clampLimit(p.gain.acceptance.upper, NO_UPPER_LIMIT_DB),
  }));
  const trim: HeaderTrim | undefined = test.trim
    ? { codes: test.trim.table.entries.map((e) => ({ code: e.code, gainDb: e.gainDb, phaseDeg: e.phaseDeg })), defaultCode: test.trim.table.defaultCode }
    : undefined;
  const f = design.evaluation.frequencyHz;
  const lo = f[0];
  const hi = f[f.length - 1];
  const grid = Array.from({ length: ENVELOPE_POINTS }, (_, i) => lo * (hi / lo) ** (i / (ENVELOPE_POINTS - 1)));
  const mc = runMonteCarlo(design.circuit, TRANSFER, production.tolerances, {
    frequenciesHz: grid,
    trials: Math.min(ENVELOPE_TRIALS, design.spec.production.trials),
    seed: design.spec.production.seed,
    quantiles: ENVELOPE_QUANTILES,
    onProgress: onProgress ? (p) => onProgress(p.completedTrials, p.totalTrials) : undefined,
  });
  const plotExtras: PlotExtras = {
    envelope: { label: 'Monte Carlo 0.5 % to 99.5 %', frequencyHz: grid, lower: mc.gainDb.quantiles[0], upper: mc.gainDb.quantiles[1] },
    testLimits: test.points.map((p) => ({
      frequencyHz: p.frequencyHz,
      gainDb: p.gain.nominal,
      phaseDeg: p.nominalPhaseDeg,
      lowDb: Number.isFinite(p.gain.acceptance.lower) ? p.gain.acceptance.lower : p.gain.nominal,
      highDb: Number.isFinite(p.gain.acceptance.upper) ? p.gain.acceptance.upper : p.gain.nominal,
    })),
  };
  const report: Record<string, unknown> = {
    production: {
      trials: test.boards,
      conformingShare: test.conformingShare,
      conformingShareInterval: test.conformingShareInterval,
      expectedAcceptedShare: test.expectedAcceptedShare,
      noLowerLimitDb: NO_LOWER_LIMIT_DB,
      points: test.points.map((p) => ({
        id: p.id,
        role: p.role,
        frequencyHz: p.frequencyHz,
        nominalGainDb: p.gain.nominal,
        nominalPhaseDeg: p.nominalPhaseDeg,
        meanGainDb: p.gain.mean,
        sdGainDb: p.gain.sd,
        toleranceDb: p.gain.tolerance,
        guardBandDb: p.gain.guardBand,
        acceptanceDb: p.gain.acceptance,
        predictedYield: p.gain.predictedYield,
        falseAccept: p.gain.falseAccept,
        falseReject: p.gain.falseReject,
        capability: p.gain.capability,
      })),
      diagnostics: test.diagnostics,
    },
    ...(test.trim
      ? {
          trim: {
            targets: production.trimTargets,
            frequencyHz: test.trim.table.frequencyHz,
            targetGainDb: test.trim.table.targetGainDb,
            defaultCode: test.trim.table.defaultCode,
            fixedOhms: test.trim.table.fixedOhms,
            untrimmedYield: test.trim.untrimmedYield,
            trimmedYield: test.trim.trimmedYield,
            boardsAtRangeEnd: test.trim.atRangeEnd,
            untrimmedErrorDb: test.trim.untrimmedError,
            trimmedErrorDb: test.trim.trimmedError,
            table: test.trim.table.entries,
          },
        }
      : {}),
  };
  const pct = (x: number) => `${(100 * x).toFixed(2)} %`;
  const lines = ['', `production test (${test.boards} Monte Carlo boards, ${design.spec.production.decisionRule}, u = ${design.spec.production.measurementUncertaintyDb} dB):`];
  for (const p of test.points) {
    const a = p.gain.acceptance;
    const lim = `${Number.isFinite(a.lower) ? a.lower.toFixed(3) : '-inf'} to ${Number.isFinite(a.upper) ? a.upper.toFixed(3) : '+inf'} dB`;
    lines.push(`  ${p.id.padEnd(20)} ${p.frequencyHz.toPrecision(5).padStart(10)} Hz  nominal ${p.gain.nominal.toFixed(3)} dB  limits ${lim}  yield ${pct(p.gain.predictedYield)}  false accept ${pct(p.gain.falseAccept)}  Cpk ${p.gain.capability.cpk.toFixed(2)}`);
  }
  lines.push(`  boards conforming to every tolerance: ${pct(test.conformingShare)}; expected to pass the test: ${pct(test.expectedAcceptedShare)}`);
  if (test.trim) {
    const t = test.trim;
    lines.push(`trim: ${production.trimTargets.map((x) => x.element).join(', ')} in series with a ${design.spec.trim.device.steps}-step rheostat, at ${t.table.frequencyHz.toPrecision(5)} Hz, default code ${t.table.defaultCode}`);
    lines.push(`  gain error at the trim frequency: sd ${t.untrimmedError.sd.toFixed(4)} dB untrimmed -> ${t.trimmedError.sd.toFixed(4)} dB trimmed; yield ${pct(t.untrimmedYield)} -> ${pct(t.trimmedYield)}; ${t.atRangeEnd} boards at the end of the range`);
  }
  for (const d of test.diagnostics) lines.push(`  ${d.code}: ${d.message}`);
  const monteCarloCsv = renderCsv([
    { name: 'frequency_hz', values: grid },
    { name: 'gain_nominal_db', values: mc.nominalGainDb },
    { name: 'gain_mean_db', values: mc.gainDb.mean },
    { name: 'gain_sd_db', values: mc.gainDb.standardDeviation },
    { name: 'gain_q0.5%_db', values: mc.gainDb.quantiles[0] },
    { name: 'gain_q99.5%_db', values: mc.gainDb.quantiles[1] },
  ]);
  return { production, headerExtras: { testPoints, trim }, plotExtras, report, summary: `${lines.join('\n')}\n`, monteCarloCsv };
}
