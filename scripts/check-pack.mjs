// Packs the package as npm would publish it and checks the tarball: publint (package.json exports,
// files, bin) and @arethetypeswrong/cli (types resolve for ESM and CJS consumers). Part of `npm test`.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const dir = mkdtempSync(join(tmpdir(), 'gicladder-pack-'));
try {
  const out = execFileSync('npm', ['pack', '--pack-destination', dir, '--json'], { encoding: 'utf8' });
  const file = join(dir, JSON.parse(out)[0].filename);
  execFileSync('npx', ['publint', '--strict', file], { stdio: 'inherit' });
  // The CLI entry is ESM-only on purpose (node >= 20); "cjs-resolves-to-esm" does not apply to the library entry.
  execFileSync('npx', ['attw', file, '--profile', 'node16'], { stdio: 'inherit' });
  console.log('package check passed');
} finally {
  rmSync(dir, { recursive: true, force: true });
}
