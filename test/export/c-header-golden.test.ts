/**
 * Golden file: the whole header of a small fixed model, byte for byte, so any change of layout, names
 * or number format shows up in review. After an intended change, regenerate the golden file with
 * GICLADDER_UPDATE_GOLDEN=1 and review the diff.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { renderCHeader, type HeaderModel } from '../../src/export/c-header';

const GOLDEN = fileURLToPath(new URL('./golden/demo-bandpass.h', import.meta.url));

/** Hand-written values (not computed), so the golden depends on the writer alone. */
const MODEL: HeaderModel = {
  name: 'demo bandpass "v2"',
  prefix: 'demo',
  libraryVersion: '0.1.0',
  designHash: 'fnv1a64:00000000deadbeef',
  floatType: 'float',
  fixedPoint: 'Q15',
  parts: [
    { name: 'R1', valueSi: 10000, unit: 'ohm' },
    { name: 'C1', valueSi: 1e-8, unit: 'farad' },
  ],
  testPoints: [{ frequencyHz: 1000, gainDb: 0, phaseDeg: -0, lowDb: -0.5, highDb: 0.5 }],
  trim: { codes: [{ code: -1, gainDb: -0.25, phaseDeg: 1.5 }, { code: 0, gainDb: 0, phaseDeg: 0 }], defaultCode: 0 },
  analogSections: [{ n0: 0, n1: 6283.185307179586, n2: 0, d0: 39478417.604357434, d1: 6283.185307179586, d2: 1 }],
  digital: { sampleRateHz: 48000, prewarpHz: 1000, sections: [{ b0: 0.125, b1: 0, b2: -0.125, a1: -1.75, a2: 0.75 }] },
};

describe('C header golden file', () => {
  it('demo-bandpass.h', () => {
    const text = renderCHeader(MODEL);
    if (process.env.GICLADDER_UPDATE_GOLDEN === '1') writeFileSync(GOLDEN, text);
    expect(text).toBe(readFileSync(GOLDEN, 'utf8'));
  });
});
