/** Reading a design file from disk for the CLI: I/O and JSON syntax errors become typed errors. */
import { readFileSync } from 'node:fs';
import { GicladderError } from '../errors';
import { SpecError } from '../spec/index';

export class InputFileError extends GicladderError {}

/** Reads and parses a JSON file; throws InputFileError (IO) or SpecError (INVALID_SPEC, with line and column). */
export function readJsonFile(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    const reason = (err as NodeJS.ErrnoException).code ?? (err as Error).message;
    throw new InputFileError('IO', path, reason, `cannot read the file (${reason})`);
  }
  try {
    return JSON.parse(text);
  } catch (err) {
    const message = (err as Error).message;
    const at = /position (\d+)/.exec(message);
    let where = '';
    if (at) {
      const pos = Number(at[1]);
      const before = text.slice(0, pos);
      const line = before.split('\n').length;
      const column = pos - before.lastIndexOf('\n');
      where = ` at line ${line}, column ${column}`;
    }
    throw new SpecError([{ path: '(file)', message: `is not valid JSON${where}: ${message.replace(/^.*?:\s*/, '')}`, value: path }]);
  }
}

/** Reads a text file (measured data); throws InputFileError (IO). */
export function readTextFile(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (err) {
    const reason = (err as NodeJS.ErrnoException).code ?? (err as Error).message;
    throw new InputFileError('IO', path, reason, `cannot read the file (${reason})`);
  }
}
