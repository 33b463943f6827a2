/**
 * Fuzzing the measured-data reader of `gicladder check` (production/csv.ts via checkMeasurements):
 * whatever the text, the result is a verdict or a CsvError / InvalidInputError with a path; the summary
 * adds up; reading in arbitrary chunks (as the CLI streams a file) gives the same result as reading
 * the whole text; and on well-formed files the verdicts are the ones the limits say (an independent
 * oracle: each generated row is inside or outside its limits by construction).
 *
 * Cases: 6,000 garbage texts, 3,000 near-valid files with defects, 1,500 well-formed files: 10,500.
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkMeasurements, checkMeasurementsStream, linesOfChunks, type ProductionPlan, type CheckResult } from '../../src/production/index';
import { GicladderError } from '../../src/errors';
import { expectTyped, formatTally, newTally, type ErrorTally } from './arbitraries';

const tallies: [string, ErrorTally][] = [];

const plan = (frequencies: readonly number[], withPhase: boolean): ProductionPlan => ({
  testPoints: frequencies.map((f, i) => ({
    id: `p${i}`,
    frequencyHz: f,
    nominalGainDb: -6,
    gainLimitsDb: i % 3 === 2 ? { lower: -Infinity, upper: -40 } : { lower: -6.5, upper: -5.5 },
    ...(withPhase ? { nominalPhaseDeg: 0, phaseLimitsDeg: { lower: -10, upper: 10 } } : {}),
  })),
  interpolation: frequencies.length > 1 && frequencies[0] === 100 ? 'log-frequency' : 'none',
});

const planArb = fc
  .tuple(fc.uniqueArray(fc.constantFrom(100, 1000, 2000, 5000, 10000, 1e5), { minLength: 1, maxLength: 5 }), fc.boolean())
  .map(([fs, phase]) => plan([...fs].sort((a, b) => a - b), phase));

const headerCell = fc.constantFrom('board', 'Board ID', 'serial', 'frequency_hz', 'Frequency (Hz)', 'freq', 'gain_db', 'Gain [dB]', 'db', 'phase_deg', 'phase', 'temperature', '', ' ', '"board"', 'board,', 'gain');
const cell = fc.oneof(
  fc.constantFrom('A1', 'B2', '1000', '1e3', '-6', '-6.1', '0', '-0', '+5', '1e400', 'NaN', 'Infinity', '0x10', '', ' ', '"', '""', '"a,b"', '"unclosed', '1,5', '\u00a0', '#', '\t', '-', '.', '1e', 'e5'),
  fc.double().map(String),
  fc.string({ maxLength: 12 }),
);
const separator = fc.constantFrom(',', ';', '\t');
const eol = fc.constantFrom('\n', '\r\n', '\r', '');

/** Text built from header-like and row-like lines with random separators, comments, BOM and line ends. */
const garbageCsv = fc.oneof(
  fc.string({ maxLength: 300 }),
  fc.string({ unit: 'binary', maxLength: 300 }),
  fc
    .tuple(
      fc.boolean(),
      separator,
      fc.array(headerCell, { minLength: 0, maxLength: 6 }),
      fc.array(fc.oneof(fc.array(cell, { maxLength: 6 }), fc.constant(['# comment']), fc.constant([])), { maxLength: 12 }),
      eol,
    )
    .map(([bom, sep, header, rows, end]) => `${bom ? '\ufeff' : ''}${[header.join(sep), ...rows.map((r) => r.join(sep))].join(end)}`),
);

/** A well-formed file: rows at the plan's frequencies (or between them), each inside or outside its limits on purpose. */
const wellFormed = planArb.chain((p) =>
  fc
    .tuple(
      fc.array(
        fc.record({
          board: fc.constantFrom('A1', 'A2', 'B"7', 'Ü-3', 'b 4'),
          point: fc.integer({ min: 0, max: p.testPoints.length - 1 }),
          inside: fc.boolean(),
          phase: fc.option(fc.double({ min: -20, max: 20, noNaN: true }), { nil: undefined }),
        }),
        { minLength: 1, maxLength: 30 },
      ),
      separator,
      fc.constantFrom('\n', '\r\n'),
    )
    .map(([rows, sep, end]) => ({ plan: p, rows, sep, end })),
);

function quoteCell(text: string, sep: string): string {
  return text.includes('"') || text.includes(sep) || text !== text.trim() ? `"${text.replace(/"/g, '""')}"` : text;
}

function expectConsistent(r: CheckResult, p: ProductionPlan): void {
  const s = r.summary;
  expect(s.passed + s.failed).toBe(s.boards);
  expect(r.boards.length).toBe(s.boards);
  expect(r.pass).toBe(s.failed === 0 && s.boards > 0);
  for (const b of r.boards) {
    expect(b.points.length).toBe(p.testPoints.length);
    expect(b.pass).toBe(b.points.every((x) => x.status === 'pass') && b.interpolatedPoints.every((x) => x.status === 'pass'));
    for (const x of [...b.points, ...b.interpolatedPoints]) {
      if (x.gainDb !== undefined) expect(Number.isFinite(x.gainDb)).toBe(true);
      if (x.gainMarginDb) expect(Number.isNaN(x.gainMarginDb.lower) || Number.isNaN(x.gainMarginDb.upper)).toBe(false);
    }
  }
  expect(s.pointFailures.map((x) => x.failed + x.missing).every((n) => n >= 0 && n <= s.boards)).toBe(true);
}

/** The same text cut into chunks at the given positions. */
function chunks(text: string, cuts: readonly number[]): string[] {
  const at = [...new Set(cuts.map((c) => Math.floor(c * text.length)))].sort((a, b) => a - b);
  const out: string[] = [];
  let prev = 0;
  for (const c of at) {
    out.push(text.slice(prev, c));
    prev = c;
  }
  out.push(text.slice(prev));
  return out;
}

async function streamed(p: ProductionPlan, text: string, cuts: readonly number[]): Promise<CheckResult | GicladderError> {
  try {
    return await checkMeasurementsStream(p, linesOfChunks(chunks(text, cuts)));
  } catch (e) {
    if (e instanceof GicladderError) return e;
    throw e;
  }
}

function whole(p: ProductionPlan, text: string): CheckResult | GicladderError {
  try {
    return checkMeasurements(p, text);
  } catch (e) {
    if (e instanceof GicladderError) return e;
    throw e;
  }
}

const comparable = (r: CheckResult | GicladderError) => (r instanceof GicladderError ? { error: r.code, path: r.path } : r);

describe('the CSV reader of check, fuzzed', () => {
  afterAll(() => {
    for (const [name, t] of tallies) console.info(formatTally(`csv ${name}`, t));
  });

  it('garbage text: a consistent verdict or a typed error, the same in whole and in chunks (6,000 cases)', async () => {
    const tally = newTally();
    tallies.push(['garbage text', tally]);
    await fc.assert(
      fc.asyncProperty(planArb, garbageCsv, fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 4 }), async (p, text, cuts) => {
        const r = expectTyped(tally, text, () => checkMeasurements(p, text));
        if (r) expectConsistent(r, p);
        // Lone CR is not a line end for either reader; both must agree on every input.
        expect(comparable(await streamed(p, text, cuts))).toEqual(comparable(whole(p, text)));
      }),
      { numRuns: 6000 },
    );
    expect(tally.errors.size).toBeGreaterThan(0);
  });

  it('near-valid files with one defect: typed errors name the line (3,000 cases)', () => {
    const tally = newTally();
    tallies.push(['near-valid files', tally]);
    const defect = fc.constantFrom('', 'x', '"', '1e999', 'NaN', '-1', '0', '  ', '1,2', 'Infinity', '"1000"', '1000 Hz');
    fc.assert(
      fc.property(planArb, fc.integer({ min: 0, max: 2 }), fc.integer({ min: 0, max: 3 }), defect, (p, column, row, bad) => {
        const rows = p.testPoints.flatMap((t) => [['A1', String(t.frequencyHz), '-6'], ['A2', String(t.frequencyHz), '-6.2']]);
        if (row < rows.length) rows[row][column] = bad;
        const text = ['board,frequency_hz,gain_db', ...rows.map((r) => r.join(','))].join('\n');
        let error: unknown;
        const r = expectTyped(tally, text, () => {
          try {
            return checkMeasurements(p, text);
          } catch (e) {
            error = e;
            throw e;
          }
        });
        if (r) expectConsistent(r, p);
        else expect((error as GicladderError).path).toMatch(/^csv line \d+/);
      }),
      { numRuns: 3000 },
    );
  });

  it('well-formed files: each board passes exactly when every row is inside its limits (1,500 cases)', () => {
    const tally = newTally();
    tallies.push(['well-formed files', tally]);
    fc.assert(
      fc.property(wellFormed, ({ plan: p, rows, sep, end }) => {
        const withPhase = p.testPoints[0].phaseLimitsDeg !== undefined;
        const lines = [['board', 'frequency_hz', 'gain_db', ...(withPhase ? ['phase_deg'] : [])].join(sep)];
        const last = new Map<string, Map<number, { inside: boolean; phase?: number }>>();
        for (const r of rows) {
          const t = p.testPoints[r.point];
          const lim = t.gainLimitsDb;
          const gain = r.inside ? (Number.isFinite(lim.lower) ? (lim.lower + lim.upper) / 2 : lim.upper - 1) : lim.upper + 0.25;
          lines.push([quoteCell(r.board, sep), String(t.frequencyHz), String(gain), ...(withPhase ? [r.phase === undefined ? '' : String(r.phase)] : [])].join(sep));
          if (!last.has(r.board.trim())) last.set(r.board.trim(), new Map());
          last.get(r.board.trim())!.set(r.point, { inside: r.inside, phase: withPhase ? r.phase : undefined }); // a repeated point keeps the last row
        }
        const r = expectTyped(tally, lines, () => checkMeasurements(p, `${lines.join(end)}${end}`));
        expect(r).toBeDefined();
        expectConsistent(r!, p);
        for (const b of r!.boards) {
          const seen = last.get(b.board)!;
          const expected = p.testPoints.every((_, i) => {
            const m = seen.get(i);
            return m !== undefined && m.inside && (m.phase === undefined || Math.abs(m.phase) <= 10);
          });
          expect(b.pass).toBe(expected);
        }
        expect(r!.boards.length).toBe(last.size);
      }),
      { numRuns: 1500 },
    );
    expect(tally.accepted).toBe(tally.runs);
  });
});
