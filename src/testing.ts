/**
 * Assertions on convergence studies for any test runner: each throws an
 * Error (a QuadrilleError with a stable `code`) whose message prints the
 * study's table, and returns quietly otherwise. Nothing here imports a test
 * framework; vitest, jest, mocha, node:test and plain scripts all report a
 * thrown Error as a failure.
 *
 * Entry point `quadrille/testing`.
 *
 * @module
 */
import { InvalidOptionError, NotAsymptoticError, OrderNotReachedError } from './errors.js';
import type { ConvergenceStudy, NormName } from './verify/study.js';
import { studyTable } from './verify/report.js';

/** What {@link expectOrder} checks. */
export interface ExpectOrderOptions {
  /** Allowed |observed − expected| (default 0.1, after Roache 1998). */
  readonly tolerance?: number;
  /** The norm to check (default 'linf'). */
  readonly norm?: NormName;
  /**
   * Which order to compare: 'fit' the least-squares order over all levels
   * (default), 'finest' the observed order of the two finest levels.
   */
  readonly using?: 'fit' | 'finest';
}

function normOf(study: ConvergenceStudy, norm: NormName): NormName {
  if (!study.norms.includes(norm)) {
    throw new InvalidOptionError('norm', `the study reports ${study.norms.join(', ')}, not ${norm}; check one of those`);
  }
  return norm;
}

/**
 * Throws unless the study's observed order is within `tolerance` of
 * `order` in the chosen norm: |p̂ − p| ≤ tolerance, with p̂ the
 * least-squares order (default) or the finest pair's order.
 *
 * @param study - a finished convergence study
 * @param order - the order the scheme promises
 * @param options - tolerance (default 0.1), norm (default 'linf'), using (default 'fit')
 * @throws OrderNotReachedError (message: the numbers and the study's table);
 *   InvalidOptionError for a norm the study lacks or a bad tolerance
 * @example expectOrder(convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] }), 2) // returns
 */
export function expectOrder(study: ConvergenceStudy, order: number, options: Readonly<ExpectOrderOptions> = {}): void {
  const tol = options.tolerance ?? 0.1;
  if (!(Number.isFinite(tol) && tol >= 0)) throw new InvalidOptionError('tolerance', `${tol}; give a finite number ≥ 0`);
  if (!Number.isFinite(order)) throw new InvalidOptionError('order', `${order}; give the finite order the scheme promises`);
  const norm = normOf(study, options.norm ?? 'linf');
  const using = options.using ?? 'fit';
  const observed = using === 'fit'
    ? study.fits[norm]!.order
    : study.pairs[study.pairs.length - 1]!.orders[norm]!;
  if (!(Math.abs(observed - order) <= tol)) {
    throw new OrderNotReachedError(norm, order, observed, tol, studyTable(study));
  }
}

/**
 * Throws unless the study flags its finest levels as asymptotic in the
 * chosen norm (errors falling, last two pair orders agreeing; see the study
 * module).
 *
 * @param study - a finished convergence study
 * @param norm - the norm (default 'linf')
 * @throws NotAsymptoticError (message: the study's table); InvalidOptionError for a norm the study lacks
 * @example expectAsymptotic(convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] })) // returns
 */
export function expectAsymptotic(study: ConvergenceStudy, norm: NormName = 'linf'): void {
  const n = normOf(study, norm);
  if (study.asymptotic[n] !== true) throw new NotAsymptoticError(n, studyTable(study));
}
