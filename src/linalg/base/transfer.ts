/**
 * Grid transfers of multigrid, line by line. The interpolation P is the
 * tensor product of 1-D linear interpolations, one per axis, so x_f = P x_c
 * splits into lines along the fastest coarsened axis: each fine line is a
 * weighted sum of (up to 2^(d−1)) coarse lines — the weights of the slower
 * axes — expanded along the line by the 1-D table of the fastest axis;
 * restriction b_c = Pᵀ r_f sums (up to 3^(d−1)) fine lines and contracts
 * the sum along the line. A line buffer of one fine line's length holds the
 * sums. On a uniform halving (n = 2n_c − 1, weights 1 and ½) the 1-D steps
 * are straight loops over pairs of nodes; other tables (an odd cell count,
 * a periodic wrap, stretched weights) go through the table loops.
 *
 * 1-D tables: fine node f takes w0[f]·coarse c0[f] + w1[f]·coarse c1[f]
 * (single entries padded with c1 = c0, w1 = 0); the transposed tables give
 * each coarse node I its fine nodes fa, fb, fc with weights, zero-padded.
 * No checks, no allocation. Source: Trottenberg, U., Oosterlee, C. W. &
 * Schüller, A. (2001). Multigrid, Academic Press, §2.3.
 *
 * @module
 * @internal
 */

/** buf[t] = Σ_q w[q0 + q]·src[line[q0 + q]·len + t] for q < k, t < len. */
export function combineLines(
  k: number, q0: number, line: Int32Array, w: Float64Array, len: number, src: Float64Array, buf: Float64Array,
): void {
  let s = line[q0] * len;
  let a = w[q0];
  for (let t = 0; t < len; t++) buf[t] = a * src[s + t];
  for (let q = 1; q < k; q++) {
    s = line[q0 + q] * len;
    a = w[q0 + q];
    for (let t = 0; t < len; t++) buf[t] += a * src[s + t];
  }
}

/**
 * dst[d0 + f] (+)= w0[f]·src[s0 + c0[f]] + w1[f]·src[s0 + c1[f]], f < n.
 * `uniform`: the table is the halving n = 2·nc − 1 with weights 1 and ½.
 */
export function expandLine(
  n: number, nc: number, c0: Int32Array, w0: Float64Array, c1: Int32Array, w1: Float64Array, uniform: boolean,
  src: Float64Array, s0: number, dst: Float64Array, d0: number, add: boolean,
): void {
  if (uniform) {
    let f = d0;
    let s = s0;
    const e = s0 + nc - 1;
    if (add) {
      for (; s < e; s++) {
        const a = src[s];
        dst[f] += a;
        dst[f + 1] += 0.5 * (a + src[s + 1]);
        f += 2;
      }
      dst[f] += src[s];
    } else {
      for (; s < e; s++) {
        const a = src[s];
        dst[f] = a;
        dst[f + 1] = 0.5 * (a + src[s + 1]);
        f += 2;
      }
      dst[f] = src[s];
    }
    return;
  }
  if (add) {
    for (let f = 0; f < n; f++) dst[d0 + f] += w0[f] * src[s0 + c0[f]] + w1[f] * src[s0 + c1[f]];
  } else {
    for (let f = 0; f < n; f++) dst[d0 + f] = w0[f] * src[s0 + c0[f]] + w1[f] * src[s0 + c1[f]];
  }
}

/**
 * dst[d0 + I] = wa[I]·src[s0 + fa[I]] + wb[I]·src[s0 + fb[I]] + wc[I]·src[s0 + fc[I]],
 * I < nc: the transpose of {@link expandLine}. `uniform` as there.
 */
export function contractLine(
  n: number, nc: number, fa: Int32Array, wa: Float64Array, fb: Int32Array, wb: Float64Array, fc: Int32Array, wc: Float64Array,
  uniform: boolean, src: Float64Array, s0: number, dst: Float64Array, d0: number,
): void {
  if (uniform) {
    if (nc === 1) {
      dst[d0] = src[s0];
      return;
    }
    dst[d0] = src[s0] + 0.5 * src[s0 + 1];
    let s = s0 + 2;
    const e = d0 + nc - 1;
    for (let I = d0 + 1; I < e; I++) {
      dst[I] = src[s] + 0.5 * (src[s - 1] + src[s + 1]);
      s += 2;
    }
    dst[e] = src[s] + 0.5 * src[s - 1];
    return;
  }
  for (let I = 0; I < nc; I++) {
    dst[d0 + I] = wa[I] * src[s0 + fa[I]] + wb[I] * src[s0 + fb[I]] + wc[I] * src[s0 + fc[I]];
  }
}
