import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { designFilter, planDesignProduction, checkMeasurements, productionOutputs, toCHeader, NO_LOWER_LIMIT_DB } from '../../src/spec/index';
import { runCli } from '../../src/cli/main';
import { GicladderError } from '../../src/errors';

const EXAMPLE = join(__dirname, '..', '..', 'examples', 'vibration-antialias-lowpass.json');
const spec = JSON.parse(readFileSync(EXAMPLE, 'utf8'));
// Fewer boards than the example asks for, to keep the test fast; the figures below do not depend on it.
spec.production = { ...spec.production, trials: 1500 };
const design = designFilter(spec);
const production = planDesignProduction(design)!;

describe('the production stage of a design', () => {
  it('chooses test points from the mask: a decade below the edge, the edge, and the stopband edge', () => {
    const f = production.test.points.map((p) => p.frequencyHz);
    expect(f).toEqual([800, 8000, 24000]);
    const roles = production.test.points.map((p) => p.role);
    expect(roles).toEqual(['passband-centre', 'passband-edge', 'stopband']);
  });

  it('sets acceptance limits inside the tolerance by the guard band (guarded acceptance, w = U = k u)', () => {
    const u = spec.production.measurementUncertaintyDb;
    const k = 1.959963984540054; // normal quantile at 0.975 (coverage 0.95; scipy.stats.norm.ppf(0.975))
    for (const p of production.test.points) {
      expect(p.gain.guardBand).toBeCloseTo(k * u, 9);
      if (Number.isFinite(p.gain.tolerance.lower)) expect(p.gain.acceptance.lower).toBeCloseTo(p.gain.tolerance.lower + k * u, 9);
      expect(p.gain.acceptance.upper).toBeCloseTo(p.gain.tolerance.upper - k * u, 9);
      expect(p.gain.predictedYield).toBeGreaterThan(0.9);
      expect(p.gain.predictedYield).toBeLessThanOrEqual(1);
    }
  });

  it('makes a trim table on the GIC set resistors, ganged, and the trim does not lower the yield', () => {
    const t = production.test.trim!;
    expect(production.trimTargets.map((x) => x.element)).toEqual(['X_C2.R5', 'X_C4.R5']);
    expect(t.table.entries).toHaveLength(spec.trim.device.steps + 1);
    expect(t.trimmedYield).toBeGreaterThanOrEqual(t.untrimmedYield);
    expect(t.trimmedError.sd).toBeLessThan(t.untrimmedError.sd);
  });

  it('checks measured boards: the nominal board passes, one 0.5 dB low at the edge fails there', () => {
    const rows = ['board,frequency_hz,gain_db'];
    for (const p of production.plan.testPoints) rows.push(`good,${p.frequencyHz},${p.nominalGainDb}`);
    for (const p of production.plan.testPoints) rows.push(`low,${p.frequencyHz},${p.nominalGainDb - (p.frequencyHz === 8000 ? 0.8 : 0)}`);
    const r = checkMeasurements(production, rows.join('\n'));
    expect(r.summary.boards).toBe(2);
    expect(r.boards.find((b) => b.board === 'good')!.pass).toBe(true);
    const low = r.boards.find((b) => b.board === 'low')!;
    expect(low.pass).toBe(false);
    expect(low.points.filter((p) => p.status === 'fail').map((p) => p.frequencyHz)).toEqual([8000]);
  });

  it('refuses a frequency that is not a test point, and malformed CSV with its line number', () => {
    expect(() => checkMeasurements(production, 'board,frequency_hz,gain_db\nb1,1234,-6')).toThrow(GicladderError);
    let err: unknown;
    try {
      checkMeasurements(production, 'board,frequency_hz,gain_db\nb1,800,-6\nb1,8000,minus six');
    } catch (e) {
      err = e;
    }
    expect((err as GicladderError).code).toBe('INVALID_CSV');
    expect((err as { line?: number }).line).toBe(3);
  });

  it('puts the test points, limits and trim table into the C header, with the documented open-limit value', () => {
    const extras = productionOutputs(design)!;
    const h = toCHeader(design, extras.headerExtras);
    expect(h).toMatch(/VIB_AAF_TEST_POINT_COUNT 3/);
    expect(h).toMatch(/VIB_AAF_TRIM_DEFAULT_CODE \d+/);
    expect(h).toContain(`${NO_LOWER_LIMIT_DB}.0f`);
    expect(h).not.toMatch(/nan|inf/i);
  });

  it('designs without a production plan unless the design file asks for one', () => {
    const plain = designFilter({ ...spec, production: { enabled: false }, trim: { enabled: false } });
    expect(planDesignProduction(plain)).toBeNull();
    expect(() => checkMeasurements(plain, 'board,frequency_hz,gain_db\n')).toThrow(/production.enabled/);
  });
});

describe('gicladder check', () => {
  const run = async (args: string[]) => {
    let stdout = '';
    let stderr = '';
    const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
    return { code, stdout, stderr };
  };
  const dir = mkdtempSync(join(tmpdir(), 'gicladder-check-'));
  const specFile = join(dir, 'spec.json');
  writeFileSync(specFile, JSON.stringify(spec));

  it('exits 0 when every board passes and 1 when one fails; --json gives every verdict', async () => {
    const good = join(dir, 'good.csv');
    const lines = ['board,frequency_hz,gain_db', ...production.plan.testPoints.map((p) => `A1,${p.frequencyHz},${p.nominalGainDb}`)];
    writeFileSync(good, lines.join('\n'));
    const ok = await run(['check', specFile, good]);
    expect(ok.code).toBe(0);
    expect(ok.stdout).toMatch(/1 boards, 1 passed, 0 failed/);
    const bad = join(dir, 'bad.csv');
    writeFileSync(bad, [...lines, ...production.plan.testPoints.map((p) => `A2,${p.frequencyHz},${p.nominalGainDb + 3}`)].join('\n'));
    const fail = await run(['check', specFile, bad, '--json']);
    expect(fail.code).toBe(1);
    const json = JSON.parse(fail.stdout);
    expect(json.summary.failed).toBe(1);
  }, 120_000);

  it('exits 2 with the line number for malformed CSV', async () => {
    const broken = join(dir, 'broken.csv');
    writeFileSync(broken, 'board,frequency_hz,gain_db\nA1,800,-6\nA1,8000,"');
    const r = await run(['check', specFile, broken]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/line 3/);
  }, 120_000);
});
