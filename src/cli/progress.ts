/**
 * A progress bar for long work (Monte Carlo) on a terminal, and nothing when output is piped or in CI,
 * so logs stay clean. Written to stderr; stdout carries only results.
 */
export interface Progress {
  update(done: number, total: number): void;
  finish(): void;
}

/** Redraws at most this often; a terminal redraw per trial would dominate a fast Monte Carlo. */
const REDRAW_INTERVAL_MS = 100;
const BAR_WIDTH = 30;

export function createProgress(label: string, stream: NodeJS.WriteStream = process.stderr): Progress {
  const enabled = Boolean(stream.isTTY) && process.env.CI !== 'true';
  let last = 0;
  let drawn = false;
  return {
    update(done, total) {
      if (!enabled) return;
      const now = Date.now();
      if (now - last < REDRAW_INTERVAL_MS && done < total) return;
      last = now;
      const share = total > 0 ? Math.min(1, done / total) : 0;
      const filled = Math.round(share * BAR_WIDTH);
      stream.write(`\r${label} [${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${(share * 100).toFixed(0).padStart(3)}%`);
      drawn = true;
    },
    finish() {
      if (enabled && drawn) stream.write('\n');
    },
  };
}
