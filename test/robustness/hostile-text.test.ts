/**
 * Hostile text in the design file (names with quotes, newlines, comment ends, #define, non-ASCII, very
 * long strings; the export prefix; the trim element's name) never reaches an output unescaped and never
 * changes behaviour: the same design with a plain name gives the same parts, evaluation, netlist cards
 * and header numbers. The header with every hostile name is compiled by gcc (-Wall -Wextra -Werror
 * -pedantic), and the netlist runs in ngspice, which must see exactly the circuit's cards.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderDesignOutputs } from '../../src/cli/design-command';
import { GicladderError } from '../../src/errors';
import { haveTool, IN_CI, toolTitle } from '../export/helpers/toolchain';
import { runNgspiceAc } from '../helpers/ngspice';
import { HOSTILE_STRINGS, prototypeSnapshot } from './arbitraries';
import { outputProblems } from './output-checks';

const BASE = { response: { type: 'lowpass', family: 'chebyshev', order: 3, passbandEdgeHz: 1000, passbandRippleDb: 0.5 }, evaluation: { sweepPoints: 32 } };
const plain = renderDesignOutputs({ ...BASE, name: 'plain' });
const GCC = haveTool('gcc');
/** Every hostile string at once, within the 1000-character name limit (without NUL, which the header refuses: FIGURES.md). */
const MIXED = HOSTILE_STRINGS.filter((t) => t.length < 100 && !t.includes('\u0000')).join('');

/** JSON with bigints (exact values) as text. */
const json = (v: unknown): string => JSON.stringify(v, (_k, x: unknown) => (typeof x === 'bigint' ? `${x}n` : x));
/** The header's lines that carry numbers (array rows and numeric macros), with identifiers cut off: the same for any name. */
const numbersOf = (header: string): string[] => header.split('\n').filter((l) => /^\s*\{|^#define \S+_COUNT /.test(l)).map((l) => l.replace(/^#define \S+_COUNT/, '#define COUNT'));
/** The netlist's element cards without the title and comments. */
const cardsOf = (netlist: string): string[] => netlist.split('\n').slice(1).filter((l) => !l.startsWith('*'));

function compiles(header: string): { ok: boolean; log: string } {
  const d = mkdtempSync(join(tmpdir(), 'gicladder-hostile-'));
  try {
    writeFileSync(join(d, 'h.h'), header);
    writeFileSync(join(d, 'main.c'), '#include "h.h"\n#include "h.h"\nint main(void) { return 0; }\n');
    const r = spawnSync('gcc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-Wno-unused-const-variable', '-Wno-unused-variable', '-fsyntax-only', join(d, 'main.c')], { encoding: 'utf8', timeout: 60_000 });
    return { ok: r.status === 0, log: `${r.stdout}${r.stderr}` };
  } finally {
    rmSync(d, { recursive: true, force: true });
  }
}

describe('hostile text in the design file', () => {
  const before = prototypeSnapshot();
  for (const [i, text] of HOSTILE_STRINGS.entries()) {
    it(`name #${i} ${JSON.stringify(text.slice(0, 30))}: escaped in every output, same design as a plain name`, () => {
      let r;
      try {
        r = renderDesignOutputs({ ...BASE, name: text });
      } catch (e) {
        // A refusal is allowed only as a typed error naming the field (e.g. a NUL the header cannot carry).
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).path).toMatch(/name/);
        return;
      }
      expect(outputProblems(r.files)).toEqual([]);
      expect(r.design.spec.name).toBe(text);
      expect(JSON.parse(r.files['report.json']).name).toBe(text); // the report keeps the name as data
      expect(json(r.design.parts)).toBe(json(plain.design.parts));
      expect(json(r.design.evaluation)).toBe(json(plain.design.evaluation));
      const header = Object.entries(r.files).find(([f]) => f.endsWith('.h'))![1];
      const netlist = Object.entries(r.files).find(([f]) => f.endsWith('.cir'))![1];
      expect(numbersOf(header)).toEqual(numbersOf(Object.entries(plain.files).find(([f]) => f.endsWith('.h'))![1]));
      expect(cardsOf(netlist)).toEqual(cardsOf(Object.entries(plain.files).find(([f]) => f.endsWith('.cir'))![1]));
      expect(prototypeSnapshot()).toBe(before);
    });
  }

  it('a hostile export prefix and trim element: sanitised identifiers or a typed refusal', () => {
    for (const text of HOSTILE_STRINGS) {
      try {
        const r = renderDesignOutputs({ ...BASE, name: 'x', export: { identifierPrefix: text } });
        expect(outputProblems(r.files)).toEqual([]);
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
      }
      try {
        renderDesignOutputs({ ...BASE, name: 'x', trim: { enabled: true, element: text }, production: { trials: 200 } });
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).path).toMatch(/trim/);
      }
    }
  });

  describe.runIf(GCC || IN_CI)(toolTitle('compiled by gcc', ['gcc'], GCC), () => {
    it('every hostile name gives a header that compiles cleanly, twice included', () => {
      const failures: string[] = [];
      for (const text of [...HOSTILE_STRINGS, MIXED]) {
        let header: string;
        try {
          header = Object.entries(renderDesignOutputs({ ...BASE, name: text }).files).find(([f]) => f.endsWith('.h'))![1];
        } catch {
          continue; // refused, typed (checked above)
        }
        const c = compiles(header);
        if (!c.ok) failures.push(`${JSON.stringify(text)}: ${c.log.slice(0, 400)}`);
      }
      expect(failures).toEqual([]);
    });
  });

  it('ngspice runs the netlist of the most hostile name and sees the same response as with a plain name', () => {
    const name = MIXED;
    const netlist = Object.entries(renderDesignOutputs({ ...BASE, name }).files).find(([f]) => f.endsWith('.cir'))![1];
    const plainNetlist = Object.entries(plain.files).find(([f]) => f.endsWith('.cir'))![1];
    const a = runNgspiceAc(netlist);
    const b = runNgspiceAc(plainNetlist);
    if (a.status === 'missing' || b.status === 'missing') {
      expect(IN_CI).toBe(false);
      return;
    }
    expect(a.points.length).toBeGreaterThan(10);
    expect(a.points).toEqual(b.points);
    expect(a.log).not.toMatch(/shell|pwned/);
  });
});
