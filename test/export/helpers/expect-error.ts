/** Asserts that `run` throws an InvalidInputError with the given code and path (by class and code, never message). */
import { expect } from 'vitest';
import { InvalidInputError } from '../../../src/errors';

export function expectInvalidInput(run: () => unknown, code: string, path: string): void {
  try {
    run();
  } catch (e) {
    expect(e).toBeInstanceOf(InvalidInputError);
    expect((e as InvalidInputError).code).toBe(code);
    expect((e as InvalidInputError).path).toBe(path);
    return;
  }
  throw new Error(`no error thrown (expected ${code} at ${path})`);
}
