/**
 * The CSV reader and the board checker: formats and variants, typed errors with line and column,
 * frequency matching and interpolation, verdicts and margins, streaming with bounded memory.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CsvError, linesOfChunks, MeasurementReader, normalizeColumnName, splitCsvLine } from '../../src/production/csv';
import { checkMeasurements, checkMeasurementsStream, type ProductionPlan } from '../../src/production/check';
import { GicladderError } from '../../src/errors';

const plan: ProductionPlan = {
  testPoints: [
    { id: 'centre', frequencyHz: 1000, nominalGainDb: -6, nominalPhaseDeg: -90, gainLimitsDb: { lower: -6.5, upper: -5.5 }, phaseLimitsDeg: { lower: -95, upper: -85 } },
    { id: 'edge', frequencyHz: 2500, nominalGainDb: -7, gainLimitsDb: { lower: -8, upper: -6 } },
    { id: 'stop', frequencyHz: 10000, nominalGainDb: -50, gainLimitsDb: { lower: -Infinity, upper: -40 } },
  ],
};

function csvError(f: () => unknown): CsvError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(CsvError);
    expect(e).toBeInstanceOf(GicladderError);
    expect((e as CsvError).code).toBe('INVALID_CSV');
    return e as CsvError;
  }
  throw new Error('did not throw');
}

describe('CSV reader', () => {
  it('normalises header names: case, spaces, hyphens, units in brackets', () => {
    expect(normalizeColumnName(' Frequency (Hz) ')).toBe('frequency_hz');
    expect(normalizeColumnName('Gain [dB]')).toBe('gain_db');
    expect(normalizeColumnName('Board-ID')).toBe('board_id');
    expect(normalizeColumnName('PHASE_DEG')).toBe('phase_deg');
  });
  it('splits quoted fields with doubled quotes and keeps empty fields', () => {
    expect(splitCsvLine('a,"b,c","say ""hi""",', ',')).toEqual(['a', 'b,c', 'say "hi"', '']);
    expect(splitCsvLine('"open', ',')).toBeNull();
  });
  it('reads comments, blank lines, CRLF, a BOM, semicolons and reordered columns', () => {
    const r = new MeasurementReader();
    const lines = ['\ufeff# produced by the tester', '', 'Gain (dB);Serial;Frequency (Hz)\r', '  # another', '-6.1;"B 7";1e3\r'];
    const rows = lines.map((l) => r.read(l)).filter((x) => x !== null);
    expect(rows).toEqual([{ board: 'B 7', frequencyHz: 1000, gainDb: -6.1, line: 5 }]);
    expect(r.hasPhase).toBe(false);
  });
  it('an empty phase cell is "not measured"', () => {
    const r = new MeasurementReader();
    r.read('board,frequency_hz,gain_db,phase_deg');
    expect(r.read('A,1000,-6,')).toEqual({ board: 'A', frequencyHz: 1000, gainDb: -6, line: 2 });
    expect(r.read('A,1000,-6,-90')?.phaseDeg).toBe(-90);
  });
  it('malformed input: a typed error with the line and the column', () => {
    const text = (body: string) => `board,frequency_hz,gain_db,phase_deg\n# c\n${body}`;
    const cases: [string, number, string][] = [
      ['A,1000,abc,0', 3, 'gain_db'],
      ['A,0x10,-6,0', 3, 'frequency_hz'],
      ['A,-5,-6,0', 3, 'frequency_hz'],
      ['A,1000,Infinity,0', 3, 'gain_db'],
      ['A,1000,-6,1e999', 3, 'phase_deg'],
      [',1000,-6,0', 3, 'board'],
      ['A,1000', 3, 'gain_db'],
      ['A,1000,-6,0\nB,2500,,', 4, 'gain_db'],
    ];
    for (const [body, line, column] of cases) {
      const e = csvError(() => checkMeasurements(plan, text(body)));
      expect([e.line, e.column]).toEqual([line, column]);
    }
  });
  it('refuses a file without a usable header, an unclosed quote, and duplicate role columns', () => {
    expect(csvError(() => checkMeasurements(plan, 'A,1000,-6\n')).line).toBe(1);
    expect(csvError(() => checkMeasurements(plan, '# only a comment\n\n')).line).toBe(3);
    expect(csvError(() => checkMeasurements(plan, 'board,frequency_hz,gain_db\n"A,1000,-6')).line).toBe(2);
    expect(csvError(() => checkMeasurements(plan, 'board,freq,frequency_hz,gain_db\n')).column).toBe('frequency_hz');
  });
  it('reads back what was written, whatever the line endings, quoting, comments and column order (fast-check)', () => {
    const noNegZero = (x: number) => (x === 0 ? 0 : x); // String(-0) is '0': not a reader matter
    const row = fc.record({
      board: fc.stringMatching(/^[A-Za-z0-9 ,"_-]{1,8}$/).filter((b) => b.trim().length > 0),
      frequencyHz: fc.double({ min: 1e-3, max: 1e9, noNaN: true }),
      gainDb: fc.double({ min: -200, max: 50, noNaN: true }).map(noNegZero),
      phaseDeg: fc.option(fc.double({ min: -720, max: 720, noNaN: true }).map(noNegZero), { nil: undefined }),
    });
    fc.assert(
      fc.property(fc.array(row, { maxLength: 20 }), fc.boolean(), fc.boolean(), fc.constantFrom(',', ';', '\t'), (rows, crlf, comments, sep) => {
        const quote = (b: string) => `"${b.replace(/"/g, '""')}"`;
        const eol = crlf ? '\r\n' : '\n';
        const lines = [['Phase (deg)', 'Gain_dB', 'Board ID', 'frequency'].join(sep)];
        rows.forEach((r, i) => {
          if (comments && i % 3 === 0) lines.push('# comment', '');
          lines.push([r.phaseDeg === undefined ? '' : String(r.phaseDeg), String(r.gainDb), quote(r.board), String(r.frequencyHz)].join(sep));
        });
        const reader = new MeasurementReader();
        const got = lines.join(eol).split('\n').map((l) => reader.read(l)).filter((x) => x !== null);
        expect(got.map(({ line: _line, ...rest }) => rest)).toEqual(rows.map((r) => (r.phaseDeg === undefined ? { board: r.board.trim(), frequencyHz: r.frequencyHz, gainDb: r.gainDb } : { ...r, board: r.board.trim() })));
      }),
      { numRuns: 200 },
    );
  });
  it('linesOfChunks re-cuts arbitrary chunks into the same lines (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.string({ maxLength: 8 }), { maxLength: 12 }), fc.array(fc.integer({ min: 1, max: 7 }), { minLength: 1 }), async (parts, cuts) => {
        const text = parts.join('\n');
        const chunks: string[] = [];
        let i = 0;
        let c = 0;
        while (i < text.length) {
          const n = cuts[c++ % cuts.length];
          chunks.push(text.slice(i, i + n));
          i += n;
        }
        const got: string[] = [];
        for await (const l of linesOfChunks(chunks)) got.push(l);
        const want = text.length === 0 ? [] : text.split('\n');
        if (text.endsWith('\n')) want.pop();
        expect(got).toEqual(want);
      }),
    );
  });
});

const GOOD_A = ['A,1000,-6.1,-91', 'A,2500,-7.2,', 'A,10000,-52'];
const header = 'board,frequency_hz,gain_db,phase_deg';

describe('checkMeasurements', () => {
  it('verdicts per board and point with margins; summary with per-point failure counts', () => {
    const text = [header, ...GOOD_A, 'B,1000,-6.9,-91', 'B,2500,-7.0,-100', 'B,10000,-39.5,0', 'C,1000,-6.0,-96', 'C,2500,-7,'].join('\r\n');
    const r = checkMeasurements(plan, text);
    expect(r.pass).toBe(false);
    expect(r.summary).toMatchObject({ boards: 3, passed: 1, failed: 2, rows: 8 });
    expect(r.summary.pointFailures).toEqual([
      { id: 'centre', frequencyHz: 1000, failed: 2, missing: 0 },
      { id: 'edge', frequencyHz: 2500, failed: 0, missing: 0 },
      { id: 'stop', frequencyHz: 10000, failed: 1, missing: 1 },
    ]);
    const [a, b, c] = r.boards;
    expect(a.pass).toBe(true);
    expect(a.points[0].gainMarginDb!.lower).toBeCloseTo(0.4, 12);
    expect(a.points[0].gainMarginDb!.upper).toBeCloseTo(-5.5 + 6.1, 12);
    expect(a.points[2].gainMarginDb).toEqual({ lower: Infinity, upper: 12 });
    expect(b.points.map((p) => p.status)).toEqual(['fail', 'pass', 'fail']);
    expect(b.points[0].gainPass).toBe(false);
    expect(b.points[1].phaseDeg).toBeUndefined(); // no phase limits at that point: not tested
    expect(c.points.map((p) => p.status)).toEqual(['fail', 'pass', 'missing']);
    expect(c.points[0]).toMatchObject({ gainPass: true, phasePass: false });
  });
  it('a frequency within 1e-6 relative matches; beyond is refused with its line', () => {
    const ok = checkMeasurements(plan, [header, 'A,1000.0009,-6.1,-91', 'A,2500,-7.2,', 'A,10000,-52'].join('\n'));
    expect(ok.boards[0].points[0].measuredFrequencyHz).toBe(1000.0009);
    const e = csvError(() => checkMeasurements(plan, [header, 'A,1000,-6.1,-91', 'A,1000.002,-6.1,-91'].join('\n')));
    expect([e.line, e.column]).toEqual([3, 'frequency']);
  });
  it('log-frequency interpolation between test points, where the plan says so', () => {
    const p: ProductionPlan = { ...plan, interpolation: 'log-frequency' };
    const f = Math.sqrt(1000 * 2500); // half way in log f: limits half way
    const r = checkMeasurements(p, [header, ...GOOD_A, `A,${f},-6.25,`, `A,${Math.sqrt(2500 * 10000)},-25`].join('\n'));
    const [mid, stop] = r.boards[0].interpolatedPoints;
    expect(mid.gainMarginDb!.lower).toBeCloseTo(-6.25 - (-6.5 - 8) / 2, 12);
    expect(mid.gainMarginDb!.upper).toBeCloseTo((-5.5 - 6) / 2 + 6.25, 12);
    expect(stop.gainMarginDb!.lower).toBe(Infinity); // an open lower limit at one end stays open
    expect(stop.gainMarginDb!.upper).toBeCloseTo((-6 - 40) / 2 + 25, 12);
    expect(r.boards[0].pass).toBe(true);
    // Outside the span of test points there is nothing to interpolate between.
    expect(csvError(() => checkMeasurements(p, [header, 'A,20000,-60'].join('\n'))).line).toBe(2);
  });
  it('a repeated measurement keeps the last row and says so', () => {
    const r = checkMeasurements(plan, [header, 'A,1000,-7,-91', ...GOOD_A].join('\n'));
    expect(r.boards[0].pass).toBe(true);
    expect(r.diagnostics.map((d) => d.code)).toEqual(['DUPLICATE_MEASUREMENT']);
  });
  it('warns when the plan has phase limits but the file has no phase column', () => {
    const r = checkMeasurements(plan, ['board,frequency_hz,gain_db', 'A,1000,-6', 'A,2500,-7', 'A,10000,-50'].join('\n'));
    expect(r.pass).toBe(true);
    expect(r.diagnostics.map((d) => d.code)).toEqual(['NO_PHASE_COLUMN']);
  });
  it('rejects a bad plan with the field named', () => {
    const bad: [unknown, string][] = [
      [{ testPoints: [] }, 'plan.testPoints'],
      [{ testPoints: [{ frequencyHz: -1, nominalGainDb: 0, gainLimitsDb: { lower: -1, upper: 1 } }] }, 'plan.testPoints[0].frequencyHz'],
      [{ testPoints: [{ frequencyHz: 1, nominalGainDb: 0, gainLimitsDb: { lower: NaN, upper: 1 } }] }, 'plan.testPoints[0].gainLimitsDb.lower'],
      [{ testPoints: plan.testPoints, interpolation: 'cubic' }, 'plan.interpolation'],
      [{ testPoints: [plan.testPoints[0], { ...plan.testPoints[0], frequencyHz: 1000.0001 }] }, 'plan.testPoints[1].frequencyHz'],
    ];
    for (const [p, path] of bad) {
      try {
        checkMeasurements(p as ProductionPlan, header);
        throw new Error('no throw');
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).path).toBe(path);
      }
    }
  });
});

describe('checkMeasurementsStream', () => {
  function* manyBoards(n: number, interleaved: boolean): Generator<string> {
    yield header;
    if (interleaved) {
      for (const f of [1000, 2500, 10000]) for (let b = 0; b < n; b++) yield `B${b},${f},${f === 1000 ? -6 : f === 2500 ? -7 : -45},-90`;
    } else {
      for (let b = 0; b < n; b++) for (const f of [1000, 2500, 10000]) yield `B${b},${f},${b % 10 === 0 && f === 2500 ? -9 : f === 1000 ? -6 : f === 2500 ? -7 : -45},-90`;
    }
  }
  it('gives the same result as checkMeasurements on the same text (interleaved boards)', async () => {
    const lines = [...manyBoards(50, true)];
    const a = checkMeasurements(plan, lines.join('\n'));
    const b = await checkMeasurementsStream(plan, lines);
    expect(b).toEqual(a);
    expect(a.summary.passed).toBe(50);
  });
  it('contiguous boards with retainBoards: false keep nothing per board (100000 boards, 300000 rows)', async () => {
    let seen = 0;
    const r = await checkMeasurementsStream(plan, manyBoards(100_000, false), {
      contiguousBoards: true,
      retainBoards: false,
      onBoard: () => {
        seen++;
      },
    });
    expect(seen).toBe(100_000);
    expect(r.boards).toEqual([]);
    expect(r.summary).toMatchObject({ boards: 100_000, failed: 10_000, rows: 300_000 });
    expect(r.summary.pointFailures[1].failed).toBe(10_000);
  });
  it('contiguous mode refuses a board that comes back', async () => {
    await expect(checkMeasurementsStream(plan, [header, 'A,1000,-6,-90', 'B,1000,-6,-90', 'A,2500,-7,'], { contiguousBoards: true })).rejects.toMatchObject({
      code: 'INVALID_CSV',
      line: 4,
    });
  });
  it('accepts an async iterable of lines', async () => {
    async function* gen() {
      yield* [header, ...GOOD_A];
    }
    expect((await checkMeasurementsStream(plan, gen())).pass).toBe(true);
  });
});

describe('documentation example', () => {
  it('runs the @example of checkMeasurements', () => {
    const plan = { testPoints: [{ id: 'edge', frequencyHz: 1000, nominalGainDb: -3, gainLimitsDb: { lower: -3.5, upper: -2.5 } }] };
    const r = checkMeasurements(plan, 'board,frequency_hz,gain_db\nA1,1000,-3.1\nA2,1000,-3.9\n');
    expect(r.summary.passed).toBe(1);
    expect(r.boards[1].points[0].gainMarginDb!.lower).toBeCloseTo(-0.4, 12);
  });
});
