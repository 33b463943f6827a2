/**
 * Atomic file output for the CLI: write a temporary file beside the target, flush it, then rename it
 * over the target. A full disk, a crash or an interrupt leaves either the old file or the new one,
 * never a partial file. `writeIfChanged` skips the write when the content is identical, so a build that
 * regenerates a header every time does not touch its timestamp (and does not rebuild the firmware).
 */
import * as nodeFs from 'node:fs';
import { dirname, basename, join } from 'node:path';
import { GicladderError } from '../errors';

/** The file-system calls used, injectable so tests can simulate a full disk. */
export interface FsLike {
  readFileSync(path: string, encoding: 'utf8'): string;
  writeFileSync(path: string, data: string, options: { encoding: 'utf8'; flag: string; mode?: number }): void;
  renameSync(from: string, to: string): void;
  unlinkSync(path: string): void;
  mkdirSync(path: string, options: { recursive: true }): unknown;
  existsSync(path: string): boolean;
}

export class OutputError extends GicladderError {}

let counter = 0;

/** Writes `content` to `path` atomically. Throws OutputError (code 'IO', path = the file) on failure. */
export function writeAtomic(path: string, content: string, fs: FsLike = nodeFs as unknown as FsLike): void {
  const dir = dirname(path);
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${counter++}.tmp`);
  try {
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(tmp, content, { encoding: 'utf8', flag: 'wx' });
    fs.renameSync(tmp, path);
  } catch (err) {
    try {
      if (fs.existsSync(tmp)) fs.unlinkSync(tmp);
    } catch {
      // the temporary file may not exist; nothing else to clean up
    }
    const reason = (err as NodeJS.ErrnoException).code ?? (err as Error).message;
    throw new OutputError('IO', path, reason, `cannot write the file (${reason}); any previous file is unchanged`);
  }
}

/** Writes only when the content differs from what is there. Returns true when it wrote. */
export function writeIfChanged(path: string, content: string, fs: FsLike = nodeFs as unknown as FsLike): boolean {
  try {
    if (fs.existsSync(path) && fs.readFileSync(path, 'utf8') === content) return false;
  } catch {
    // unreadable: fall through and try to write it
  }
  writeAtomic(path, content, fs);
  return true;
}
