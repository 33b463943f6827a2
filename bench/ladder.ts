/**
 * Ladder-synthesis benchmarks: designLadderPrototype (prototype + Darlington synthesis) for elliptic
 * 1 dB / 80 dB and inverse Chebyshev 80 dB at orders 9 to 15, equal terminations, and the raw-zpk route
 * (synthesizeLadder without the approximation's reflection zeros, which infers them). Target: well under
 * a second per synthesis at order 15. Median of repetitions after a warm-up. Run: npx tsx bench/ladder.ts
 * Prints a Markdown table (with the load average, since timings on a shared machine vary).
 */
import { loadavg } from 'node:os';
import { designLadderPrototype } from '../src/ladder/ladder-prototype';
import { synthesizeLadder } from '../src/ladder/darlington';
import { lowpassPrototype, type LowpassPrototypeParams } from '../src/approximation/index';

const SAMPLES = 5;

function medianMs(f: () => void): number {
  f(); // warm-up
  const t: number[] = [];
  for (let k = 0; k < SAMPLES; k++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  t.sort((a, b) => a - b);
  return t[(SAMPLES - 1) / 2];
}

const rows: string[] = ['| response | order | designLadderPrototype (ms) | raw zpk (ms) |', '|---|---|---|---|'];
const families: [string, (n: number) => LowpassPrototypeParams][] = [
  ['elliptic 1 dB / 80 dB', (n) => ({ family: 'elliptic', order: n, passbandRippleDb: 1, stopbandAttenuationDb: 80 })],
  ['inverse Chebyshev 80 dB', (n) => ({ family: 'inverse-chebyshev', order: n, stopbandAttenuationDb: 80 })],
];
for (const [name, params] of families) {
  for (let n = 9; n <= 15; n++) {
    const p = params(n);
    const run = (f: () => unknown) => () => {
      try {
        f();
      } catch {
        // refused (no positive ladder): timed all the same
      }
    };
    const withZeros = medianMs(run(() => designLadderPrototype(p)));
    const zpk = lowpassPrototype(p);
    const raw = medianMs(run(() => synthesizeLadder(zpk)));
    rows.push(`| ${name} | ${n} | ${withZeros.toFixed(1)} | ${raw.toFixed(1)} |`);
  }
}
console.log(rows.join('\n'));
console.log(`\nload average ${loadavg().map((x) => x.toFixed(1)).join(' ')}`);
