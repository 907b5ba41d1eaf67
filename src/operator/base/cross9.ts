/**
 * Strided kernel of the 2-D nine-point cross (±1 and ±2 nodes along each
 * axis) at nodes two or more away from the edge. No checks, no allocation:
 * the public operator layer validates first.
 *
 * With the fourth-order central weights of u'' on offsets −2 … 2,
 * (−1/12, 4/3, −5/2, 4/3, −1/12), along each axis,
 *
 * Δu(xᵢ, yⱼ) ≈ Σₖ wₖ uᵢ₊ₖ,ⱼ / dx² + Σₖ wₖ uᵢ,ⱼ₊ₖ / dy²,
 *
 * with error −(dx⁴/90)·∂⁶u/∂x⁶ − (dy⁴/90)·∂⁶u/∂y⁶ + O(h⁶): accuracy 4, exact
 * for every polynomial of degree ≤ 5 in x and ≤ 5 in y. Source: Fornberg,
 * B. (1988). Generation of finite difference formulas on arbitrarily spaced
 * grids. Math. Comp. 51(184), 699–706, Table 1 (the weights).
 *
 * @module
 */

/**
 * out[i,j] = (cx1·(u[i−1,j] + u[i+1,j]) + cx2·(u[i−2,j] + u[i+2,j]))
 *          + (cy1·(u[i,j−1] + u[i,j+1]) + cy2·(u[i,j−2] + u[i,j+2]))
 *          + c0·u[i,j]
 * at the nodes 2 ≤ i ≤ nx − 3, 2 ≤ j ≤ ny − 3 of an nx × ny node array;
 * every other entry of `out` is untouched. The fourth-order Δ has
 * cx1 = 4/(3dx²), cx2 = −1/(12dx²), cy1 = 4/(3dy²), cy2 = −1/(12dy²),
 * c0 = −(5/2)(1/dx² + 1/dy²).
 *
 * Node (i, j) of u is `u[ou + i·sux + j·suy]`, of out `out[oo + i·sox + j·soy]`;
 * strides may be negative. The sum is formed in exactly the association
 * written above whatever the strides, so the result is the same bit for bit
 * for every layout. `out` must not overlap `u`; every index must fit in an
 * int32 (arrays below 2³¹ elements). Nothing is written when nx < 5 or ny < 5;
 * NaN in u gives NaN at the nodes whose stencil reaches it.
 *
 * @param nx - nodes along x (the i index), boundary nodes included
 * @param ny - nodes along y (the j index), boundary nodes included
 * @param cx1 - weight of the x neighbours at ±1 (1/m²)
 * @param cx2 - weight of the x neighbours at ±2 (1/m²)
 * @param cy1 - weight of the y neighbours at ±1 (1/m²)
 * @param cy2 - weight of the y neighbours at ±2 (1/m²)
 * @param c0 - weight of the centre node (1/m²)
 * @param u - input values; read only
 * @param sux - stride of i in u
 * @param suy - stride of j in u
 * @param ou - index of node (0, 0) in u
 * @param out - output array, written at nodes 2 … n − 3 of each axis only
 * @param sox - stride of i in out
 * @param soy - stride of j in out
 * @param oo - index of node (0, 0) in out (may be negative when out holds only the written nodes)
 * @returns `out`
 */
export function cross9(
  nx: number, ny: number,
  cx1: number, cx2: number, cy1: number, cy2: number, c0: number,
  u: Float64Array, sux: number, suy: number, ou: number,
  out: Float64Array, sox: number, soy: number, oo: number,
): Float64Array {
  // Smaller u stride innermost; swapping the axes swaps the two bracketed
  // sums, which floating-point addition does not notice.
  if (Math.abs(sux) < Math.abs(suy)) {
    sweep9(ny, nx, cy1, cy2, cx1, cx2, c0, u, suy, sux, ou, out, soy, sox, oo);
  } else {
    sweep9(nx, ny, cx1, cx2, cy1, cy2, c0, u, sux, suy, ou, out, sox, soy, oo);
  }
  return out;
}

/**
 * {@link cross9} with axis a outermost and axis b innermost, two rows and two
 * columns per iteration: the four points share V8's per-iteration typed-array
 * checks and the column loads, and each row keeps its four trailing values in
 * locals, which leaves 3 loads per point instead of 9.
 */
function sweep9(
  na: number, nb: number,
  ca1: number, ca2: number, cb1: number, cb2: number, cc: number,
  u: Float64Array, sa: number, sb: number, ou: number,
  out: Float64Array, ta: number, tb: number, oo: number,
): void {
  const ma = na - 4;
  const mb = nb - 4;
  if (ma <= 0 || mb <= 0) return;
  // Unary + unboxes each coefficient once here, not in every iteration.
  const wa1 = +ca1;
  const wa2 = +ca2;
  const wb1 = +cb1;
  const wb2 = +cb2;
  const wc = +cc;
  const sa2 = 2 * sa;
  const sa3 = 3 * sa;
  const sb2 = 2 * sb;
  const sb3 = 3 * sb;
  // u offsets from the block's first node (r, c)
  const oUp2 = sb - sa2; // (r−2, c+1)
  const oUp1 = sb - sa; // (r−1, c+1)
  const oDn2 = sb + sa2; // (r+2, c+1)
  const oDn3 = sb + sa3; // (r+3, c+1)
  const oF = sa + sb2; // (r+1, c+2)
  const oG = sa + sb3; // (r+1, c+3)
  const ta2 = 2 * ta;
  const tb2 = 2 * tb;
  const q1 = ta + tb;
  const pairs = mb >> 1;
  const oddColumn = (mb & 1) !== 0;
  let ru = ou + sa2 + sb2;
  let ro = oo + ta2 + tb2;
  let i = 0;
  // An odd row first: code after the hot loop would be compiled (on stack
  // replacement, during the first call) before it ever ran, and would then
  // deoptimise at the end of later calls.
  if ((ma & 1) !== 0) {
    let k = ru;
    let q = ro;
    let a2 = u[k - sb2];
    let a1 = u[k - sb];
    let a0 = u[k];
    let ae = u[k + sb];
    for (let j = 0; j < mb; j++) {
      const af = u[(k + sb2) | 0];
      out[q] = (wa1 * (u[(k - sa) | 0] + u[(k + sa) | 0]) + wa2 * (u[(k - sa2) | 0] + u[(k + sa2) | 0]))
        + (wb1 * (a1 + ae) + wb2 * (a2 + af)) + wc * a0;
      a2 = a1;
      a1 = a0;
      a0 = ae;
      ae = af;
      k = (k + sb) | 0;
      q = (q + tb) | 0;
    }
    ru += sa;
    ro += ta;
    i = 1;
  }
  for (; i < ma; i += 2) {
    let k = ru;
    let q = ro;
    // row r: values at c−2, c−1, c, c+1; row r+1 likewise
    let a2 = u[k - sb2];
    let a1 = u[k - sb];
    let a0 = u[k];
    let ae = u[k + sb];
    let b2 = u[k + sa - sb2];
    let b1 = u[k + sa - sb];
    let b0 = u[k + sa];
    let be = u[k + sa + sb];
    if (oddColumn) {
      // the odd column first, for the reason the odd row goes first
      const up2 = u[k - sa2];
      const up1 = u[k - sa];
      const dn2 = u[k + sa2];
      const dn3 = u[k + sa3];
      const af = u[k + sb2];
      const bf = u[k + oF];
      out[q] = (wa1 * (up1 + b0) + wa2 * (up2 + dn2))
        + (wb1 * (a1 + ae) + wb2 * (a2 + af)) + wc * a0;
      out[q + ta] = (wa1 * (a0 + dn2) + wa2 * (up1 + dn3))
        + (wb1 * (b1 + be) + wb2 * (b2 + bf)) + wc * b0;
      a2 = a1;
      a1 = a0;
      a0 = ae;
      ae = af;
      b2 = b1;
      b1 = b0;
      b0 = be;
      be = bf;
      k += sb;
      q += tb;
    }
    for (let j = 0; j < pairs; j++) {
      // `| 0` keeps index arithmetic in int32 without overflow checks
      const up2 = u[(k - sa2) | 0];
      const up1 = u[(k - sa) | 0];
      const dn2 = u[(k + sa2) | 0];
      const dn3 = u[(k + sa3) | 0];
      const af = u[(k + sb2) | 0];
      const bf = u[(k + oF) | 0];
      out[q] = (wa1 * (up1 + b0) + wa2 * (up2 + dn2))
        + (wb1 * (a1 + ae) + wb2 * (a2 + af)) + wc * a0;
      out[(q + ta) | 0] = (wa1 * (a0 + dn2) + wa2 * (up1 + dn3))
        + (wb1 * (b1 + be) + wb2 * (b2 + bf)) + wc * b0;
      const vp2 = u[(k + oUp2) | 0];
      const vp1 = u[(k + oUp1) | 0];
      const vn2 = u[(k + oDn2) | 0];
      const vn3 = u[(k + oDn3) | 0];
      const ag = u[(k + sb3) | 0];
      const bg = u[(k + oG) | 0];
      out[(q + tb) | 0] = (wa1 * (vp1 + be) + wa2 * (vp2 + vn2))
        + (wb1 * (a0 + af) + wb2 * (a1 + ag)) + wc * ae;
      out[(q + q1) | 0] = (wa1 * (ae + vn2) + wa2 * (vp1 + vn3))
        + (wb1 * (b0 + bf) + wb2 * (b1 + bg)) + wc * be;
      a2 = a0;
      a1 = ae;
      a0 = af;
      ae = ag;
      b2 = b0;
      b1 = be;
      b0 = bf;
      be = bg;
      k = (k + sb2) | 0;
      q = (q + tb2) | 0;
    }
    ru += sa2;
    ro += ta2;
  }
}
