/**
 * Prints the extreme-design table of test/robustness/FIGURES.md (markdown) from the cases in
 * test/robustness/extreme-cases.ts: `npx tsx scripts/robustness/figures.ts`. The fuzzing figures come
 * from the test run itself (each fuzz test logs its tally: cases, accepted, errors by class and code).
 */
import { EXTREME_CASES, runExtremeCase } from '../../test/robustness/extreme-cases';

const db = (x: number | undefined): string => (x === undefined ? '' : x < 1e-3 ? x.toExponential(1) : x.toFixed(3));
const rows = ['| case | what | outcome | order, route | prototype deviation (evaluation / own), dB | passband error, dB | warnings |', '|---|---|---|---|---|---|---|'];
for (const c of EXTREME_CASES) {
  const o = runExtremeCase(c);
  if (o.designed) {
    const warnings = (o.warnings ?? []).filter((w) => !/_TOO_(SMALL|LARGE)$/.test(w));
    const ranges = (o.warnings ?? []).some((w) => /_TOO_(SMALL|LARGE)$/.test(w)) ? ' (+ part ranges)' : '';
    rows.push(`| ${c.id} | ${c.what} | designed | ${o.order}, ${o.method} | ${db(o.prototypeDeviationDb)} / ${db(o.ownDeviationDb)} | ${db(o.passbandErrorDb)} | ${warnings.join(', ') || '-'}${ranges} |`);
  } else {
    const reason = o.error!.message.replace(/\s*\(got .*$/s, '').replace(/\|/g, '/').slice(0, 160);
    rows.push(`| ${c.id} | ${c.what} | refused: ${o.error!.kind} at \`${o.error!.path}\` | | | | ${reason} |`);
  }
}
console.log(rows.join('\n'));
