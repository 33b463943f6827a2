/**
 * The JSON report of a design: a versioned, documented record of every stage's result, for reviews,
 * scripts and archives. `REPORT_SCHEMA_VERSION` changes when a field changes meaning or is removed
 * (adding fields keeps it). Numbers are finite or null: JSON has no NaN or Infinity, and null means
 * "not applicable or unbounded" (for example the gain-bandwidth of an ideal op-amp).
 *
 * Top-level fields (schema version 1):
 * - `schemaVersion`, `generator` ("gicladder x.y.z"), `designHash` (the hash stamped in every output)
 * - `name`, `spec` (the design file with every default filled in)
 * - `order` ({ order, estimated }), `prototype` ({ zeros, poles, gain }: normalised lowpass)
 * - `ladder` (normalised LC ladder: sourceOhms, loadOhms, branches), `impedance` ({ impedanceOhms, capacitorF })
 * - `method`, `opamp` (the model), `opampCount`, `nominalPassbandGainDb`
 * - `parts`: [{ name, kind, valueSi, exactValue (rational as text), series, tolerancePercent,
 *   temperatureCoefficientPpmPerK, deviation, role }]
 * - `evaluation`: { passbandErrorDb { rounding, opamp, total }, prototypeDeviationDb, stopband,
 *   gainBandwidth { forPassbandErrorDb, requiredHz, chosenHz, meets }, swing }
 * - `stability`: { degree, rightHalfPlane, imaginaryAxis, leftHalfPlane, stable }
 * - `precompensation` (when asked for), `response`: { frequencyHz, gainDb, phaseDeg, groupDelayS } of
 *   the circuit to build, `diagnostics`: [{ code, message, severity, stage }]
 * - `production` and `trim` when the design file asks for them (see their own documentation).
 */
import { GENERATOR } from '../version';
import type { FilterDesign } from './design-filter';
import { designHashOf } from './outputs';
import { frequencyResponse } from './frequency-response';

export const REPORT_SCHEMA_VERSION = 1;

/** JSON-safe copies: non-finite numbers become null, Fractions their 'n/d' text, typed arrays arrays. */
function jsonSafe(value: unknown): unknown {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (typeof value === 'bigint') return value.toString();
  if (value === null || typeof value !== 'object') return value;
  if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>, (x) => (Number.isFinite(x) ? x : null));
  if (Array.isArray(value)) return value.map(jsonSafe);
  const ctor = (value as { constructor?: { name?: string } }).constructor?.name;
  if (ctor === 'Fraction') return (value as { toFraction(): string }).toFraction();
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value)) if (v !== undefined && typeof v !== 'function') out[k] = jsonSafe(v);
  return out;
}

/** The report as a plain object (JSON-safe). `extra` adds sections such as production and trim. */
export function reportOf(design: FilterDesign, extra: Record<string, unknown> = {}): Record<string, unknown> {
  const f = design.evaluation.frequencyHz;
  const r = frequencyResponse(design, f);
  const e = design.evaluation;
  return jsonSafe({
    schemaVersion: REPORT_SCHEMA_VERSION,
    generator: GENERATOR,
    designHash: designHashOf(design),
    name: design.spec.name,
    spec: design.spec,
    order: { order: design.order.order, estimated: design.order.estimate !== undefined },
    prototype: design.prototype,
    ladder: design.ladder.ladder,
    impedance: { impedanceOhms: Number(design.impedance.impedanceOhms.valueOf()), capacitorF: Number(design.impedance.capacitorF.valueOf()) },
    method: design.method,
    opamp: design.opamp,
    opampCount: design.opampCount,
    nominalPassbandGainDb: design.nominalPassbandGainDb,
    parts: design.parts.map((p) => ({
      name: p.name,
      kind: p.kind,
      valueSi: p.value,
      exactValue: p.exactValue,
      series: p.series ?? null,
      tolerancePercent: p.tolerancePercent,
      temperatureCoefficientPpmPerK: p.temperatureCoefficientPpmPerK,
      deviation: p.deviation,
      role: p.role,
    })),
    evaluation: {
      passbandErrorDb: e.passbandErrorDb,
      prototypeDeviationDb: e.prototypeDeviationDb,
      stopband: e.stopband,
      gainBandwidth: e.gainBandwidth,
      swing: e.swing,
    },
    stability: {
      degree: design.stability.degree,
      rightHalfPlane: design.stability.rightHalfPlane,
      imaginaryAxis: design.stability.imaginaryAxis,
      leftHalfPlane: design.stability.leftHalfPlane,
      stable: design.stability.stable,
    },
    precompensation: design.precompensation,
    response: { frequencyHz: f, gainDb: r.gainDb, phaseDeg: r.phaseDeg, groupDelayS: r.groupDelayS },
    diagnostics: design.diagnostics,
    ...extra,
  }) as Record<string, unknown>;
}

/** The report as JSON text (two-space indent, trailing newline). */
export function toJsonReport(design: FilterDesign, extra: Record<string, unknown> = {}): string {
  return `${JSON.stringify(reportOf(design, extra), null, 2)}\n`;
}
