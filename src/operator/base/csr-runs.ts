/**
 * CSR matrix–vector products through stencil runs: an inspector–executor
 * form of y = A·x for the matrices finite differences make.
 *
 * A finite-difference matrix on a grid repeats itself: along a grid line
 * every interior row is the same stencil shifted by one column. The
 * inspector ({@link findCsrRuns}) walks the matrix once (O(nnz)) and records
 * the runs of consecutive rows that are bit-for-bit the same shifted stencil:
 * row i of a run holds w[k] in column i + off[k], k = 0 … m − 1, with the
 * same m, offsets and values (compared with ===) in every row. The executor
 * ({@link csrRunsMatVec}) then sums a run's rows with the weights and
 * offsets held in locals, reading x and writing y but no matrix storage —
 * the CSR form reads 12 bytes per entry (value and column) on top. Rows
 * outside runs go through the CSR arrays as before.
 *
 * The result is bit-for-bit that of the plain CSR loop: every row is summed
 * in storage order starting from 0, the same products of the same numbers.
 * The inspector–executor split is the one of Saltz, J., Mirchandaney, R.,
 * Crowley, K. (1991), "Run-time parallelization and scheduling of loops",
 * IEEE Trans. Computers 40(5); storing repeated values once is the idea of
 * the value-compressed CSR-VI format of Kourtis, K., Goumas, G., Koziris, N.
 * (2008), "Optimizing sparse matrix-vector multiplication using index and
 * value compression", Proc. 5th ACM Conf. Computing Frontiers.
 *
 * The runs describe the arrays as they were inspected: a matrix whose
 * arrays change afterwards needs a new inspection.
 *
 * @module
 * @internal
 */

/** The stencil runs of a CSR matrix (see the module doc). @internal */
export interface CsrRuns {
  /** Number of runs. */
  readonly count: number;
  /** First row of each run. */
  readonly start: Int32Array;
  /** One past the last row of each run. */
  readonly end: Int32Array;
  /** Index of each run's stencil. */
  readonly stencil: Int32Array;
  /** Entries m of each stencil. */
  readonly size: Int32Array;
  /** Position of each stencil's first entry in `offsets` and `weights`. */
  readonly base: Int32Array;
  /** Column offsets of every stencil, ascending within one. */
  readonly offsets: Int32Array;
  /** Weights of every stencil. */
  readonly weights: Float64Array;
  /** Rows that lie in runs. */
  readonly covered: number;
}

/** Stencils wider than this are left to the CSR loop. */
const maxStencil = 32;

/** Whether row i holds m entries equal to `w` in columns i + `off`. */
function sameRow(rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array, i: number, m: number, off: Int32Array, w: Float64Array): boolean {
  const b = rowPtr[i];
  if (rowPtr[i + 1] - b !== m) return false;
  for (let k = 0; k < m; k++) {
    if (colIdx[b + k] - i !== off[k] || values[b + k] !== w[k]) return false;
  }
  return true;
}

/**
 * Finds the runs of at least `minRun` consecutive rows that are one stencil
 * shifted (module doc). Identical stencils share one entry. Cost O(nnz) time,
 * O(runs + stencil entries) memory.
 *
 * @param n - number of rows
 * @param rowPtr - n + 1 row starts
 * @param colIdx - column of each entry
 * @param values - value of each entry
 * @param minRun - shortest run kept (default 8 rows)
 * @returns the runs
 */
export function findCsrRuns(n: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array, minRun = 8): CsrRuns {
  const starts: number[] = [];
  const ends: number[] = [];
  const which: number[] = [];
  const sizes: number[] = [];
  const bases: number[] = [];
  const offs: number[] = [];
  const wts: number[] = [];
  const known = new Map<string, number>();
  const off = new Int32Array(maxStencil);
  const w = new Float64Array(maxStencil);
  let covered = 0;
  let i = 0;
  while (i < n) {
    const a = rowPtr[i];
    const m = rowPtr[i + 1] - a;
    let r = i + 1;
    if (m > 0 && m <= maxStencil) {
      for (let k = 0; k < m; k++) {
        off[k] = colIdx[a + k] - i;
        w[k] = values[a + k];
      }
      while (r < n && sameRow(rowPtr, colIdx, values, r, m, off, w)) r++;
    }
    if (r - i >= minRun) {
      let key = `${m}`;
      for (let k = 0; k < m; k++) key += ` ${off[k]}:${w[k]}`;
      let s = known.get(key);
      if (s === undefined) {
        s = sizes.length;
        known.set(key, s);
        sizes.push(m);
        bases.push(offs.length);
        for (let k = 0; k < m; k++) {
          offs.push(off[k]);
          wts.push(w[k]);
        }
      }
      starts.push(i);
      ends.push(r);
      which.push(s);
      covered += r - i;
    }
    i = r;
  }
  return {
    count: starts.length,
    start: Int32Array.from(starts),
    end: Int32Array.from(ends),
    stencil: Int32Array.from(which),
    size: Int32Array.from(sizes),
    base: Int32Array.from(bases),
    offsets: Int32Array.from(offs),
    weights: Float64Array.from(wts),
    covered,
  };
}

/** Rows lo … hi − 1 through the CSR arrays, summed in storage order from 0. */
function csrRows(lo: number, hi: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array, x: Float64Array, y: Float64Array): void {
  let start = rowPtr[lo];
  for (let i = lo; i < hi; i++) {
    const end = rowPtr[i + 1];
    let s = 0;
    for (let k = start; k < end; k++) s += values[k] * x[colIdx[k]];
    y[i] = s;
    start = end;
  }
}

function run3(s0: number, e0: number, off: Int32Array, w: Float64Array, b: number, x: Float64Array, y: Float64Array): void {
  const o0 = off[b];
  const o1 = off[b + 1];
  const o2 = off[b + 2];
  const w0 = w[b];
  const w1 = w[b + 1];
  const w2 = w[b + 2];
  for (let i = s0; i < e0; i++) {
    y[i] = 0 + w0 * x[i + o0] + w1 * x[i + o1] + w2 * x[i + o2];
  }
}

function run5(s0: number, e0: number, off: Int32Array, w: Float64Array, b: number, x: Float64Array, y: Float64Array): void {
  const o0 = off[b];
  const o1 = off[b + 1];
  const o2 = off[b + 2];
  const o3 = off[b + 3];
  const o4 = off[b + 4];
  const w0 = w[b];
  const w1 = w[b + 1];
  const w2 = w[b + 2];
  const w3 = w[b + 3];
  const w4 = w[b + 4];
  for (let i = s0; i < e0; i++) {
    y[i] = 0 + w0 * x[i + o0] + w1 * x[i + o1] + w2 * x[i + o2] + w3 * x[i + o3] + w4 * x[i + o4];
  }
}

function run7(s0: number, e0: number, off: Int32Array, w: Float64Array, b: number, x: Float64Array, y: Float64Array): void {
  const o0 = off[b];
  const o1 = off[b + 1];
  const o2 = off[b + 2];
  const o3 = off[b + 3];
  const o4 = off[b + 4];
  const o5 = off[b + 5];
  const o6 = off[b + 6];
  const w0 = w[b];
  const w1 = w[b + 1];
  const w2 = w[b + 2];
  const w3 = w[b + 3];
  const w4 = w[b + 4];
  const w5 = w[b + 5];
  const w6 = w[b + 6];
  for (let i = s0; i < e0; i++) {
    y[i] = 0 + w0 * x[i + o0] + w1 * x[i + o1] + w2 * x[i + o2] + w3 * x[i + o3] + w4 * x[i + o4]
      + w5 * x[i + o5] + w6 * x[i + o6];
  }
}

function run9(s0: number, e0: number, off: Int32Array, w: Float64Array, b: number, x: Float64Array, y: Float64Array): void {
  const o0 = off[b];
  const o1 = off[b + 1];
  const o2 = off[b + 2];
  const o3 = off[b + 3];
  const o4 = off[b + 4];
  const o5 = off[b + 5];
  const o6 = off[b + 6];
  const o7 = off[b + 7];
  const o8 = off[b + 8];
  const w0 = w[b];
  const w1 = w[b + 1];
  const w2 = w[b + 2];
  const w3 = w[b + 3];
  const w4 = w[b + 4];
  const w5 = w[b + 5];
  const w6 = w[b + 6];
  const w7 = w[b + 7];
  const w8 = w[b + 8];
  for (let i = s0; i < e0; i++) {
    y[i] = 0 + w0 * x[i + o0] + w1 * x[i + o1] + w2 * x[i + o2] + w3 * x[i + o3] + w4 * x[i + o4]
      + w5 * x[i + o5] + w6 * x[i + o6] + w7 * x[i + o7] + w8 * x[i + o8];
  }
}

function runAny(s0: number, e0: number, m: number, off: Int32Array, w: Float64Array, b: number, x: Float64Array, y: Float64Array): void {
  const e = b + m;
  for (let i = s0; i < e0; i++) {
    let s = 0;
    for (let k = b; k < e; k++) s += w[k] * x[i + off[k]];
    y[i] = s;
  }
}

/**
 * y = A·x through the runs of `findCsrRuns` (module doc), x and y of unit
 * stride from element 0, y not overlapping x. Bit-for-bit the plain CSR loop.
 *
 * @param runs - the runs of this very matrix
 * @param n - number of rows
 * @param rowPtr - n + 1 row starts
 * @param colIdx - column of each entry
 * @param values - value of each entry
 * @param x - input vector
 * @param y - output vector, all n elements written
 * @returns `y`
 */
export function csrRunsMatVec(
  runs: CsrRuns, n: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array,
  x: Float64Array, y: Float64Array,
): Float64Array {
  const { count, start, end, stencil, size, base, offsets, weights } = runs;
  let i = 0;
  for (let q = 0; q < count; q++) {
    const s0 = start[q];
    const e0 = end[q];
    if (i < s0) csrRows(i, s0, rowPtr, colIdx, values, x, y);
    const t = stencil[q];
    const b = base[t];
    switch (size[t]) {
      case 5: run5(s0, e0, offsets, weights, b, x, y); break;
      case 3: run3(s0, e0, offsets, weights, b, x, y); break;
      case 7: run7(s0, e0, offsets, weights, b, x, y); break;
      case 9: run9(s0, e0, offsets, weights, b, x, y); break;
      default: runAny(s0, e0, size[t], offsets, weights, b, x, y);
    }
    i = e0;
  }
  if (i < n) csrRows(i, n, rowPtr, colIdx, values, x, y);
  return y;
}
