/**
 * What varies and how: the tolerance specification of a circuit, and its resolution into the input
 * quantities of the measurement model (JCGM 100:2008 "GUM", clause 4: input quantities X_i with
 * standard uncertainties u(x_i); JCGM 101:2008, clause 6: probability distributions for the X_i).
 *
 * The model of one part's value (relative deviations delta are dimensionless):
 *
 *   value = nominal * (1 + delta_group + delta_part) * (1 + alpha * (T - T_ref))
 *
 * - delta_part: the part's own deviation, drawn from its distribution within +-tolerance;
 * - delta_group: a shared offset of every part in the same group (e.g. all capacitors from one reel),
 *   drawn once per trial from the group's distribution; the part's own tolerance is then the
 *   independent remainder (the matching within the reel). This is the "shared offset plus an
 *   independent part" model: the share of the variance that is common is u_g^2 / (u_g^2 + u_i^2);
 * - alpha = tempcoPpmPerK * 1e-6, T the ambient temperature of the trial (the same for every part).
 *
 * Op-amp gain-bandwidth products vary as nominal * (1 + delta) on the compiled parameter
 * `${opamp}.unityGainRadPerS` (wt = 2 pi GBW, so a relative change of GBW is the same change of wt).
 *
 * Distributions (the relative tolerance `a` is the half-width of the permitted interval):
 * - 'uniform': rectangular on [-a, a], u = a / sqrt(3) (GUM 4.3.7);
 * - 'gaussian': normal with a = k sigma (k = sigmaK, stated; default 3), u = a / k (GUM 4.3.4);
 * - 'truncated-gaussian': the same normal cut at +-a (parts outside the tolerance are rejected at
 *   incoming inspection); u is the standard deviation of the truncated normal, see distributions.ts.
 */
import { InvalidInputError, requireFinite, requireOneOf } from '../errors';
import type { Circuit } from '../netlist/index';

export type ToleranceDistribution = 'uniform' | 'gaussian' | 'truncated-gaussian';

export const DISTRIBUTIONS: readonly ToleranceDistribution[] = ['uniform', 'gaussian', 'truncated-gaussian'];

/** A tolerance of 3 sigma is the usual reading of a Gaussian part tolerance (common practice, no source). */
export const DEFAULT_SIGMA_K = 3;

/** Relative tolerances above 50 % would let a part's value reach zero or change sign in a trial. */
export const MAX_RELATIVE_TOLERANCE = 0.5;

/** One toleranced passive part (R, C, L or D element). */
export interface PartTolerance {
  /** The element's name in the circuit. */
  readonly element: string;
  /** Relative half-width of the tolerance interval (0.01 for 1 %). */
  readonly tolerance: number;
  /** Default 'uniform'. */
  readonly distribution?: ToleranceDistribution;
  /** For the Gaussian forms: tolerance = sigmaK * sigma. Default {@link DEFAULT_SIGMA_K}. */
  readonly sigmaK?: number;
  /** Temperature coefficient in ppm/K (default 0). */
  readonly tempcoPpmPerK?: number;
  /** Name of a correlated group (see {@link GroupTolerance}) whose shared offset this part carries. */
  readonly group?: string;
}

/** The shared offset of a correlated group (a capacitor reel, a resistor network). */
export interface GroupTolerance {
  readonly name: string;
  readonly tolerance: number;
  readonly distribution?: ToleranceDistribution;
  readonly sigmaK?: number;
}

/** An op-amp whose gain-bandwidth product varies (models with a gainBandwidthHz only). */
export interface OpampTolerance {
  readonly element: string;
  /** Relative half-width (0.3 for +-30 %). */
  readonly gainBandwidthTolerance: number;
  readonly distribution?: ToleranceDistribution;
  readonly sigmaK?: number;
}

/**
 * The ambient temperature. With minC/maxC each trial draws a temperature uniformly from the range (one
 * temperature for all parts); with fixedC every trial runs at that temperature (a corner).
 */
export type TemperatureSpec =
  | { readonly referenceC: number; readonly minC: number; readonly maxC: number }
  | { readonly referenceC: number; readonly fixedC: number };

export interface ToleranceSpec {
  readonly parts: readonly PartTolerance[];
  readonly groups?: readonly GroupTolerance[];
  readonly opamps?: readonly OpampTolerance[];
  readonly temperature?: TemperatureSpec;
}

/** A distribution with its half-width, resolved. */
export interface ResolvedDistribution {
  readonly distribution: ToleranceDistribution;
  /** Relative half-width a. */
  readonly tolerance: number;
  /** k in a = k sigma (1 for 'uniform', unused). */
  readonly sigmaK: number;
}

/** One input quantity: a compiled parameter that varies. */
export interface ToleranceInput extends ResolvedDistribution {
  /** What the user named: the element, or `${opamp}.gainBandwidth`. */
  readonly name: string;
  /** The compiled parameter (analysis/ac-engine.ts parameterNames). */
  readonly parameter: string;
  /** Index of the group in {@link ResolvedTolerances.groups}, or -1. */
  readonly group: number;
  /** alpha in 1/K. */
  readonly tempcoPerK: number;
}

export interface ResolvedTemperature {
  readonly referenceC: number;
  readonly minC: number;
  readonly maxC: number;
}

export interface ResolvedTolerances {
  readonly inputs: readonly ToleranceInput[];
  readonly groups: readonly (ResolvedDistribution & { readonly name: string })[];
  /** minC === maxC for a fixed temperature; absent when the spec has none (T = T_ref). */
  readonly temperature: ResolvedTemperature | null;
}

const PASSIVE_KINDS = new Set(['R', 'C', 'L', 'D']);

/** Validates a tolerance specification against a circuit (throws InvalidInputError naming the field). */
export function resolveTolerances(circuit: Circuit, spec: ToleranceSpec): ResolvedTolerances {
  if (typeof spec !== 'object' || spec === null) throw new InvalidInputError('INVALID_ARGUMENT', 'spec', spec, 'must be a tolerance specification object');
  if (!Array.isArray(spec.parts)) throw new InvalidInputError('INVALID_ARGUMENT', 'spec.parts', spec.parts, 'must be an array');
  const groups = (spec.groups ?? []).map((g, i) => {
    const path = `spec.groups[${i}]`;
    if (typeof g !== 'object' || g === null || typeof g.name !== 'string' || g.name.length === 0) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.name`, g, 'must be a non-empty name');
    }
    return { name: g.name, ...resolveDistribution(g, 'tolerance', path) };
  });
  const groupIndex = new Map<string, number>();
  groups.forEach((g, i) => {
    if (groupIndex.has(g.name)) throw new InvalidInputError('INVALID_ARGUMENT', `spec.groups[${i}].name`, g.name, 'is used twice');
    groupIndex.set(g.name, i);
  });
  const inputs: ToleranceInput[] = [];
  const seen = new Set<string>();
  spec.parts.forEach((p, i) => {
    const path = `spec.parts[${i}]`;
    if (typeof p !== 'object' || p === null) throw new InvalidInputError('INVALID_ARGUMENT', path, p, 'must be an object');
    const el = circuit.element(p.element);
    if (!el) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, p.element, 'is not an element of the circuit');
    if (!PASSIVE_KINDS.has(el.kind)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, p.element, 'must be a resistor, capacitor, inductor or FDNR');
    if (seen.has(p.element)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, p.element, 'is listed twice');
    seen.add(p.element);
    let group = -1;
    if (p.group !== undefined) {
      const g = groupIndex.get(p.group);
      if (g === undefined) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.group`, p.group, 'is not a group of spec.groups');
      group = g;
    }
    const tc = p.tempcoPpmPerK === undefined ? 0 : requireFinite(p.tempcoPpmPerK, `${path}.tempcoPpmPerK`);
    inputs.push({ name: p.element, parameter: p.element, group, tempcoPerK: tc * 1e-6, ...resolveDistribution(p, 'tolerance', path) });
  });
  (spec.opamps ?? []).forEach((o, i) => {
    const path = `spec.opamps[${i}]`;
    if (typeof o !== 'object' || o === null) throw new InvalidInputError('INVALID_ARGUMENT', path, o, 'must be an object');
    const el = circuit.element(o.element);
    if (!el || el.kind !== 'OPAMP') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, o.element, 'is not an op-amp of the circuit');
    if (!('gainBandwidthHz' in el.model)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, o.element, 'has a model without a gain-bandwidth product');
    const name = `${o.element}.gainBandwidth`;
    if (seen.has(name)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.element`, o.element, 'is listed twice');
    seen.add(name);
    inputs.push({ name, parameter: `${o.element}.unityGainRadPerS`, group: -1, tempcoPerK: 0, ...resolveDistribution(o, 'gainBandwidthTolerance', path) });
  });
  return { inputs, groups, temperature: resolveTemperature(spec.temperature) };
}

function resolveDistribution(x: object, field: 'tolerance' | 'gainBandwidthTolerance', path: string): ResolvedDistribution {
  const r = x as Record<string, unknown>;
  const tolerance = requireFinite(r[field], `${path}.${field}`);
  if (!(tolerance >= 0 && tolerance <= MAX_RELATIVE_TOLERANCE)) {
    throw new InvalidInputError('OUT_OF_RANGE', `${path}.${field}`, tolerance, `must be a relative tolerance from 0 to ${MAX_RELATIVE_TOLERANCE}`);
  }
  const distribution = r.distribution === undefined ? 'uniform' : requireOneOf(r.distribution, `${path}.distribution`, DISTRIBUTIONS);
  let sigmaK = 1;
  if (distribution !== 'uniform') {
    sigmaK = r.sigmaK === undefined ? DEFAULT_SIGMA_K : requireFinite(r.sigmaK, `${path}.sigmaK`);
    if (!(sigmaK >= MIN_SIGMA_K && sigmaK <= MAX_SIGMA_K)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.sigmaK`, sigmaK, `must be from ${MIN_SIGMA_K} to ${MAX_SIGMA_K}`);
  }
  return { distribution, tolerance, sigmaK };
}

/** Below k = 0.5 a truncated normal is nearly rectangular and rejection sampling wastes most draws. */
export const MIN_SIGMA_K = 0.5;
/** Above k = 10 the truncation is below 1e-23 in probability: meaningless. */
export const MAX_SIGMA_K = 10;

function resolveTemperature(t: TemperatureSpec | undefined): ResolvedTemperature | null {
  if (t === undefined) return null;
  if (typeof t !== 'object' || t === null) throw new InvalidInputError('INVALID_ARGUMENT', 'spec.temperature', t, 'must be { referenceC, minC, maxC } or { referenceC, fixedC }');
  const referenceC = requireFinite(t.referenceC, 'spec.temperature.referenceC');
  if ('fixedC' in t) {
    const c = requireFinite(t.fixedC, 'spec.temperature.fixedC');
    return { referenceC, minC: c, maxC: c };
  }
  const minC = requireFinite(t.minC, 'spec.temperature.minC');
  const maxC = requireFinite(t.maxC, 'spec.temperature.maxC');
  if (!(maxC >= minC)) throw new InvalidInputError('OUT_OF_RANGE', 'spec.temperature.maxC', maxC, 'must not be below minC');
  return { referenceC, minC, maxC };
}
