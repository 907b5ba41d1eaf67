/**
 * One-dimensional stencil tables: for every node of an axis, the offsets and
 * weights (spacing included) of one derivative at one accuracy, with the
 * boundary closures. Internal; the operator builders spread these along an
 * axis of a grid.
 *
 * Windows. Interior nodes use the centred stencil of `centralStencil(m, p)`
 * when p is even, and for odd p the m + p offsets centred as nearly as
 * possible (one more node on the + side). Where that window would leave the
 * axis, the row uses m + p consecutive nodes starting at (or ending at) the
 * boundary: a one-sided or biased stencil whose accuracy is p exactly (N
 * nodes give order N − m on any node set). On a periodic axis every node
 * uses the interior window, wrapping around.
 *
 * Stretched axes. Weights come from Fornberg's recursion on the actual
 * coordinates of the same windows. Boundary windows keep order p on any node
 * set; a centred interior window gains its extra order only where the
 * stretching is smooth (neighbouring widths differ by a factor 1 + O(h)),
 * which the clustering helpers of the grid stage guarantee.
 *
 * @module
 */
import { InvalidAccuracyError, TooFewNodesError } from '../errors.js';
import type { Axis } from '../grid/index.js';
import { fornbergTable } from '../stencil/fornberg.js';
import { centralStencil, stencil } from '../stencil/index.js';

/** Offsets and weights per node: row i is `offsets/weights[ptr[i] … ptr[i+1]−1]`. @internal */
export interface LineTable {
  /** Node count of the axis. */
  readonly n: number;
  /** Row starts, length n + 1. */
  readonly ptr: Int32Array;
  /** Node index offsets relative to the row's node (unwrapped on a periodic axis). */
  readonly offsets: Int32Array;
  /** Weights with the spacing included. */
  readonly weights: Float64Array;
}

/** Interior window of derivative m at accuracy p. @internal */
export function interiorOffsets(m: number, p: number): number[] {
  if (p % 2 === 0) return [...centralStencil(m, p).offsets];
  const n = m + p;
  const lo = -Math.floor((n - 1) / 2);
  return Array.from({ length: n }, (_, k) => lo + k);
}

/** Smallest node count an axis needs for derivative m at accuracy p. @internal */
export function nodesNeeded(m: number, p: number, periodic: boolean): number {
  return periodic ? interiorOffsets(m, p).length : m + p;
}

/** Checks an accuracy order (whole number ≥ 1). @internal */
export function checkAccuracyOrder(p: number): void {
  if (!Number.isSafeInteger(p) || p < 1) {
    throw new InvalidAccuracyError(p, 'use a whole number ≥ 1 (the order p of the error O(hᵖ))');
  }
}

/**
 * The table of derivative m at accuracy p along `axis`.
 *
 * @internal
 */
export function lineTable(axis: Axis, m: number, p: number): LineTable {
  const n = axis.count;
  const inner = interiorOffsets(m, p);
  const need = nodesNeeded(m, p, axis.periodic);
  if (n < need) {
    throw new TooFewNodesError(n, need, `derivative ${m} at accuracy ${p} along ${axis.name}${axis.periodic ? ' (periodic)' : ''}`);
  }
  const lo = inner[0]!;
  const hi = inner[inner.length - 1]!;
  const nb = m + p;
  const rows: Array<readonly number[]> = [];
  for (let i = 0; i < n; i++) {
    if (axis.periodic || (i + lo >= 0 && i + hi <= n - 1)) rows.push(inner);
    else if (i + lo < 0) rows.push(Array.from({ length: nb }, (_, k) => k - i));
    else rows.push(Array.from({ length: nb }, (_, k) => n - nb + k - i));
  }
  const ptr = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) ptr[i + 1] = ptr[i]! + rows[i]!.length;
  const offsets = new Int32Array(ptr[n]!);
  const weights = new Float64Array(ptr[n]!);
  const x = axis.coordinates;
  const period = axis.to - axis.from;
  const cache = new Map<string, Float64Array>();
  for (let i = 0; i < n; i++) {
    const offs = rows[i]!;
    offsets.set(offs, ptr[i]!);
    if (axis.uniform) {
      const key = offs.join(',');
      let w = cache.get(key);
      if (w === undefined) {
        const scale = 1 / axis.spacing ** m;
        w = Float64Array.from(stencil(m, [...offs]).weights, (v) => v * scale);
        cache.set(key, w);
      }
      weights.set(w, ptr[i]!);
    } else {
      const local = new Float64Array(offs.length);
      for (let k = 0; k < offs.length; k++) {
        const j = i + offs[k]!;
        // unwrap a periodic neighbour across the seam
        const wrap = Math.floor(j / n);
        local[k] = x[j - wrap * n]! + wrap * period;
      }
      const t = fornbergTable(m, local, x[i]!);
      weights.set(t.subarray(m * offs.length, (m + 1) * offs.length), ptr[i]!);
    }
  }
  return { n, ptr, offsets, weights };
}
