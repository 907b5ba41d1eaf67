/**
 * Strided kernel of the 2-D five-point Laplacian at interior nodes. No checks,
 * no allocation: the public operator layer validates first.
 *
 * Δu(xᵢ, yⱼ) ≈ (uᵢ₋₁,ⱼ − 2uᵢⱼ + uᵢ₊₁,ⱼ)/dx² + (uᵢ,ⱼ₋₁ − 2uᵢⱼ + uᵢ,ⱼ₊₁)/dy²,
 * with error (dx²/12)·∂⁴u/∂x⁴ + (dy²/12)·∂⁴u/∂y⁴ + O(h⁴): accuracy 2, exact
 * for every polynomial of degree ≤ 3 in x and ≤ 3 in y (x³y³ included).
 * Source: LeVeque, R. J. (2007). Finite Difference Methods for Ordinary and
 * Partial Differential Equations. SIAM, ch. 3.
 *
 * @module
 */

/**
 * out[i,j] = cx·(u[i−1,j] + u[i+1,j]) + cy·(u[i,j−1] + u[i,j+1]) + c0·u[i,j]
 * at the interior nodes 1 ≤ i ≤ nx − 2, 1 ≤ j ≤ ny − 2 of an nx × ny node
 * array (boundary nodes included); every other entry of `out` is untouched.
 * cx = 1/dx², cy = 1/dy², c0 = −2(cx + cy) gives the five-point Δ; other
 * c0 give Δ + c·I (Helmholtz, implicit time steps).
 *
 * Node (i, j) of u is `u[ou + i·sux + j·suy]`, of out `out[oo + i·sox + j·soy]`;
 * strides may be negative. The sum is formed in exactly the association
 * written above whatever the strides, so the result is the same bit for bit
 * for every layout. `out` must not overlap `u`; every index must fit in an
 * int32 (arrays below 2³¹ elements). Nothing is written when nx < 3 or ny < 3;
 * NaN in u gives NaN at the nodes whose stencil reaches it.
 *
 * @param nx - nodes along x (the i index), boundary nodes included
 * @param ny - nodes along y (the j index), boundary nodes included
 * @param cx - weight of the two x neighbours (1/dx² for Δ, 1/m²)
 * @param cy - weight of the two y neighbours (1/dy² for Δ, 1/m²)
 * @param c0 - weight of the centre node (−2(cx + cy) for Δ)
 * @param u - input values; read only
 * @param sux - stride of i in u
 * @param suy - stride of j in u
 * @param ou - index of node (0, 0) in u
 * @param out - output array, written at interior nodes only
 * @param sox - stride of i in out
 * @param soy - stride of j in out
 * @param oo - index of node (0, 0) in out (may be negative when out holds only the interior)
 * @returns `out`
 */
export function laplace5(
  nx: number, ny: number, cx: number, cy: number, c0: number,
  u: Float64Array, sux: number, suy: number, ou: number,
  out: Float64Array, sox: number, soy: number, oo: number,
): Float64Array {
  // Walk the axis of smaller u stride innermost (3× faster on x-fastest input
  // at W1 size). The formula is symmetric in the axes, and exactly so in
  // floating point because a + b = b + a.
  if (Math.abs(sux) < Math.abs(suy)) {
    sweep5(ny, nx, cy, cx, c0, u, suy, sux, ou, out, soy, sox, oo);
  } else {
    sweep5(nx, ny, cx, cy, c0, u, sux, suy, ou, out, sox, soy, oo);
  }
  return out;
}

/**
 * {@link laplace5} with axis a outermost and axis b innermost. Rows are done
 * four at a time and columns two at a time: V8 re-checks each typed array
 * (map, data pointer, length) once per loop iteration, so eight points per
 * iteration share those checks, and each row keeps its west and centre values
 * in locals, which leaves 1.5 loads per point instead of 5. The ma mod 4
 * remainder rows go one at a time, with the same sliding window, before the
 * blocks. On W1 (n = 2048) this is about 2× a one-point-per-iteration loop;
 * a copy with the unit strides hard-coded (sb = tb = 1) measured no faster,
 * so the general-stride sweep is also the contiguous path.
 */
function sweep5(
  na: number, nb: number, ca: number, cb: number, cc: number,
  u: Float64Array, sa: number, sb: number, ou: number,
  out: Float64Array, ta: number, tb: number, oo: number,
): void {
  const ma = na - 2;
  const mb = nb - 2;
  if (ma <= 0 || mb <= 0) return;
  // Unary + unboxes each coefficient once here; without it V8 re-checks the
  // tagged parameter inside the loop.
  const wa = +ca;
  const wb = +cb;
  const wc = +cc;
  const sa2 = 2 * sa;
  const sa3 = 3 * sa;
  const sa4 = 4 * sa;
  const sb2 = 2 * sb;
  // u offsets from the block's first node (r, c): rows r−1 … r+4, columns c+1, c+2
  const oUp1 = sb - sa;
  const oDn1 = sa4 + sb;
  const oE1 = sa + sb;
  const oE2 = sa2 + sb;
  const oE3 = sa3 + sb;
  const oF1 = sa + sb2;
  const oF2 = sa2 + sb2;
  const oF3 = sa3 + sb2;
  // out offsets from (r, c)
  const ta2 = 2 * ta;
  const ta3 = 3 * ta;
  const ta4 = 4 * ta;
  const tb2 = 2 * tb;
  const q1 = ta + tb;
  const q2 = ta2 + tb;
  const q3 = ta3 + tb;
  const pairs = mb >> 1;
  const oddColumn = (mb & 1) !== 0;
  let ru = ou + sa + sb;
  let ro = oo + ta + tb;
  // Remainder rows first: code after the hot loop would be compiled (on stack
  // replacement, during the first call) before it ever ran, and would then
  // deoptimise at the end of later calls.
  const rest = ma & 3;
  let i = 0;
  for (; i < rest; i++) {
    let k = ru;
    let q = ro;
    let w = u[k - sb];
    let m = u[k];
    for (let j = 0; j < mb; j++) {
      const e = u[(k + sb) | 0];
      out[q] = wa * (u[(k - sa) | 0] + u[(k + sa) | 0]) + wb * (w + e) + wc * m;
      w = m;
      m = e;
      k = (k + sb) | 0;
      q = (q + tb) | 0;
    }
    ru += sa;
    ro += ta;
  }
  for (; i < ma; i += 4) {
    let k = ru;
    let q = ro;
    // west (w) and middle (m) values of rows r … r+3
    let w0 = u[k - sb];
    let m0 = u[k];
    let w1 = u[k + sa - sb];
    let m1 = u[k + sa];
    let w2 = u[k + sa2 - sb];
    let m2 = u[k + sa2];
    let w3 = u[k + sa3 - sb];
    let m3 = u[k + sa3];
    if (oddColumn) {
      // the odd column first, for the reason the remainder rows go first
      const up0 = u[k - sa];
      const dn0 = u[k + sa4];
      const e0 = u[k + sb];
      const e1 = u[k + oE1];
      const e2 = u[k + oE2];
      const e3 = u[k + oE3];
      out[q] = wa * (up0 + m1) + wb * (w0 + e0) + wc * m0;
      out[q + ta] = wa * (m0 + m2) + wb * (w1 + e1) + wc * m1;
      out[q + ta2] = wa * (m1 + m3) + wb * (w2 + e2) + wc * m2;
      out[q + ta3] = wa * (m2 + dn0) + wb * (w3 + e3) + wc * m3;
      w0 = m0;
      m0 = e0;
      w1 = m1;
      m1 = e1;
      w2 = m2;
      m2 = e2;
      w3 = m3;
      m3 = e3;
      k += sb;
      q += tb;
    }
    for (let j = 0; j < pairs; j++) {
      // `| 0` keeps index arithmetic in int32 without overflow checks
      const up0 = u[(k - sa) | 0];
      const dn0 = u[(k + sa4) | 0];
      const e0 = u[(k + sb) | 0];
      const e1 = u[(k + oE1) | 0];
      const e2 = u[(k + oE2) | 0];
      const e3 = u[(k + oE3) | 0];
      out[q] = wa * (up0 + m1) + wb * (w0 + e0) + wc * m0;
      out[(q + ta) | 0] = wa * (m0 + m2) + wb * (w1 + e1) + wc * m1;
      out[(q + ta2) | 0] = wa * (m1 + m3) + wb * (w2 + e2) + wc * m2;
      out[(q + ta3) | 0] = wa * (m2 + dn0) + wb * (w3 + e3) + wc * m3;
      const up1 = u[(k + oUp1) | 0];
      const dn1 = u[(k + oDn1) | 0];
      const f0 = u[(k + sb2) | 0];
      const f1 = u[(k + oF1) | 0];
      const f2 = u[(k + oF2) | 0];
      const f3 = u[(k + oF3) | 0];
      out[(q + tb) | 0] = wa * (up1 + e1) + wb * (m0 + f0) + wc * e0;
      out[(q + q1) | 0] = wa * (e0 + e2) + wb * (m1 + f1) + wc * e1;
      out[(q + q2) | 0] = wa * (e1 + e3) + wb * (m2 + f2) + wc * e2;
      out[(q + q3) | 0] = wa * (e2 + dn1) + wb * (m3 + f3) + wc * e3;
      w0 = e0;
      m0 = f0;
      w1 = e1;
      m1 = f1;
      w2 = e2;
      m2 = f2;
      w3 = e3;
      m3 = f3;
      k = (k + sb2) | 0;
      q = (q + tb2) | 0;
    }
    ru += sa4;
    ro += ta4;
  }
}
