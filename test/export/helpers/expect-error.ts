/** Asserts that `run` throws an InvalidInputError with the given code and path (by class and code, never message). */
import { expectInvalid } from '../../helpers/expect-error';

export function expectInvalidInput(run: () => unknown, code: string, path: string): void {
  expectInvalid(run, code, path);
}
