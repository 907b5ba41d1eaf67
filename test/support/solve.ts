import { type LinearSystem, factorBanded, solveBanded } from '../../src/index.js';

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

/** Observed orders log(e₀/e₁)/log(r) between successive levels of refinement ratio r. */
export function observedOrders(errs: readonly number[], r = 2): number[] {
  return errs.slice(1).map((e, i) => Math.log(errs[i]! / e) / Math.log(r));
}
