import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const SRC = join(__dirname, '..', 'src');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : [];
  });
}

/** The stage order of DESIGN.md: a folder may import only folders listed before it. */
const STAGES = [
  'algebra', 'units', 'netlist', 'analysis', 'approximation', 'ladder', 'transform', 'converter',
  'substitution', 'selection', 'tolerance', 'production', 'export', 'spec', 'cli',
];

const importsOf = (text: string) => [...text.matchAll(/(?:import|export)[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1] ?? m[2]);

describe('package structure', () => {
  it('the core imports no Node built-ins, so it bundles for browsers (the CLI and node-only files are exempt)', () => {
    const offenders: string[] = [];
    for (const f of files(SRC)) {
      const rel = relative(SRC, f);
      if (rel.startsWith('cli') || rel.includes('.node.')) continue;
      for (const spec of importsOf(readFileSync(f, 'utf8'))) {
        if (spec.startsWith('node:') || ['fs', 'path', 'os', 'child_process', 'worker_threads', 'crypto', 'url'].includes(spec)) offenders.push(`${rel} -> ${spec}`);
      }
    }
    expect(offenders).toEqual([]);
  });

  it('stage folders import only the stages above them (DESIGN.md data flow)', () => {
    const offenders: string[] = [];
    for (const f of files(SRC)) {
      const rel = relative(SRC, f).split(/[\\/]/);
      if (rel.length < 2) continue;
      const own = STAGES.indexOf(rel[0]);
      if (own < 0) continue;
      for (const spec of importsOf(readFileSync(f, 'utf8'))) {
        if (!spec.startsWith('.')) continue;
        const target = relative(SRC, join(f, '..', spec)).split(/[\\/]/)[0];
        const other = STAGES.indexOf(target);
        if (other > own) offenders.push(`${rel.join('/')} -> ${target}`);
      }
    }
    expect(offenders).toEqual([]);
  });
});

describe('version', () => {
  it('src/version.ts matches package.json', async () => {
    const { VERSION } = await import('../src/version');
    const pkg = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8'));
    expect(VERSION).toBe(pkg.version);
  });
});
