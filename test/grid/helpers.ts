import { expect } from 'vitest';
import { QuadrilleError } from '../../src/errors.js';

/** Runs `fn`, expects a QuadrilleError with `code`, and returns it for further checks. */
export function expectCode(fn: () => unknown, code: string): QuadrilleError {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught, `expected ${code}`).toBeInstanceOf(QuadrilleError);
  expect((caught as QuadrilleError).code).toBe(code);
  return caught as QuadrilleError;
}

export const eps = Number.EPSILON;
export const SEED = 20261202;
