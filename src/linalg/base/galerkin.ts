/**
 * The Galerkin coarse operator A_c = Pᵀ A P for P the tensor product of
 * 1-D interpolations, one sparse triple product row by row, with P applied
 * from its 1-D tables instead of a stored matrix. Coarse row I: over the
 * fine nodes f that coarse node I interpolates to (the transposed 1-D
 * tables, up to 3 per axis), over the entries a_fj of A's row f, over the
 * coarse nodes J that fine node j interpolates from (up to 2 per axis),
 * accumulate P_fI · a_fj · P_jJ in a dense accumulator indexed by J with a
 * marker of the row that last touched it (Gustavson's row-wise sparse
 * product). Prescribed fine nodes have zero rows in P and prescribed coarse
 * nodes zero columns, and the latter get identity rows. Cost: about
 * 9·5·2.25 multiply-adds per coarse row of a 2-D five-point matrix
 * (27·7·3.4 in 3-D), O(n_c) extra memory.
 *
 * Rows the caller marks as regular (constant coefficients, uniform
 * interpolation, at most value faces nearby: shifted copies of one another
 * by construction, less the columns of prescribed coarse nodes) are
 * computed once and then copied with shifted columns, which leaves
 * constant-coefficient problems with little more than the cost of writing
 * A_c. Source: Gustavson, F. G. (1978). Two fast algorithms for
 * sparse matrices: multiplication and permuted transposition. ACM Trans.
 * Math. Softw. 4(3), 250–269; Trottenberg, U., Oosterlee, C. W. &
 * Schüller, A. (2001). Multigrid, Academic Press, §7.3.
 *
 * @module
 * @internal
 */
import type { CsrMatrix } from '../../operator/matrix.js';
import type { AxisTransfer } from './coarsen.js';

/** The end of the run of regular rows starting at I. */
function runEnd(regular: Uint8Array, I: number, n: number): number {
  let e = I;
  while (e < n && regular[e] === 1) e++;
  return e;
}

/**
 * Writes row I as the pattern (I + off[u], v[u]) without the entries in
 * prescribed columns; returns the new entry count.
 */
function copyRowMasked(
  I: number, off: Int32Array, v: Float64Array, len: number, mask: Uint8Array,
  col: Int32Array, val: Float64Array, nnz: number, ptr: Int32Array,
): number {
  let q = nnz;
  for (let u = 0; u < len; u++) {
    const J = I + off[u];
    if (mask[J] === 1) continue;
    col[q] = J;
    val[q] = v[u];
    q++;
  }
  ptr[I + 1] = q;
  return q;
}

/** Writes rows I … e − 1 as the pattern (I + off[u], v[u]) shifted; returns the new entry count. */
function copyRows(
  I: number, e: number, off: Int32Array, v: Float64Array, len: number,
  col: Int32Array, val: Float64Array, nnz: number, ptr: Int32Array,
): number {
  let q = nnz;
  for (let r = I; r < e; r++) {
    for (let u = 0; u < len; u++) {
      col[q] = r + off[u];
      val[q] = v[u];
      q++;
    }
    ptr[r + 1] = q;
  }
  return q;
}

/** The row-by-row product with its accumulator and output; one method per coarse row. */
class TripleProduct {
  readonly n1: number;
  readonly n2: number;
  readonly n12: number;
  readonly N1: number;
  readonly N2: number;
  readonly marker: Int32Array;
  readonly acc: Float64Array;
  touched = new Int32Array(64);
  col: Int32Array;
  val: Float64Array;
  nnz = 0;
  cap: number;
  /** Fine nodes of the current coarse node along x and y, combined, with their weights. */
  readonly fIdx = new Int32Array(9);
  readonly fW = new Float64Array(9);

  constructor(
    readonly a: CsrMatrix, readonly tx: AxisTransfer, readonly ty: AxisTransfer, readonly tz: AxisTransfer,
    readonly fineMask: Uint8Array, readonly coarseMask: Uint8Array,
  ) {
    this.n1 = ty.c0.length;
    this.n2 = tz.c0.length;
    this.n12 = this.n1 * this.n2;
    this.N1 = ty.coarse.count;
    this.N2 = tz.coarse.count;
    const nc = tx.coarse.count * this.N1 * this.N2;
    this.marker = new Int32Array(nc).fill(-1);
    this.acc = new Float64Array(nc);
    this.cap = Math.max(64, Math.ceil((a.rowPtr[a.rows] / Math.max(1, a.rows)) * 2 * nc));
    this.col = new Int32Array(this.cap);
    this.val = new Float64Array(this.cap);
  }

  /** Room for `extra` more entries. */
  ensure(extra: number): void {
    if (this.nnz + extra <= this.cap) return;
    while (this.nnz + extra > this.cap) this.cap *= 2;
    const c2 = new Int32Array(this.cap);
    c2.set(this.col.subarray(0, this.nnz));
    const v2 = new Float64Array(this.cap);
    v2.set(this.val.subarray(0, this.nnz));
    this.col = c2;
    this.val = v2;
  }

  /** Computes coarse row I = (I0, I1, I2) and appends it. */
  row(I0: number, I1: number, I2: number, I: number): void {
    const { tx, ty, tz, fineMask, coarseMask, marker, acc, fIdx, fW, n1, n2, n12, N1, N2 } = this;
    const { rowPtr: ap, colIdx: ac, values: av } = this.a;
    const { c0: xc0, w0: xw0, c1: xc1, w1: xw1 } = tx;
    const { c0: yc0, w0: yw0, c1: yc1, w1: yw1 } = ty;
    const { c0: zc0, w0: zw0, c1: zc1, w1: zw1 } = tz;
    const inv12 = 1 / n12;
    const inv2 = 1 / n2;
    let touched = this.touched;
    let tcount = 0;
    if (coarseMask[I] === 0) {
      // fine support of column I of P along x and y, combined (≤ 9), then z inside
      let k01 = 0;
      for (let a0 = 0; a0 < 3; a0++) {
        const w0 = a0 === 0 ? tx.wa[I0] : a0 === 1 ? tx.wb[I0] : tx.wc[I0];
        if (w0 === 0) continue;
        const f0 = a0 === 0 ? tx.fa[I0] : a0 === 1 ? tx.fb[I0] : tx.fc[I0];
        for (let a1 = 0; a1 < 3; a1++) {
          const w1 = a1 === 0 ? ty.wa[I1] : a1 === 1 ? ty.wb[I1] : ty.wc[I1];
          if (w1 === 0) continue;
          const f1 = a1 === 0 ? ty.fa[I1] : a1 === 1 ? ty.fb[I1] : ty.fc[I1];
          fIdx[k01] = f0 * n1 + f1;
          fW[k01] = w0 * w1;
          k01++;
        }
      }
      for (let q = 0; q < k01; q++) {
        for (let a2 = 0; a2 < 3; a2++) {
          const w2 = a2 === 0 ? tz.wa[I2] : a2 === 1 ? tz.wb[I2] : tz.wc[I2];
          if (w2 === 0) continue;
          const f = fIdx[q] * n2 + (a2 === 0 ? tz.fa[I2] : a2 === 1 ? tz.fb[I2] : tz.fc[I2]);
          if (fineMask[f] === 1) continue;
          const wf = fW[q] * w2;
          const re = ap[f + 1];
          for (let r = ap[f]; r < re; r++) {
            const j = ac[r];
            if (fineMask[j] === 1) continue;
            const wa = wf * av[r];
            if (wa === 0) continue;
            // j = (j0·n1 + j1)·n2 + j2: a multiply by the reciprocal, corrected by one if rounding missed
            let j0 = (j * inv12) | 0;
            if (j0 * n12 > j) j0--;
            else if ((j0 + 1) * n12 <= j) j0++;
            const rem = j - j0 * n12;
            let j1 = (rem * inv2) | 0;
            if (j1 * n2 > rem) j1--;
            else if ((j1 + 1) * n2 <= rem) j1++;
            const j2 = rem - j1 * n2;
            for (let b0 = 0; b0 < 2; b0++) {
              const v0 = b0 === 0 ? xw0[j0] : xw1[j0];
              if (v0 === 0) continue;
              const c0 = b0 === 0 ? xc0[j0] : xc1[j0];
              for (let b1 = 0; b1 < 2; b1++) {
                const v1 = b1 === 0 ? yw0[j1] : yw1[j1];
                if (v1 === 0) continue;
                const c01 = (c0 * N1 + (b1 === 0 ? yc0[j1] : yc1[j1])) * N2;
                const v01 = wa * v0 * v1;
                for (let b2 = 0; b2 < 2; b2++) {
                  const v2 = b2 === 0 ? zw0[j2] : zw1[j2];
                  if (v2 === 0) continue;
                  const J = c01 + (b2 === 0 ? zc0[j2] : zc1[j2]);
                  if (coarseMask[J] === 1) continue;
                  const v = v01 * v2;
                  if (marker[J] !== I) {
                    marker[J] = I;
                    acc[J] = v;
                    if (tcount === touched.length) {
                      const g = new Int32Array(2 * tcount);
                      g.set(touched);
                      touched = g;
                    }
                    touched[tcount++] = J;
                  } else {
                    acc[J] += v;
                  }
                }
              }
            }
          }
        }
      }
    }
    if (marker[I] !== I) {
      // keep the diagonal: an identity row, or a row whose products vanished
      marker[I] = I;
      acc[I] = coarseMask[I] === 1 ? 1 : 0;
      if (tcount === touched.length) {
        const g = new Int32Array(2 * tcount);
        g.set(touched);
        touched = g;
      }
      touched[tcount++] = I;
    }
    // columns ascending: insertion sort for stencil-sized rows
    if (tcount <= 32) {
      for (let u = 1; u < tcount; u++) {
        const c = touched[u];
        let v = u - 1;
        while (v >= 0 && touched[v] > c) {
          touched[v + 1] = touched[v];
          v--;
        }
        touched[v + 1] = c;
      }
    } else {
      touched.subarray(0, tcount).sort();
    }
    this.touched = touched;
    this.ensure(tcount);
    const col = this.col;
    const val = this.val;
    let nnz = this.nnz;
    for (let u = 0; u < tcount; u++) {
      const J = touched[u];
      const v = acc[J];
      if (v === 0 && J !== I) continue;
      col[nnz] = J;
      val[nnz] = v;
      nnz++;
    }
    this.nnz = nnz;
  }
}

/**
 * Pᵀ A P on a grid of `fine` = [n0, n1, n2] nodes (x slowest) with the 1-D
 * tables `t` (one per axis, trivial axes of one node included). Exact
 * zeros off the diagonal are dropped; the diagonal is always stored.
 *
 * @param a - the fine matrix, n0·n1·n2 rows
 * @param t - the three 1-D interpolations
 * @param fineMask - 1 at prescribed fine nodes (zero rows of P)
 * @param coarseMask - 1 at prescribed coarse nodes (zero columns of P, identity rows of A_c)
 * @param regular - 1 at coarse rows that are shifted copies of one regular row, 2 where they are
 *   copies without the entries in prescribed columns (see `regularRows`), or undefined
 */
export function galerkinProduct(
  a: CsrMatrix, t: readonly AxisTransfer[], fineMask: Uint8Array, coarseMask: Uint8Array, regular?: Uint8Array,
): CsrMatrix {
  const p = new TripleProduct(a, t[0], t[1], t[2], fineMask, coarseMask);
  const { N1, N2 } = p;
  const N12 = N1 * N2;
  const nc = t[0].coarse.count * N12;
  const ptr = new Int32Array(nc + 1);
  // the relative pattern of the first regular row, once computed
  let refLen = -1;
  let refOff = new Int32Array(0);
  let refVal = new Float64Array(0);
  let I = 0;
  while (I < nc) {
    if (regular !== undefined && refLen >= 0 && regular[I] !== 0) {
      p.ensure(refLen * 64);
      if (regular[I] === 2) {
        p.nnz = copyRowMasked(I, refOff, refVal, refLen, coarseMask, p.col, p.val, p.nnz, ptr);
        I++;
        continue;
      }
      const e = Math.min(runEnd(regular, I, nc), I + 64);
      p.nnz = copyRows(I, e, refOff, refVal, refLen, p.col, p.val, p.nnz, ptr);
      I = e;
      continue;
    }
    const I0 = Math.floor(I / N12);
    const rem = I - I0 * N12;
    const I1 = Math.floor(rem / N2);
    const start = p.nnz;
    p.row(I0, I1, rem - I1 * N2, I);
    ptr[I + 1] = p.nnz;
    if (regular !== undefined && regular[I] === 1 && refLen < 0) {
      refLen = p.nnz - start;
      refOff = new Int32Array(refLen);
      refVal = new Float64Array(refLen);
      for (let u = 0; u < refLen; u++) {
        refOff[u] = p.col[start + u] - I;
        refVal[u] = p.val[start + u];
      }
    }
    I++;
  }
  return { rows: nc, cols: nc, rowPtr: ptr, colIdx: p.col.slice(0, p.nnz), values: p.val.slice(0, p.nnz) };
}
