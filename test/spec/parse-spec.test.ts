import { describe, expect, it } from 'vitest';
import { GicladderError } from '../../src/errors';
import { parseSpec, sanitiseIdentifier, FORBIDDEN_KEYS } from '../../src/spec/parse-spec';
import { SpecError } from '../../src/spec/spec-error';
import { HALF_POWER_DB } from '../../src/spec/schema';

const minimal = { name: 'shaker_lowpass', response: { type: 'lowpass', family: 'chebyshev', order: 5, passbandEdgeHz: 2500, passbandRippleDb: 0.1 } };

function specError(input: unknown): SpecError {
  try {
    parseSpec(input);
  } catch (e) {
    expect(e).toBeInstanceOf(SpecError);
    expect(e).toBeInstanceOf(GicladderError);
    expect((e as SpecError).code).toBe('INVALID_SPEC');
    return e as SpecError;
  }
  throw new Error('expected a SpecError');
}

describe('parseSpec: valid files and defaults', () => {
  it("reads DESIGN.md's minimal file and fills every default", () => {
    const s = parseSpec({ ...minimal, realization: { method: 'fdnr', capacitorF: '4.7n' }, parts: { opamp: { model: 'single-pole', gainBandwidthHz: 4e6, openLoopGainDb: 110 } } });
    expect(s.realization.capacitorF).toBe(4.7e-9);
    expect(s.realization.buffers).toEqual({ input: false, output: true });
    expect(s.parts.selection).toBe('capacitors-first');
    expect(s.parts.resistors.series).toBe('E96');
    expect(s.parts.capacitors.series).toBe('E12');
    expect(s.parts.opamp).toEqual({ model: 'single-pole', gainBandwidthHz: 4e6, openLoopGainDb: 110, supplyV: 30, outputSwingV: 13.5 });
    expect(s.evaluation.precompensationFrequencyHz).toBe(2500);
    expect(s.export.identifierPrefix).toBe('shaker_lowpass');
    expect(s.safety).toEqual({ mainsConnected: false, safetyRelated: false });
    expect(s.production.seed).toBe(1);
  });
  it('takes quantity strings with the unit of the field', () => {
    const s = parseSpec({
      response: { type: 'bandpass', order: 2, passbandEdgeHz: ['38 kHz', '42k'] },
      realization: { impedanceOhms: '4k7' },
      parts: { opamp: { model: 'two-pole', gainBandwidthHz: '10 MHz', secondPoleHz: '30meg' } },
    });
    expect(s.response.passbandEdgeHz).toEqual([38000, 42000]);
    expect(s.realization.impedanceOhms).toBe(4700);
    expect(s.realization.capacitorF).toBeUndefined();
    expect(s.parts.opamp).toMatchObject({ model: 'two-pole', gainBandwidthHz: 1e7, secondPoleHz: 3e7, openLoopGainDb: 100 });
    expect(s.trim.frequencyHz).toBeCloseTo(Math.sqrt(38000 * 42000), 6);
  });
  it('defaults the ripple by family: the half-power loss for butterworth, 0.5 dB for equiripple families', () => {
    expect(parseSpec({ response: { order: 3, passbandEdgeHz: 1000 } }).response.passbandRippleDb).toBe(HALF_POWER_DB);
    expect(parseSpec({ response: { family: 'elliptic', order: 3, passbandEdgeHz: 1000 } }).response.passbandRippleDb).toBe(0.5);
    expect(parseSpec({ response: { order: 3, passbandEdgeHz: 1000 } }).realization.capacitorF).toBe(10e-9);
  });
});

describe('parseSpec: errors name the path and value and list every problem', () => {
  it('collects all issues at once', () => {
    const e = specError({
      response: { type: 'lowpass', passbandEdgeHz: -1, order: 3, passbandRippleDb: 'x' },
      parts: { resistors: { series: 'E97' }, opamp: { model: 'single-pole' } },
    });
    const paths = e.issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['response.passbandEdgeHz', 'response.passbandRippleDb', 'parts.resistors.series', 'parts.opamp.gainBandwidthHz']));
    expect(e.path).toBe(e.issues[0].path);
    expect(e.issues.find((i) => i.path === 'response.passbandEdgeHz')!.value).toBe(-1);
    expect(e.issues.find((i) => i.path === 'parts.opamp.gainBandwidthHz')!.message).toBe('is required');
  });
  it('suggests the nearest key for a misspelt one, at any depth and inside the op-amp union', () => {
    const e = specError({ response: { order: 3, passbandEdgHz: 1000 }, parts: { opamp: { model: 'single-pole', gainBandwithHz: '1 MHz' } }, realisation: {} });
    const by = (p: string) => e.issues.find((i) => i.path === p);
    expect(by('response.passbandEdgHz')!.suggestion).toBe('passbandEdgeHz');
    expect(by('parts.opamp.gainBandwithHz')!.suggestion).toBe('gainBandwidthHz');
    expect(by('parts.opamp.gainBandwithHz')!.value).toBe('1 MHz');
    expect(by('realisation')!.suggestion).toBe('realization');
    expect(by('response.passbandEdgeHz')!.message).toBe('is required');
  });
  it('refuses a quantity with the wrong unit or that does not parse', () => {
    const e = specError({ response: { order: 3, passbandEdgeHz: '10 nF' }, realization: { capacitorF: '4.7.1n' } });
    expect(e.issues.map((i) => i.path).sort()).toEqual(['realization.capacitorF', 'response.passbandEdgeHz']);
    expect(e.issues.every((i) => typeof i.value === 'string')).toBe(true);
  });
  it('applies the cross-field rules', () => {
    const cases: [unknown, string][] = [
      [{ response: { type: 'bandpass', order: 2, passbandEdgeHz: 1000 } }, 'response.passbandEdgeHz'],
      [{ response: { type: 'lowpass', order: 2, passbandEdgeHz: [1, 2] } }, 'response.passbandEdgeHz'],
      [{ response: { passbandEdgeHz: 1000 } }, 'response.order'],
      [{ response: { passbandEdgeHz: 1000, stopbandEdgeHz: 500 } }, 'response.stopbandEdgeHz'],
      [{ response: { type: 'bandstop', passbandEdgeHz: [100, 1000], stopbandEdgeHz: [50, 500] } }, 'response.stopbandEdgeHz'],
      [{ response: { family: 'elliptic', order: 1, passbandEdgeHz: 1000 } }, 'response.order'],
      [{ response: { family: 'elliptic', order: 3, passbandEdgeHz: 1000, passbandRippleDb: 3, stopbandAttenuationDb: 2 } }, 'response.stopbandAttenuationDb'],
      [{ response: { order: 3, passbandEdgeHz: 1000 }, realization: { impedanceOhms: 1000, capacitorF: 1e-8 } }, 'realization.capacitorF'],
      [{ response: { type: 'highpass', order: 3, passbandEdgeHz: 1000 }, realization: { method: 'fdnr' } }, 'realization.method'],
      [{ response: { order: 3, passbandEdgeHz: 1000 }, parts: { resistors: { minOhms: '1M', maxOhms: '1k' } } }, 'parts.resistors.maxOhms'],
      [{ response: { order: 3, passbandEdgeHz: 1000 }, parts: { opamp: { model: 'ideal', supplyV: 10, outputSwingV: 6 } } }, 'parts.opamp.outputSwingV'],
    ];
    for (const [input, path] of cases) expect(specError(input).issues.map((i) => i.path)).toContain(path);
  });
  it('refuses non-objects, deep nesting and huge inputs without crashing', () => {
    for (const v of [null, 3, 'x', [], undefined]) expect(specError(v).path).toBe('');
    let deep: unknown = 1;
    for (let i = 0; i < 100; i++) deep = { a: deep };
    expect(specError({ response: deep }).issues.some((i) => i.message.startsWith('nesting'))).toBe(true);
    expect(specError({ name: 'x'.repeat(100_000), response: { order: 3, passbandEdgeHz: 1000 } }).path).toBe('name');
  });
});

describe('parseSpec: prototype-pollution keys never change behaviour', () => {
  it.each(FORBIDDEN_KEYS)('refuses %s at any depth and leaves Object.prototype alone', (key) => {
    const text = `{"${key}": {"polluted": 1}, "response": {"order": 3, "passbandEdgeHz": 1000, "${key}": {"type": "highpass"}}}`;
    const e = specError(JSON.parse(text));
    expect(e.issues.map((i) => i.path)).toEqual(expect.arrayContaining([key, `response.${key}`]));
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('sanitiseIdentifier', () => {
  it('makes C identifiers from any name', () => {
    expect(sanitiseIdentifier('shaker lowpass (rev B)')).toBe('shaker_lowpass_rev_B');
    expect(sanitiseIdentifier('Füllstand-Filter')).toBe('Fullstand_Filter');
    expect(sanitiseIdentifier('40kHz-rx')).toBe('f_40kHz_rx');
    expect(sanitiseIdentifier('日本語')).toBe('filter');
    expect(sanitiseIdentifier('a'.repeat(500)).length).toBeLessThanOrEqual(40);
    expect(/^[A-Za-z_][A-Za-z0-9_]*$/.test(sanitiseIdentifier('--__--'))).toBe(true);
  });
});
