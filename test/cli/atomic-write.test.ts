import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import * as fs from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeAtomic, writeIfChanged, OutputError, type FsLike } from '../../src/cli/atomic-write';

const dir = () => mkdtempSync(join(tmpdir(), 'gicladder-write-'));

describe('atomic writes', () => {
  it('writes the file and leaves no temporary file', () => {
    const d = dir();
    writeAtomic(join(d, 'a.h'), 'one');
    expect(readFileSync(join(d, 'a.h'), 'utf8')).toBe('one');
    expect(readdirSync(d)).toEqual(['a.h']);
  });

  it('a full disk leaves the previous header intact and no partial file', () => {
    const d = dir();
    const target = join(d, 'filter.h');
    writeFileSync(target, 'previous');
    const fullDisk: FsLike = {
      ...(fs as unknown as FsLike),
      writeFileSync: (p: string, data: string, o: { encoding: 'utf8'; flag: string }) => {
        fs.writeFileSync(p, data.slice(0, 3), o); // a partial write, then the disk is full
        const e = new Error('no space left on device') as NodeJS.ErrnoException;
        e.code = 'ENOSPC';
        throw e;
      },
    };
    let err: unknown;
    try {
      writeAtomic(target, 'new content', fullDisk);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(OutputError);
    expect((err as OutputError).code).toBe('IO');
    expect((err as OutputError).value).toBe('ENOSPC');
    expect(readFileSync(target, 'utf8')).toBe('previous');
    expect(readdirSync(d)).toEqual(['filter.h']);
  });

  it('an output path whose parent is a file fails with a typed error', () => {
    const d = dir();
    writeFileSync(join(d, 'file'), 'x');
    expect(() => writeAtomic(join(d, 'file', 'out.h'), 'y')).toThrow(OutputError);
  });

  it('rewrites only when the content changed, keeping the timestamp otherwise', async () => {
    const d = dir();
    const target = join(d, 'f.h');
    expect(writeIfChanged(target, 'abc')).toBe(true);
    const before = statSync(target).mtimeMs;
    await new Promise((r) => setTimeout(r, 20));
    expect(writeIfChanged(target, 'abc')).toBe(false);
    expect(statSync(target).mtimeMs).toBe(before);
    expect(writeIfChanged(target, 'abcd')).toBe(true);
    expect(readFileSync(target, 'utf8')).toBe('abcd');
  });
});
