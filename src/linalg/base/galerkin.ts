/**
 * The Galerkin coarse operator A_c = Pᵀ A P as one sparse triple product,
 * row by row: coarse row I gathers, over the fine rows f of column I of P
 * (row I of Pᵀ), the fine entries a_fj, and over the coarse columns J of
 * row j of P the products (Pᵀ)_If · a_fj · P_jJ, summed in a dense
 * accumulator indexed by J with a marker of the row that last touched it
 * (Gustavson's row-wise sparse product). Cost: Σ_I Σ_f Σ_j nnz(P_j) —
 * about 9·5·2.25 multiply-adds per coarse row of a 2-D five-point matrix —
 * and O(n_c) extra memory. Rows the caller marks as regular (constant
 * coefficients, uniform interpolation, no prescribed node nearby: shifted
 * copies of one another by construction) are computed once and then
 * copied with shifted columns, which leaves the product about 2 × the cost
 * of copying A_c on constant-coefficient problems. Source: Gustavson, F. G. (1978). Two fast
 * algorithms for sparse matrices: multiplication and permuted
 * transposition. ACM Trans. Math. Softw. 4(3), 250–269.
 *
 * @module
 * @internal
 */
import type { CsrMatrix } from '../../operator/matrix.js';

/**
 * Pᵀ A P with `pt` = Pᵀ (n_c × n), `a` (n × n), `p` (n × n_c). Rows where
 * `identity[I]` is 1 become identity rows (their products are skipped: the
 * caller zeroes P's columns there, so they would be empty). Exact zeros
 * off the diagonal are dropped; the diagonal is always stored.
 */
export function galerkinProduct(
  pt: CsrMatrix, a: CsrMatrix, p: CsrMatrix, identity: Uint8Array, regular?: Uint8Array,
): CsrMatrix {
  const nc = pt.rows;
  const { rowPtr: tp, colIdx: tc, values: tv } = pt;
  const { rowPtr: ap, colIdx: ac, values: av } = a;
  const { rowPtr: pp, colIdx: pc, values: pv } = p;
  const marker = new Int32Array(nc).fill(-1);
  const acc = new Float64Array(nc);
  let touched = new Int32Array(64);
  const ptr = new Int32Array(nc + 1);
  // a first guess from the fine rows per coarse row; grows by doubling
  let cap = Math.max(64, Math.ceil((ap[a.rows] / Math.max(1, a.rows)) * 2 * nc));
  let col = new Int32Array(cap);
  let val = new Float64Array(cap);
  let nnz = 0;
  // the relative pattern of the first regular row, once computed
  let refLen = -1;
  let refOff = new Int32Array(0);
  let refVal = new Float64Array(0);
  for (let I = 0; I < nc; I++) {
    if (regular !== undefined && regular[I] === 1 && refLen >= 0) {
      if (nnz + refLen > cap) {
        while (nnz + refLen > cap) cap *= 2;
        const c2 = new Int32Array(cap);
        c2.set(col.subarray(0, nnz));
        const v2 = new Float64Array(cap);
        v2.set(val.subarray(0, nnz));
        col = c2;
        val = v2;
      }
      for (let u = 0; u < refLen; u++) {
        col[nnz] = I + refOff[u];
        val[nnz] = refVal[u];
        nnz++;
      }
      ptr[I + 1] = nnz;
      continue;
    }
    let t = 0;
    if (identity[I] === 0) {
      for (let q = tp[I]; q < tp[I + 1]; q++) {
        const f = tc[q];
        const w1 = tv[q];
        for (let r = ap[f]; r < ap[f + 1]; r++) {
          const j = ac[r];
          const wa = w1 * av[r];
          if (wa === 0) continue;
          for (let s = pp[j]; s < pp[j + 1]; s++) {
            const J = pc[s];
            const v = wa * pv[s];
            if (marker[J] !== I) {
              marker[J] = I;
              acc[J] = v;
              if (t === touched.length) {
                const g = new Int32Array(2 * t);
                g.set(touched);
                touched = g;
              }
              touched[t++] = J;
            } else {
              acc[J] += v;
            }
          }
        }
      }
    }
    if (marker[I] !== I) {
      // keep the diagonal: an identity row, or a row whose products vanished
      marker[I] = I;
      acc[I] = identity[I] === 1 ? 1 : 0;
      if (t === touched.length) {
        const g = new Int32Array(2 * t);
        g.set(touched);
        touched = g;
      }
      touched[t++] = I;
    }
    // columns ascending: insertion sort for stencil-sized rows
    if (t <= 32) {
      for (let u = 1; u < t; u++) {
        const c = touched[u];
        let v = u - 1;
        while (v >= 0 && touched[v] > c) {
          touched[v + 1] = touched[v];
          v--;
        }
        touched[v + 1] = c;
      }
    } else {
      touched.subarray(0, t).sort();
    }
    if (nnz + t > cap) {
      while (nnz + t > cap) cap *= 2;
      const c2 = new Int32Array(cap);
      c2.set(col.subarray(0, nnz));
      const v2 = new Float64Array(cap);
      v2.set(val.subarray(0, nnz));
      col = c2;
      val = v2;
    }
    for (let u = 0; u < t; u++) {
      const J = touched[u];
      const v = acc[J];
      if (v === 0 && J !== I) continue;
      col[nnz] = J;
      val[nnz] = v;
      nnz++;
    }
    ptr[I + 1] = nnz;
    if (regular !== undefined && regular[I] === 1) {
      refLen = nnz - ptr[I];
      refOff = new Int32Array(refLen);
      refVal = new Float64Array(refLen);
      for (let u = 0; u < refLen; u++) {
        refOff[u] = col[ptr[I] + u] - I;
        refVal[u] = val[ptr[I] + u];
      }
    }
  }
  return { rows: nc, cols: nc, rowPtr: ptr, colIdx: col.slice(0, nnz), values: val.slice(0, nnz) };
}
