import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../support/prng.js';
import { laplace5 } from '../../../src/operator/base/laplace2d.js';

const EPS = Number.EPSILON;
const SENTINEL = 1234.5;

const prng = mulberry32;

/** Where node (i, j) of an nx × ny array lives: data[o + i·sx + j·sy]. */
interface Layout {
  readonly sx: number;
  readonly sy: number;
  readonly o: number;
  readonly length: number;
}

const layouts: Record<string, (nx: number, ny: number) => Layout> = {
  'stride 1 (x slowest)': (nx, ny) => ({ sx: ny, sy: 1, o: 0, length: nx * ny }),
  'stride 2': (nx, ny) => ({ sx: 2 * ny, sy: 2, o: 0, length: 2 * nx * ny }),
  'offset 5': (nx, ny) => ({ sx: ny, sy: 1, o: 5, length: nx * ny + 9 }),
  'negative y stride': (nx, ny) => ({ sx: ny, sy: -1, o: ny - 1, length: nx * ny }),
  'negative x stride, offset': (nx, ny) => ({ sx: -ny, sy: 1, o: 3 + (nx - 1) * ny, length: nx * ny + 3 }),
  'x fastest': (nx, ny) => ({ sx: 1, sy: nx, o: 0, length: nx * ny }),
  'x fastest, both negative': (nx, ny) => ({ sx: -1, sy: -nx, o: nx * ny - 1, length: nx * ny }),
};

function fill(nx: number, ny: number, l: Layout, f: (i: number, j: number) => number): Float64Array {
  const a = new Float64Array(l.length).fill(SENTINEL);
  for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) a[l.o + i * l.sx + j * l.sy] = f(i, j);
  return a;
}

/** The formula of laplace5, in its association, node by node. */
function reference(
  nx: number, ny: number, cx: number, cy: number, c0: number, g: (i: number, j: number) => number,
): (i: number, j: number) => number {
  return (i, j) => cx * (g(i - 1, j) + g(i + 1, j)) + cy * (g(i, j - 1) + g(i, j + 1)) + c0 * g(i, j);
}

function apply(
  nx: number, ny: number, cx: number, cy: number, c0: number,
  u: Float64Array, lu: Layout, out: Float64Array, lo: Layout,
): Float64Array {
  return laplace5(nx, ny, cx, cy, c0, u, lu.sx, lu.sy, lu.o, out, lo.sx, lo.sy, lo.o);
}

const sizes: ReadonlyArray<readonly [number, number]> = [
  [3, 3], [4, 5], [5, 4], [6, 7], [7, 6], [8, 9], [9, 8], [10, 11], [13, 10],
];

describe('laplace5', () => {
  for (const [name, make] of Object.entries(layouts)) {
    it(`matches the formula bit for bit and leaves the rest untouched: ${name}`, () => {
      const rand = prng(11);
      for (const [nx, ny] of sizes) {
        const lu = make(nx, ny);
        const lo = layouts['offset 5'](nx, ny);
        const vals = Array.from({ length: nx * ny }, () => rand() * 2 - 1);
        const g = (i: number, j: number) => vals[i * ny + j];
        const u = fill(nx, ny, lu, g);
        const out = new Float64Array(lo.length).fill(SENTINEL);
        const [cx, cy, c0] = [1.7, 0.3, -4.1];
        const r = apply(nx, ny, cx, cy, c0, u, lu, out, lo);
        expect(r).toBe(out);
        const want = reference(nx, ny, cx, cy, c0, g);
        const written = new Set<number>();
        for (let i = 1; i < nx - 1; i++) {
          for (let j = 1; j < ny - 1; j++) {
            const k = lo.o + i * lo.sx + j * lo.sy;
            written.add(k);
            expect(out[k]).toBe(want(i, j));
          }
        }
        for (let k = 0; k < out.length; k++) if (!written.has(k)) expect(out[k]).toBe(SENTINEL);
      }
    });
  }

  it('gives the same bits whichever layout u and out have', () => {
    const rand = prng(5);
    const [nx, ny] = [11, 9];
    const vals = Array.from({ length: nx * ny }, () => rand());
    const g = (i: number, j: number) => vals[i * ny + j];
    const results: number[][] = [];
    for (const make of Object.values(layouts)) {
      const lu = make(nx, ny);
      const lo = make(nx, ny);
      const out = new Float64Array(lo.length);
      apply(nx, ny, 3.1, 0.7, -7.6, fill(nx, ny, lu, g), lu, out, lo);
      const row: number[] = [];
      for (let i = 1; i < nx - 1; i++) for (let j = 1; j < ny - 1; j++) row.push(out[lo.o + i * lo.sx + j * lo.sy]);
      results.push(row);
    }
    for (const r of results) expect(r).toEqual(results[0]);
  });

  it('writes nothing for n = 0 or fewer than 3 nodes along an axis, and returns out', () => {
    for (const [nx, ny] of [[0, 0], [0, 5], [5, 0], [1, 7], [2, 7], [7, 2], [7, 1], [2, 2]]) {
      const l = layouts['stride 1 (x slowest)'](nx, ny);
      const u = new Float64Array(Math.max(l.length, 1)).fill(1);
      const out = new Float64Array(Math.max(l.length, 1)).fill(SENTINEL);
      expect(laplace5(nx, ny, 1, 1, -4, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0)).toBe(out);
      expect(Array.from(out).every((v) => v === SENTINEL)).toBe(true);
    }
  });

  it('turns a NaN into NaN at exactly the nodes whose stencil reaches it', () => {
    const [nx, ny] = [9, 10];
    const l = layouts['stride 1 (x slowest)'](nx, ny);
    const u = fill(nx, ny, l, (i, j) => i + 0.5 * j);
    const [pi, pj] = [4, 6];
    u[pi * ny + pj] = NaN;
    const out = new Float64Array(l.length);
    laplace5(nx, ny, 1, 1, -4, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0);
    for (let i = 1; i < nx - 1; i++) {
      for (let j = 1; j < ny - 1; j++) {
        const reaches = Math.abs(i - pi) + Math.abs(j - pj) <= 1;
        expect(Number.isNaN(out[i * ny + j])).toBe(reaches);
      }
    }
  });

  it('is exact on polynomials of degree ≤ 3 in x and in y (dyadic spacing: exact arithmetic)', () => {
    // h = 1/8, nodes i·h, integer coefficients: every sample and every
    // partial sum is k/2¹⁸ with |k| < 2⁵³, and the weights 64 and −256 are
    // powers of two, so no operation rounds. Expected error: 0 (k = 0).
    const rand = prng(3);
    const h = 1 / 8;
    const [nx, ny] = [13, 12];
    for (let trial = 0; trial < 5; trial++) {
      const c = Array.from({ length: 16 }, () => Math.floor(rand() * 7) - 3);
      const p = (x: number, y: number) => {
        let s = 0;
        for (let a = 0; a < 4; a++) for (let b = 0; b < 4; b++) s += c[4 * a + b] * x ** a * y ** b;
        return s;
      };
      const lap = (x: number, y: number) => {
        let s = 0;
        for (let a = 0; a < 4; a++) {
          for (let b = 0; b < 4; b++) {
            if (a >= 2) s += c[4 * a + b] * a * (a - 1) * x ** (a - 2) * y ** b;
            if (b >= 2) s += c[4 * a + b] * b * (b - 1) * x ** a * y ** (b - 2);
          }
        }
        return s;
      };
      const l = layouts['stride 2'](nx, ny);
      const u = fill(nx, ny, l, (i, j) => p(i * h, j * h));
      const out = new Float64Array(l.length);
      const w = 1 / (h * h);
      laplace5(nx, ny, w, w, -4 * w, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0);
      for (let i = 1; i < nx - 1; i++) {
        for (let j = 1; j < ny - 1; j++) expect(out[i * l.sx + j * l.sy]).toBe(lap(i * h, j * h));
      }
    }
  });

  it('is exact on cubics to round-off with non-dyadic, unequal spacings', () => {
    // Δ(x³ + x y² − 2x²y³ + y³) = 6x + 2x − 4y³ − 12x²y + 6y, dx = 0.1, dy = 0.07.
    // Bound k·ε·W·P with W = 2/dx² + 2/dy² + |c0| = 4(1/dx² + 1/dy²) (the sum
    // of |weights|) and P = max Σ|terms| of u: samples err by ≤ 32εP
    // (evaluation, ≤ 7 roundings a term, 4 terms; nodes i·dx rounded, ≤ 3εP
    // per axis since |x ∂p/∂x| ≤ 3Σ|terms|); the stencil adds ≤ 4εWP
    // (4 sums); 4 more spare for the reference Δu. k = 40.
    const [dx, dy] = [0.1, 0.07];
    const [nx, ny] = [12, 15];
    const p = (x: number, y: number) => x ** 3 + x * y * y - 2 * x * x * y ** 3 + y ** 3;
    const mag = (x: number, y: number) => Math.abs(x) ** 3 + Math.abs(x) * y * y + 2 * x * x * Math.abs(y) ** 3 + Math.abs(y) ** 3;
    const lap = (x: number, y: number) => 6 * x + 2 * x - 4 * y ** 3 - 12 * x * x * y + 6 * y;
    const l = layouts['negative x stride, offset'](nx, ny);
    const x0 = -0.4;
    const y0 = -0.3;
    const u = fill(nx, ny, l, (i, j) => p(x0 + i * dx, y0 + j * dy));
    const out = new Float64Array(l.length);
    const [cx, cy] = [1 / (dx * dx), 1 / (dy * dy)];
    laplace5(nx, ny, cx, cy, -2 * (cx + cy), u, l.sx, l.sy, l.o, out, l.sx, l.sy, l.o);
    let P = 0;
    for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) P = Math.max(P, mag(x0 + i * dx, y0 + j * dy));
    const tol = 40 * EPS * 4 * (cx + cy) * P;
    for (let i = 1; i < nx - 1; i++) {
      for (let j = 1; j < ny - 1; j++) {
        const got = out[l.o + i * l.sx + j * l.sy];
        expect(Math.abs(got - lap(x0 + i * dx, y0 + j * dy))).toBeLessThanOrEqual(tol);
      }
    }
  });

  it('converges at order 2 on a smooth function (observed order within 0.1 of 2)', () => {
    // u = eˣ sin 2y on [0, 1]²: Δu = −3u, leading error (h²/12)(1 + 16)u ≠ 0.
    const errs: number[] = [];
    for (const cells of [8, 16, 32, 64]) {
      const h = 1 / cells;
      const n = cells + 1;
      const l = layouts['stride 1 (x slowest)'](n, n);
      const f = (i: number, j: number) => Math.exp(i * h) * Math.sin(2 * j * h);
      const u = fill(n, n, l, f);
      const out = new Float64Array(l.length);
      const w = 1 / (h * h);
      laplace5(n, n, w, w, -4 * w, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0);
      let e = 0;
      // the same points [1/4, 3/4]² on every grid: a max over a region that grows
      // with n would add a spurious O(h) factor (the max of eˣ moves)
      for (let i = cells / 4; i <= (3 * cells) / 4; i++) {
        for (let j = cells / 4; j <= (3 * cells) / 4; j++) e = Math.max(e, Math.abs(out[i * n + j] + 3 * f(i, j)));
      }
      errs.push(e);
    }
    for (let k = 1; k < errs.length; k++) {
      expect(Math.abs(Math.log2(errs[k - 1] / errs[k]) - 2)).toBeLessThan(0.1);
    }
  });
});
