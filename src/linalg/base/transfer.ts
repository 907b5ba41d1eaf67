/**
 * Grid transfers of multigrid, one axis at a time. The interpolation P is
 * the tensor product P_x ⊗ P_y ⊗ P_z of 1-D linear interpolations, so
 * x_f = P x_c is three 1-D passes and b_c = Pᵀ r_f three transposed ones,
 * each over an array seen as (outer, n along the axis, inner): the passes
 * along a slow axis combine whole contiguous lines of length `inner`, the
 * pass along the fastest axis (inner = 1) gathers within each line. About
 * 2 reads and 1 write per fine value in all, against 2.25 CSR entries
 * (12 bytes each) per fine row for P stored as a matrix.
 *
 * 1-D interpolation tables: fine node f takes w0[f]·coarse c0[f] +
 * w1[f]·coarse c1[f] (single entries padded with c1 = c0, w1 = 0). The
 * transposed tables give each coarse node I its (up to) three fine nodes
 * fa, fb, fc and weights, padded with zero weights. No checks, no
 * allocation. Source: Trottenberg, U., Oosterlee, C. W. & Schüller, A.
 * (2001). Multigrid, Academic Press, §2.3 (transfer operators).
 *
 * @module
 * @internal
 */

/**
 * One interpolation pass along an axis: dst (outer, n, inner) from src
 * (outer, nc, inner), dst[o, f, t] (+)= w0[f]·src[o, c0[f], t] + w1[f]·src[o, c1[f], t].
 */
export function interpolateAxis(
  outer: number, nc: number, n: number, inner: number,
  c0: Int32Array, w0: Float64Array, c1: Int32Array, w1: Float64Array,
  src: Float64Array, dst: Float64Array, add: boolean,
): void {
  if (inner === 1) {
    for (let o = 0; o < outer; o++) {
      const si = o * nc;
      const di = o * n;
      if (add) {
        for (let f = 0; f < n; f++) dst[di + f] += w0[f] * src[si + c0[f]] + w1[f] * src[si + c1[f]];
      } else {
        for (let f = 0; f < n; f++) dst[di + f] = w0[f] * src[si + c0[f]] + w1[f] * src[si + c1[f]];
      }
    }
    return;
  }
  for (let o = 0; o < outer; o++) {
    for (let f = 0; f < n; f++) {
      const a = (o * nc + c0[f]) * inner;
      const b = (o * nc + c1[f]) * inner;
      const d = (o * n + f) * inner;
      const wa = w0[f];
      const wb = w1[f];
      if (wb === 0) {
        if (add) for (let t = 0; t < inner; t++) dst[d + t] += wa * src[a + t];
        else for (let t = 0; t < inner; t++) dst[d + t] = wa * src[a + t];
      } else if (add) {
        for (let t = 0; t < inner; t++) dst[d + t] += wa * src[a + t] + wb * src[b + t];
      } else {
        for (let t = 0; t < inner; t++) dst[d + t] = wa * src[a + t] + wb * src[b + t];
      }
    }
  }
}

/**
 * One restriction pass along an axis (the transpose of
 * {@link interpolateAxis}): dst (outer, nc, inner) from src (outer, n, inner),
 * dst[o, I, t] = wa[I]·src[o, fa[I], t] + wb[I]·src[o, fb[I], t] + wc[I]·src[o, fc[I], t].
 */
export function restrictAxis(
  outer: number, n: number, nc: number, inner: number,
  fa: Int32Array, wa: Float64Array, fb: Int32Array, wb: Float64Array, fc: Int32Array, wc: Float64Array,
  src: Float64Array, dst: Float64Array,
): void {
  if (inner === 1) {
    for (let o = 0; o < outer; o++) {
      const si = o * n;
      const di = o * nc;
      for (let I = 0; I < nc; I++) {
        dst[di + I] = wa[I] * src[si + fa[I]] + wb[I] * src[si + fb[I]] + wc[I] * src[si + fc[I]];
      }
    }
    return;
  }
  for (let o = 0; o < outer; o++) {
    for (let I = 0; I < nc; I++) {
      const a = (o * n + fa[I]) * inner;
      const b = (o * n + fb[I]) * inner;
      const c = (o * n + fc[I]) * inner;
      const d = (o * nc + I) * inner;
      const x = wa[I];
      const y = wb[I];
      const z = wc[I];
      if (y === 0 && z === 0) {
        for (let t = 0; t < inner; t++) dst[d + t] = x * src[a + t];
      } else {
        for (let t = 0; t < inner; t++) dst[d + t] = x * src[a + t] + y * src[b + t] + z * src[c + t];
      }
    }
  }
}
