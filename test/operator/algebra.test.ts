/**
 * Operator algebra (sum, scale, compose, transpose, identity, diagonal,
 * kronecker) and the shared `apply` of every operator.
 *
 * Each matrix-free apply is checked against the product of its own CSR form
 * on seeded random vectors, to the round-off bound of `expectApplyMatchesCsr`
 * (helpers.ts: two sums of the same products in different orders, Higham
 * 2002, §3.1), with the scale of the matrix-free path where it multiplies
 * factor by factor. Expected CSR forms are rebuilt densely from the
 * definitions. The Kronecker identity Δ₂ = D²ₓ ⊗ I + I ⊗ D²ᵧ is that of
 * Van Loan, C. F. (2000). The ubiquitous Kronecker product. J. Comput.
 * Appl. Math. 123, 85–100.
 */
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  type CsrMatrix, type Grid, type Operator, compose, csrIsSymmetric, derivative, diagonal, fromCsr, geometricAxis, grid,
  identity, kronecker, laplacian, scale, sum, tanhAxis, transpose,
} from '../../src/index.js';
import { SEED, csrApply, csrFromDense, eps, expectApplyMatchesCsr, expectCode, maxRowNnz, mulberry32, randomVector, toDense } from './helpers.js';

const rng = mulberry32(SEED + 20);

/** A random operator from a dense matrix with about `fill` of its entries nonzero. */
function randomOp(rows: number, cols: number, fill = 0.4, shape?: number[]): Operator {
  const ptr = [0];
  const ci: number[] = [];
  const v: number[] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      if (rng() < fill) {
        ci.push(c);
        v.push(2 * rng() - 1);
      }
    }
    ptr.push(ci.length);
  }
  const m: CsrMatrix = { rows, cols, rowPtr: Int32Array.from(ptr), colIdx: Int32Array.from(ci), values: Float64Array.from(v) };
  return fromCsr(m, shape === undefined ? {} : { shape });
}

/** A random symmetric n × n operator. */
function randomSym(n: number): Operator {
  const d = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      if (rng() < 0.4 || i === j) {
        const v = 2 * rng() - 1;
        d[i]![j] = v;
        d[j]![i] = v;
      }
    }
  }
  return fromDense(d, true);
}

function fromDense(d: number[][], symmetric = false): Operator {
  return fromCsr(csrFromDense(d), { symmetric });
}

/** |A|·|x|. */
function absApply(op: Operator, x: Float64Array): Float64Array {
  const a = op.matrix;
  const y = new Float64Array(a.rows);
  for (let r = 0; r < a.rows; r++) {
    for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) y[r]! += Math.abs(a.values[q]!) * Math.abs(x[a.colIdx[q]!]!);
  }
  return y;
}

/** Dense entries equal within k·ε·|want| each (k stated by the caller). */
function expectDenseClose(got: number[][], want: number[][], k: number): void {
  expect(got.length).toBe(want.length);
  for (let i = 0; i < want.length; i++) {
    for (let j = 0; j < want[i]!.length; j++) {
      expect(Math.abs(got[i]![j]! - want[i]![j]!), `(${i}, ${j})`).toBeLessThanOrEqual(k * eps * Math.abs(want[i]![j]!));
    }
  }
}

describe('CSR forms follow the definitions', () => {
  it('sum: entries add (one rounding per entry and term)', () => {
    const a = randomOp(7, 5);
    const b = randomOp(7, 5);
    const c = randomOp(7, 5);
    const da = toDense(a.matrix);
    const db = toDense(b.matrix);
    const dc = toDense(c.matrix);
    const s = sum(a, b, c);
    // (a + b) + c: two roundings, each ≤ ε of the partial sum ≤ |a| + |b| + |c|
    const got = toDense(s.matrix);
    for (let i = 0; i < 7; i++) {
      for (let j = 0; j < 5; j++) {
        const w = da[i]![j]! + db[i]![j]! + dc[i]![j]!;
        const mag = Math.abs(da[i]![j]!) + Math.abs(db[i]![j]!) + Math.abs(dc[i]![j]!);
        expect(Math.abs(got[i]![j]! - w)).toBeLessThanOrEqual(4 * eps * mag);
      }
    }
    expect(sum(a)).toBe(a);
  });

  it('scale: s·aᵢⱼ, one rounding each; the factor must be finite', () => {
    const a = randomOp(4, 6);
    const s = scale(a, -2.7);
    expectDenseClose(toDense(s.matrix), toDense(a.matrix).map((r) => r.map((v) => -2.7 * v)), 0);
    for (const v of [NaN, Infinity]) expectCode(() => scale(a, v), 'NON_FINITE');
  });

  it('compose: (A·B)ᵢⱼ = Σₖ aᵢₖ bₖⱼ, to round-off of the k-sum', () => {
    const a = randomOp(5, 8);
    const b = randomOp(8, 6);
    const p = compose(a, b);
    expect([p.rows, p.cols]).toEqual([5, 6]);
    const da = toDense(a.matrix);
    const db = toDense(b.matrix);
    const got = toDense(p.matrix);
    for (let i = 0; i < 5; i++) {
      for (let j = 0; j < 6; j++) {
        let w = 0;
        let mag = 0;
        for (let k = 0; k < 8; k++) {
          w += da[i]![k]! * db[k]![j]!;
          mag += Math.abs(da[i]![k]! * db[k]![j]!);
        }
        // two sums of 8 products in different orders: 2·8·ε·Σ|a||b| (Higham 2002, §3.1)
        expect(Math.abs(got[i]![j]! - w)).toBeLessThanOrEqual(16 * eps * mag);
      }
    }
  });

  it('transpose: (Aᵀ)ᵢⱼ = aⱼᵢ exactly; a symmetric operator is its own transpose', () => {
    const a = randomOp(4, 7);
    const t = transpose(a);
    expect([t.rows, t.cols]).toEqual([7, 4]);
    const da = toDense(a.matrix);
    expect(toDense(t.matrix)).toEqual(da[0]!.map((_, j) => da.map((r) => r[j]!)));
    const s = randomSym(5);
    expect(transpose(s)).toBe(s);
  });

  it('identity and diagonal: the diagonal, copied', () => {
    expect(toDense(identity(3).matrix)).toEqual([[1, 0, 0], [0, 1, 0], [0, 0, 1]]);
    const d = Float64Array.of(2, -3, 0.5);
    const op = diagonal(d);
    d[0] = 99;
    expect(toDense(op.matrix)).toEqual([[2, 0, 0], [0, -3, 0], [0, 0, 0.5]]);
    expect(Array.from(op.apply(Float64Array.of(1, 2, 4)))).toEqual([2, -6, 2]);
    expect([...identity(6, [2, 3]).shape]).toEqual([2, 3]);
  });

  it('kronecker: entry (i·p + k, j·q + l) is aᵢⱼ·bₖₗ for B of size p × q (Van Loan 2000)', () => {
    const a = randomOp(3, 4, 0.6);
    const b = randomOp(2, 5, 0.6);
    const k = kronecker(a, b);
    expect([k.rows, k.cols, [...k.shape]]).toEqual([6, 20, [3, 2]]);
    const da = toDense(a.matrix);
    const db = toDense(b.matrix);
    const want = Array.from({ length: 6 }, (_, r) => Array.from({ length: 20 }, (_, c) => {
      const [i, kk] = [Math.floor(r / 2), r % 2];
      const [j, l] = [Math.floor(c / 5), c % 5];
      return da[i]![j]! * db[kk]![l]!;
    }));
    // one product per entry, the same product in both: exact
    expectDenseClose(toDense(k.matrix), want, 0);
  });
});

describe('matrix-free apply equals the CSR product to round-off (seeded random vectors)', () => {
  it('fromCsr, identity, diagonal, scale, transpose', () => {
    expectApplyMatchesCsr(randomOp(9, 7), rng, { trials: 3 });
    expectApplyMatchesCsr(identity(5), rng);
    expectApplyMatchesCsr(diagonal(randomVector(rng, 8)), rng);
    expectApplyMatchesCsr(scale(randomOp(6, 6), 3.3), rng, { trials: 3 });
    expectApplyMatchesCsr(transpose(randomOp(6, 9)), rng, { trials: 3 });
  });

  it('sum: the path adds Ax + Bx + Cx, so its scale is |A||x| + |B||x| + |C||x|', () => {
    const a = randomOp(8, 8);
    const b = randomOp(8, 8);
    const c = randomSym(8);
    const s = sum(a, b, c);
    // terms: all products of the three rows, plus the two additions of the partial results
    const terms = maxRowNnz(a.matrix) + maxRowNnz(b.matrix) + maxRowNnz(c.matrix) + 2;
    expectApplyMatchesCsr(s, rng, { trials: 3, terms, scale: (x) => {
      const ya = absApply(a, x);
      const yb = absApply(b, x);
      const yc = absApply(c, x);
      return ya.map((v, i) => v + yb[i]! + yc[i]!);
    } });
  });

  it('compose: the path is A(Bx), scale |A|(|B||x|), terms nnz(A)·nnz(B) + both row lengths', () => {
    const a = randomOp(6, 9);
    const b = randomOp(9, 5);
    const p = compose(a, b);
    const terms = maxRowNnz(a.matrix) * maxRowNnz(b.matrix) + maxRowNnz(a.matrix) + maxRowNnz(b.matrix);
    expectApplyMatchesCsr(p, rng, { trials: 3, terms, scale: (x) => absApply(a, absApply(b, x)) });
  });

  it('kronecker: the path is B along the fast index then A along the slow one; |A⊗B||x| = |A|⊗|B| |x|', () => {
    const a = randomOp(4, 3, 0.7);
    const b = randomOp(5, 6, 0.5);
    const k = kronecker(a, b);
    const terms = maxRowNnz(a.matrix) * maxRowNnz(b.matrix) + maxRowNnz(a.matrix) + maxRowNnz(b.matrix);
    expectApplyMatchesCsr(k, rng, { trials: 3, terms });
    // nested: (A ⊗ B) ⊗ C and compositions of sums
    const c = randomOp(3, 3, 0.7);
    const kk = kronecker(k, c);
    expectApplyMatchesCsr(kk, rng, { trials: 2, terms: terms * maxRowNnz(c.matrix) + terms + maxRowNnz(c.matrix) });
  });
});

describe('kronecker products of 1-D second derivatives give the grid Laplacian, entry by entry (Van Loan 2000)', () => {
  const d2 = (spec: Parameters<typeof grid>[0]['x'], p: number): Operator =>
    derivative(grid({ x: spec }), { axis: 'x', derivative: 2, accuracy: p });
  const cases: Array<[string, Grid, number]> = [
    ['uniform 2-D, accuracy 2', grid({ x: { from: 0, to: 1, cells: 6 }, y: { from: -1, to: 2, cells: 9 } }), 2],
    ['uniform 2-D, accuracy 4', grid({ x: { from: 0, to: 1, cells: 7 }, y: { from: -1, to: 2, cells: 9 } }), 4],
    ['uniform 2-D, accuracy 6', grid({ x: { from: 0, to: 1, cells: 9 }, y: { from: -1, to: 2, cells: 8 } }), 6],
    ['stretched 2-D, accuracy 2', grid({
      x: tanhAxis({ from: 0, to: 1, cells: 8, beta: 2, cluster: 'both' }),
      y: geometricAxis({ from: 0, to: 3, cells: 7, ratio: 1.2, cluster: 'from' }),
    }), 2],
    ['periodic × uniform, accuracy 4', grid({ x: { from: 0, to: 1, cells: 8, periodic: true }, y: { from: 0, to: 1, cells: 7 } }), 4],
  ];
  for (const [name, g, p] of cases) {
    it(name, () => {
      const [nx, ny] = g.shape as readonly number[];
      const dx = d2(g.axes[0]!.uniform ? { from: g.x.from, to: g.x.to, cells: g.x.cells, periodic: g.x.periodic } : { nodes: g.x.coordinates }, p);
      const dy = d2(g.axes[1]!.uniform ? { from: g.y!.from, to: g.y!.to, cells: g.y!.cells, periodic: g.y!.periodic } : { nodes: g.y!.coordinates }, p);
      const k = sum(kronecker(dx, identity(ny!)), kronecker(identity(nx!), dy));
      expect([...k.shape]).toEqual([nx, ny]);
      // same axes → the same stencil weights bit for bit; each entry is then one IEEE sum of the
      // same two numbers (or one number), and addition is commutative: equal exactly
      expect(toDense(k.matrix)).toEqual(toDense(laplacian(g, { accuracy: p }).matrix));
      expectApplyMatchesCsr(k, rng, { trials: 1, terms: 4 * maxRowNnz(k.matrix) });
    });
  }
  it('3-D: Dx ⊗ I ⊗ I + I ⊗ Dy ⊗ I + I ⊗ I ⊗ Dz', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 3 }, y: { from: 0, to: 2, cells: 4 }, z: { from: -1, to: 1, cells: 5 } });
    const [nx, ny, nz] = g.shape as readonly number[];
    const dx = d2({ from: 0, to: 1, cells: 3 }, 2);
    const dy = d2({ from: 0, to: 2, cells: 4 }, 2);
    const dz = d2({ from: -1, to: 1, cells: 5 }, 2);
    const k = sum(
      kronecker(kronecker(dx, identity(ny!)), identity(nz!)),
      kronecker(kronecker(identity(nx!), dy), identity(nz!)),
      kronecker(identity(nx!), kronecker(identity(ny!), dz)),
    );
    expect([...k.shape]).toEqual([nx, ny, nz]);
    // three terms: (a + b) + c here against the builder's a + b + c in axis order: the same order, exact
    expect(toDense(k.matrix)).toEqual(toDense(laplacian(g).matrix));
  });
});

describe('sizes and symmetric flags', () => {
  it('size mismatches → SHAPE_MISMATCH', () => {
    expectCode(() => sum(identity(3), identity(4)), 'SHAPE_MISMATCH');
    expectCode(() => sum(randomOp(3, 4), randomOp(4, 3)), 'SHAPE_MISMATCH');
    expectCode(() => compose(randomOp(3, 4), randomOp(3, 4)), 'SHAPE_MISMATCH');
    expectCode(() => diagonal(Float64Array.of(1, 2, 3), [2, 2]), 'SHAPE_MISMATCH');
    expectCode(() => identity(6, [4]), 'SHAPE_MISMATCH');
    const op = randomOp(4, 3);
    expectCode(() => op.apply(new Float64Array(4)), 'SHAPE_MISMATCH');
    expectCode(() => op.apply(new Float64Array(3), new Float64Array(3)), 'SHAPE_MISMATCH');
    expectCode(() => op.apply(ndarray(new Float64Array(6), [2, 3]), ndarray(new Float64Array(6), [2, 3])), 'SHAPE_MISMATCH');
  });

  it('identity of size 0, fractional or NaN → TOO_FEW_NODES; a non-finite diagonal → NON_FINITE', () => {
    for (const n of [0, -1, 2.5, NaN]) expectCode(() => identity(n), 'TOO_FEW_NODES');
    expectCode(() => diagonal([]), 'TOO_FEW_NODES');
    expectCode(() => diagonal([1, NaN]), 'NON_FINITE');
  });

  it('flags as documented, and every flagged operator exactly symmetric in CSR', () => {
    const s1 = randomSym(6);
    const s2 = randomSym(6);
    const n = randomOp(6, 6);
    const flagged: Array<[string, Operator, boolean]> = [
      ['identity', identity(6), true],
      ['diagonal', diagonal(randomVector(rng, 6)), true],
      ['fromCsr symmetric', s1, true],
      ['sum of symmetric', sum(s1, s2, identity(6)), true],
      ['sum with a nonsymmetric term', sum(s1, n), false],
      ['scale of symmetric', scale(s1, -4.1), true],
      ['scale of nonsymmetric', scale(n, 2), false],
      ['compose, even of symmetric factors', compose(identity(6), identity(6)), false],
      ['transpose of nonsymmetric', transpose(n), false],
      ['transpose of symmetric', transpose(s1), true],
      ['kronecker of symmetric', kronecker(s1, s2), true],
      ['kronecker with a nonsymmetric factor', kronecker(s1, n), false],
    ];
    for (const [name, op, want] of flagged) {
      expect(op.symmetric, name).toBe(want);
      if (want) expect(csrIsSymmetric(op.matrix, 0), name).toBe(true);
    }
  });
});

describe('apply: kinds of input and output', () => {
  // a 3 × 4 grid-shaped operator, so that ndarray inputs and outputs have a 2-D shape
  const op = randomOp(12, 12, 0.4, [3, 4]);
  const x = randomVector(rng, 12);
  const want = op.apply(x.slice());

  it('agrees with the CSR product on a plain Float64Array', () => {
    const { y, scale: s } = csrApply(op.matrix, x);
    // same operator, the CSR kernel itself: two sums of ≤ 12 products (Higham 2002, §3.1)
    want.forEach((v, r) => expect(Math.abs(v - y[r]!)).toBeLessThanOrEqual(24 * eps * s[r]!));
  });

  it('Float64Array in → new Float64Array out; the input untouched; out written and returned', () => {
    const u = x.slice();
    const y = op.apply(u);
    expect(y).toBeInstanceOf(Float64Array);
    expect(y).not.toBe(u);
    expect(Array.from(u)).toEqual(Array.from(x));
    const out = new Float64Array(12).fill(7);
    expect(op.apply(u, out)).toBe(out);
    // the same kernel on the same numbers: identical
    expect(Array.from(out)).toEqual(Array.from(want));
  });

  it('contiguous ndarray in → ndarray of the operator shape out', () => {
    const u = ndarray(x.slice(), [3, 4]);
    const y = op.apply(u);
    expect(y.shape).toEqual([3, 4]);
    expect(Array.from(y.data)).toEqual(Array.from(want));
  });

  it('strided, offset and negative-stride views are read in the order of their indices (x slowest)', () => {
    // logical element (i, j) = x[i·4 + j], laid out three ways in bigger buffers
    const views = [
      // every other element of a 3 × 8 block
      (() => {
        const d = new Float64Array(24).fill(NaN);
        const v = ndarray(d, [3, 8]).step(1, 2);
        return v;
      })(),
      // x reversed, with an offset
      (() => {
        const d = new Float64Array(20).fill(NaN);
        return ndarray(d, [3, 4], [4, 1], 5).step(-1, 1);
      })(),
      // the transpose of a 4 × 3 array (column-major for [3, 4]), both strides negative
      (() => {
        const d = new Float64Array(12);
        return ndarray(d, [4, 3]).transpose(1, 0).step(-1, -1);
      })(),
    ];
    for (const v of views) {
      for (let i = 0; i < 3; i++) for (let j = 0; j < 4; j++) v.set(i, j, x[i * 4 + j]!);
      const copy = Float64Array.from(v.data);
      const y = op.apply(v);
      // the values in the gaps (NaN) are never read, so no NON_FINITE; the view is untouched
      expect(Array.from(v.data)).toEqual(Array.from(copy));
      expect(y.shape).toEqual([3, 4]);
      for (let i = 0; i < 3; i++) for (let j = 0; j < 4; j++) expect(y.get(i, j)).toBe(want[i * 4 + j]);
    }
  });

  it('writes into a strided or offset ndarray out in index order, leaving the rest of its buffer alone', () => {
    const u = ndarray(x.slice(), [3, 4]);
    const d = new Float64Array(30).fill(-5);
    const out = ndarray(d, [3, 4], [-8, 2], 17); // rows backwards, every other column
    expect(op.apply(u, out)).toBe(out);
    const touched = new Set<number>();
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 4; j++) {
        expect(out.get(i, j)).toBe(want[i * 4 + j]);
        touched.add(17 - 8 * i + 2 * j);
      }
    }
    d.forEach((v, p) => {
      if (!touched.has(p)) expect(v).toBe(-5);
    });
    // contiguous with an offset: written in place
    const d2 = new Float64Array(15).fill(-5);
    const out2 = ndarray(d2, [3, 4], [4, 1], 2);
    op.apply(u, out2);
    expect(Array.from(d2.subarray(2, 14))).toEqual(Array.from(want));
    expect([d2[0], d2[1], d2[14]]).toEqual([-5, -5, -5]);
  });

  it('in place (out = u) gives the same result as into a fresh array', () => {
    const u = x.slice();
    op.apply(u, u);
    expect(Array.from(u)).toEqual(Array.from(want));
    const v = ndarray(x.slice(), [3, 4]);
    op.apply(v, v);
    expect(Array.from(v.data)).toEqual(Array.from(want));
    // also through a composite operator whose kernel writes its output early
    const k = kronecker(randomOp(3, 3, 0.7), randomOp(4, 4, 0.7));
    const w = k.apply(x.slice());
    const z = x.slice();
    k.apply(z, z);
    expect(Array.from(z)).toEqual(Array.from(w));
  });

  it('NaN or ±Infinity in the input → NON_FINITE (Float64Array and views)', () => {
    for (const bad of [NaN, Infinity, -Infinity]) {
      const u = x.slice();
      u[5] = bad;
      expectCode(() => op.apply(u), 'NON_FINITE');
      const v = ndarray(new Float64Array(24), [3, 8]).step(1, 2);
      v.set(2, 3, bad);
      expectCode(() => op.apply(v), 'NON_FINITE');
    }
    // composite operators refuse it too, through the same apply
    const u = x.slice();
    u[0] = NaN;
    expectCode(() => sum(op, op).apply(u), 'NON_FINITE');
    expectCode(() => compose(op, op).apply(u), 'NON_FINITE');
  });
});
