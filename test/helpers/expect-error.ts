/** Error assertions shared by the tests: by class, code and path, never by message text. */
import { expect } from 'vitest';
import { GicladderError, InvalidInputError } from '../../src/errors';

/** Asserts that `run` throws an error of class `cls` with the code (and path, when given). Returns it. */
export function expectThrows(run: () => unknown, cls: abstract new (...args: never[]) => GicladderError, code: string, path?: string): GicladderError {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(cls);
    expect((e as GicladderError).code).toBe(code);
    if (path !== undefined) expect((e as GicladderError).path).toBe(path);
    return e as GicladderError;
  }
  throw new Error(`no error thrown (expected ${code}${path === undefined ? '' : ` at ${path}`})`);
}

/** Asserts that `run` throws an InvalidInputError with the code (and path, when given). */
export function expectInvalid(run: () => unknown, code: string, path?: string): void {
  expectThrows(run, InvalidInputError, code, path);
}

/** The code of the InvalidInputError `run` throws (asserting the class), or 'none' when it does not throw. */
export function invalidCode(run: () => unknown): string {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(InvalidInputError);
    return (e as InvalidInputError).code;
  }
  return 'none';
}
