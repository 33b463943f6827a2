/**
 * The C header for firmware: a self-contained, include-guarded file of constants for one filter.
 *
 * `renderCHeader(model)` writes a {@link HeaderModel}, a small intermediate model that the pipeline fills
 * from the design (parts, production test points, trim table, sections), so this file depends on no
 * design type. What it writes, in this order (PREFIX is the sanitised `prefix`):
 * - a "generated, do not edit" banner with the library version, the design name and the design hash;
 * - an include guard PREFIX_NAME_H (sanitised, never a leading underscore or double underscore);
 * - PREFIX_LIBRARY_VERSION, PREFIX_DESIGN_HASH, PREFIX_DESIGN_NAME (string macros);
 * - counts as #define (PREFIX_PART_COUNT, PREFIX_TEST_POINT_COUNT, PREFIX_TRIM_CODE_COUNT,
 *   PREFIX_ANALOG_SECTION_COUNT, PREFIX_DIGITAL_SECTION_COUNT); a table whose count is 0 is left out
 *   (C has no zero-length arrays);
 * - parts as parallel arrays PREFIX_PART_NAMES, PREFIX_PART_UNITS (strings) and PREFIX_PART_VALUES_SI;
 * - test points PREFIX_TEST_FREQ_HZ, _GAIN_DB, _PHASE_DEG, _LOW_DB, _HIGH_DB;
 * - the trim table PREFIX_TRIM_CODES (int32_t), _GAIN_DB, _PHASE_DEG and PREFIX_TRIM_DEFAULT_CODE;
 * - analog sections PREFIX_ANALOG_SOS[n][6], rows {n0, n1, n2, d0, d1, d2}:
 *   H(s) = prod (n0 + n1 s + n2 s^2) / (d0 + d1 s + d2 s^2), s in rad/s;
 * - with a sample rate, PREFIX_SAMPLE_RATE_HZ (and PREFIX_PREWARP_HZ) and digital sections
 *   PREFIX_DIGITAL_SOS[n][5], rows {b0, b1, b2, a1, a2}: H(z) = prod (b0 + b1 z^-1 + b2 z^-2) /
 *   (1 + a1 z^-1 + a2 z^-2); with `fixedPoint`, also PREFIX_DIGITAL_SOS_Q15 (or _Q31) as int16_t
 *   (int32_t) with PREFIX_DIGITAL_SOS_Q15_SHIFT and the rule in a comment (see fixed-point.ts).
 * Numbers print as c-literals.ts does (exact round trip in the chosen type); text from the design can
 * never leave its string or comment. The output is valid C99 and C++11 (C++17 for hex constants),
 * checked by compiling it with -Wall -Wextra -Werror (and -Wpedantic for C).
 */
import { InvalidInputError, requireOneOf, requirePositive } from '../errors';
import {
  cCommentText,
  cStringLiteral,
  formatCFloat,
  formatCInteger,
  sanitiseCIdentifier,
  type CFloatType,
  type CNumberFormat,
} from './c-literals';
import { FRACTION_BITS, quantiseSections, type FixedPointFormat } from './fixed-point';
import type { AnalogSection, DigitalSection } from './sos';

export interface HeaderPart {
  /** As the design names it (any text; written as an escaped string). */
  readonly name: string;
  /** In SI base units (ohm, farad, henry...). */
  readonly valueSi: number;
  /** The unit's name, e.g. 'ohm', 'farad' (written as a string). */
  readonly unit: string;
}

export interface HeaderTestPoint {
  readonly frequencyHz: number;
  /** Expected gain and phase of a good board. */
  readonly gainDb: number;
  readonly phaseDeg: number;
  /** Acceptance limits of the gain. */
  readonly lowDb: number;
  readonly highDb: number;
}

export interface HeaderTrim {
  /** One entry per trim code (integer, int32 range), with the response it gives at the trim frequency. */
  readonly codes: readonly { readonly code: number; readonly gainDb: number; readonly phaseDeg: number }[];
  /** One of the codes. */
  readonly defaultCode: number;
}

export interface HeaderDigital {
  readonly sampleRateHz: number;
  readonly prewarpHz?: number;
  readonly sections: readonly DigitalSection[];
}

/** Everything the header holds, as plain data (the pipeline maps a design onto it). */
export interface HeaderModel {
  /** Design name: the include guard and the banner (any text). */
  readonly name: string;
  /** C identifier prefix of every macro and constant (any text; sanitised, upper case). */
  readonly prefix: string;
  readonly libraryVersion: string;
  /** E.g. from hashDesign(design). */
  readonly designHash: string;
  readonly floatType: CFloatType;
  /** Default 'decimal' (9 / 17 significant digits); 'hex' needs C99 or C++17. */
  readonly numberFormat?: CNumberFormat;
  readonly fixedPoint?: FixedPointFormat;
  readonly parts: readonly HeaderPart[];
  readonly testPoints?: readonly HeaderTestPoint[];
  readonly trim?: HeaderTrim;
  readonly analogSections: readonly AnalogSection[];
  readonly digital?: HeaderDigital;
}

/** Prefixes are cut to this many characters so that PREFIX_ plus the longest suffix stays within 63. */
const MAX_PREFIX_LENGTH = 31;
/** The guard's name part is cut so the whole guard stays within 63 characters. */
const MAX_GUARD_LENGTH = 63;

/** The include guard and the sanitised prefix `renderCHeader` uses for a model. */
export function headerIdentifiers(model: Pick<HeaderModel, 'name' | 'prefix'>): { prefix: string; guard: string } {
  const prefix = sanitiseCIdentifier(model.prefix, { fallback: 'GICLADDER', maxLength: MAX_PREFIX_LENGTH });
  const name = /[A-Za-z0-9]/.test(String(model.name)) ? String(model.name) : 'FILTER';
  const guard = sanitiseCIdentifier(`${prefix}_${name}`, { maxLength: MAX_GUARD_LENGTH - 2 });
  return { prefix, guard: `${guard}_H` };
}

/**
 * The header text (see the module comment). Throws InvalidInputError on a bad model (path names the field).
 *
 * @example
 * const h = renderCHeader({ name: 'demo', prefix: 'flt', libraryVersion: '0.1.0', designHash: hashDesign({ name: 'demo' }),
 *   floatType: 'float', parts: [{ name: 'R1', valueSi: 4700, unit: 'ohm' }],
 *   analogSections: [{ n0: 1, n1: 0, n2: 0, d0: 1, d1: 1e-4, d2: 0 }] });
 * h.includes('static const float FLT_PART_VALUES_SI[FLT_PART_COUNT] = { 4700.0f };'); // true
 */
export function renderCHeader(model: HeaderModel): string {
  if (typeof model !== 'object' || model === null) throw new InvalidInputError('INVALID_ARGUMENT', 'model', model, 'must be a HeaderModel');
  for (const key of ['name', 'prefix', 'libraryVersion', 'designHash'] as const) requireText(model[key], key);
  const type = requireOneOf(model.floatType, 'floatType', ['float', 'double'] as const);
  const format = requireOneOf(model.numberFormat ?? 'decimal', 'numberFormat', ['decimal', 'hex'] as const);
  const fixed = model.fixedPoint === undefined ? undefined : requireOneOf(model.fixedPoint, 'fixedPoint', ['Q15', 'Q31'] as const);
  const parts = requireArray(model.parts, 'parts');
  const testPoints = model.testPoints === undefined ? [] : requireArray(model.testPoints, 'testPoints');
  const analog = requireArray(model.analogSections, 'analogSections');
  const { prefix: P, guard } = headerIdentifiers(model);
  const num = (x: number, path: string) => formatCFloat(x, type, format, path);
  const list = (items: string[]) => `{ ${items.join(', ')} }`;
  const array = (name: string, count: string, items: string[]) => `static const ${type} ${P}_${name}[${count}] = ${list(items)};`;
  const lines: string[] = [];
  const out = (...l: string[]) => lines.push(...l);

  out(
    '/*',
    ` * Generated by gicladder ${cCommentText(model.libraryVersion)}. Do not edit: regenerate it from the design file.`,
    ` * Design: ${cCommentText(model.name)}`,
    ` * Design hash: ${cCommentText(model.designHash)}`,
    ` * Numbers: ${type}, ${format === 'hex' ? 'C99 hexadecimal constants (exact)' : `${type === 'float' ? 9 : 17} significant digits (exact round trip)`}; values in SI base units.`,
    ' */',
    `#ifndef ${guard}`,
    `#define ${guard}`,
    '',
  );
  if (format === 'hex') {
    out('#if defined(__cplusplus) && __cplusplus < 201703L', '#error "hexadecimal floating constants need C99 or C++17"', '#endif', '');
  }
  if (model.trim !== undefined || fixed !== undefined) out('#include <stdint.h>', '');
  out(
    `#define ${P}_LIBRARY_VERSION ${cStringLiteral(model.libraryVersion)}`,
    `#define ${P}_DESIGN_HASH ${cStringLiteral(model.designHash)}`,
    `#define ${P}_DESIGN_NAME ${cStringLiteral(model.name)}`,
    '',
  );

  out('/* Parts: names, units and values in SI base units (ohm, farad, ...), index by index. */', `#define ${P}_PART_COUNT ${parts.length}`);
  if (parts.length > 0) {
    parts.forEach((p, i) => {
      requireText(p?.name, `parts[${i}].name`);
      requireText(p.unit, `parts[${i}].unit`);
    });
    out(
      `static const char *const ${P}_PART_NAMES[${P}_PART_COUNT] = ${list(parts.map((p) => cStringLiteral(p.name)))};`,
      `static const char *const ${P}_PART_UNITS[${P}_PART_COUNT] = ${list(parts.map((p) => cStringLiteral(p.unit)))};`,
      array('PART_VALUES_SI', `${P}_PART_COUNT`, parts.map((p, i) => num(p.valueSi, `parts[${i}].valueSi`))),
    );
  }
  out('');

  out('/* Production test points: frequency, expected gain and phase, gain limits. */', `#define ${P}_TEST_POINT_COUNT ${testPoints.length}`);
  if (testPoints.length > 0) {
    const column = (name: string, key: keyof HeaderTestPoint) =>
      array(name, `${P}_TEST_POINT_COUNT`, testPoints.map((t, i) => num(t?.[key], `testPoints[${i}].${key}`)));
    out(
      column('TEST_FREQ_HZ', 'frequencyHz'),
      column('TEST_GAIN_DB', 'gainDb'),
      column('TEST_PHASE_DEG', 'phaseDeg'),
      column('TEST_LOW_DB', 'lowDb'),
      column('TEST_HIGH_DB', 'highDb'),
    );
  }
  out('');

  if (model.trim !== undefined) {
    const codes = requireArray(model.trim.codes, 'trim.codes');
    const values = codes.map((c, i) => formatCInteger(c?.code, 32, `trim.codes[${i}].code`));
    const defaultText = formatCInteger(model.trim.defaultCode, 32, 'trim.defaultCode');
    if (!codes.some((c) => c.code === model.trim?.defaultCode)) {
      throw new InvalidInputError('OUT_OF_RANGE', 'trim.defaultCode', model.trim.defaultCode, 'must be one of trim.codes');
    }
    out(
      '/* Trim table: code, and the gain and phase at the trim frequency with that code. */',
      `#define ${P}_TRIM_CODE_COUNT ${codes.length}`,
      `#define ${P}_TRIM_DEFAULT_CODE ${defaultText}`,
      `static const int32_t ${P}_TRIM_CODES[${P}_TRIM_CODE_COUNT] = ${list(values)};`,
      array('TRIM_GAIN_DB', `${P}_TRIM_CODE_COUNT`, codes.map((c, i) => num(c.gainDb, `trim.codes[${i}].gainDb`))),
      array('TRIM_PHASE_DEG', `${P}_TRIM_CODE_COUNT`, codes.map((c, i) => num(c.phaseDeg, `trim.codes[${i}].phaseDeg`))),
      '',
    );
  }

  out(
    '/* Analog transfer function, s in rad/s: H(s) = prod_k (n0 + n1 s + n2 s^2) / (d0 + d1 s + d2 s^2),',
    ' * rows {n0, n1, n2, d0, d1, d2}; the overall gain is folded into the numerators. */',
    `#define ${P}_ANALOG_SECTION_COUNT ${analog.length}`,
  );
  if (analog.length > 0) {
    const keys = ['n0', 'n1', 'n2', 'd0', 'd1', 'd2'] as const;
    const rows = analog.map((s, i) => `  ${list(keys.map((k) => num(s?.[k], `analogSections[${i}].${k}`)))}`);
    out(`static const ${type} ${P}_ANALOG_SOS[${P}_ANALOG_SECTION_COUNT][6] = {`, rows.join(',\n'), '};');
  }
  out('');

  if (model.digital !== undefined) {
    const d = model.digital;
    const fs = requirePositive(d.sampleRateHz, 'digital.sampleRateHz');
    const sections = requireArray(d.sections, 'digital.sections');
    if (sections.length === 0) throw new InvalidInputError('OUT_OF_RANGE', 'digital.sections', sections, 'needs at least one section');
    out(
      '/* Digital sections (bilinear transform): H(z) = prod_k (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2),',
      ' * rows {b0, b1, b2, a1, a2} (a0 = 1); the overall gain is folded into the numerators. */',
      `#define ${P}_SAMPLE_RATE_HZ ${num(fs, 'digital.sampleRateHz')}`,
    );
    if (d.prewarpHz !== undefined) out(`#define ${P}_PREWARP_HZ ${num(requirePositive(d.prewarpHz, 'digital.prewarpHz'), 'digital.prewarpHz')}`);
    const keys = ['b0', 'b1', 'b2', 'a1', 'a2'] as const;
    const rows = sections.map((s, i) => `  ${list(keys.map((k) => num(s?.[k], `digital.sections[${i}].${k}`)))}`);
    out(
      `#define ${P}_DIGITAL_SECTION_COUNT ${sections.length}`,
      `static const ${type} ${P}_DIGITAL_SOS[${P}_DIGITAL_SECTION_COUNT][5] = {`,
      rows.join(',\n'),
      '};',
    );
    if (fixed !== undefined) {
      const q = quantiseSections(sections, fixed);
      const bits = FRACTION_BITS[fixed];
      const intType = bits === 15 ? 'int16_t' : 'int32_t';
      const name = `${P}_DIGITAL_SOS_${fixed}`;
      out(
        `/* ${fixed} form: coefficient = ${name}[k][i] * 2^(${name}_SHIFT - ${bits}).`,
        ' * The numerators are rescaled to equal peak magnitude (the same overall H as the table above).',
        ` * Quantised by rounding to nearest (ties away from zero), saturated to [-2^${bits}, 2^${bits} - 1]. A filter`,
        ` * using them should accumulate products in ${bits === 15 ? 'int32_t' : 'int64_t'}, shift left by ${name}_SHIFT, then round`,
        ' * and saturate the same way. */',
        `#define ${name}_FRACTION_BITS ${bits}`,
        `#define ${name}_SHIFT ${q.shift}`,
        `static const ${intType} ${name}[${P}_DIGITAL_SECTION_COUNT][5] = {`,
        q.rows.map((r) => `  ${list(r.map((v) => formatCInteger(v, bits === 15 ? 16 : 32)))}`).join(',\n'),
        '};',
      );
    }
    out('');
  } else if (fixed !== undefined) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'fixedPoint', fixed, 'needs digital sections (a sample rate)');
  }

  out(`#endif /* ${guard} */`, '');
  return lines.join('\n');
}

/** Text for a C string: any string without NUL (a NUL would end the C string early). */
function requireText(value: unknown, path: string): string {
  if (typeof value !== 'string') throw new InvalidInputError('INVALID_ARGUMENT', path, value, 'must be a string');
  if (value.includes('\u0000')) throw new InvalidInputError('INVALID_ARGUMENT', path, value, 'must not contain NUL');
  return value;
}

function requireArray<T>(value: readonly T[] | undefined, path: string): readonly T[] {
  if (!Array.isArray(value)) throw new InvalidInputError('INVALID_ARGUMENT', path, value, 'must be an array');
  return value;
}
