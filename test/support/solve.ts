import { type LinearSystem, convergenceStudy, factorBanded, solveBanded } from '../../src/index.js';

/** Direct solve of a discretisation's system by banded LU (small test grids only). */
export function solveDirect(s: LinearSystem): Float64Array {
  return solveBanded(factorBanded(s.matrix), s.rhs);
}

/** Max-norm of a − b. */
export function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs((a[i] as number) - (b[i] as number)));
  return e;
}

/**
 * Observed orders log(e₀/e₁)/log(r) between successive levels of refinement
 * ratio r, computed by the library's own convergence study (src/verify), so
 * that the project's convergence tests go through the module users call.
 */
export function observedOrders(errs: readonly number[], r = 2): number[] {
  const spacings = errs.map((_, k) => r ** -k);
  const study = convergenceStudy(({ index }) => ({ linf: errs[index]! }), { refine: 'space', spacings });
  return study.pairs.map((p) => p.orders.linf!);
}
