/**
 * One implicit step of a 1-D scheme whose explicit part E and implicit part
 * K are both tridiagonal, fused: the right-hand side r = E·u + b is formed
 * inside the forward sweep of the Thomas algorithm for K, and the back
 * substitution follows, in place. Two passes over the data instead of four.
 * No checks, no allocation.
 */

/**
 * u ← K⁻¹(E·u + b), K factored as in `factorTridiagonal` (a: sub-diagonal,
 * inv: 1/pivots, ratio: super/pivot); E given by its three diagonals.
 */
export function fusedTridiagonalStep(
  n: number,
  es: Float64Array, ed: Float64Array, eu: Float64Array, b: Float64Array,
  a: Float64Array, inv: Float64Array, ratio: Float64Array,
  u: Float64Array,
): void {
  if (n === 0) return;
  let prevOld = 0; // u[i − 1] before this step
  let cur = u[0];
  let y = 0;
  for (let i = 0; i < n - 1; i++) {
    const next = u[i + 1];
    const r = es[i] * prevOld + ed[i] * cur + eu[i] * next + b[i];
    y = (r - a[i] * y) * inv[i];
    u[i] = y;
    prevOld = cur;
    cur = next;
  }
  const last = n - 1;
  y = (es[last] * prevOld + ed[last] * cur + b[last] - a[last] * y) * inv[last];
  u[last] = y;
  for (let i = n - 2; i >= 0; i--) u[i] -= ratio[i] * u[i + 1];
}
