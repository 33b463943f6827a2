/**
 * `gicladder check <spec.json> <measured.csv> [--json]`: production-test verdicts for measured boards.
 * The CSV streams from disk (memory grows with boards and test points, not with the file). Exit 0
 * when every board passes, 1 when any fails; malformed CSV is bad input (exit 2, with the line).
 */
import { createReadStream, statSync } from 'node:fs';
import { checkMeasurementsStream, linesOfChunks } from '../production/index';
import { designFilter, planOf } from '../spec/index';
import { InputFileError, readJsonFile } from './spec-file';
import { cautionFor } from './caution';
import type { CliIo } from './io';

/** Board ids come from the CSV as written: control characters are shown as \\xNN so they cannot drive the terminal. */
export function printable(text: string): string {
  return text.replace(/[\u0000-\u001f\u007f-\u009f]/g, (c) => `\\x${c.charCodeAt(0).toString(16).padStart(2, '0')}`);
}

export async function runCheckCommand(specPath: string, csvPath: string, options: { json?: boolean }, io: CliIo): Promise<number> {
  const design = designFilter(readJsonFile(specPath));
  const caution = cautionFor(design.spec);
  if (caution) io.stderr(`${caution}\n\n`);
  const plan = planOf(design);
  try {
    statSync(csvPath);
  } catch (err) {
    const reason = (err as NodeJS.ErrnoException).code ?? (err as Error).message;
    throw new InputFileError('IO', csvPath, reason, `cannot read the file (${reason})`);
  }
  const stream = createReadStream(csvPath, { encoding: 'utf8' });
  const result = await checkMeasurementsStream(plan, linesOfChunks(stream as AsyncIterable<string>));
  if (options.json) {
    io.stdout(`${JSON.stringify(result, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2)}\n`);
  } else {
    const s = result.summary;
    const lines = [`${s.boards} boards, ${s.passed} passed, ${s.failed} failed (${s.rows} measurements)`];
    for (const b of result.boards) {
      if (b.pass) continue;
      const bad = b.points.filter((p) => p.status !== 'pass').map((p) => `${p.id} ${p.status}${p.gainDb !== undefined ? ` (${p.gainDb.toFixed(3)} dB)` : ''}`);
      lines.push(`  FAIL ${printable(b.board)}: ${bad.join(', ')}`);
    }
    for (const p of s.pointFailures) if (p.failed > 0 || p.missing > 0) lines.push(`  point ${p.id} (${p.frequencyHz} Hz): ${p.failed} failed, ${p.missing} missing`);
    for (const d of result.diagnostics) lines.push(`  ${d.code}: ${d.message}`);
    io.stdout(`${lines.join('\n')}\n`);
  }
  return result.pass ? 0 : 1;
}
