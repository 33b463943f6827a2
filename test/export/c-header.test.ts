/**
 * The C header: literal and identifier rules, the design hash, fixed-point quantisation laws, typed
 * errors, and the real check: headers for several models (float, double, hex, Q15, Q31, hostile names)
 * are compiled with gcc -std=c99 -Wall -Wextra -Wpedantic -Werror and g++ -std=c++11 -Wall -Wextra
 * -Werror into a program that prints the raw bits of every value (memcpy into uint32/uint64), and each
 * must equal the library's value bit for bit. Skipped when gcc is missing, unless CI=true.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cCommentText, cStringLiteral, formatCFloat, formatCInteger, sanitiseCIdentifier, toCTypeValue } from '../../src/export/c-literals';
import { headerIdentifiers, renderCHeader, type HeaderModel } from '../../src/export/c-header';
import { quantiseSections } from '../../src/export/fixed-point';
import { canonicalJson, fnv1a64, hashDesign } from '../../src/export/design-hash';
import { zpkToAnalogSections, zpkToDigitalSections, type DigitalSection } from '../../src/export/sos';
import { bilinearZpk } from '../../src/export/bilinear';
import { lowpassPrototype } from '../../src/approximation/prototype';
import { evaluateZpk } from '../../src/approximation/zpk';
import { expectInvalidInput } from './helpers/expect-error';
import { haveTool, IN_CI, toolTitle } from './helpers/toolchain';


/** C99 6.4.4.2 decimal floating constant with a mandatory '.', as we write them. */
const DECIMAL_LITERAL = /^-?[0-9]+\.[0-9]+(e[+-][0-9]+)?f?$/;
const HEX_LITERAL = /^-?0x1(\.[0-9a-f]+)?p[+-][0-9]+f?$/;

describe('C number literals', () => {
  it('known forms (common practice, no source)', () => {
    expect(formatCFloat(5, 'float')).toBe('5.0f');
    expect(formatCFloat(5, 'double')).toBe('5.0');
    expect(formatCFloat(-0, 'float')).toBe('-0.0f');
    expect(formatCFloat(0, 'double')).toBe('0.0');
    expect(formatCFloat(4700, 'double')).toBe('4700.0');
    expect(formatCFloat(0.1, 'double')).toBe('0.10000000000000001'); // python3 '%.17g' % 0.1
    expect(formatCFloat(0.1, 'float')).toBe('0.100000001f');
    expect(formatCFloat(1e21, 'double')).toBe('1.0e+21');
    expect(formatCFloat(4.7e-9, 'double')).toBe('4.6999999999999999e-9'); // python3 '%.17g' % 4.7e-9
    expect(formatCFloat(12, 'double', 'hex')).toBe('0x1.8p+3');
    expect(formatCFloat(1, 'float', 'hex')).toBe('0x1p+0f');
    expect(formatCFloat(2 ** -1074, 'double', 'hex')).toBe('0x1p-1074');
    expect(formatCFloat(2 ** -149, 'float')).toBe('1.40129846e-45f'); // the smallest float subnormal is printed
  });

  it('every double and float round-trips and is a valid literal (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const d = formatCFloat(x, 'double');
        expect(d).toMatch(DECIMAL_LITERAL);
        expect(Object.is(Number(d), x)).toBe(true);
        const h = formatCFloat(x, 'double', 'hex');
        expect(h === '0.0' || h === '-0.0' || HEX_LITERAL.test(h)).toBe(true);
      }),
      { numRuns: 2000 },
    );
    fc.assert(
      fc.property(fc.float({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const f = formatCFloat(x, 'float');
        expect(f).toMatch(DECIMAL_LITERAL);
        // 9 correctly rounded digits lie within 5e-9 relative of the float, far from a rounding midpoint,
        // so reading them as a double first cannot change the float (IEEE 754-2008, 5.12.2)
        expect(Object.is(Math.fround(Number(f.slice(0, -1))), x)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('refuses NaN, Infinity, float overflow and underflow to zero with typed errors', () => {
    expectInvalidInput(() => formatCFloat(NaN, 'double', 'decimal', 'parts[0].valueSi'), 'INVALID_NUMBER', 'parts[0].valueSi');
    expectInvalidInput(() => formatCFloat(-Infinity, 'float'), 'INVALID_NUMBER', 'value');
    expectInvalidInput(() => formatCFloat(1e39, 'float'), 'OUT_OF_RANGE', 'value');
    expectInvalidInput(() => formatCFloat(1e-50, 'float'), 'OUT_OF_RANGE', 'value');
    expect(formatCFloat(1e-50, 'double')).toBe('1.0e-50');
    expect(toCTypeValue(1e-40, 'float')).toBeGreaterThan(0); // a float subnormal: printed, not refused
    expect(formatCFloat(1e-40, 'float')).toMatch(DECIMAL_LITERAL);
  });

  it('integers: parenthesised negatives, the minimum as (-max - 1), range checked', () => {
    expect(formatCInteger(5, 16)).toBe('5');
    expect(formatCInteger(-5, 16)).toBe('(-5)');
    expect(formatCInteger(-32768, 16)).toBe('(-32767 - 1)');
    expect(formatCInteger(-(2 ** 31), 32)).toBe('(-2147483647 - 1)');
    expectInvalidInput(() => formatCInteger(32768, 16, 'q'), 'OUT_OF_RANGE', 'q');
    expectInvalidInput(() => formatCInteger(1.5, 32), 'OUT_OF_RANGE', 'value');
  });
});

describe('C text', () => {
  const hostile = fc.oneof(
    fc.string({ unit: 'binary', maxLength: 60 }),
    fc.array(fc.constantFrom('*/', '/*', '??', '?', '"', '\\', '\n', '\r', '#define X', 'é', '日本', '\u0000', '//', '*'), { maxLength: 12 }).map((a) => a.join('')),
  );

  it('string literals hold only printable ASCII, escapes and no trigraph; decoding gives the UTF-8 bytes', () => {
    fc.assert(
      fc.property(hostile, (text) => {
        const lit = cStringLiteral(text);
        expect(lit).toMatch(/^"([ !#-&(-\[\]-~]|\\[0-7]{3}|\\[\\"?'])*"$/); // no bare ", \ or ?
        // decode the escapes again and compare with the UTF-8 bytes (the inverse of C99 6.4.4.4)
        const bytes: number[] = [];
        const body = lit.slice(1, -1);
        for (let i = 0; i < body.length; i++) {
          if (body[i] !== '\\') bytes.push(body.charCodeAt(i));
          else if (/[0-7]/.test(body[i + 1])) {
            bytes.push(parseInt(body.slice(i + 1, i + 4), 8));
            i += 3;
          } else bytes.push(body.charCodeAt(++i));
        }
        expect(bytes).toEqual([...new TextEncoder().encode(text)]);
      }),
      { numRuns: 500 },
    );
  });

  it('comment text cannot close or open a comment, form a trigraph or leave the line', () => {
    fc.assert(
      fc.property(hostile, (text) => {
        const c = cCommentText(text);
        expect(c).toMatch(/^[ -~]*$/);
        expect(c).not.toMatch(/\*\/|\/\*|\?\?|\\/);
      }),
      { numRuns: 500 },
    );
    expect(cCommentText('a???/b */ c')).toBe('a?_?_?/b * / c');
    expect(cCommentText('x'.repeat(500))).toHaveLength(200);
  });

  it('identifiers: [A-Z0-9_], no leading underscore, no double underscore, no keyword, no reserved prefix', () => {
    expect(sanitiseCIdentifier('shaker lowpass')).toBe('SHAKER_LOWPASS');
    expect(sanitiseCIdentifier('__Init__')).toBe('INIT');
    expect(sanitiseCIdentifier('9khz')).toBe('N9KHZ');
    expect(sanitiseCIdentifier('int', { upper: false })).toBe('G_int');
    expect(sanitiseCIdentifier('ERANGE_FILTER')).toBe('G_ERANGE_FILTER');
    expect(sanitiseCIdentifier('SIGNAL')).toBe('G_SIGNAL');
    expect(sanitiseCIdentifier('***')).toBe('GICLADDER');
    expect(sanitiseCIdentifier('é')).toBe('GICLADDER');
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 100 }), (text) => {
        const id = sanitiseCIdentifier(text);
        expect(id).toMatch(/^[A-Z][A-Z0-9_]*$/);
        expect(id).not.toMatch(/__|_$/);
        expect(id.length).toBeLessThanOrEqual(63);
      }),
      { numRuns: 500 },
    );
  });
});

describe('design hash', () => {
  it('FNV-1a 64 test vectors (draft-eastlake-fnv test vectors, from memory)', () => {
    expect(fnv1a64('')).toBe('cbf29ce484222325');
    expect(fnv1a64('a')).toBe('af63dc4c8601ec8c');
    expect(fnv1a64('foobar')).toBe('85944171f73967e8');
  });

  it('canonical JSON ignores key order; different designs hash differently', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { y: 2, x: 1 }], c: 'q' } })).toBe('{"a":{"c":"q","d":[1,{"x":1,"y":2}]},"b":1}');
    expect(hashDesign({ a: 1, b: 2 })).toBe(hashDesign({ b: 2, a: 1 }));
    expect(hashDesign({ a: 1, b: 2 })).not.toBe(hashDesign({ a: 1, b: 3 }));
    expect(hashDesign({ a: 1 })).toMatch(/^fnv1a64:[0-9a-f]{16}$/);
  });
});

const W = 2 * Math.PI * 2500;
function scaledPrototype(p: ReturnType<typeof lowpassPrototype>, w: number) {
  return {
    zeros: p.zeros.map((z) => ({ re: z.re * w, im: z.im * w })),
    poles: p.poles.map((z) => ({ re: z.re * w, im: z.im * w })),
    gain: p.gain * w ** (p.poles.length - p.zeros.length),
  };
}
const ELLIPTIC = scaledPrototype(lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 0.1, stopbandAttenuationDb: 60 }), W);
const CHEBY = scaledPrototype(lowpassPrototype({ family: 'chebyshev', order: 9, passbandRippleDb: 0.5 }), 2 * Math.PI * 20000);

function model(overrides: Partial<HeaderModel> = {}): HeaderModel {
  return {
    name: 'shaker_lowpass',
    prefix: 'shk',
    libraryVersion: '0.1.0',
    designHash: hashDesign({ name: 'shaker_lowpass' }),
    floatType: 'double',
    parts: [
      { name: 'R1', valueSi: 4700, unit: 'ohm' },
      { name: 'C1', valueSi: 4.7e-9, unit: 'farad' },
      { name: 'D1', valueSi: 1.234e-13, unit: 'farad second' },
    ],
    testPoints: [
      { frequencyHz: 100, gainDb: -0.02, phaseDeg: -12.5, lowDb: -0.3, highDb: 0.25 },
      { frequencyHz: 5000, gainDb: -61.3, phaseDeg: 170.25, lowDb: -1e3, highDb: -55 },
    ],
    trim: { codes: [-2, -1, 0, 1, 2].map((code) => ({ code, gainDb: code * 0.07, phaseDeg: -code * 0.3 })), defaultCode: 0 },
    analogSections: zpkToAnalogSections(ELLIPTIC),
    digital: { sampleRateHz: 48000, prewarpHz: 2500, sections: zpkToDigitalSections(bilinearZpk(ELLIPTIC, 48000, { prewarpHz: 2500 })) },
    ...overrides,
  };
}

describe('fixed point', () => {
  it('shift is the smallest making |c| / 2^shift < 1; each value within half a step unless saturated', () => {
    const sections = zpkToDigitalSections(bilinearZpk(CHEBY, 96000));
    for (const format of ['Q15', 'Q31'] as const) {
      const q = quantiseSections(sections, format);
      const all = q.balanced.flatMap((s) => [s.b0, s.b1, s.b2, s.a1, s.a2]);
      const largest = Math.max(...all.map(Math.abs));
      expect(largest).toBeLessThan(2 ** q.shift);
      expect(q.shift === 0 || largest >= 2 ** (q.shift - 1)).toBe(true);
      const step = 2 ** (q.shift - q.fractionBits);
      q.rows.flat().forEach((v, i) => {
        expect(Number.isInteger(v)).toBe(true);
        expect(v).toBeGreaterThanOrEqual(-(2 ** q.fractionBits));
        expect(v).toBeLessThanOrEqual(2 ** q.fractionBits - 1);
        expect(Math.abs(v * step - all[i])).toBeLessThanOrEqual(step / 2);
      });
    }
  });

  it('balancing keeps the cascade and gives every numerator the same peak; a narrow lowpass keeps its gain in Q15', () => {
    const narrow = scaledPrototype(lowpassPrototype({ family: 'chebyshev', order: 5, passbandRippleDb: 0.1 }), 2 * Math.PI * 200);
    const sections = zpkToDigitalSections(bilinearZpk(narrow, 48000));
    expect(sections[0].b0).toBeLessThan(1e-9); // the whole gain in the first numerator: 0 in Q15 without balancing
    const q = quantiseSections(sections, 'Q15');
    const peaks = q.balanced.map((s) => Math.max(Math.abs(s.b0), Math.abs(s.b1), Math.abs(s.b2)));
    for (const p of peaks) expect(p).toBeCloseTo(peaks[0], 12);
    // same H at DC (z = 1): sum(b) / (1 + a1 + a2) multiplied over the sections
    const dc = (ss: readonly DigitalSection[]) => ss.reduce((acc, s) => (acc * (s.b0 + s.b1 + s.b2)) / (1 + s.a1 + s.a2), 1);
    expect(dc(q.balanced)).toBeCloseTo(dc(sections), 12);
    // quantised numerators (exact denominators: poles this close to z = 1 need more than Q15, a separate
    // matter) give the DC gain within 5 %: balanced numerators are ~7e-4, about 12 steps of 2^-14, so each
    // rounds by up to 4 %, partly cancelling; unbalanced, the first numerator (~1e-10) rounds to 0
    const step = 2 ** (q.shift - q.fractionBits);
    const fromQ = q.rows.map((r, i) => ({ b0: r[0] * step, b1: r[1] * step, b2: r[2] * step, a1: sections[i].a1, a2: sections[i].a2 }));
    expect(q.rows.every((r) => r[0] !== 0)).toBe(true);
    expect(Math.abs(dc(fromQ) / dc(sections) - 1)).toBeLessThan(0.05);
    expect(Math.round(sections[0].b0 * 2 ** (15 - q.shift))).toBe(0);
  });

  it('saturates 1 - tiny to 2^15 - 1, rounds ties away from zero', () => {
    const q = quantiseSections([{ b0: 1 - 2 ** -20, b1: -(1 - 2 ** -20), b2: 2.5 * 2 ** -15, a1: -2.5 * 2 ** -15, a2: 0 }], 'Q15');
    expect(q.shift).toBe(0);
    expect(q.rows[0]).toEqual([32767, -32768, 3, -3, 0]);
  });
});

describe('renderCHeader structure', () => {
  it('is deterministic and carries banner, guard, prefix, hash and unit names', () => {
    const text = renderCHeader(model());
    expect(renderCHeader(model())).toBe(text);
    const lines = text.split('\n');
    expect(lines[1]).toContain('Generated by gicladder 0.1.0');
    expect(lines[1]).toContain('Do not edit');
    expect(text).toContain(`Design hash: ${hashDesign({ name: 'shaker_lowpass' })}`);
    expect(lines).toContain('#ifndef SHK_SHAKER_LOWPASS_H');
    for (const name of ['SHK_PART_VALUES_SI', 'SHK_TEST_FREQ_HZ', 'SHK_TEST_LOW_DB', 'SHK_TRIM_DEFAULT_CODE', 'SHK_ANALOG_SOS', 'SHK_DIGITAL_SOS', 'SHK_SAMPLE_RATE_HZ']) {
      expect(text).toContain(name);
    }
    expect(lines.at(-2)).toBe('#endif /* SHK_SHAKER_LOWPASS_H */');
    expect(text).not.toMatch(/NaN|Infinity|[0-9]f[ ,}]/); // never NaN, never '5f'
  });

  it('the guard comes from prefix and name, sanitised as one identifier', () => {
    expect(headerIdentifiers({ prefix: 'shk', name: 'evil */ x' }).guard).toBe('SHK_EVIL_X_H');
    expect(headerIdentifiers({ prefix: '', name: '***' }).guard).toBe('GICLADDER_FILTER_H');
    expect(headerIdentifiers({ prefix: 'e', name: 'rr' }).guard).toBe('E_RR_H'); // E + underscore is not reserved (C99 7.26.3)
    expect(headerIdentifiers({ prefix: 'errno', name: 'rr' }).guard).toBe('G_ERRNO_RR_H');
    expect(headerIdentifiers({ prefix: 'p', name: 'n'.repeat(200) }).guard).toHaveLength(63);
  });

  it('empty tables give a count of 0 and no array', () => {
    const text = renderCHeader(model({ parts: [], testPoints: [], trim: undefined, digital: undefined }));
    expect(text).toContain('#define SHK_PART_COUNT 0');
    expect(text).not.toContain('SHK_PART_NAMES');
    expect(text).not.toContain('stdint.h');
  });

  it('bad models throw typed errors naming the field', () => {
    expectInvalidInput(() => renderCHeader(model({ floatType: 'half' as never })), 'INVALID_ARGUMENT', 'floatType');
    expectInvalidInput(() => renderCHeader(model({ parts: [{ name: 'R1', valueSi: NaN, unit: 'ohm' }] })), 'INVALID_NUMBER', 'parts[0].valueSi');
    expectInvalidInput(() => renderCHeader(model({ trim: { codes: [{ code: 1, gainDb: 0, phaseDeg: 0 }], defaultCode: 3 } })), 'OUT_OF_RANGE', 'trim.defaultCode');
    expectInvalidInput(() => renderCHeader(model({ trim: { codes: [{ code: 0.5, gainDb: 0, phaseDeg: 0 }], defaultCode: 0.5 } })), 'OUT_OF_RANGE', 'trim.codes[0].code');
    expectInvalidInput(() => renderCHeader(model({ digital: undefined, fixedPoint: 'Q15' })), 'INVALID_ARGUMENT', 'fixedPoint');
    expectInvalidInput(() => renderCHeader(model({ digital: { sampleRateHz: 0, sections: [] } })), 'OUT_OF_RANGE', 'digital.sampleRateHz');
    expectInvalidInput(() => renderCHeader(model({ floatType: 'float', testPoints: [{ frequencyHz: 1e40, gainDb: 0, phaseDeg: 0, lowDb: 0, highDb: 0 }] })), 'OUT_OF_RANGE', 'testPoints[0].frequencyHz');
    expectInvalidInput(() => renderCHeader(model({ name: 5 as never })), 'INVALID_ARGUMENT', 'name');
    // a NUL would end the C string early: refused rather than silently cut
    expectInvalidInput(() => renderCHeader(model({ parts: [{ name: 'R\u00001', valueSi: 1, unit: 'ohm' }] })), 'INVALID_ARGUMENT', 'parts[0].name');
    expectInvalidInput(() => renderCHeader(model({ name: 'a\u0000' })), 'INVALID_ARGUMENT', 'name');
  });

  it('the 9th-order 20 kHz lowpass fits binary32 only with the gain spread over the sections', () => {
    expectInvalidInput(() => renderCHeader(model({ floatType: 'float', analogSections: zpkToAnalogSections(CHEBY) })), 'OUT_OF_RANGE', 'analogSections[0].n0');
    expect(renderCHeader(model({ floatType: 'float', analogSections: zpkToAnalogSections(CHEBY, { gain: 'spread' }) }))).toContain('SHK_ANALOG_SOS');
  });
});

// ---- compiled checks ----

const HAVE_GCC = haveTool('gcc') && haveTool('g++');

const HOSTILE_NAME = `evil */ #define EVIL 1 /* "quoted" \\ back\\\nnew line ??/ ??= trigraphs \u00fcn\u00efc\u00f8d\u00e9 \u65e5\u672c // ${'x'.repeat(300)}`;
const HOSTILE_PARTS = [
  { name: 'R"1"', valueSi: 1e3, unit: 'ohm' },
  { name: 'C\\2\n#define EVIL 2', valueSi: 1e-40, unit: 'farad */' },
  { name: '??=??/??\'', valueSi: -0, unit: '\u00b5F \u2126' },
  { name: '', valueSi: 2 ** -149, unit: '\u0001\u001b[31m\u007f' },
];

interface Probe {
  readonly c: string; // a C statement printing one line
  readonly expected: string;
}

function bitsOf(x: number, type: 'float' | 'double'): string {
  const view = new DataView(new ArrayBuffer(8));
  if (type === 'float') {
    view.setFloat32(0, x);
    return view.getUint32(0).toString(16).padStart(8, '0');
  }
  view.setFloat64(0, x);
  return view.getBigUint64(0).toString(16).padStart(16, '0');
}
const hexBytes = (s: string) => [...new TextEncoder().encode(s)].map((b) => b.toString(16).padStart(2, '0')).join('');

/** Statements printing every value of the header, with the line each must print. */
function probes(m: HeaderModel): Probe[] {
  const { prefix: P } = headerIdentifiers(m);
  const t = m.floatType;
  const out: Probe[] = [];
  const real = (expr: string, x: number) => out.push({ c: `PR("${expr}", ${expr});`, expected: `${expr} ${bitsOf(toCTypeValue(x, t), t)}` });
  const int = (expr: string, n: number) => out.push({ c: `PI("${expr}", ${expr});`, expected: `${expr} ${n}` });
  const str = (expr: string, s: string) => out.push({ c: `PS("${expr}", ${expr});`, expected: `${expr} ${hexBytes(s)}` });
  int(`(long)sizeof(${P}_ANALOG_SOS[0][0])`, t === 'float' ? 4 : 8);
  str(`${P}_LIBRARY_VERSION`, m.libraryVersion);
  str(`${P}_DESIGN_HASH`, m.designHash);
  str(`${P}_DESIGN_NAME`, m.name);
  int(`${P}_PART_COUNT`, m.parts.length);
  m.parts.forEach((p, i) => {
    str(`${P}_PART_NAMES[${i}]`, p.name);
    str(`${P}_PART_UNITS[${i}]`, p.unit);
    real(`${P}_PART_VALUES_SI[${i}]`, p.valueSi);
  });
  const tps = m.testPoints ?? [];
  int(`${P}_TEST_POINT_COUNT`, tps.length);
  tps.forEach((tp, i) => {
    real(`${P}_TEST_FREQ_HZ[${i}]`, tp.frequencyHz);
    real(`${P}_TEST_GAIN_DB[${i}]`, tp.gainDb);
    real(`${P}_TEST_PHASE_DEG[${i}]`, tp.phaseDeg);
    real(`${P}_TEST_LOW_DB[${i}]`, tp.lowDb);
    real(`${P}_TEST_HIGH_DB[${i}]`, tp.highDb);
  });
  if (m.trim) {
    int(`${P}_TRIM_CODE_COUNT`, m.trim.codes.length);
    int(`${P}_TRIM_DEFAULT_CODE`, m.trim.defaultCode);
    m.trim.codes.forEach((c, i) => {
      int(`${P}_TRIM_CODES[${i}]`, c.code);
      real(`${P}_TRIM_GAIN_DB[${i}]`, c.gainDb);
      real(`${P}_TRIM_PHASE_DEG[${i}]`, c.phaseDeg);
    });
  }
  int(`${P}_ANALOG_SECTION_COUNT`, m.analogSections.length);
  m.analogSections.forEach((s, i) => [s.n0, s.n1, s.n2, s.d0, s.d1, s.d2].forEach((x, j) => real(`${P}_ANALOG_SOS[${i}][${j}]`, x)));
  if (m.digital) {
    real(`${P}_SAMPLE_RATE_HZ`, m.digital.sampleRateHz);
    if (m.digital.prewarpHz !== undefined) real(`${P}_PREWARP_HZ`, m.digital.prewarpHz);
    int(`${P}_DIGITAL_SECTION_COUNT`, m.digital.sections.length);
    m.digital.sections.forEach((s, i) => [s.b0, s.b1, s.b2, s.a1, s.a2].forEach((x, j) => real(`${P}_DIGITAL_SOS[${i}][${j}]`, x)));
    if (m.fixedPoint) {
      const q = quantiseSections(m.digital.sections, m.fixedPoint);
      int(`${P}_DIGITAL_SOS_${m.fixedPoint}_SHIFT`, q.shift);
      int(`${P}_DIGITAL_SOS_${m.fixedPoint}_FRACTION_BITS`, q.fractionBits);
      q.rows.forEach((r, i) => r.forEach((v, j) => int(`(long)${P}_DIGITAL_SOS_${m.fixedPoint}[${i}][${j}]`, v)));
    }
  }
  return out;
}

function program(m: HeaderModel, list: Probe[]): string {
  const pr =
    m.floatType === 'float'
      ? 'static void pr(const char *tag, float v) { uint32_t u; memcpy(&u, &v, sizeof u); printf("%s %08lx\\n", tag, (unsigned long)u); }'
      : 'static void pr(const char *tag, double v) { uint64_t u; memcpy(&u, &v, sizeof u); printf("%s %016llx\\n", tag, (unsigned long long)u); }';
  return [
    '#include <stdio.h>',
    '#include <string.h>',
    '#include <stdint.h>',
    '#include "filter.h"',
    '#include "filter.h" /* the guard makes a second include harmless */',
    '#ifdef EVIL',
    '#error "text from the design file became a macro"',
    '#endif',
    pr,
    'static void pi(const char *tag, long v) { printf("%s %ld\\n", tag, v); }',
    'static void ps(const char *tag, const char *s) { printf("%s ", tag); for (; *s; s++) printf("%02x", (unsigned)(unsigned char)*s); printf("\\n"); }',
    '#define PR(t, v) pr(t, v)',
    '#define PI(t, v) pi(t, (long)(v))',
    '#define PS(t, v) ps(t, v)',
    'int main(void) {',
    ...list.map((p) => `  ${p.c}`),
    '  return 0;',
    '}',
    '',
  ].join('\n');
}

function compileAndRun(header: string, source: string, cxx: boolean, libraries: string[] = []): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'gicladder-h-'));
  try {
    writeFileSync(join(dir, 'filter.h'), header);
    writeFileSync(join(dir, 'main.c'), source);
    const exe = join(dir, cxx ? 'main-cxx' : 'main-c');
    const args = cxx
      ? ['-x', 'c++', '-std=c++11', '-Wall', '-Wextra', '-Werror', '-o', exe, join(dir, 'main.c')]
      : ['-std=c99', '-Wall', '-Wextra', '-Wpedantic', '-Werror', '-o', exe, join(dir, 'main.c'), ...libraries];
    const cc = spawnSync(cxx ? 'g++' : 'gcc', args, { encoding: 'utf8', timeout: 60_000 });
    if (cc.error) throw new Error(`${cxx ? 'g++' : 'gcc'} could not be run (CI=true needs it installed): ${cc.error.message}`);
    if (cc.status !== 0) throw new Error(`${cxx ? 'g++' : 'gcc'} failed:\n${cc.stderr}\n--- header ---\n${header}`);
    const run = spawnSync(exe, [], { encoding: 'utf8', timeout: 30_000 });
    if (run.status !== 0) throw new Error(`program failed: ${run.stderr}`);
    return run.stdout.trimEnd().split('\n');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const MODELS: [string, HeaderModel][] = [
  ['double, decimal', model()],
  ['float, decimal, Q15', model({ floatType: 'float', fixedPoint: 'Q15' })],
  ['double, hex, Q31', model({ numberFormat: 'hex', fixedPoint: 'Q31', digital: { sampleRateHz: 96000, sections: zpkToDigitalSections(bilinearZpk(CHEBY, 96000)) } })],
  ['float, hex', model({ floatType: 'float', numberFormat: 'hex', analogSections: zpkToAnalogSections(CHEBY, { gain: 'spread' }) })],
  ['hostile names, float', model({ name: HOSTILE_NAME, prefix: '9 int */ __Reserved', floatType: 'float', parts: HOSTILE_PARTS, libraryVersion: '0.1.0"*/', designHash: '??/' })],
  ['hostile names, double, no optional tables', model({ name: '*/\n#define EVIL 3', prefix: '', parts: HOSTILE_PARTS, testPoints: undefined, trim: undefined, digital: undefined })],
];

describe.skipIf(!HAVE_GCC && !IN_CI)(toolTitle('headers compiled with gcc and g++, every value bit for bit', ['gcc', 'g++'], HAVE_GCC), () => {
  for (const [name, m] of MODELS) {
    it(name, () => {
      const header = renderCHeader(m);
      const list = probes(m);
      const expected = list.map((p) => p.expected);
      const source = program(m, list);
      expect(compileAndRun(header, source, false)).toEqual(expected);
      // C++11 has no hexadecimal floating constants; the header says so with #error (checked below)
      if (m.numberFormat !== 'hex') expect(compileAndRun(header, source, true)).toEqual(expected);
    });
  }

  it('the rows mean what the header says: H(j w) and H(e^(j w T)) computed in C from the tables match the analog filter', () => {
    const m = model();
    const fp = m.digital!.prewarpHz!;
    // C code evaluating both cascades from the header's rows with the formulas in its comments
    const source = [
      '#include <stdio.h>',
      '#include <math.h>',
      '#include "filter.h"',
      'static void mul(double *r, double *i, double a, double b) { double t = *r * a - *i * b; *i = *r * b + *i * a; *r = t; }',
      'static void dv(double *r, double *i, double a, double b) { double d = a * a + b * b; mul(r, i, a / d, -b / d); }',
      'int main(void) {',
      '  const double f[3] = { 100.0, 2500.0, 6000.0 };',
      '  int k, j;',
      '  for (k = 0; k < 3; k++) {',
      '    double w = 2.0 * 3.14159265358979323846 * f[k], r = 1.0, i = 0.0;',
      '    for (j = 0; j < SHK_ANALOG_SECTION_COUNT; j++) {',
      '      const double *q = SHK_ANALOG_SOS[j];',
      '      mul(&r, &i, q[0] - q[2] * w * w, q[1] * w);',
      '      dv(&r, &i, q[3] - q[5] * w * w, q[4] * w);',
      '    }',
      '    printf("analog %.17g %.17g\\n", r, i);',
      '  }',
      '  {',
      '    double wt = 2.0 * 3.14159265358979323846 * SHK_PREWARP_HZ / SHK_SAMPLE_RATE_HZ, r = 1.0, i = 0.0;',
      '    double c1 = cos(wt), s1 = -sin(wt), c2 = cos(2.0 * wt), s2 = -sin(2.0 * wt);',
      '    for (j = 0; j < SHK_DIGITAL_SECTION_COUNT; j++) {',
      '      const double *q = SHK_DIGITAL_SOS[j];',
      '      mul(&r, &i, q[0] + q[1] * c1 + q[2] * c2, q[1] * s1 + q[2] * s2);',
      '      dv(&r, &i, 1.0 + q[3] * c1 + q[4] * c2, q[3] * s1 + q[4] * s2);',
      '    }',
      '    printf("digital %.17g %.17g\\n", r, i);',
      '  }',
      '  return 0;',
      '}',
      '',
    ].join('\n');
    const lines = compileAndRun(renderCHeader(m), source, false, ['-lm']);
    const parsed = lines.map((l) => l.split(' ').slice(1).map(Number));
    const want = [100, 2500, 6000, fp].map((f) => evaluateZpk(ELLIPTIC, { re: 0, im: 2 * Math.PI * f }));
    parsed.forEach(([re, im], k) => {
      // the analog rows are exact copies; the digital response equals the analog one at the prewarp
      // frequency up to the rounding of tan near the band edge (1e-9 relative, see sos.test.ts)
      const tol = (k < 3 ? 1e-12 : 1e-9) * Math.hypot(want[k].re, want[k].im);
      expect(Math.hypot(re - want[k].re, im - want[k].im)).toBeLessThanOrEqual(tol);
    });
  });

  it('a hex header refuses C++ before C++17 with a clear #error', () => {
    expect(() => compileAndRun(renderCHeader(model({ numberFormat: 'hex' })), program(model(), []), true)).toThrow(/need C99 or C\+\+17/);
  });
});
