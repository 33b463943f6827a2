/**
 * Determinism (DESIGN.md, conventions): the same design file and library version give byte-identical
 * outputs. Every example is designed twice, from two separately parsed copies of the file (so no
 * cache keyed on the object can make the second run agree); the parts and evaluation, and every output
 * file of `gicladder design` (report, header, netlist, CSV, plots), must match byte for byte. The Monte
 * Carlo of a real design's circuit and tolerances gives the same result serially and on two worker
 * threads.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { renderDesignOutputs } from '../../src/cli/design-command';
import { designFilter } from '../../src/spec/design-filter';
import { designMask, designTolerances } from '../../src/spec/production';
import { runMonteCarlo } from '../../src/tolerance/monte-carlo';
import { runMonteCarloParallel } from '../../src/tolerance/parallel.node';

const examplesDir = fileURLToPath(new URL('../../examples/', import.meta.url));
const examples = readdirSync(examplesDir).filter((f) => f.endsWith('.json')).sort();
const load = (name: string): unknown => JSON.parse(readFileSync(`${examplesDir}${name}`, 'utf8'));

/** Typed arrays as arrays and bigints (exact values) as text, so JSON compares their values. */
const json = (v: unknown): string => JSON.stringify(v, (_k, x: unknown) => (ArrayBuffer.isView(x) ? Array.from(x as Float64Array) : typeof x === "bigint" ? `${x}n` : x));

describe('determinism', () => {
  it('finds the examples', () => {
    expect(examples.length).toBeGreaterThanOrEqual(4);
  });

  for (const name of examples) {
    it(`${name}: two designs from two parses give byte-identical parts, evaluation and output files`, () => {
      const a = renderDesignOutputs(load(name));
      const b = renderDesignOutputs(load(name));
      expect(json(b.design.parts)).toBe(json(a.design.parts));
      expect(json(b.design.evaluation)).toBe(json(a.design.evaluation));
      expect(Object.keys(b.files)).toEqual(Object.keys(a.files));
      for (const f of Object.keys(a.files)) expect(b.files[f], f).toBe(a.files[f]);
    });
  }

  it('the Monte Carlo of an example design: serial and two worker threads agree byte for byte', async () => {
    const design = designFilter(load('vibration-antialias-lowpass.json'));
    const tolerances = designTolerances(design);
    const options = { frequenciesHz: [1000, 8000, 24000], trials: 2000 + 37, seed: 11, blockSize: 256, mask: designMask(design) };
    const serial = runMonteCarlo(design.circuit, { input: 'VIN', output: 'out' }, tolerances, options);
    const parallel = await runMonteCarloParallel(design.circuit, { input: 'VIN', output: 'out' }, tolerances, { ...options, workers: 2 });
    expect(json(parallel)).toBe(json(serial));
  });
});
