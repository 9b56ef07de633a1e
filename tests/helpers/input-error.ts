/** The InputError a function throws (any other outcome fails the test), so tests can assert its field and message. */
import { InputError } from '../../src/model/errors.js';

export function inputErrorOf(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError, but nothing was thrown');
}
