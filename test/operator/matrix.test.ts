/**
 * CSR matrices: row-by-row assembly (CsrBuilder), the transpose, the
 * symmetry test, the structure check, and fromCsr.
 *
 * The layout under test is the classical compressed sparse row form: row r
 * holds colIdx/values[rowPtr[r] … rowPtr[r+1] − 1], columns strictly
 * ascending (Saad, Y. (2003). Iterative Methods for Sparse Linear Systems,
 * 2nd ed., SIAM, §3.4). Every expected matrix here is rebuilt densely, from
 * the definition, not from the code under test.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type CsrMatrix, csrIsSymmetric, csrTranspose, fromCsr } from '../../src/index.js';
import { CsrBuilder, checkCsr } from '../../src/operator/matrix.js';
import { SEED, csrApply, csrFromDense, eps, expectCode, mulberry32, toDense } from './helpers.js';

const rng = mulberry32(SEED + 10);


/** A random sparse rows × cols matrix with about `fill` of its entries stored (some rows empty). */
function randomCsr(rows: number, cols: number, fill: number, r: () => number = rng): CsrMatrix {
  return csrFromDense(Array.from({ length: rows }, () => Array.from({ length: cols }, () => (r() < fill ? 2 * r() - 1 : 0))), cols);
}

/** Columns of every row strictly ascending and in range, lengths consistent (restated, not checkCsr). */
function expectWellFormed(m: CsrMatrix): void {
  expect(m.rowPtr.length).toBe(m.rows + 1);
  expect(m.rowPtr[0]).toBe(0);
  expect(m.colIdx.length).toBe(m.rowPtr[m.rows]);
  expect(m.values.length).toBe(m.rowPtr[m.rows]);
  for (let r = 0; r < m.rows; r++) {
    expect(m.rowPtr[r + 1]!).toBeGreaterThanOrEqual(m.rowPtr[r]!);
    for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) {
      expect(m.colIdx[q]!).toBeGreaterThanOrEqual(0);
      expect(m.colIdx[q]!).toBeLessThan(m.cols);
      if (q > m.rowPtr[r]!) expect(m.colIdx[q]!).toBeGreaterThan(m.colIdx[q - 1]!);
    }
  }
}

describe('CsrBuilder', () => {
  it('sorts each row by column and sums repeated columns (integers: sums exact)', () => {
    const b = new CsrBuilder(3, 5);
    // row 0: columns out of order, column 3 three times
    for (const [c, v] of [[3, 1], [0, 2], [3, 4], [1, -7], [3, 8]] as const) b.add(c, v);
    b.endRow();
    // row 1: empty
    b.endRow();
    // row 2: a repeat that cancels, kept as a stored zero
    for (const [c, v] of [[4, 5], [2, 1], [4, -5]] as const) b.add(c, v);
    b.endRow();
    const m = b.finish();
    expectWellFormed(m);
    expect(Array.from(m.rowPtr)).toEqual([0, 3, 3, 5]);
    expect(Array.from(m.colIdx)).toEqual([0, 1, 3, 2, 4]);
    expect(Array.from(m.values)).toEqual([2, -7, 13, 1, 0]);
  });

  it('grows past its initial capacity and trims the result', () => {
    // nnzGuess 1 gives the minimum capacity (16); 40 rows of 7 entries force several doublings
    const b = new CsrBuilder(40, 40, 1);
    const want = Array.from({ length: 40 }, () => new Array<number>(40).fill(0));
    for (let r = 0; r < 40; r++) {
      for (let k = 0; k < 7; k++) {
        const c = (r * 13 + k * 17) % 40;
        b.add(c, r + k); // small integers: every partial sum is exact
        want[r]![c]! += r + k;
      }
      b.endRow();
    }
    const m = b.finish();
    expectWellFormed(m);
    expect(m.colIdx.length).toBe(m.rowPtr[40]);
    expect(toDense(m)).toEqual(want);
  });

  it('random triplets (fast-check): equals dense accumulation to round-off', () => {
    // A repeated column summed once per repeat: |fl(Σ) − Σ| ≤ (t − 1)·ε·Σ|v| for t terms in any
    // order (Higham, N. J. (2002). Accuracy and Stability of Numerical Algorithms, 2nd ed., §3.1);
    // the dense reference has the same bound, so the two differ by at most 2(t − 1)·ε·Σ|v|.
    const triplets = fc.array(fc.tuple(fc.nat({ max: 5 }), fc.nat({ max: 6 }), fc.double({ min: -10, max: 10, noNaN: true })), { maxLength: 60 });
    fc.assert(
      fc.property(triplets, (ts) => {
        const rows = 6;
        const cols = 7;
        const b = new CsrBuilder(rows, cols, 2);
        const dense = Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
        const abs = Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
        const count = Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
        const sorted = [...ts].sort((a, c) => a[0] - c[0]);
        let r = 0;
        for (const [row, c, v] of sorted) {
          while (r < row) {
            b.endRow();
            r++;
          }
          b.add(c, v);
          dense[row]![c]! += v;
          abs[row]![c]! += Math.abs(v);
          count[row]![c]!++;
        }
        while (r < rows) {
          b.endRow();
          r++;
        }
        const m = b.finish();
        expectWellFormed(m);
        const got = toDense(m);
        for (let i = 0; i < rows; i++) {
          for (let c = 0; c < cols; c++) {
            const t = count[i]![c]!;
            expect(Math.abs(got[i]![c]! - dense[i]![c]!)).toBeLessThanOrEqual(2 * Math.max(t - 1, 0) * eps * abs[i]![c]!);
          }
        }
        // a column is stored iff it was added at least once
        for (let i = 0; i < rows; i++) {
          const stored = Array.from(m.colIdx.subarray(m.rowPtr[i]!, m.rowPtr[i + 1]!));
          expect(stored).toEqual(count[i]!.flatMap((t, c) => (t > 0 ? [c] : [])));
        }
      }),
      { seed: SEED, numRuns: 200 },
    );
  });
});

describe('csrTranspose', () => {
  it('entry (i, j) of Aᵀ is entry (j, i) of A; rectangular, with empty rows and columns', () => {
    for (const [rows, cols] of [[1, 1], [5, 3], [3, 8], [12, 12]] as const) {
      const a = randomCsr(rows, cols, 0.3);
      const t = csrTranspose(a);
      expect([t.rows, t.cols]).toEqual([cols, rows]);
      expectWellFormed(t);
      checkCsr(t);
      const da = toDense(a);
      const dt = toDense(t);
      for (let i = 0; i < cols; i++) for (let j = 0; j < rows; j++) expect(dt[i]![j]).toBe(da[j]![i]);
    }
  });

  it('(Aᵀ)ᵀ = A exactly: same structure, same values (no arithmetic on values)', () => {
    for (let trial = 0; trial < 5; trial++) {
      const a = randomCsr(7 + trial, 11 - trial, 0.4);
      const back = csrTranspose(csrTranspose(a));
      expect(back.rows).toBe(a.rows);
      expect(back.cols).toBe(a.cols);
      expect(Array.from(back.rowPtr)).toEqual(Array.from(a.rowPtr));
      expect(Array.from(back.colIdx)).toEqual(Array.from(a.colIdx));
      expect(Array.from(back.values)).toEqual(Array.from(a.values));
    }
  });

  it('an all-zero (no stored entries) and a 0 × 3 matrix', () => {
    const z: CsrMatrix = { rows: 3, cols: 2, rowPtr: new Int32Array(4), colIdx: new Int32Array(0), values: new Float64Array(0) };
    const t = csrTranspose(z);
    expect(Array.from(t.rowPtr)).toEqual([0, 0, 0]);
    const e: CsrMatrix = { rows: 0, cols: 3, rowPtr: new Int32Array(1), colIdx: new Int32Array(0), values: new Float64Array(0) };
    const te = csrTranspose(e);
    expect([te.rows, te.cols]).toEqual([3, 0]);
    expect(Array.from(te.rowPtr)).toEqual([0, 0, 0, 0]);
  });

  it('Aᵀ·y = (yᵀA)ᵀ: the transpose product against a dense loop, to round-off', () => {
    const a = randomCsr(9, 6, 0.5);
    const t = csrTranspose(a);
    const y = Float64Array.from({ length: 9 }, () => 2 * rng() - 1);
    const { y: got, scale } = csrApply(t, y);
    const d = toDense(a);
    for (let c = 0; c < 6; c++) {
      let s = 0;
      for (let r = 0; r < 9; r++) s += d[r]![c]! * y[r]!;
      // two sums of ≤ 9 products in different orders: 2·9·ε·Σ|a||y| (Higham 2002, §3.1)
      expect(Math.abs(got[c]! - s)).toBeLessThanOrEqual(18 * eps * scale[c]!);
    }
  });
});

describe('csrIsSymmetric', () => {
  const sym = (): CsrMatrix => {
    const d = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
    for (let i = 0; i < 6; i++) {
      for (let j = i; j < 6; j++) {
        if (rng() < 0.5) {
          const v = 2 * rng() - 1;
          d[i]![j] = v;
          d[j]![i] = v;
        }
      }
    }
    d[0]![0] = 4; // max |a| = 4 for the tolerance cases
    return csrFromDense(d);
  };

  it('exact: a symmetric matrix passes, a one-ulp change fails', () => {
    const a = sym();
    expect(csrIsSymmetric(a)).toBe(true);
    expect(csrIsSymmetric(a, 0)).toBe(true);
    const d = toDense(a);
    // perturb one off-diagonal entry (i < j) by one ulp of itself
    let done = false;
    for (let i = 0; i < 6 && !done; i++) {
      for (let j = i + 1; j < 6 && !done; j++) {
        if (d[i]![j] !== 0) {
          const v = d[i]![j]!;
          d[i]![j] = v + Math.abs(v) * eps;
          done = d[i]![j] !== v;
        }
      }
    }
    expect(done).toBe(true);
    expect(csrIsSymmetric(csrFromDense(d))).toBe(false);
  });

  it('with tolerance: |aᵢⱼ − aⱼᵢ| ≤ tol·max|a| passes, above it fails', () => {
    // a₀₁ = 1, a₁₀ = 1 + 2⁻²⁰, max |a| = 4: the gap 2⁻²⁰ is 2⁻²² of max|a| (all exact binary numbers)
    const a = csrFromDense([[4, 1, 0], [1 + 2 ** -20, 2, 0], [0, 0, 3]]);
    expect(csrIsSymmetric(a)).toBe(false);
    expect(csrIsSymmetric(a, 2 ** -22)).toBe(true);
    expect(csrIsSymmetric(a, 2 ** -23)).toBe(false);
  });

  it('a stored entry missing on the other side counts as 0: fine if zero, not if nonzero', () => {
    // explicit zero at (0, 2), nothing at (2, 0)
    const a: CsrMatrix = {
      rows: 3, cols: 3, rowPtr: Int32Array.of(0, 2, 3, 4), colIdx: Int32Array.of(0, 2, 1, 2), values: Float64Array.of(1, 0, 1, 1),
    };
    expect(csrIsSymmetric(a)).toBe(true);
    const b = { ...a, values: Float64Array.of(1, 1e-300, 1, 1) };
    expect(csrIsSymmetric(b)).toBe(false);
  });

  it('non-square → false; NaN entries → false whatever the tolerance', () => {
    expect(csrIsSymmetric(randomCsr(3, 4, 0.5))).toBe(false);
    const a = csrFromDense([[1, NaN], [NaN, 1]]);
    expect(csrIsSymmetric(a, 1)).toBe(false);
  });
});

describe('checkCsr (the structure check behind fromCsr)', () => {
  const good = (): CsrMatrix => ({
    rows: 3, cols: 4, rowPtr: Int32Array.of(0, 2, 2, 4), colIdx: Int32Array.of(0, 3, 1, 2), values: Float64Array.of(1, 2, 3, 4),
  });
  it('accepts a valid matrix, an empty one and a 0 × 0 one', () => {
    expect(() => checkCsr(good())).not.toThrow();
    expect(() => checkCsr({ rows: 2, cols: 2, rowPtr: new Int32Array(3), colIdx: new Int32Array(0), values: new Float64Array(0) })).not.toThrow();
    expect(() => checkCsr({ rows: 0, cols: 0, rowPtr: new Int32Array(1), colIdx: new Int32Array(0), values: new Float64Array(0) })).not.toThrow();
  });
  const bad: Array<[string, (m: CsrMatrix) => CsrMatrix]> = [
    ['negative rows', (m) => ({ ...m, rows: -1 })],
    ['fractional cols', (m) => ({ ...m, cols: 2.5 })],
    ['NaN rows', (m) => ({ ...m, rows: NaN })],
    ['rowPtr too short', (m) => ({ ...m, rowPtr: Int32Array.of(0, 2, 4) })],
    ['rowPtr not starting at 0', (m) => ({ ...m, rowPtr: Int32Array.of(1, 2, 2, 4) })],
    ['colIdx shorter than rowPtr says', (m) => ({ ...m, colIdx: Int32Array.of(0, 3, 1) })],
    ['values longer than rowPtr says', (m) => ({ ...m, values: Float64Array.of(1, 2, 3, 4, 5) })],
    ['rowPtr decreasing', (m) => ({ ...m, rowPtr: Int32Array.of(0, 3, 2, 4), colIdx: Int32Array.of(0, 1, 3, 2) })],
    ['column ≥ cols', (m) => ({ ...m, colIdx: Int32Array.of(0, 4, 1, 2) })],
    ['negative column', (m) => ({ ...m, colIdx: Int32Array.of(-1, 3, 1, 2) })],
    ['columns out of order', (m) => ({ ...m, colIdx: Int32Array.of(3, 0, 1, 2) })],
    ['repeated column', (m) => ({ ...m, colIdx: Int32Array.of(0, 3, 2, 2) })],
  ];
  for (const [name, make] of bad) {
    it(`${name} → SHAPE_MISMATCH (checkCsr and fromCsr)`, () => {
      expectCode(() => checkCsr(make(good())), 'SHAPE_MISMATCH');
      expectCode(() => fromCsr(make(good())), 'SHAPE_MISMATCH');
    });
  }
});

describe('fromCsr', () => {
  it('copies its input: later changes to the arrays do not reach the operator, and the input is untouched', () => {
    const m: CsrMatrix = {
      rows: 2, cols: 3, rowPtr: Int32Array.of(0, 2, 3), colIdx: Int32Array.of(0, 2, 1), values: Float64Array.of(1, -2, 0.5),
    };
    const before = [Array.from(m.rowPtr), Array.from(m.colIdx), Array.from(m.values)];
    const op = fromCsr(m);
    expect([Array.from(m.rowPtr), Array.from(m.colIdx), Array.from(m.values)]).toEqual(before);
    m.values[0] = 100;
    m.colIdx[1] = 1;
    m.rowPtr[1] = 1;
    expect(op.matrix.values).not.toBe(m.values);
    expect(Array.from(op.matrix.values)).toEqual([1, -2, 0.5]);
    expect(Array.from(op.matrix.colIdx)).toEqual([0, 2, 1]);
    // y = A·(1, 2, 4) = (1 − 8, 1): exact small binary numbers
    expect(Array.from(op.apply(Float64Array.of(1, 2, 4)))).toEqual([-7, 1]);
    expect([op.rows, op.cols, op.symmetric, [...op.shape]]).toEqual([2, 3, false, [2]]);
  });

  it('NaN or ±Infinity among the values → NON_FINITE', () => {
    for (const v of [NaN, Infinity, -Infinity]) {
      const m: CsrMatrix = { rows: 2, cols: 2, rowPtr: Int32Array.of(0, 1, 2), colIdx: Int32Array.of(0, 1), values: Float64Array.of(1, v) };
      expectCode(() => fromCsr(m), 'NON_FINITE');
    }
  });

  it('symmetric: true is checked exactly: a false claim → NOT_SYMMETRIC, a true one is kept', () => {
    const ns = csrFromDense([[2, 1], [1 + 2 ** -52, 2]]);
    expectCode(() => fromCsr(ns, { symmetric: true }), 'NOT_SYMMETRIC');
    expect(fromCsr(ns).symmetric).toBe(false);
    const s = csrFromDense([[2, 1], [1, 2]]);
    expect(fromCsr(s, { symmetric: true }).symmetric).toBe(true);
    // symmetric is a declaration, never inferred
    expect(fromCsr(s).symmetric).toBe(false);
    // a non-square matrix cannot be symmetric
    expectCode(() => fromCsr(randomCsr(2, 3, 1), { symmetric: true }), 'NOT_SYMMETRIC');
  });

  it('shape: kept when its product is the row count, else SHAPE_MISMATCH', () => {
    const m = randomCsr(6, 6, 0.5);
    expect([...fromCsr(m, { shape: [2, 3] }).shape]).toEqual([2, 3]);
    expectCode(() => fromCsr(m, { shape: [2, 2] }), 'SHAPE_MISMATCH');
  });
});
