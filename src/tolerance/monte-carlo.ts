/**
 * Monte Carlo propagation of distributions (JCGM 101:2008, "Propagation of distributions using a
 * Monte Carlo method"): each trial draws every toleranced value from its distribution (spec.ts,
 * distributions.ts), sets it into the compiled float engine (analysis/ac-engine.ts, no recompiling and
 * no allocation per trial) and solves V(out)/V(in) at each frequency; the gain (dB) and phase (degrees,
 * continued from the nominal unwrapped phase) are the output quantities. Streaming statistics
 * (streaming-stats.ts) keep the memory fixed, so 10^6 trials fit in a few megabytes.
 *
 * Reproducibility: trials are cut into blocks with their own random streams (random.ts). A pure
 * "driver" ({@link monteCarloDriver}) decides which blocks to run and combines their results in block
 * order; the serial runner here and the worker-thread runner (parallel.node.ts) both feed it, so they
 * give byte-identical results for the same seed.
 *
 * Adaptive stopping (JCGM 101, 7.9.4): batches of M = max(J, 10^4) trials (J = ceil(100 / (1 - p)),
 * rounded up to whole blocks) run until twice the standard deviation of the batch averages, of the
 * batch standard uncertainties and of both coverage-interval endpoints is at most the numerical
 * tolerance delta = 10^l / 2 of u(y) written with n_dig significant digits (7.9.2), for every output.
 */
import { InvalidInputError, requireFinite, requireInteger } from '../errors';
import { compileAc, type CompiledAc, type TransferSpec } from '../analysis/index';
import type { Circuit } from '../netlist/index';
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { resolveTolerances, type ToleranceSpec } from './spec';
import { TrialDraw } from './trial-draw';
import { BlockStreams, DEFAULT_BLOCK_SIZE } from './random';
import {
  addHistogram,
  addMoments,
  createHistogram,
  createMoments,
  DEFAULT_HISTOGRAM_BINS,
  histogramQuantile,
  histogramRangesFromPilot,
  histogramResolution,
  mergeHistogram,
  mergeMoments,
  sortedQuantile,
  standardDeviationOf,
  symmetricCoverageInterval,
  type HistogramRanges,
  type MomentAccumulator,
} from './streaming-stats';
import { maskLimits, wilsonInterval, type MaskLimits, type ProportionInterval, type SpecMask } from './yield';
import { validateFrequencies, DEG_PER_RAD } from './sensitivity';

/** Default quantiles reported: the 95 % and 99 % symmetric bounds and the median. */
export const DEFAULT_QUANTILES: readonly number[] = [0.005, 0.025, 0.5, 0.975, 0.995];
/** JCGM 101 uses p = 0.95 throughout its examples. */
export const DEFAULT_COVERAGE_PROBABILITY = 0.95;
/** Up to this many trials every value is kept and quantiles are exact order statistics (20,000 x 32 outputs = 5 MB). */
export const DEFAULT_EXACT_QUANTILE_LIMIT = 20_000;
/** Blocks per driver request: 32 blocks (about 32,000 trials) between progress reports. */
const CHUNK_BLOCKS = 32;
/** JCGM 101 7.9.4 a): at least 10^4 trials per batch. */
const MIN_BATCH_TRIALS = 10_000;

export interface AdaptiveOptions {
  /** n_dig: significant digits of u(y) to be stabilised (JCGM 101 7.9.2); 1 or 2 are usual. */
  readonly significantDigits: number;
}

export interface MonteCarloProgress {
  readonly completedTrials: number;
  /** The planned total (the maximum in adaptive mode). */
  readonly totalTrials: number;
}

export interface MonteCarloOptions {
  readonly frequenciesHz: ArrayLike<number>;
  /** Number of trials (the maximum in adaptive mode). */
  readonly trials: number;
  /** 32-bit integer seed of the pure-rand xoroshiro128+ generator. */
  readonly seed: number;
  /** Trials per random-stream block (default {@link DEFAULT_BLOCK_SIZE}); results depend on it. */
  readonly blockSize?: number;
  readonly quantiles?: readonly number[];
  readonly coverageProbability?: number;
  readonly histogramBins?: number;
  readonly exactQuantileLimit?: number;
  /** When given, the yield against the mask is counted at the analysis frequencies. */
  readonly mask?: SpecMask;
  readonly adaptive?: AdaptiveOptions;
  readonly onProgress?: (progress: MonteCarloProgress) => void;
}

/** Per-frequency statistics of one output (gain or phase). */
export interface QuantityStatistics {
  readonly mean: Float64Array;
  readonly standardDeviation: Float64Array;
  readonly min: Float64Array;
  readonly max: Float64Array;
  /** One array per requested quantile probability, in the order given. */
  readonly quantiles: readonly Float64Array[];
  /** The probabilistically symmetric coverage interval (JCGM 101 7.7.2). */
  readonly coverageLow: Float64Array;
  readonly coverageHigh: Float64Array;
  /** Histogram bin width per frequency (0 for exact order statistics). */
  readonly quantileResolution: Float64Array;
}

export interface MonteCarloYield extends ProportionInterval {
  readonly passed: number;
  readonly trials: number;
  /** Trials failing the mask at each frequency. */
  readonly failuresAt: Uint32Array;
}

export interface MonteCarloResult {
  readonly seed: number;
  readonly blockSize: number;
  /** Trials run. */
  readonly trials: number;
  /** Trials with a finite response everywhere (the statistics are over these). */
  readonly validTrials: number;
  readonly failedTrials: number;
  readonly frequencyHz: Float64Array;
  readonly nominalGainDb: Float64Array;
  readonly nominalPhaseDeg: Float64Array;
  readonly gainDb: QuantityStatistics;
  readonly phaseDeg: QuantityStatistics;
  readonly quantileProbabilities: readonly number[];
  readonly coverageProbability: number;
  readonly quantileMethod: 'exact-order-statistics' | 'histogram';
  /** Failed trials count as failing the mask. */
  readonly yield: MonteCarloYield | null;
  readonly adaptive: { readonly batches: number; readonly batchSize: number; readonly converged: boolean } | null;
}

/** Which trials a block runs and what it returns. Plain data (crosses worker boundaries). */
export interface BlockRequest {
  readonly block: number;
  /** First trial index of the block is block * blockSize. */
  readonly count: number;
  readonly keepValues: boolean;
  readonly histogram: HistogramRanges | null;
}

/** One block's results. Plain data (typed arrays). */
export interface BlockResult {
  readonly block: number;
  readonly count: number;
  readonly failed: number;
  readonly passed: number;
  readonly failuresAt: Uint32Array;
  readonly moments: MomentAccumulator;
  /** Histogram counts of this block, or of several blocks summed (see TrialModel.runBlocks); null when none. */
  readonly histogram: Uint32Array | null;
  /** Valid trials' outputs, trial-major (validCount x quantityCount), when asked for. */
  readonly values: Float64Array | null;
}

/** The resolved, validated options without the callback (plain data). */
export interface MonteCarloConfig {
  readonly frequencyHz: Float64Array;
  readonly trials: number;
  readonly seed: number;
  readonly blockSize: number;
  readonly quantiles: readonly number[];
  readonly coverageProbability: number;
  readonly histogramBins: number;
  readonly exactQuantileLimit: number;
  readonly mask: SpecMask | null;
  readonly adaptive: AdaptiveOptions | null;
}

export function resolveMonteCarloOptions(options: MonteCarloOptions): MonteCarloConfig {
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an options object');
  const frequencyHz = validateFrequencies(options.frequenciesHz, 'options.frequenciesHz');
  const trials = requireInteger(options.trials, 'options.trials', 1, 1e9);
  const seed = requireInteger(options.seed, 'options.seed', -(2 ** 31), 2 ** 31 - 1);
  const blockSize = requireInteger(options.blockSize ?? DEFAULT_BLOCK_SIZE, 'options.blockSize', 1, 2 ** 20);
  const quantiles = [...(options.quantiles ?? DEFAULT_QUANTILES)];
  quantiles.forEach((p, i) => {
    requireFinite(p, `options.quantiles[${i}]`);
    if (!(p >= 0 && p <= 1)) throw new InvalidInputError('OUT_OF_RANGE', `options.quantiles[${i}]`, p, 'must be a probability from 0 to 1');
  });
  const coverageProbability = requireFinite(options.coverageProbability ?? DEFAULT_COVERAGE_PROBABILITY, 'options.coverageProbability');
  if (!(coverageProbability > 0 && coverageProbability < 1)) throw new InvalidInputError('OUT_OF_RANGE', 'options.coverageProbability', coverageProbability, 'must be between 0 and 1 (exclusive)');
  const histogramBins = requireInteger(options.histogramBins ?? DEFAULT_HISTOGRAM_BINS, 'options.histogramBins', 16, 2 ** 20);
  const exactQuantileLimit = requireInteger(options.exactQuantileLimit ?? DEFAULT_EXACT_QUANTILE_LIMIT, 'options.exactQuantileLimit', 0, 1e7);
  let adaptive: AdaptiveOptions | null = null;
  if (options.adaptive !== undefined) {
    adaptive = { significantDigits: requireInteger(options.adaptive?.significantDigits, 'options.adaptive.significantDigits', 1, 4) };
  }
  if (options.onProgress !== undefined && typeof options.onProgress !== 'function') throw new InvalidInputError('INVALID_ARGUMENT', 'options.onProgress', options.onProgress, 'must be a function');
  if (options.mask !== undefined) maskLimits(options.mask, frequencyHz); // validates
  return { frequencyHz, trials, seed, blockSize, quantiles, coverageProbability, histogramBins, exactQuantileLimit, mask: options.mask ?? null, adaptive };
}

/**
 * A circuit compiled for trials: the engine, the parameter slots of the toleranced inputs and their
 * nominal values, the nominal response, the mask limits. One per thread.
 */
export class TrialModel {
  readonly quantityCount: number;
  readonly nominalGainDb: Float64Array;
  readonly nominalPhaseDeg: Float64Array;
  private readonly engine: CompiledAc;
  /** The draw order and value model of a trial (trial-draw.ts). */
  private readonly draws: TrialDraw;
  private readonly slots: Int32Array;
  private readonly frequencyHz: Float64Array;
  private readonly h0Re: Float64Array;
  private readonly h0Im: Float64Array;
  private readonly limits: MaskLimits | null;
  private readonly h = new Float64Array(2);
  private readonly values: Float64Array;
  /** This trial's value of each toleranced input, in slot order. */
  private readonly drawn: Float64Array;

  constructor(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, frequencyHz: Float64Array, mask: SpecMask | null) {
    const tol = resolveTolerances(circuit, spec);
    this.engine = compileAc(circuit, transfer);
    const e = this.engine;
    this.draws = TrialDraw.forEngine(tol, e);
    this.slots = this.draws.slots;
    this.frequencyHz = frequencyHz;
    const m = frequencyHz.length;
    this.quantityCount = 2 * m;
    const sweep = e.sweep(frequencyHz, { nodes: 'none' });
    this.nominalGainDb = sweep.gainDb;
    this.nominalPhaseDeg = sweep.phaseDeg;
    this.h0Re = new Float64Array(m);
    this.h0Im = new Float64Array(m);
    for (let p = 0; p < m; p++) {
      e.transferAt(frequencyHz[p], this.h);
      this.h0Re[p] = this.h[0];
      this.h0Im[p] = this.h[1];
    }
    this.limits = mask ? maskLimits(mask, frequencyHz) : null;
    this.values = new Float64Array(this.quantityCount);
    this.drawn = new Float64Array(this.slots.length);
  }

  /**
   * Draws one trial's values from `rng` (temperature, then group offsets, then inputs, each in spec
   * order), sets them, and writes gain and phase into `out`; returns false if the response is not
   * finite somewhere. No allocation.
   */
  trial(rng: RandomGenerator, out: Float64Array): boolean {
    const { engine, slots, drawn } = this;
    this.draws.draw(rng, drawn);
    engine.setParameters(slots, drawn);
    const m = this.frequencyHz.length;
    const h = this.h;
    let ok = true;
    for (let p = 0; p < m; p++) {
      engine.transferAt(this.frequencyHz[p], h);
      const hr = h[0];
      const hi = h[1];
      out[p] = 10 * Math.log10(hr * hr + hi * hi);
      // phase continued from the nominal: arg(H conj(H0)) in (-180, 180] added to the nominal unwrapped phase
      out[m + p] = this.nominalPhaseDeg[p] + Math.atan2(hi * this.h0Re[p] - hr * this.h0Im[p], hr * this.h0Re[p] + hi * this.h0Im[p]) * DEG_PER_RAD;
      if (!Number.isFinite(out[p]) || !Number.isFinite(out[m + p])) ok = false;
    }
    return ok;
  }

  /**
   * Runs a list of blocks, each with its own generator from `streams`. Histogram counts are integers,
   * so instead of one histogram per block (half a megabyte each for 16 frequencies) the list's counts
   * are summed into the first histogram-carrying result and the others carry none: the driver's sum is
   * the same whatever the grouping.
   */
  runBlocks(requests: readonly BlockRequest[], streams: { generatorFor(block: number): RandomGenerator }): BlockResult[] {
    let shared: Uint32Array | null = null;
    return requests.map((r) => {
      const result = this.runBlock(r, streams.generatorFor(r.block), shared);
      if (r.histogram && !shared) shared = result.histogram;
      return result;
    });
  }

  /** Runs one block of trials with the block's own generator (histogram counts added to `into` when given). */
  runBlock(request: BlockRequest, rng: RandomGenerator, into: Uint32Array | null = null): BlockResult {
    const q = this.quantityCount;
    const m = this.frequencyHz.length;
    const moments = createMoments(q);
    const counts = request.histogram ? into ?? createHistogram(q, request.histogram) : null;
    const values = request.keepValues ? new Float64Array(request.count * q) : null;
    const failuresAt = new Uint32Array(m);
    const lim = this.limits;
    let failed = 0;
    let passed = 0;
    let kept = 0;
    const v = this.values;
    for (let i = 0; i < request.count; i++) {
      const ok = this.trial(rng, v);
      if (lim) {
        let pass = ok;
        for (let p = 0; p < m; p++) {
          if (!(v[p] >= lim.minGainDb[p] && v[p] <= lim.maxGainDb[p])) {
            failuresAt[p]++;
            pass = false;
          }
        }
        if (pass) passed++;
      }
      if (!ok) {
        failed++;
        continue;
      }
      addMoments(moments, v);
      if (counts) addHistogram(counts, request.histogram!, v);
      if (values) values.set(v, q * kept++);
    }
    return { block: request.block, count: request.count, failed, passed, failuresAt, moments, histogram: counts && counts !== into ? counts : null, values: values ? values.slice(0, kept * q) : null };
  }
}

/** The nominal response of a model, for the driver's result. */
export interface NominalResponse {
  readonly gainDb: Float64Array;
  readonly phaseDeg: Float64Array;
}

/**
 * The deterministic core: yields lists of block requests, receives their results (in any order; they
 * are combined in block order), returns the finished result.
 */
export function* monteCarloDriver(
  config: MonteCarloConfig,
  nominal: NominalResponse,
  onProgress?: (p: MonteCarloProgress) => void,
): Generator<BlockRequest[], MonteCarloResult, BlockResult[]> {
  const m = config.frequencyHz.length;
  const q = 2 * m;
  const bs = config.blockSize;
  const moments = createMoments(q);
  const failuresAt = new Uint32Array(m);
  let failed = 0;
  let passed = 0;
  let run = 0;
  let histogram: Uint32Array | null = null;
  let ranges: HistogramRanges | null = null;
  const kept: Float64Array[] = []; // exact mode: values of every block, in block order
  const exact = config.trials <= config.exactQuantileLimit;
  const blockCount = (b: number) => Math.min(bs, config.trials - b * bs);
  const totalBlocks = Math.ceil(config.trials / bs);
  let nextBlock = 0;

  const absorb = (results: BlockResult[], binValues: boolean) => {
    results.sort((a, b) => a.block - b.block);
    for (const r of results) {
      mergeMoments(moments, r.moments);
      for (let p = 0; p < m; p++) failuresAt[p] += r.failuresAt[p];
      failed += r.failed;
      passed += r.passed;
      run += r.count;
      if (r.histogram && histogram) mergeHistogram(histogram, r.histogram);
      if (r.values) {
        if (exact) kept.push(r.values);
        if (binValues && histogram && ranges) for (let i = 0; i < r.values.length; i += q) addHistogram(histogram, ranges, r.values.subarray(i, i + q));
      }
    }
    onProgress?.({ completedTrials: run, totalTrials: config.trials });
  };
  const setRangesFrom = (results: BlockResult[]) => {
    const pilot = createMoments(q);
    for (const r of [...results].sort((a, b) => a.block - b.block)) mergeMoments(pilot, r.moments);
    ranges = histogramRangesFromPilot(pilot.min, pilot.max, config.histogramBins);
    histogram = createHistogram(q, ranges);
  };
  const requests = (from: number, to: number, keepValues: boolean, withHistogram: boolean): BlockRequest[] => {
    const list: BlockRequest[] = [];
    for (let b = from; b < to; b++) list.push({ block: b, count: blockCount(b), keepValues, histogram: withHistogram ? ranges : null });
    return list;
  };

  let adaptiveInfo: MonteCarloResult['adaptive'] = null;
  if (config.adaptive) {
    const j = Math.ceil(100 / (1 - config.coverageProbability)); // JCGM 101 7.9.4 a)
    const batchBlocks = Math.ceil(Math.max(j, MIN_BATCH_TRIALS) / bs);
    const batchStats: { mean: Float64Array; u: Float64Array; low: Float64Array; high: Float64Array }[] = [];
    let converged = false;
    while (nextBlock < totalBlocks && !converged) {
      const to = Math.min(totalBlocks, nextBlock + batchBlocks);
      const results: BlockResult[] = yield requests(nextBlock, to, true, false);
      nextBlock = to;
      if (!ranges && !exact) setRangesFrom(results);
      absorb(results, !exact);
      batchStats.push(batchStatistics(results, q, config.coverageProbability));
      if (batchStats.length >= 2) converged = adaptiveConverged(batchStats, moments, config.adaptive.significantDigits);
    }
    adaptiveInfo = { batches: batchStats.length, batchSize: batchBlocks * bs, converged };
  } else {
    if (!exact) {
      const pilot: BlockResult[] = yield requests(0, 1, true, false);
      setRangesFrom(pilot);
      absorb(pilot, true);
      nextBlock = 1;
    }
    while (nextBlock < totalBlocks) {
      const to = Math.min(totalBlocks, nextBlock + CHUNK_BLOCKS);
      const results: BlockResult[] = yield requests(nextBlock, to, exact, !exact);
      absorb(results, false);
      nextBlock = to;
    }
  }
  return finish(config, nominal, { moments, failed, passed, run, failuresAt, histogram, ranges, kept: exact ? kept : null }, adaptiveInfo);
}

/** Per-batch average, standard uncertainty and coverage endpoints of every output (JCGM 101 7.9.4 d). */
function batchStatistics(results: BlockResult[], q: number, p: number) {
  const acc = createMoments(q);
  const all: Float64Array[] = [];
  for (const r of [...results].sort((a, b) => a.block - b.block)) {
    mergeMoments(acc, r.moments);
    all.push(r.values!);
  }
  const n = acc.n;
  const mean = Float64Array.from(acc.mean);
  const u = Float64Array.from({ length: q }, (_, k) => standardDeviationOf(acc, k));
  const low = new Float64Array(q);
  const high = new Float64Array(q);
  const column = new Float64Array(n);
  for (let k = 0; k < q; k++) {
    let i = 0;
    for (const v of all) for (let t = k; t < v.length; t += q) column[i++] = v[t];
    column.sort();
    [low[k], high[k]] = symmetricCoverageInterval(column, p);
  }
  return { mean, u, low, high };
}

/** JCGM 101 7.9.4 f)-h): all of 2 s(y), 2 s(u), 2 s(y_low), 2 s(y_high) within delta, for every output. */
function adaptiveConverged(batches: { mean: Float64Array; u: Float64Array; low: Float64Array; high: Float64Array }[], all: MomentAccumulator, ndig: number): boolean {
  const h = batches.length;
  const sd = (get: (b: (typeof batches)[number]) => number) => {
    let s = 0;
    for (const b of batches) s += get(b);
    const avg = s / h;
    let ss = 0;
    for (const b of batches) ss += (get(b) - avg) ** 2;
    return Math.sqrt(ss / (h * (h - 1))); // standard deviation of the average of h batch values
  };
  for (let k = 0; k < all.mean.length; k++) {
    const u = standardDeviationOf(all, k);
    if (!(u > 0)) continue; // an output that does not vary is stable
    const l = Math.floor(Math.log10(u)) - (ndig - 1); // u = c x 10^l with n_dig digits in c
    const delta = 0.5 * 10 ** l; // JCGM 101 7.9.2
    if (2 * sd((b) => b.mean[k]) > delta) return false;
    if (2 * sd((b) => b.u[k]) > delta) return false;
    if (2 * sd((b) => b.low[k]) > delta) return false;
    if (2 * sd((b) => b.high[k]) > delta) return false;
  }
  return true;
}

interface Totals {
  moments: MomentAccumulator;
  failed: number;
  passed: number;
  run: number;
  failuresAt: Uint32Array;
  histogram: Uint32Array | null;
  ranges: HistogramRanges | null;
  kept: Float64Array[] | null;
}

function finish(config: MonteCarloConfig, nominal: NominalResponse, t: Totals, adaptive: MonteCarloResult['adaptive']): MonteCarloResult {
  const m = config.frequencyHz.length;
  const q = 2 * m;
  const n = t.moments.n;
  const ps = config.quantiles;
  const cov = config.coverageProbability;
  const quant = ps.map(() => new Float64Array(q));
  const low = new Float64Array(q);
  const high = new Float64Array(q);
  const resolution = new Float64Array(q);
  if (t.kept) {
    const column = new Float64Array(n);
    for (let k = 0; k < q; k++) {
      let i = 0;
      for (const v of t.kept) for (let j = k; j < v.length; j += q) column[i++] = v[j];
      column.sort();
      ps.forEach((p, a) => (quant[a][k] = sortedQuantile(column, p)));
      [low[k], high[k]] = symmetricCoverageInterval(column, cov);
    }
  } else {
    const hist = t.histogram!;
    const ranges = t.ranges!;
    for (let k = 0; k < q; k++) {
      const mn = t.moments.min[k];
      const mx = t.moments.max[k];
      ps.forEach((p, a) => (quant[a][k] = histogramQuantile(hist, ranges, k, p, n, mn, mx)));
      low[k] = histogramQuantile(hist, ranges, k, (1 - cov) / 2, n, mn, mx);
      high[k] = histogramQuantile(hist, ranges, k, (1 + cov) / 2, n, mn, mx);
      resolution[k] = histogramResolution(ranges, k);
    }
  }
  const part = (from: number): QuantityStatistics => ({
    mean: t.moments.mean.slice(from, from + m),
    standardDeviation: Float64Array.from({ length: m }, (_, i) => standardDeviationOf(t.moments, from + i)),
    min: t.moments.min.slice(from, from + m),
    max: t.moments.max.slice(from, from + m),
    quantiles: quant.map((a) => a.slice(from, from + m)),
    coverageLow: low.slice(from, from + m),
    coverageHigh: high.slice(from, from + m),
    quantileResolution: resolution.slice(from, from + m),
  });
  const yieldResult: MonteCarloYield | null = config.mask
    ? { ...wilsonInterval(t.passed, t.run, cov), passed: t.passed, trials: t.run, failuresAt: t.failuresAt }
    : null;
  return {
    seed: config.seed,
    blockSize: config.blockSize,
    trials: t.run,
    validTrials: n,
    failedTrials: t.failed,
    frequencyHz: config.frequencyHz,
    nominalGainDb: nominal.gainDb,
    nominalPhaseDeg: nominal.phaseDeg,
    gainDb: part(0),
    phaseDeg: part(m),
    quantileProbabilities: ps,
    coverageProbability: cov,
    quantileMethod: t.kept ? 'exact-order-statistics' : 'histogram',
    yield: yieldResult,
    adaptive,
  };
}

/**
 * Runs a Monte Carlo analysis of V(output)/V(input) in this thread (browser-safe). For worker threads
 * see parallel.node.ts (same results for the same seed).
 *
 * @example
 * const r = runMonteCarlo(circuit, { input: 'in', output: 'out' }, { parts: [{ element: 'R1', tolerance: 0.01 }] },
 *   { frequenciesHz: [1000], trials: 10_000, seed: 1 });
 * r.gainDb.standardDeviation[0];
 */
export function runMonteCarlo(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, options: MonteCarloOptions): MonteCarloResult {
  const config = resolveMonteCarloOptions(options);
  const model = new TrialModel(circuit, transfer, spec, config.frequencyHz, config.mask);
  const streams = new BlockStreams(config.seed);
  const driver = monteCarloDriver(config, { gainDb: model.nominalGainDb, phaseDeg: model.nominalPhaseDeg }, options.onProgress);
  let step = driver.next();
  while (!step.done) {
    step = driver.next(model.runBlocks(step.value, streams));
  }
  return step.value;
}
