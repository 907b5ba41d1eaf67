import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../support/prng.js';
import { assembleLaplace5, laplace5Nnz } from '../../../src/operator/base/assemble-laplace.js';
import { csrRunsMatVec, findCsrRuns } from '../../../src/operator/base/csr-runs.js';
import { csrKernel } from '../../../src/operator/matrix.js';
import { grid } from '../../../src/grid/index.js';
import { laplacian } from '../../../src/operator/index.js';

interface Csr {
  readonly n: number;
  readonly rowPtr: Int32Array;
  readonly colIdx: Int32Array;
  readonly values: Float64Array;
}

/** y[i] by a plain loop from 0 in storage order: what the runs must reproduce bit for bit. */
function plain(a: Csr, x: Float64Array): Float64Array {
  const y = new Float64Array(a.n);
  for (let i = 0; i < a.n; i++) {
    let s = 0;
    for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) s += a.values[k] * x[a.colIdx[k]];
    y[i] = s;
  }
  return y;
}

/** Index of the first element that differs in bits (Object.is), or −1. */
function firstDifference(a: Float64Array, b: Float64Array): number {
  if (a.length !== b.length) return 0;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return i;
  return -1;
}

function randomVector(n: number, seed: number): Float64Array {
  const r = mulberry32(seed);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = r() * 2 - 1;
  return x;
}

/**
 * Rows built from stencils: row i is stencil `s` shifted to i, its entries
 * clipped to the columns that exist; `plan` gives (stencil, rows) segments,
 * and `poke` perturbs single values after assembly.
 */
function fromStencils(
  n: number,
  stencils: readonly (readonly [number, number][])[],
  plan: readonly [number, number][],
  poke: readonly [number, number][] = [],
): Csr {
  const rowPtr = new Int32Array(n + 1);
  const ci: number[] = [];
  const vs: number[] = [];
  let i = 0;
  for (const [s, rows] of plan) {
    for (let r = 0; r < rows && i < n; r++, i++) {
      for (const [o, w] of stencils[s]!) {
        if (i + o >= 0 && i + o < n) {
          ci.push(i + o);
          vs.push(w);
        }
      }
      rowPtr[i + 1] = ci.length;
    }
  }
  for (; i < n; i++) rowPtr[i + 1] = ci.length;
  const values = Float64Array.from(vs);
  for (const [k, v] of poke) if (k < values.length) values[k] = v;
  return { n, rowPtr, colIdx: Int32Array.from(ci), values };
}

describe('findCsrRuns', () => {
  it('finds the runs of the n × n zero-Dirichlet five-point matrix exactly: n − 2 five-entry runs, 2 four-entry runs, 3 stencils', () => {
    const nx = 40;
    const rows = nx * nx;
    const rowPtr = new Int32Array(rows + 1);
    const colIdx = new Int32Array(laplace5Nnz(nx, nx));
    const values = new Float64Array(colIdx.length);
    assembleLaplace5(nx, nx, 1681, 1681, -4 * 1681, rowPtr, colIdx, values);
    const runs = findCsrRuns(rows, rowPtr, colIdx, values);
    // each grid line's interior rows j = 1 … n − 2 are one run; the end rows of a line differ (a missing neighbour)
    expect(runs.count).toBe(nx);
    expect(runs.covered).toBe(nx * (nx - 2));
    expect([...runs.size].sort()).toEqual([4, 4, 5]);
    for (let q = 0; q < runs.count; q++) {
      expect(runs.start[q]).toBe(q * nx + 1);
      expect(runs.end[q]).toBe(q * nx + nx - 1);
    }
    const five = [...runs.size].indexOf(5);
    const b = runs.base[five]!;
    expect([...runs.offsets.subarray(b, b + 5)]).toEqual([-nx, -1, 0, 1, nx]);
    expect([...runs.weights.subarray(b, b + 5)]).toEqual([1681, 1681, -4 * 1681, 1681, 1681]);
  });

  it('keeps no run shorter than minRun, and none where one value differs in the last bit', () => {
    const st = [[[-1, 1], [0, -2], [1, 1]] as [number, number][]];
    const a = fromStencils(30, st, [[0, 30]]);
    expect(findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values, 31).count).toBe(0);
    // rows 1 … 28 are the full stencil (row 0 and 29 are clipped)
    const all = findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values, 8);
    expect([all.count, all.covered]).toEqual([1, 28]);
    // a one-ulp change at row 15 (entries 1 + 3·14 … ) splits the run in two around it
    const k = a.rowPtr[15]! + 1;
    a.values[k] = -2 * (1 + Number.EPSILON);
    const split = findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values, 8);
    expect([...split.start]).toEqual([1, 16]);
    expect([...split.end]).toEqual([15, 29]);
  });

  it('leaves stencils wider than 32 entries and empty rows to the CSR loop', () => {
    const wide = [Array.from({ length: 33 }, (_, k) => [k - 16, 1 + k] as [number, number])];
    const a = fromStencils(200, wide, [[0, 200]]);
    expect(findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values).count).toBe(0);
    const empty = { n: 50, rowPtr: new Int32Array(51), colIdx: new Int32Array(0), values: new Float64Array(0) };
    expect(findCsrRuns(empty.n, empty.rowPtr, empty.colIdx, empty.values).count).toBe(0);
  });
});

describe('csrRunsMatVec is bit-for-bit the plain CSR loop', () => {
  const stencils: (readonly [number, number][])[] = [
    [[-1, 1], [0, -2], [1, 1]], // 3: 1-D
    [[-7, 0.3], [-1, 1.1], [0, -4.7], [1, 1.3], [7, 0.9]], // 5: 2-D five-point, unequal weights
    [[-49, 1], [-7, 2], [-1, 3], [0, -6.5], [1, 3], [7, 2], [49, 1]], // 7: 3-D
    [[-8, 0.1], [-7, 0.2], [-6, 0.3], [-1, 0.4], [0, -5], [1, 0.6], [6, 0.7], [7, 0.8], [8, 0.9]], // 9
    [[-2, -1 / 12], [-1, 4 / 3], [0, -5 / 2], [1, 4 / 3], [2, -1 / 12]], // 5, fourth order
    [[-3, 0.5], [0, 2], [3, 0.5], [4, -1]], // 4: any-size loop
    [[0, 3]], // 1: diagonal
    [[-2, -0], [0, 1], [2, 0]], // signed zeros
  ];

  it('on planted runs of every stencil size, with short segments and single-value perturbations (property, seeded)', () => {
    fc.assert(fc.property(
      fc.array(fc.tuple(fc.integer({ min: 0, max: stencils.length - 1 }), fc.integer({ min: 1, max: 40 })), { minLength: 1, maxLength: 12 }),
      fc.array(fc.tuple(fc.nat(2000), fc.double({ min: -3, max: 3, noNaN: true })), { maxLength: 4 }),
      fc.integer(),
      (plan, poke, seed) => {
        const n = plan.reduce((s, [, r]) => s + r, 0);
        const a = fromStencils(n, stencils, plan, poke);
        const x = randomVector(n, seed);
        const runs = findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values, 4);
        const y = new Float64Array(n).fill(Number.NaN);
        csrRunsMatVec(runs, a.n, a.rowPtr, a.colIdx, a.values, x, y);
        return firstDifference(y, plain(a, x)) === -1;
      },
    ), { seed: 20261202, numRuns: 300 });
  });

  it('on the 2-D and 3-D Laplacians of the operator stage, with NaN and infinities in x propagating as in the loop', () => {
    for (const g of [
      grid({ x: { from: 0, to: 1, cells: 30 }, y: { from: 0, to: 2, cells: 17 } }),
      grid({ x: { from: 0, to: 1, cells: 9 }, y: { from: 0, to: 1, cells: 8 }, z: { from: 0, to: 3, cells: 10 } }),
    ]) {
      const m = laplacian(g).matrix;
      const a = { n: m.rows, rowPtr: m.rowPtr, colIdx: m.colIdx, values: m.values };
      const runs = findCsrRuns(a.n, a.rowPtr, a.colIdx, a.values);
      expect(2 * runs.covered).toBeGreaterThan(a.n);
      const x = randomVector(a.n, 7);
      x[a.n >> 1] = Number.NaN;
      x[3] = Infinity;
      const y = csrRunsMatVec(runs, a.n, a.rowPtr, a.colIdx, a.values, x, new Float64Array(a.n));
      expect(firstDifference(y, plain(a, x))).toBe(-1);
      expect(Number.isNaN(y[a.n >> 1]!)).toBe(true);
    }
  });
});

describe('csrKernel', () => {
  it('multiplies through the CSR arrays first, then through the runs found at the second call (which a later change of values does not reach, as documented)', () => {
    const st = [[[-1, 1], [0, -2], [1, 1]] as [number, number][]];
    const a = fromStencils(100, st, [[0, 100]]);
    const m = { rows: a.n, cols: a.n, rowPtr: a.rowPtr, colIdx: a.colIdx, values: a.values };
    const x = randomVector(a.n, 3);
    const mul = csrKernel(m);
    const y = new Float64Array(a.n);
    expect(firstDifference(mul(x, y), plain(a, x))).toBe(-1);
    // before the second call the arrays are still read: a change shows
    m.values[m.rowPtr[50]! + 1] = -3;
    expect(mul(x, y)[50]).toBe(plain(a, x)[50]);
    // the second call inspected the matrix; row 50 is outside the runs now and rows 1 … 49 are one run
    m.values[m.rowPtr[20]! + 1] = -5;
    const stale = mul(x, y)[20];
    expect(stale).not.toBe(plain(a, x)[20]);
    expect(stale).toBe(x[19]! - 2 * x[20]! + x[21]!);
  });

  it('stays on the CSR loop when runs cover less than half the rows', () => {
    const r = mulberry32(11);
    const n = 64;
    const rowPtr = new Int32Array(n + 1);
    const ci: number[] = [];
    const vs: number[] = [];
    for (let i = 0; i < n; i++) {
      ci.push(i);
      vs.push(1 + r());
      rowPtr[i + 1] = ci.length;
    }
    const m = { rows: n, cols: n, rowPtr, colIdx: Int32Array.from(ci), values: Float64Array.from(vs) };
    const mul = csrKernel(m);
    const x = randomVector(n, 5);
    mul(x, new Float64Array(n));
    mul(x, new Float64Array(n));
    m.values[10] = 100; // no runs: the loop keeps reading the arrays
    expect(mul(x, new Float64Array(n))[10]).toBe(100 * x[10]!);
  });
});
