/**
 * What every iterative solver returns, and the settings they share.
 *
 * Convergence is measured by the relative residual ‖b − Ax‖₂ / ‖b‖₂ (the
 * true residual of the unpreconditioned system, so results of different
 * methods and preconditioners compare directly); a zero right-hand side
 * returns x = 0 at once.
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';

/** Settings of an iterative solve. */
export interface IterativeOptions {
  /** Stop when ‖b − Ax‖/‖b‖ ≤ tolerance (default 1e-8). */
  readonly tolerance?: number;
  /** Give up (with NotConvergedError) after this many iterations (default: depends on the method). */
  readonly maxIterations?: number;
}

/** The outcome of a converged solve. */
export interface SolveResult {
  /** x. */
  readonly solution: Float64Array;
  /** Iterations (Krylov steps or multigrid cycles) done. */
  readonly iterations: number;
  /** Final relative residual ‖b − Ax‖/‖b‖. */
  readonly residual: number;
  /** Relative residual after each iteration; entry 0 is the starting guess's. */
  readonly history: Float64Array;
  /** The method, e.g. `'cg+multigrid'`. */
  readonly method: string;
  /** Wall-clock seconds spent in the solve (set-up excluded). */
  readonly seconds: number;
}

/** Checks a tolerance and an iteration cap. @internal */
export function checkIterative(o: IterativeOptions, defaultMax: number): { tol: number; maxIt: number } {
  const tol = o.tolerance ?? 1e-8;
  const maxIt = o.maxIterations ?? defaultMax;
  if (!(Number.isFinite(tol) && tol > 0 && tol < 1)) {
    throw new InvalidOptionError('tolerance', `${tol} is not a relative residual in (0, 1); 1e-8 is a common choice`);
  }
  if (!(Number.isSafeInteger(maxIt) && maxIt >= 1)) {
    throw new InvalidOptionError('maxIterations', `${maxIt} is not a whole number ≥ 1`);
  }
  return { tol, maxIt };
}

/** Euclidean norm with a running scale, so Σx² cannot overflow. @internal */
export function norm2(x: Float64Array, n = x.length): number {
  let scale = 0;
  let ssq = 1;
  for (let i = 0; i < n; i++) {
    const v = x[i]!;
    if (v !== 0) {
      const a = Math.abs(v);
      if (scale < a) {
        ssq = 1 + ssq * (scale / a) * (scale / a);
        scale = a;
      } else {
        ssq += (a / scale) * (a / scale);
      }
    }
  }
  return scale * Math.sqrt(ssq);
}
