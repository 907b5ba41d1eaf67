/**
 * One leapfrog step of u_tt = c²Δu − γu_t + f on the interior of a uniform
 * 2-D grid with the 5-point Laplacian, fused into a single pass that writes
 * the new level over the old one:
 *
 *   old[k] ← (2u[k] − cm·old[k] + dt²·(cx(u[k−sx] + u[k+sx]) + cy(u[k−1] + u[k+1]) + c0·u[k] + f)) · inv,
 *
 * cx = c²/dx², cy = c²/dy², c0 = −2(cx + cy), cm = 1 − γdt/2,
 * inv = 1/(1 + γdt/2). Boundary nodes are not touched (their values are
 * prescribed). Contiguous fields, x slowest (sx = ny). Returns the sum of
 * the new interior values, so that the caller can detect a non-finite value
 * without another pass. No checks, no allocation.
 */
export function leapfrog5(
  nx: number, ny: number, cx: number, cy: number, c0: number,
  dt2: number, cm: number, inv: number, f: number,
  u: Float64Array, old: Float64Array,
): number {
  let sum = 0;
  const sx = ny;
  for (let i = 1; i < nx - 1; i++) {
    let k = i * sx + 1;
    const end = i * sx + ny - 1;
    let west = u[k - 1];
    let centre = u[k];
    for (; k < end; k++) {
      const east = u[k + 1];
      const lap = cx * (u[k - sx] + u[k + sx]) + cy * (west + east) + c0 * centre;
      const v = (2 * centre - cm * old[k] + dt2 * (lap + f)) * inv;
      old[k] = v;
      sum += v;
      west = centre;
      centre = east;
    }
  }
  return sum;
}
