/**
 * Fuzzing the command line: runCli with generated argument lists (commands, options, values, file
 * paths to valid, invalid, missing and unreadable inputs). The exit code is always 0, 1 or 2, never
 * 70 (an internal error, i.e. an exception that is not a GicladderError); bad input always says why on
 * stderr; a successful run prints no NaN or Infinity; and no temporary or partial file is left behind.
 *
 * The test runs in its own temporary folder (process.chdir: the vitest pool is 'forks'), so a
 * generated `design` without --out writes there, never into the checkout.
 *
 * 10,000 cases; about 1 % design the small valid file in full (FIGURES.md gives the split).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../src/cli/main';
import { hostileText } from './arbitraries';

const CASES = 10_000;
let dir = '';
let previousCwd = '';
const exitCodes = new Map<number, number>();
let designs = 0;

/** A valid design file that designs in well under a second. */
const SMALL_SPEC = { name: 'cli fuzz', response: { type: 'lowpass', family: 'butterworth', order: 2, passbandEdgeHz: 1000 }, parts: { opamp: { model: 'ideal' } }, evaluation: { sweepPoints: 16 } };

beforeAll(() => {
  previousCwd = process.cwd();
  dir = mkdtempSync(join(tmpdir(), 'gicladder-cli-fuzz-'));
  process.chdir(dir);
  writeFileSync('valid.json', JSON.stringify(SMALL_SPEC));
  writeFileSync('invalid.json', JSON.stringify({ response: { type: 'lowpass', order: 99, passbandEdgeHz: -1 } }));
  writeFileSync('syntax.json', '{"response": {"type": "lowpass",, }');
  writeFileSync('empty.json', '');
  writeFileSync('polluting.json', '{"__proto__": {"polluted": true}, "response": {"type": "lowpass", "order": 2, "passbandEdgeHz": 1000}}');
  writeFileSync('binary.json', Buffer.from([0xff, 0xfe, 0x00, 0x7b, 0x80]));
  writeFileSync('measured.csv', 'board,frequency_hz,gain_db\nA1,1000,-9\n');
  writeFileSync('garbage.csv', '"unclosed,1000\n');
  mkdirSync('a-directory');
  writeFileSync('a-file', 'not a directory');
});

afterAll(() => {
  process.chdir(previousCwd);
  rmSync(dir, { recursive: true, force: true });
  console.info(`cli: ${CASES} cases, ${designs} with the valid design file; exit codes ${[...exitCodes].sort((a, b) => a[0] - b[0]).map(([c, n]) => `${c}: ${n}`).join(', ')}`);
});

const specPath = fc.oneof(
  { weight: 1, arbitrary: fc.constant('valid.json') },
  { weight: 20, arbitrary: fc.constantFrom('invalid.json', 'syntax.json', 'empty.json', 'polluting.json', 'binary.json', 'missing.json', 'a-directory', 'a-file/x.json', '', '-', '--', '-o') },
  { weight: 3, arbitrary: hostileText },
);
const csvPath = fc.constantFrom('measured.csv', 'garbage.csv', 'missing.csv', 'a-directory', 'valid.json');
const outPath = fc.oneof(fc.constantFrom('out1', 'a-file', 'a-file/sub', 'a-directory', '', 'out2/deeper/still', 'header.h'), hostileText.map((t) => `h-${t.replace(/[/\\]/g, '_').slice(0, 40)}`));
const value = fc.oneof(
  fc.constantFrom('1', '2', '5', '15', '16', '0', '-1', '1.5', '1e3', 'NaN', 'Infinity', '', ' ', '0x10', '3 dB', 'open', 'butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel', 'delay', 'magnitude', 'phase', 'shunt-first', 'series-first'),
  fc.double().map(String),
  fc.string({ maxLength: 12 }),
);
const option = fc.oneof(
  fc.constantFrom('--json', '--help', '-h', '--version', '-V', '--', '-', '--out', '-o', '--output', '--bogus', '-x', '--family=elliptic', '--order=3'),
  fc.tuple(fc.constantFrom('--family', '--order', '--ripple-db', '--attenuation-db', '--normalization', '--form', '--source-ohms', '--load-ohms'), value).map(([o, v]) => [o, v]),
  fc.tuple(fc.constantFrom('--out', '-o', '--output'), outPath).map(([o, v]) => [o, v]),
);

/** A prototype command that is usually valid (cheap: a ladder of order <= 6). */
const prototypeArgs = fc
  .record({
    family: fc.constantFrom('butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel', 'Elliptic', 'cauer', ''),
    order: fc.oneof(fc.integer({ min: 0, max: 7 }).map(String), value),
    extra: fc.array(option, { maxLength: 3 }),
  })
  .map((r) => ['prototype', '--family', r.family, '--order', r.order, ...r.extra.flat()]);

const argv = fc.oneof(
  { weight: 3, arbitrary: prototypeArgs },
  {
    weight: 6,
    arbitrary: fc
      .tuple(fc.constantFrom('design', 'header', 'netlist', 'check', 'prototype', 'help', 'bogus', '', '--help', '--version', 'DESIGN'), fc.array(fc.oneof(specPath, csvPath), { maxLength: 3 }), fc.array(option, { maxLength: 3 }))
      .map(([cmd, paths, opts]) => [cmd, ...paths, ...opts.flat()]),
  },
  { weight: 1, arbitrary: fc.array(fc.oneof(value, hostileText, fc.constantFrom('design', 'check', 'prototype')), { maxLength: 6 }) },
);

/** Every file under the folder (relative paths). */
function filesUnder(root: string, prefix = ''): string[] {
  const out: string[] = [];
  for (const name of readdirSync(join(root, prefix))) {
    const rel = prefix ? join(prefix, name) : name;
    if (statSync(join(root, rel)).isDirectory()) out.push(...filesUnder(root, rel));
    else out.push(rel);
  }
  return out;
}

describe('the gicladder command, fuzzed', () => {
  it(`exit 0, 1 or 2 with a reason, never an internal error or a leftover temporary file (${CASES} cases)`, async () => {
    await fc.assert(
      fc.asyncProperty(argv, async (args) => {
        let stdout = '';
        let stderr = '';
        if (args.includes('valid.json') && ['design', 'header', 'netlist', 'check'].includes(args[0])) designs++;
        const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
        exitCodes.set(code, (exitCodes.get(code) ?? 0) + 1);
        const context = `args ${JSON.stringify(args)}\nstdout ${stdout.slice(0, 400)}\nstderr ${stderr.slice(0, 800)}`;
        expect([0, 1, 2], context).toContain(code);
        if (code === 2) expect(stderr.trim().length, context).toBeGreaterThan(0);
        if (code === 0) expect(stdout, context).not.toMatch(/\bNaN\b|(?<![-+"\w])Infinity\b/);
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
        const leftovers = filesUnder(dir).filter((f) => f.endsWith('.tmp'));
        expect(leftovers, context).toEqual([]);
      }),
      { numRuns: CASES },
    );
    expect(exitCodes.get(0) ?? 0).toBeGreaterThan(0);
    expect(exitCodes.get(2) ?? 0).toBeGreaterThan(0);
  });
});
