/**
 * The InputError a call throws, for tests that check its message and location. Fails the
 * test when the call returns normally; any other error is rethrown with its stack (a bug,
 * not a user mistake).
 */
import { InputError } from '../../src/core/inputError.js';

export function expectInputError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError');
}
