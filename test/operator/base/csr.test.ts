import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../support/prng.js';
import { assembleLaplace5, laplace5Nnz } from '../../../src/operator/base/assemble-laplace.js';
import { csrMatVec } from '../../../src/operator/base/csr.js';
import { laplace5 } from '../../../src/operator/base/laplace2d.js';

const EPS = Number.EPSILON;
const SENTINEL = 98.5;

const prng = mulberry32;

interface Csr {
  readonly n: number;
  readonly cols: number;
  readonly rowPtr: Int32Array;
  readonly colIdx: Int32Array;
  readonly values: Float64Array;
}

/**
 * A random CSR matrix whose row lengths are drawn from `lengths`, runs of
 * equal lengths included (the straight-line paths) and mixed pairs (the loop).
 */
function randomCsr(n: number, cols: number, lengths: readonly number[], seed: number): Csr {
  const rand = prng(seed);
  const rowPtr = new Int32Array(n + 1);
  const ci: number[] = [];
  const vs: number[] = [];
  let len = lengths[0];
  for (let i = 0; i < n; i++) {
    if (rand() < 0.4) len = lengths[Math.floor(rand() * lengths.length)];
    const picked = new Set<number>();
    while (picked.size < Math.min(len, cols)) picked.add(Math.floor(rand() * cols));
    for (const c of [...picked].sort((a, b) => a - b)) {
      ci.push(c);
      vs.push(rand() * 4 - 2);
    }
    rowPtr[i + 1] = ci.length;
  }
  return { n, cols, rowPtr, colIdx: Int32Array.from(ci), values: Float64Array.from(vs) };
}

/** y[i] by a plain loop from 0, in storage order (the kernel's documented order). */
function reference(a: Csr, x: (c: number) => number): number[] {
  const y: number[] = [];
  for (let i = 0; i < a.n; i++) {
    let s = 0;
    for (let k = a.rowPtr[i]; k < a.rowPtr[i + 1]; k++) s += a.values[k] * x(a.colIdx[k]);
    y.push(s);
  }
  return y;
}

/** A vector of `count` elements stored at data[o + k·s]. */
interface Strided {
  readonly s: number;
  readonly o: number;
  readonly length: number;
}

const vectorLayouts: Record<string, (count: number) => Strided> = {
  'stride 1': (c) => ({ s: 1, o: 0, length: c }),
  'stride 2': (c) => ({ s: 2, o: 0, length: 2 * c }),
  'offset 3': (c) => ({ s: 1, o: 3, length: c + 5 }),
  'negative stride': (c) => ({ s: -1, o: c - 1, length: c }),
  'stride -3, offset 2': (c) => ({ s: -3, o: 2 + 3 * (c - 1), length: 3 * c + 2 }),
};

describe('csrMatVec', () => {
  const lengths = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 11];
  for (const [xName, xl] of Object.entries(vectorLayouts)) {
    for (const [yName, yl] of Object.entries(vectorLayouts)) {
      it(`matches a plain loop bit for bit: x ${xName}, y ${yName}`, () => {
        for (const [n, seed] of [[1, 1], [2, 2], [7, 3], [40, 4], [41, 5]]) {
          const a = randomCsr(n, 23, lengths, seed);
          const lx = xl(a.cols);
          const ly = yl(n);
          const rand = prng(seed + 100);
          const xv = Array.from({ length: a.cols }, () => rand() * 2 - 1);
          const x = new Float64Array(lx.length).fill(SENTINEL);
          for (let c = 0; c < a.cols; c++) x[lx.o + c * lx.s] = xv[c];
          const y = new Float64Array(ly.length).fill(SENTINEL);
          expect(csrMatVec(n, a.rowPtr, a.colIdx, a.values, x, lx.s, lx.o, y, ly.s, ly.o)).toBe(y);
          const want = reference(a, (c) => xv[c]);
          const written = new Set<number>();
          for (let i = 0; i < n; i++) {
            written.add(ly.o + i * ly.s);
            expect(y[ly.o + i * ly.s]).toBe(want[i]);
          }
          for (let k = 0; k < y.length; k++) if (!written.has(k)) expect(y[k]).toBe(SENTINEL);
        }
      });
    }
  }

  it('covers each straight-line row length in pairs (3, 5, 7, 9) and rows without entries', () => {
    for (const len of [0, 3, 5, 7, 9]) {
      for (const n of [1, 2, 5, 6]) {
        const a = randomCsr(n, 12, [len], 40 + len);
        const x = Float64Array.from({ length: 12 }, (_, c) => (c + 1) / 7);
        const y = new Float64Array(n).fill(SENTINEL);
        csrMatVec(n, a.rowPtr, a.colIdx, a.values, x, 1, 0, y, 1, 0);
        expect(Array.from(y)).toEqual(reference(a, (c) => x[c]));
      }
    }
  });

  it('writes nothing for n = 0 and returns y', () => {
    const y = new Float64Array(3).fill(SENTINEL);
    const r = csrMatVec(0, new Int32Array(1), new Int32Array(0), new Float64Array(0), new Float64Array(2), 1, 0, y, 1, 0);
    expect(r).toBe(y);
    expect(Array.from(y)).toEqual([SENTINEL, SENTINEL, SENTINEL]);
  });

  it('turns a NaN in x into NaN in exactly the rows that reach its column', () => {
    const a = randomCsr(30, 10, [3, 5, 2], 9);
    for (const [s, o] of [[1, 0], [2, 1]]) {
      const x = new Float64Array(10 * s + o).fill(1);
      x[o + 4 * s] = NaN;
      const y = new Float64Array(30);
      csrMatVec(30, a.rowPtr, a.colIdx, a.values, x, s, o, y, 1, 0);
      for (let i = 0; i < 30; i++) {
        const reaches = Array.from(a.colIdx.subarray(a.rowPtr[i], a.rowPtr[i + 1])).includes(4);
        expect(Number.isNaN(y[i])).toBe(reaches);
      }
    }
  });
});

describe('assembleLaplace5', () => {
  it('counts 5·nx·ny − 2nx − 2ny entries, and 0 for an empty grid', () => {
    expect(laplace5Nnz(3, 4)).toBe(60 - 6 - 8);
    expect(laplace5Nnz(1, 5)).toBe(13); // tridiagonal: 3·5 − 2
    expect(laplace5Nnz(1, 1)).toBe(1);
    expect(laplace5Nnz(0, 7)).toBe(0);
    expect(laplace5Nnz(2048, 2048)).toBe(20963328); // scipy's nnz for W1
  });

  it('builds the five-point matrix: entries, sorted columns, symmetry, row starts', () => {
    for (const [nx, ny] of [[1, 1], [1, 5], [5, 1], [2, 2], [3, 4], [4, 3], [6, 7]]) {
      const nnz = laplace5Nnz(nx, ny);
      const rowPtr = new Int32Array(nx * ny + 1).fill(-1);
      const colIdx = new Int32Array(nnz).fill(-1);
      const values = new Float64Array(nnz).fill(NaN);
      const [cx, cy, c0] = [2, 3, -10];
      expect(assembleLaplace5(nx, ny, cx, cy, c0, rowPtr, colIdx, values)).toBe(nnz);
      expect(rowPtr[0]).toBe(0);
      expect(rowPtr[nx * ny]).toBe(nnz);
      const dense = new Map<string, number>();
      for (let r = 0; r < nx * ny; r++) {
        expect(rowPtr[r + 1]).toBeGreaterThan(rowPtr[r]);
        for (let k = rowPtr[r]; k < rowPtr[r + 1]; k++) {
          if (k > rowPtr[r]) expect(colIdx[k]).toBeGreaterThan(colIdx[k - 1]);
          dense.set(`${r},${colIdx[k]}`, values[k]);
        }
      }
      for (let i = 0; i < nx; i++) {
        for (let j = 0; j < ny; j++) {
          const r = i * ny + j;
          const want = new Map<number, number>([[r, c0]]);
          if (i > 0) want.set(r - ny, cx);
          if (i < nx - 1) want.set(r + ny, cx);
          if (j > 0) want.set(r - 1, cy);
          if (j < ny - 1) want.set(r + 1, cy);
          expect(rowPtr[r + 1] - rowPtr[r]).toBe(want.size);
          for (const [c, v] of want) {
            expect(dense.get(`${r},${c}`)).toBe(v);
            expect(dense.get(`${c},${r}`)).toBe(v);
          }
        }
      }
    }
  });

  it('writes nothing but rowPtr[0] for an empty grid', () => {
    const rowPtr = new Int32Array(1).fill(7);
    expect(assembleLaplace5(0, 5, 1, 1, -4, rowPtr, new Int32Array(0), new Float64Array(0))).toBe(0);
    expect(rowPtr[0]).toBe(0);
  });

  it('agrees with laplace5 on a zero-halo array to round-off', () => {
    // Both form Σ of five products; the CSR row adds them left to right
    // (each term ≤ 5 roundings), laplace5 pairs neighbours first (≤ 4), so
    // |csr − apply| ≤ (γ₅ + γ₄)·Sᵢ ≤ 10ε·Sᵢ with Sᵢ = Σ|weight·u| of row i. k = 10.
    const rand = prng(17);
    for (const [nx, ny] of [[1, 1], [1, 6], [6, 1], [5, 8], [9, 4], [16, 15]]) {
      const [cx, cy] = [1 / 0.07 ** 2, 1 / 0.13 ** 2];
      const c0 = -2 * (cx + cy);
      const nnz = laplace5Nnz(nx, ny);
      const rowPtr = new Int32Array(nx * ny + 1);
      const colIdx = new Int32Array(nnz);
      const values = new Float64Array(nnz);
      assembleLaplace5(nx, ny, cx, cy, c0, rowPtr, colIdx, values);
      const x = Float64Array.from({ length: nx * ny }, () => rand() * 2 - 1);
      // padded (nx + 2) × (ny + 2), zero halo; the interior vector x inside
      const m = ny + 2;
      const u = new Float64Array((nx + 2) * m);
      for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) u[(i + 1) * m + j + 1] = x[i * ny + j];
      const out = new Float64Array(nx * ny);
      laplace5(nx + 2, ny + 2, cx, cy, c0, u, m, 1, 0, out, ny, 1, -(ny + 1));
      const y = new Float64Array(nx * ny);
      csrMatVec(nx * ny, rowPtr, colIdx, values, x, 1, 0, y, 1, 0);
      for (let i = 0; i < nx; i++) {
        for (let j = 0; j < ny; j++) {
          const k = (i + 1) * m + j + 1;
          const S = cx * (Math.abs(u[k - m]) + Math.abs(u[k + m])) + cy * (Math.abs(u[k - 1]) + Math.abs(u[k + 1]))
            + Math.abs(c0 * u[k]);
          expect(Math.abs(y[i * ny + j] - out[i * ny + j])).toBeLessThanOrEqual(10 * EPS * S);
        }
      }
    }
  });
});
