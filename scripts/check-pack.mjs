// Packs the package as npm would publish it and checks the tarball: publint (package.json exports,
// files, bin) and @arethetypeswrong/cli (types resolve for ESM and CJS consumers), then smoke-tests the
// built files: the CJS and ESM entries load and design a filter, the Node-only entry runs a parallel
// Monte Carlo on worker threads, and the CLI answers. Part of `npm test`.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const dir = mkdtempSync(join(tmpdir(), 'gicladder-pack-'));
try {
  const out = execFileSync('npm', ['pack', '--pack-destination', dir, '--json'], { encoding: 'utf8' });
  const file = join(dir, JSON.parse(out)[0].filename);
  execFileSync('npx', ['publint', '--strict', file], { stdio: 'inherit' });
  // `gicladder/node` is ESM-only on purpose (worker threads, import.meta.url): from CommonJS it is
  // reached by dynamic import, which attw reports as cjs-resolves-to-esm. The main entry is dual.
  execFileSync('npx', ['attw', file, '--profile', 'node16', '--ignore-rules', 'cjs-resolves-to-esm'], { stdio: 'inherit' });

  const require = createRequire(import.meta.url);
  const cjs = require('../dist/index.cjs');
  const esm = await import('../dist/index.js');
  const spec = { name: 'pack_smoke', response: { type: 'lowpass', family: 'butterworth', order: 3, passbandEdgeHz: 1000 } };
  for (const lib of [cjs, esm]) {
    const d = lib.designFilter(spec);
    if (!(d.parts.length > 0)) throw new Error('the built library designed no parts');
  }
  const node = await import('../dist/node.js');
  const circuit = new esm.Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', 'out', 1000).addCapacitor('C1', 'out', '0', 1e-7);
  const tol = { parts: [{ element: 'R1', tolerance: 0.01 }, { element: 'C1', tolerance: 0.05 }] };
  const r = await node.runMonteCarloParallel(circuit, { input: 'VIN', output: 'out' }, tol, { frequenciesHz: [100, 1000], trials: 2048, seed: 1, workers: 2 });
  if (r.trials !== 2048) throw new Error(`parallel Monte Carlo from dist ran ${r.trials} trials`);
  const help = execFileSync('node', ['dist/cli.js', '--help'], { encoding: 'utf8' });
  if (!help.includes('gicladder')) throw new Error('the built CLI did not answer --help');
  // A reader that closes the pipe before the output comes (here `true`) must not make the CLI crash with an unhandled EPIPE.
  const piped = spawnSync('bash', ['-c', 'node dist/cli.js netlist examples/vibration-antialias-lowpass.json | true'], { encoding: 'utf8' });
  if (/EPIPE/.test(piped.stderr)) throw new Error(`the built CLI crashed on a closed pipe:\n${piped.stderr}`);
  console.log('package check passed');
} finally {
  rmSync(dir, { recursive: true, force: true });
}
