import { QuadrilleError } from '../../src/index.js';

/** The `code` of the QuadrilleError that `f` throws; fails the test if it throws nothing or something else. */
export function codeOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof QuadrilleError) return e.code;
    throw e;
  }
  throw new Error('expected a QuadrilleError, but nothing was thrown');
}

/** The QuadrilleError that `f` throws. */
export function errorOf(f: () => unknown): QuadrilleError {
  try {
    f();
  } catch (e) {
    if (e instanceof QuadrilleError) return e;
    throw e;
  }
  throw new Error('expected a QuadrilleError, but nothing was thrown');
}
