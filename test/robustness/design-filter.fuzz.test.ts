/**
 * Fuzzing the whole chain: designFilter, then every output of `gicladder design` (report, C header,
 * SPICE netlist, SVG plots) rendered in memory. Only typed errors may come out; a design that is
 * returned has finite part values and evaluation figures, and every output passes output-checks.ts.
 *
 * A full design costs 0.05 s to a few seconds, so this file runs fewer cases than the reader's fuzzing
 * (parse-spec.fuzz.test.ts, 12,000 cases): 3,000 garbage or mutated files (about 2 % of the mutated
 * ones stay valid and are designed in full) and 60 structurally valid extreme files. ROBUSTNESS_SCALE=k
 * multiplies both counts for a longer local run (FIGURES.md gives the counts of such a run).
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { renderDesignOutputs, type RenderedOutputs } from '../../src/cli/design-command';
import { cheapValidSpec, expectTyped, formatTally, garbageSpec, mutatedSpec, newTally, nonFiniteNumbers, prototypeSnapshot, safeShow, type ErrorTally } from './arbitraries';
import { headerProblems, netlistProblems, outputProblems, svgProblems } from './output-checks';

const SCALE = Math.max(1, Number(process.env.ROBUSTNESS_SCALE ?? 1) || 1);
const tallies: [string, ErrorTally][] = [];
const before = prototypeSnapshot();

function checkRendered(r: RenderedOutputs, input: unknown): void {
  const d = r.design;
  const where = `\ninput: ${safeShow(input)}`;
  expect(nonFiniteNumbers(d.parts.map((p) => p.value)), where).toEqual([]);
  expect(d.parts.every((p) => p.value > 0), where).toBe(true);
  const e = d.evaluation;
  expect(nonFiniteNumbers({ passband: e.passbandErrorDb, deviation: e.prototypeDeviationDb, stopband: e.stopband, swing: e.swing }), where).toEqual([]);
  expect(outputProblems(r.files), where).toEqual([]);
  for (const x of d.diagnostics) expect(x.message, where).not.toMatch(/\bNaN\b|\bInfinity\b|undefined/);
}

describe('designFilter and its outputs, fuzzed', () => {
  afterAll(() => {
    for (const [name, t] of tallies) console.info(formatTally(`designFilter ${name}`, t));
  });

  it('the output checks catch what they look for (so the fuzzing below can fail)', () => {
    const header = '#ifndef X_H\n#define X_H\nstatic const float A = nan;\n#endif\n';
    expect(headerProblems(header).join()).toMatch(/non-finite/);
    expect(headerProblems('#ifndef X_H\n#define X_H\n#define N "a\n#endif\n').join()).toMatch(/not closed/);
    expect(headerProblems('#ifndef X_H\n#define X_H\n/* x */ #define evil 1\n#endif\n').join()).toMatch(/macro name/);
    expect(netlistProblems('title\nR1 a b NaN\n.end\n').join()).toMatch(/non-finite/);
    expect(netlistProblems('title\n.control\nshell x\n.endc\n.end\n').join()).toMatch(/unexpected card/);
    expect(svgProblems('<svg><text>a < b</text></svg>').join()).toMatch(/unmatched/);
    expect(svgProblems('<svg><line x1="NaN"/></svg>').join()).toMatch(/non-finite/);
    expect(svgProblems('<svg><text>&#0;</text></svg>').join()).toMatch(/not allowed/);
  });

  it(`garbage and mutated design files: typed errors, or a clean design (${3000 * SCALE} cases)`, () => {
    const tally = newTally();
    tallies.push(['garbage and mutated files', tally]);
    fc.assert(
      fc.property(fc.oneof({ weight: 1, arbitrary: garbageSpec }, { weight: 4, arbitrary: mutatedSpec }), (input) => {
        const r = expectTyped(tally, input, () => renderDesignOutputs(input));
        if (r) checkRendered(r, input);
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      }),
      { numRuns: 3000 * SCALE },
    );
    expect(tally.accepted).toBeGreaterThan(0);
    expect(prototypeSnapshot()).toBe(before);
  });

  it(`structurally valid extreme files (orders 1-4, 1 Hz-10 MHz, 100 ohm-10 Mohm, any family and type): typed refusal or a clean design (${60 * SCALE} cases)`, () => {
    const tally = newTally();
    tallies.push(['valid extreme files', tally]);
    fc.assert(
      fc.property(cheapValidSpec, (input) => {
        const r = expectTyped(tally, input, () => renderDesignOutputs(input));
        if (r) checkRendered(r, input);
      }),
      { numRuns: 60 * SCALE },
    );
    // Most of these design (the refusals are the highpass routes without a DC path, see FIGURES.md).
    expect(tally.accepted).toBeGreaterThan(tally.runs / 2);
  });
});
