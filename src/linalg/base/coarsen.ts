/**
 * The coarsening of a multigrid hierarchy, axis by axis: which nodes each
 * coarser level keeps, the 1-D linear interpolation tables, the line plans
 * of the grid transfers, and the coarse rows the Galerkin product may copy
 * instead of compute. Set-up code: it allocates,
 * and it is run once per level. Source: Trottenberg, U., Oosterlee, C. W. &
 * Schüller, A. (2001). Multigrid, Academic Press, §2.3 and §7.3 (Galerkin
 * coarse operators).
 *
 * @module
 * @internal
 */
import type { LevelMatrix } from './smooth.js';

/** One axis on one level: stored node count, periodicity, node positions. */
export interface AxisLevel {
  readonly count: number;
  readonly periodic: boolean;
  /** Node indices of level 0 on uniform axes, coordinates on stretched ones. */
  readonly pos: Float64Array;
  /** Length of the period in the units of `pos` (periodic axes). */
  readonly period: number;
}

/** 1-D interpolation from a coarse axis to a fine one. */
export interface AxisTransfer {
  readonly coarse: AxisLevel;
  /** First coarse node of each fine node, and its weight. */
  readonly c0: Int32Array;
  readonly w0: Float64Array;
  /** Second coarse node and its weight (w1 = 0 and c1 = c0 when there is none); c1 > c0 otherwise. */
  readonly c1: Int32Array;
  readonly w1: Float64Array;
  /** Fine index of each coarse node. */
  readonly fineOf: Int32Array;
  /** Whether the axis is coarsened (false: the identity). */
  readonly coarsened: boolean;
  /** Transposed table: the fine nodes fa, fb, fc of each coarse node and their weights (zero-padded). */
  readonly fa: Int32Array;
  readonly wa: Float64Array;
  readonly fb: Int32Array;
  readonly wb: Float64Array;
  readonly fc: Int32Array;
  readonly wc: Float64Array;
}

/** One 1-D pass of a grid transfer over an array seen as (outer, n along the axis, inner). */
export interface Pass {
  readonly outer: number;
  readonly fine: number;
  readonly coarse: number;
  readonly inner: number;
  readonly t: AxisTransfer;
}

/** Whether the axis halves regularly: an even number of cells (non-periodic, ≥ 2) or an even node count (periodic, ≥ 4). */
export function canHalve(a: AxisLevel): boolean {
  return a.periodic ? a.count >= 4 && a.count % 2 === 0 : a.count >= 3 && (a.count - 1) % 2 === 0;
}

/** Whether the axis can be coarsened at all (irregularly if need be): at least 3 stored nodes. */
export function canCoarsen(a: AxisLevel): boolean {
  return a.count >= 3;
}

/** Adds the transposed table (each coarse node's fine nodes) to a 1-D interpolation. */
function withTranspose(
  coarse: AxisLevel, c0: Int32Array, w0: Float64Array, c1: Int32Array, w1: Float64Array, fineOf: Int32Array, coarsened: boolean,
): AxisTransfer {
  const nc = coarse.count;
  const fa = new Int32Array(nc);
  const wa = new Float64Array(nc);
  const fb = new Int32Array(nc);
  const wb = new Float64Array(nc);
  const fc = new Int32Array(nc);
  const wc = new Float64Array(nc);
  const used = new Uint8Array(nc);
  const put = (I: number, f: number, w: number): void => {
    if (used[I] === 0) { fa[I] = f; wa[I] = w; fb[I] = f; fc[I] = f; } else if (used[I] === 1) { fb[I] = f; wb[I] = w; } else { fc[I] = f; wc[I] = w; }
    used[I]++;
  };
  for (let f = 0; f < c0.length; f++) {
    put(c0[f], f, w0[f]);
    if (w1[f] !== 0) put(c1[f], f, w1[f]);
  }
  return { coarse, c0, w0, c1, w1, fineOf, coarsened, fa, wa, fb, wb, fc, wc };
}

/** The 1-D interpolation of one axis: coarsened (even nodes, plus the last one of an odd non-periodic axis) or kept. */
export function axisTransfer(ax: AxisLevel, coarsen: boolean): AxisTransfer {
  const nf = ax.count;
  const c0 = new Int32Array(nf);
  const w0 = new Float64Array(nf);
  const c1 = new Int32Array(nf);
  const w1 = new Float64Array(nf);
  if (!coarsen) {
    for (let f = 0; f < nf; f++) {
      c0[f] = f;
      c1[f] = f;
      w0[f] = 1;
    }
    return withTranspose(ax, c0, w0, c1, w1, Int32Array.from(c0), false);
  }
  const fine: number[] = [];
  for (let f = 0; f < nf; f += 2) fine.push(f);
  if (!ax.periodic && (nf - 1) % 2 === 1) fine.push(nf - 1);
  const fineOf = Int32Array.from(fine);
  const coarseOf = new Int32Array(nf).fill(-1);
  fineOf.forEach((f, c) => { coarseOf[f] = c; });
  const pos = ax.pos;
  for (let f = 0; f < nf; f++) {
    if (coarseOf[f] >= 0) {
      c0[f] = coarseOf[f];
      c1[f] = coarseOf[f];
      w0[f] = 1;
      continue;
    }
    // f is odd and lies between two coarse nodes (its right one wraps round on a periodic axis)
    const wrap = f + 1 === nf;
    const xl = pos[f - 1];
    const xr = wrap ? pos[0] + ax.period : pos[f + 1];
    const wl = (xr - pos[f]) / (xr - xl);
    const wr = (pos[f] - xl) / (xr - xl);
    const cl = coarseOf[f - 1];
    const cr = coarseOf[wrap ? 0 : f + 1];
    if (cl < cr) {
      c0[f] = cl; w0[f] = wl; c1[f] = cr; w1[f] = wr;
    } else {
      c0[f] = cr; w0[f] = wr; c1[f] = cl; w1[f] = wl;
    }
  }
  const cpos = Float64Array.from(fineOf, (f) => pos[f]);
  return withTranspose({ count: fineOf.length, periodic: ax.periodic, pos: cpos, period: ax.period }, c0, w0, c1, w1, fineOf, true);
}

/** Whether a 1-D table is the uniform halving: n = 2·nc − 1, weight 1 at even nodes, ½ and ½ at odd ones. */
export function isUniform(t: AxisTransfer): boolean {
  const n = t.c0.length;
  const nc = t.coarse.count;
  if (!t.coarsened || n !== 2 * nc - 1) return false;
  for (let f = 0; f < n; f++) {
    const J = f >> 1;
    const ok = (f & 1) === 0
      ? t.c0[f] === J && t.w0[f] === 1 && t.w1[f] === 0
      : t.c0[f] === J && t.w0[f] === 0.5 && t.c1[f] === J + 1 && t.w1[f] === 0.5;
    if (!ok) return false;
  }
  return true;
}

/**
 * How the transfers between a level and the next coarser one run line by
 * line (see `transfer.ts`): the line axis is the fastest axis with more than
 * one node; each fine line is a weighted sum of coarse lines (`up…`) and
 * each coarse line a weighted sum of fine lines (`down…`), in CSR-like
 * start/index/weight arrays over line numbers.
 */
export interface LinePlan {
  /** Nodes per line, fine and coarse. */
  readonly fineLen: number;
  readonly coarseLen: number;
  /** Number of lines, fine and coarse. */
  readonly fineLines: number;
  readonly coarseLines: number;
  /** The 1-D table along the lines, and whether it is the uniform halving. */
  readonly line: AxisTransfer;
  readonly uniform: boolean;
  /** Coarse lines and weights of fine line ℓ: entries upStart[ℓ] … upStart[ℓ + 1] − 1. */
  readonly upStart: Int32Array;
  readonly upLine: Int32Array;
  readonly upW: Float64Array;
  /** Fine lines and weights of coarse line L: entries downStart[L] … downStart[L + 1] − 1. */
  readonly downStart: Int32Array;
  readonly downLine: Int32Array;
  readonly downW: Float64Array;
  /** The highest fine line each coarse line gathers. */
  readonly downLast: Int32Array;
}

/** The {@link LinePlan} of the transfer with per-axis tables `t` (x, y, z; trivial axes have one node). */
export function linePlan(t: readonly AxisTransfer[]): LinePlan {
  const fine = t.map((x) => x.c0.length);
  const coarse = t.map((x) => x.coarse.count);
  let ax = 2;
  while (ax > 0 && fine[ax] === 1) ax--;
  // the slow axes (before the line axis), padded to two with a one-node identity
  const one: AxisTransfer = axisTransfer({ count: 1, periodic: false, pos: new Float64Array(1), period: 1 }, false);
  const sx = ax > 0 ? t[0] : one;
  const sy = ax > 1 ? t[1] : one;
  const nfx = sx.c0.length;
  const nfy = sy.c0.length;
  const ncx = sx.coarse.count;
  const ncy = sy.coarse.count;
  const fineLines = nfx * nfy;
  const coarseLines = ncx * ncy;
  // up: each fine line from ≤ 2 × 2 coarse lines (products of the slow axes' entries, nonzero weights only)
  const upStart = new Int32Array(fineLines + 1);
  const upLine = new Int32Array(4 * fineLines);
  const upW = new Float64Array(4 * fineLines);
  let q = 0;
  for (let i = 0; i < nfx; i++) {
    for (let j = 0; j < nfy; j++) {
      for (let a = 0; a < 2; a++) {
        const wa = a === 0 ? sx.w0[i] : sx.w1[i];
        if (wa === 0) continue;
        const ca = a === 0 ? sx.c0[i] : sx.c1[i];
        for (let b = 0; b < 2; b++) {
          const wb = b === 0 ? sy.w0[j] : sy.w1[j];
          if (wb === 0) continue;
          upLine[q] = ca * ncy + (b === 0 ? sy.c0[j] : sy.c1[j]);
          upW[q] = wa * wb;
          q++;
        }
      }
      upStart[i * nfy + j + 1] = q;
    }
  }
  // down: each coarse line from ≤ 3 × 3 fine lines (the transposed entries)
  const downStart = new Int32Array(coarseLines + 1);
  const downLine = new Int32Array(9 * coarseLines);
  const downW = new Float64Array(9 * coarseLines);
  q = 0;
  for (let I = 0; I < ncx; I++) {
    for (let J = 0; J < ncy; J++) {
      for (let a = 0; a < 3; a++) {
        const wa = a === 0 ? sx.wa[I] : a === 1 ? sx.wb[I] : sx.wc[I];
        if (wa === 0) continue;
        const fa = a === 0 ? sx.fa[I] : a === 1 ? sx.fb[I] : sx.fc[I];
        for (let b = 0; b < 3; b++) {
          const wb = b === 0 ? sy.wa[J] : b === 1 ? sy.wb[J] : sy.wc[J];
          if (wb === 0) continue;
          downLine[q] = fa * nfy + (b === 0 ? sy.fa[J] : b === 1 ? sy.fb[J] : sy.fc[J]);
          downW[q] = wa * wb;
          q++;
        }
      }
      downStart[I * ncy + J + 1] = q;
    }
  }
  const downLast = new Int32Array(coarseLines);
  for (let c = 0; c < coarseLines; c++) {
    for (let e = downStart[c]; e < downStart[c + 1]; e++) downLast[c] = Math.max(downLast[c], downLine[e]);
  }
  return {
    downLast,
    fineLen: fine[ax], coarseLen: coarse[ax], fineLines, coarseLines, line: t[ax], uniform: isUniform(t[ax]),
    upStart, upLine: upLine.slice(0, upStart[fineLines]), upW: upW.slice(0, upStart[fineLines]),
    downStart, downLine: downLine.slice(0, q), downW: downW.slice(0, q),
  };
}

/** For each fine index i of an axis, the range lo[i] … hi[i] of coarse nodes I with |fineOf[I] − i| ≤ r. */
function reachOf(t: AxisTransfer, r: number): { lo: Int32Array; hi: Int32Array } {
  const n = t.c0.length;
  const f = t.fineOf;
  const lo = new Int32Array(n);
  const hi = new Int32Array(n);
  let a = 0;
  let b = 0;
  for (let i = 0; i < n; i++) {
    while (a < f.length && f[a] < i - r) a++;
    while (b + 1 < f.length && f[b + 1] <= i + r) b++;
    lo[i] = a;
    hi[i] = b;
  }
  return { lo, hi };
}

/**
 * The coarse rows of Pᵀ A P that are shifted copies of one regular row:
 * 1 where the row equals it, 2 where it equals it without the entries in
 * prescribed coarse columns (a row next to a value face). Undefined when A
 * has no stencil rows.
 *
 * A coarse row I is regular when every axis interpolates uniformly
 * (weights ½) within two fine nodes of I's place, every fine row it gathers
 * (within 1 along a coarsened axis) is A's stencil row — or, next to a
 * value face, the stencil row without its entries in prescribed columns —
 * and every prescribed fine node within 2 is harmless: all the coarse nodes
 * it interpolates from are prescribed. Then each product P_fI·a_fj·P_jJ of
 * the row either equals the regular row's or lands in a prescribed coarse
 * column, dropped in both. Found from the 1-D tables, the rows outside the
 * stencil runs and the prescribed nodes, in O(n_c + boundary).
 */
export function regularRows(
  m: LevelMatrix, axes: readonly AxisLevel[], fixed: Int32Array, t: readonly AxisTransfer[], cmask: Uint8Array,
): Uint8Array | undefined {
  if (m.runCount === 0) return undefined;
  const sh = axes.map((ax) => ax.count);
  const q = sh.map((c) => (c > 1 ? 1 : 0));
  // the stencil must reach only the 3^d neighbours; counts ≥ 3 make that decomposition unique
  if (sh.some((c) => c === 2)) return undefined;
  const reach = new Set<number>();
  for (let a = -q[0]; a <= q[0]; a++) for (let b = -q[1]; b <= q[1]; b++) for (let c = -q[2]; c <= q[2]; c++) reach.add((a * sh[1] + b) * sh[2] + c);
  for (let k = 0; k < m.offsets.length; k++) if (!reach.has(m.offsets[k])) return undefined;
  const csh = t.map((x) => x.coarse.count);
  const out = new Uint8Array(cmask.length);
  // 1-D: uniform weights within two fine nodes, coarse neighbours on both sides
  const ok1 = t.map((x, d) => {
    const N = x.coarse.count;
    const nf = sh[d];
    const ok = new Uint8Array(N);
    for (let I = 0; I < N; I++) {
      const F = x.fineOf[I];
      if (!x.coarsened) {
        ok[I] = nf === 1 || (F >= 1 && F <= nf - 2) ? 1 : 0;
        continue;
      }
      if (F < 2 || F > nf - 3 || I < 1 || I > N - 2) continue;
      const one = (f: number, c: number): boolean => x.c0[f] === c && x.w0[f] === 1 && x.w1[f] === 0;
      const half = (f: number, c: number): boolean => x.c0[f] === c && x.w0[f] === 0.5 && x.c1[f] === c + 1 && x.w1[f] === 0.5;
      if (one(F, I) && one(F - 2, I - 1) && one(F + 2, I + 1) && half(F - 1, I - 1) && half(F + 1, I)) ok[I] = 1;
    }
    return ok;
  });
  // the (y, z) plane pattern once, then one copy per x index
  const plane = new Uint8Array(csh[1] * csh[2]);
  for (let J = 0; J < csh[1]; J++) {
    if (ok1[1][J] === 0) continue;
    plane.set(ok1[2], J * csh[2]);
  }
  let count = 0;
  for (let k = 0; k < plane.length; k++) count += plane[k];
  let planes = 0;
  for (let I = 0; I < csh[0]; I++) {
    if (ok1[0][I] === 0) continue;
    out.set(plane, I * plane.length);
    planes++;
  }
  count *= planes;
  const n12 = sh[1] * sh[2];
  const c12 = csh[1] * csh[2];
  const split = (f: number): [number, number, number] => {
    const i0 = Math.floor(f / n12);
    const rem = f - i0 * n12;
    const i1 = Math.floor(rem / sh[2]);
    return [i0, i1, rem - i1 * sh[2]];
  };
  // clear the coarse rows within reach of a fine node that breaks the pattern
  const clear = (f: number, r: readonly { lo: Int32Array; hi: Int32Array }[]): void => {
    const [i0, i1, i2] = split(f);
    for (let I = r[0].lo[i0]; I <= r[0].hi[i0]; I++) {
      for (let J = r[1].lo[i1]; J <= r[1].hi[i1]; J++) {
        for (let K = r[2].lo[i2]; K <= r[2].hi[i2]; K++) out[(I * csh[1] + J) * csh[2] + K] = 0;
      }
    }
  };
  const fine = new Uint8Array(m.n);
  for (let k = 0; k < fixed.length; k++) fine[fixed[k]] = 1;
  // a prescribed fine node is harmless when every coarse node it interpolates from is prescribed
  const harmless = (f: number): boolean => {
    const ix = split(f);
    for (let a = 0; a < 2; a++) {
      const x = t[0];
      if (a === 1 && x.w1[ix[0]] === 0) continue;
      const c0 = a === 0 ? x.c0[ix[0]] : x.c1[ix[0]];
      for (let b = 0; b < 2; b++) {
        const y = t[1];
        if (b === 1 && y.w1[ix[1]] === 0) continue;
        const c1 = b === 0 ? y.c0[ix[1]] : y.c1[ix[1]];
        for (let c = 0; c < 2; c++) {
          const z = t[2];
          if (c === 1 && z.w1[ix[2]] === 0) continue;
          if (cmask[c0 * c12 + c1 * csh[2] + (c === 0 ? z.c0[ix[2]] : z.c1[ix[2]])] === 0) return false;
        }
      }
    }
    return true;
  };
  // a row outside the runs still counts when it is the stencil on its unprescribed columns and nothing else
  const { rowPtr, colIdx, values } = m;
  const off = m.offsets;
  const w = m.weights;
  const effective = (f: number): boolean => {
    // merge the row's columns and the stencil's, both ascending, skipping prescribed columns in each
    let p = rowPtr[f];
    const e = rowPtr[f + 1];
    let k = 0;
    for (;;) {
      while (p < e && fine[colIdx[p]] === 1) p++;
      while (k < off.length) {
        const j = f + off[k];
        if (j < 0 || j >= m.n) return false;
        if (fine[j] === 0) break;
        k++;
      }
      if (p === e || k === off.length) return p === e && k === off.length;
      if (colIdx[p] - f !== off[k] || !(Math.abs(values[p] - w[k]) <= m.tol)) return false;
      p++;
      k++;
    }
  };
  // rows the coarse row gathers (within 1 along a coarsened axis) must be stencil rows, or effectively so
  const r1 = t.map((x) => reachOf(x, x.coarsened ? 1 : 0));
  let i = 0;
  for (let run = 0; run <= m.runCount; run++) {
    const end = run < m.runCount ? m.runStart[run] : m.n;
    for (; i < end; i++) {
      if (fine[i] === 1) continue;
      if (!effective(i)) clear(i, r1);
    }
    if (run < m.runCount) i = m.runEnd[run];
  }
  // prescribed fine nodes zero P's rows: no harmful one within 2 along a coarsened axis (1 along the others)
  const r2 = t.map((x, d) => reachOf(x, x.coarsened ? 2 : q[d]));
  for (let k = 0; k < fixed.length; k++) if (!harmless(fixed[k])) clear(fixed[k], r2);
  // prescribed coarse nodes zero P's columns: rows beside them are copies without those entries
  for (let c = 0; c < cmask.length; c++) {
    if (cmask[c] === 0) continue;
    const I = Math.floor(c / c12);
    const rem = c - I * c12;
    const J = Math.floor(rem / csh[2]);
    const K = rem - J * csh[2];
    for (let a = Math.max(0, I - q[0]); a <= Math.min(csh[0] - 1, I + q[0]); a++) {
      for (let b = Math.max(0, J - q[1]); b <= Math.min(csh[1] - 1, J + q[1]); b++) {
        for (let e = Math.max(0, K - q[2]); e <= Math.min(csh[2] - 1, K + q[2]); e++) {
          const u = (a * csh[1] + b) * csh[2] + e;
          if (out[u] === 1) out[u] = 2;
        }
      }
    }
    out[c] = 0;
  }
  return count > 0 ? out : undefined;
}

/** Product of a[from … to − 1]. */
export function prod(a: readonly number[], from: number, to: number): number {
  let p = 1;
  for (let d = from; d < to; d++) p *= a[d];
  return p;
}
