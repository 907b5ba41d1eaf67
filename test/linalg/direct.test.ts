import { describe, expect, it } from 'vitest';
import {
  discretize, factorBanded, factorTridiagonal, fromCsr, identity, laplacian, grid, solveBanded, solveTridiagonal,
} from '../../src/index.js';
import { mulberry32 } from '../support/prng.js';
import { codeOf } from '../support/errors.js';

const eps = Number.EPSILON;

describe('Thomas algorithm', () => {
  it('solves the 1-D Dirichlet Poisson matrix exactly on a quadratic (discrete solution = exact)', () => {
    // −u'' = 2 on (0, 1), u(0) = u(1) = 0: u = x(1 − x); the 3-point scheme is exact on
    // quadratics (a fact of common practice: its truncation error involves u⁗ only)
    const n = 99;
    const h = 1 / (n + 1);
    const sub = new Float64Array(n).fill(-1);
    const diag = new Float64Array(n).fill(2);
    const sup = new Float64Array(n).fill(-1);
    const rhs = new Float64Array(n).fill(2 * h * h);
    const f = factorTridiagonal(sub, diag, sup);
    const x = solveTridiagonal(f, rhs);
    for (let i = 0; i < n; i++) {
      const t = (i + 1) * h;
      // cond ≈ 4n²/π² ≈ 4e3 for this matrix: 8·ε·cond·max|u| bounds the error
      expect(Math.abs(x[i]! - t * (1 - t))).toBeLessThanOrEqual(8 * eps * 4e3 * 0.25);
    }
  });
  it('reuses its factors, solves in place, and matches banded LU on a random diagonally dominant matrix', () => {
    const rnd = mulberry32(11);
    const n = 50;
    const sub = Float64Array.from({ length: n }, () => rnd() - 0.5);
    const sup = Float64Array.from({ length: n }, () => rnd() - 0.5);
    const diag = Float64Array.from({ length: n }, () => 2 + rnd());
    const rhs = Float64Array.from({ length: n }, () => rnd());
    const f = factorTridiagonal(sub, diag, sup);
    const a = solveTridiagonal(f, rhs);
    const inPlace = Float64Array.from(rhs);
    expect(solveTridiagonal(f, inPlace, inPlace)).toBe(inPlace);
    expect(Array.from(inPlace)).toEqual(Array.from(a));
    const rowPtr = new Int32Array(n + 1);
    const col: number[] = [];
    const val: number[] = [];
    for (let i = 0; i < n; i++) {
      if (i > 0) { col.push(i - 1); val.push(sub[i]!); }
      col.push(i); val.push(diag[i]!);
      if (i < n - 1) { col.push(i + 1); val.push(sup[i]!); }
      rowPtr[i + 1] = col.length;
    }
    const b = solveBanded(factorBanded({ rows: n, cols: n, rowPtr, colIdx: Int32Array.from(col), values: Float64Array.from(val) }), rhs);
    // diagonally dominant (|d| ≥ 2 > |a| + |c|): cond ≤ 3/1 = 3; 32·ε bounds both solves' difference
    for (let i = 0; i < n; i++) expect(Math.abs(a[i]! - b[i]!)).toBeLessThanOrEqual(32 * eps * Math.max(1, Math.abs(a[i]!)));
  });
  it('refuses a vanishing pivot instead of returning Infinity', () => {
    // [[1, 1], [1, 1]] is singular: β₁ = 1 − 1·1 = 0
    const e = codeOf(() => factorTridiagonal(Float64Array.of(0, 1), Float64Array.of(1, 1), Float64Array.of(1, 0)));
    expect(e).toBe('SINGULAR_MATRIX');
    expect(codeOf(() => factorTridiagonal(Float64Array.of(0, 1), Float64Array.of(0, 1), Float64Array.of(1, 0)))).toBe('SINGULAR_MATRIX');
  });
  it('refuses mismatched lengths and NaN', () => {
    expect(codeOf(() => factorTridiagonal(new Float64Array(2), new Float64Array(3), new Float64Array(3)))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => factorTridiagonal(new Float64Array(2), Float64Array.of(1, NaN), new Float64Array(2)))).toBe('NON_FINITE');
    // the unused corners sub[0] and sup[n−1] may hold anything; a used entry is named by its own index
    expect(() => factorTridiagonal(Float64Array.of(NaN, 1, 1), Float64Array.of(4, 4, 4), Float64Array.of(1, 1, Infinity))).not.toThrow();
    expect(() => factorTridiagonal(Float64Array.of(0, 1, NaN), Float64Array.of(4, 4, 4), new Float64Array(3))).toThrow(/sub\[2\]/);
    expect(() => factorTridiagonal(new Float64Array(3), Float64Array.of(4, 4, 4), Float64Array.of(0, Infinity, 0))).toThrow(/sup\[1\]/);
    const f = factorTridiagonal(new Float64Array(2), Float64Array.of(1, 1), new Float64Array(2));
    expect(codeOf(() => solveTridiagonal(f, Float64Array.of(1, NaN)))).toBe('NON_FINITE');
    expect(codeOf(() => solveTridiagonal(f, Float64Array.of(1)))).toBe('SHAPE_MISMATCH');
  });
});

describe('banded LU with partial pivoting (LAPACK xGBTF2 scheme)', () => {
  it('needs pivoting on a matrix with a zero leading entry and still solves it', () => {
    // [[0, 1], [1, 0]] x = [2, 3] → x = [3, 2]: no factorisation without a row swap exists
    const a = fromCsr({ rows: 2, cols: 2, rowPtr: Int32Array.of(0, 1, 2), colIdx: Int32Array.of(1, 0), values: Float64Array.of(1, 1) });
    expect(Array.from(solveBanded(factorBanded(a), Float64Array.of(2, 3)))).toEqual([3, 2]);
  });
  it('solves random banded systems to backward-stable accuracy', () => {
    const rnd = mulberry32(5);
    for (const [n, kl, ku] of [[30, 2, 3], [40, 5, 1], [25, 0, 4], [20, 3, 0]] as const) {
      const rowPtr = new Int32Array(n + 1);
      const col: number[] = [];
      const val: number[] = [];
      for (let i = 0; i < n; i++) {
        for (let j = Math.max(0, i - kl); j <= Math.min(n - 1, i + ku); j++) { col.push(j); val.push(rnd() - 0.5); }
        rowPtr[i + 1] = col.length;
      }
      const m = { rows: n, cols: n, rowPtr, colIdx: Int32Array.from(col), values: Float64Array.from(val) };
      const xTrue = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const b = fromCsr(m).apply(xTrue);
      const x = solveBanded(factorBanded(m), b);
      // residual check (backward error): ‖b − Ax‖ ≤ c·n·ε·‖A‖‖x‖ with a generous c = 64
      const r = fromCsr(m).apply(x);
      let res = 0;
      for (let i = 0; i < n; i++) res = Math.max(res, Math.abs(r[i]! - b[i]!));
      const normA = kl + ku + 1;
      expect(res).toBeLessThanOrEqual(64 * n * eps * normA * Math.max(...x.map(Math.abs)));
    }
  });
  it('solves a 2-D steady system with identity rows (the shape of every steady system)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 6 }, y: { from: 0, to: 1, cells: 6 } });
    const a = discretize(g, { boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] }).system().matrix;
    const x = Float64Array.from({ length: g.size }, (_, i) => Math.sin(i));
    const y = solveBanded(factorBanded(a), a.apply(x));
    // cond ≈ 0.4·n² ≈ 15 (eigenvalues of the 5-point matrix, h² scaled); 64·ε·cond bounds it
    for (let i = 0; i < g.size; i++) expect(Math.abs(y[i]! - x[i]!)).toBeLessThanOrEqual(64 * eps * 15);
  });
  it('the raw Laplacian with closures is singular (linear functions are in its null space) and says so', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4 } });
    expect(codeOf(() => factorBanded(laplacian(g)))).toBe('SINGULAR_MATRIX');
  });
  it('reports a singular matrix with the row, and refuses oversized bands', () => {
    const z = fromCsr({ rows: 2, cols: 2, rowPtr: Int32Array.of(0, 1, 1), colIdx: Int32Array.of(0), values: Float64Array.of(1) });
    expect(codeOf(() => factorBanded(z))).toBe('SINGULAR_MATRIX');
    expect(codeOf(() => factorBanded(identity(4), { maxBytes: 8 }))).toBe('INVALID_OPTION');
    const lu = factorBanded(identity(3));
    expect(codeOf(() => solveBanded(lu, Float64Array.of(1, 2)))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => solveBanded(lu, Float64Array.of(1, NaN, 2)))).toBe('NON_FINITE');
  });
});
