/** The TSDoc @example blocks of src/export, run as written. */
import { expect, it } from 'vitest';
import { cStringLiteral, formatCFloat, sanitiseCIdentifier } from '../../src/export/c-literals';
import { fnv1a64, hashDesign } from '../../src/export/design-hash';
import { bilinearZpk } from '../../src/export/bilinear';
import { zpkToDigitalSections } from '../../src/export/sos';
import { renderCHeader } from '../../src/export/c-header';
import { renderPlotSvg } from '../../src/export/svg/render-svg';
import { gainPlot } from '../../src/export/svg/plots';

it('c-literals.ts examples', () => {
  expect(formatCFloat(5, 'float')).toBe('5.0f');
  expect(formatCFloat(0.1, 'double')).toBe('0.10000000000000001');
  expect(formatCFloat(12, 'double', 'hex')).toBe('0x1.8p+3');
  expect(cStringLiteral('10 \u00b5F "x"??')).toBe('"10 \\302\\265F \\"x\\"\\?\\?"');
  expect(sanitiseCIdentifier('shaker lowpass #2')).toBe('SHAKER_LOWPASS_2');
});

it('design-hash.ts example', () => {
  expect(fnv1a64('a')).toBe('af63dc4c8601ec8c');
});

it('bilinear.ts example: the closed form of a prewarped first-order lowpass (derived by hand, K = wc / tan(pi / 8))', () => {
  const wc = 2 * Math.PI * 1000;
  const [s] = zpkToDigitalSections(bilinearZpk({ zeros: [], poles: [{ re: -wc, im: 0 }], gain: wc }, 8000, { prewarpHz: 1000 }));
  expect(s.b0).toBeCloseTo(1 - 1 / Math.SQRT2, 14);
  expect(s.b1).toBeCloseTo(1 - 1 / Math.SQRT2, 14);
  expect(s.a1).toBeCloseTo(1 - Math.SQRT2, 14);
});

it('c-header.ts example', () => {
  const h = renderCHeader({
    name: 'demo',
    prefix: 'flt',
    libraryVersion: '0.1.0',
    designHash: hashDesign({ name: 'demo' }),
    floatType: 'float',
    parts: [{ name: 'R1', valueSi: 4700, unit: 'ohm' }],
    analogSections: [{ n0: 1, n1: 0, n2: 0, d0: 1, d1: 1e-4, d2: 0 }],
  });
  expect(h.includes('static const float FLT_PART_VALUES_SI[FLT_PART_COUNT] = { 4700.0f };')).toBe(true);
});

it('render-svg.ts example', () => {
  const svg = renderPlotSvg(gainPlot({ frequencyHz: [10, 100, 1000], gainDb: [0, -3, -20] }));
  expect(svg.includes('>Gain (dB)<')).toBe(true);
});
