/**
 * Axis ticks: decades with minor ticks at 2..9 for log axes, 1-2-5 steps for linear axes, and their
 * labels (SI prefixes for log-frequency labels: 10, 100, 1k, 10k). Deterministic: ticks are computed as
 * integers times a power of ten, never by repeated addition.
 */

export interface AxisTick {
  readonly value: number;
  /** Empty for an unlabelled minor tick. */
  readonly label: string;
  readonly major: boolean;
}

/** Multipliers 1, 2, 5 (the usual "nice" steps; common practice, no source). */
const NICE_STEPS = [1, 2, 5, 10];
/** About this many labelled ticks on a linear axis. */
const TARGET_LINEAR_TICKS = 10;
/** A step may be this much finer than span / target (so 0..105 dB gets 10 dB steps, not 20). */
const STEP_SLACK = 0.85;
const SI_PREFIXES: readonly [number, string][] = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'u'],
  [1e-9, 'n'],
  [1e-12, 'p'],
];

/** The enclosing whole decades of [min, max] (both > 0). */
export function logRange(min: number, max: number): [number, number] {
  const lo = Math.floor(Math.log10(min) + 1e-12);
  let hi = Math.ceil(Math.log10(max) - 1e-12);
  if (hi <= lo) hi = lo + 1;
  return [10 ** lo, 10 ** hi];
}

/** Decade ticks (labelled) and 2..9 minor ticks; with fewer than two decades inside, 2 and 5 are labelled too. */
export function logTicks(min: number, max: number): AxisTick[] {
  const ticks: AxisTick[] = [];
  const lo = Math.floor(Math.log10(min) + 1e-12);
  const hi = Math.ceil(Math.log10(max) - 1e-12);
  const decadesInside = [];
  for (let k = lo; k <= hi; k++) if (inside(10 ** k, min, max)) decadesInside.push(k);
  const labelMinor = decadesInside.length < 2;
  for (let k = lo; k <= hi; k++) {
    for (let m = 1; m <= 9; m++) {
      const v = Number(`${m}e${k}`); // exact decimal, not m * 10^k rounded twice
      if (!inside(v, min, max)) continue;
      const major = m === 1;
      ticks.push({ value: v, label: major || (labelMinor && (m === 2 || m === 5)) ? formatSi(v) : '', major });
    }
  }
  return ticks;
}

/** A 1-2-5 step giving about {@link TARGET_LINEAR_TICKS} ticks over the span. */
export function niceStep(span: number, target = TARGET_LINEAR_TICKS): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / target;
  const exp = Math.floor(Math.log10(raw));
  for (const m of NICE_STEPS) if (m * 10 ** exp >= raw * STEP_SLACK) return Number(`${m}e${exp}`);
  return Number(`1e${exp + 1}`);
}

/** [min, max] widened to multiples of `step` (default the nice step). */
export function niceRange(min: number, max: number, step?: number): [number, number] {
  if (min === max) {
    const pad = min === 0 ? 1 : Math.abs(min) * 0.1;
    return niceRange(min - pad, max + pad, step);
  }
  step ??= niceStep(max - min);
  return [Math.floor(min / step + 1e-9) * step, Math.ceil(max / step - 1e-9) * step];
}

/** Linear ticks at multiples of `step` (default the nice step) inside [min, max], all labelled. */
export function linearTicks(min: number, max: number, step = niceStep(max - min)): AxisTick[] {
  const digits = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const ticks: AxisTick[] = [];
  for (let i = Math.ceil(min / step - 1e-9); i * step <= max + step * 1e-9; i++) {
    const v = Number((i * step).toFixed(digits)) + 0; // + 0: -0 prints as 0
    ticks.push({ value: v, label: v.toFixed(digits), major: true });
  }
  return ticks;
}

/** 1000 -> '1k', 2e6 -> '2M', 0.5 -> '500m' (SI prefixes, ASCII 'u' for micro). */
export function formatSi(v: number): string {
  if (v === 0) return '0';
  for (const [scale, prefix] of SI_PREFIXES) {
    if (Math.abs(v) >= scale * (1 - 1e-12)) return `${Number((v / scale).toPrecision(6))}${prefix}`;
  }
  return v.toExponential(2);
}

function inside(v: number, min: number, max: number): boolean {
  return v >= min * (1 - 1e-12) && v <= max * (1 + 1e-12);
}

/** Phase spans above this many degrees get ticks at multiples of 45 degrees. */
const PHASE_DEGREE_TICKS_FROM = 90;
/** Tick steps for phase in degrees: 45, 90, 180, 360... chosen for at most about 10 ticks. */
export function phaseStep(spanDeg: number): number | undefined {
  if (!(spanDeg > PHASE_DEGREE_TICKS_FROM) || !Number.isFinite(spanDeg)) return undefined;
  let step = 45;
  while (spanDeg / step > TARGET_LINEAR_TICKS) step *= 2;
  return step;
}
