import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../support/prng.js';
import { cross9 } from '../../../src/operator/base/cross9.js';

const EPS = Number.EPSILON;
const SENTINEL = -777.25;

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
  'offset 4': (nx, ny) => ({ sx: ny, sy: 1, o: 4, length: nx * ny + 6 }),
  'negative y stride': (nx, ny) => ({ sx: ny, sy: -1, o: ny - 1, length: nx * ny }),
  'negative x stride, offset': (nx, ny) => ({ sx: -ny, sy: 1, o: 2 + (nx - 1) * ny, length: nx * ny + 2 }),
  'x fastest': (nx, ny) => ({ sx: 1, sy: nx, o: 0, length: nx * ny }),
  'x fastest, both negative': (nx, ny) => ({ sx: -1, sy: -nx, o: nx * ny - 1, length: nx * ny }),
};

function fill(nx: number, ny: number, l: Layout, f: (i: number, j: number) => number): Float64Array {
  const a = new Float64Array(l.length).fill(SENTINEL);
  for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) a[l.o + i * l.sx + j * l.sy] = f(i, j);
  return a;
}

interface Weights {
  readonly x1: number;
  readonly x2: number;
  readonly y1: number;
  readonly y2: number;
  readonly c: number;
}

/** The formula of cross9, in its association, node by node. */
function reference(w: Weights, g: (i: number, j: number) => number): (i: number, j: number) => number {
  return (i, j) => (w.x1 * (g(i - 1, j) + g(i + 1, j)) + w.x2 * (g(i - 2, j) + g(i + 2, j)))
    + (w.y1 * (g(i, j - 1) + g(i, j + 1)) + w.y2 * (g(i, j - 2) + g(i, j + 2))) + w.c * g(i, j);
}

function apply(nx: number, ny: number, w: Weights, u: Float64Array, lu: Layout, out: Float64Array, lo: Layout): Float64Array {
  return cross9(nx, ny, w.x1, w.x2, w.y1, w.y2, w.c, u, lu.sx, lu.sy, lu.o, out, lo.sx, lo.sy, lo.o);
}

/** The fourth-order Δ with spacings dx, dy. */
function fourthOrder(dx: number, dy: number): Weights {
  const [ax, ay] = [1 / (dx * dx), 1 / (dy * dy)];
  return { x1: (4 / 3) * ax, x2: (-1 / 12) * ax, y1: (4 / 3) * ay, y2: (-1 / 12) * ay, c: (-5 / 2) * (ax + ay) };
}

const sizes: ReadonlyArray<readonly [number, number]> = [
  [5, 5], [6, 7], [7, 6], [8, 9], [9, 8], [10, 12], [13, 11],
];

describe('cross9', () => {
  for (const [name, make] of Object.entries(layouts)) {
    it(`matches the formula bit for bit and leaves the rest untouched: ${name}`, () => {
      const rand = prng(21);
      const w: Weights = { x1: 1.3, x2: -0.11, y1: 0.9, y2: -0.07, c: -4.2 };
      for (const [nx, ny] of sizes) {
        const lu = make(nx, ny);
        const lo = layouts['offset 4'](nx, ny);
        const vals = Array.from({ length: nx * ny }, () => rand() * 2 - 1);
        const g = (i: number, j: number) => vals[i * ny + j];
        const u = fill(nx, ny, lu, g);
        const out = new Float64Array(lo.length).fill(SENTINEL);
        expect(apply(nx, ny, w, u, lu, out, lo)).toBe(out);
        const want = reference(w, g);
        const written = new Set<number>();
        for (let i = 2; i < nx - 2; i++) {
          for (let j = 2; j < ny - 2; j++) {
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
    const rand = prng(8);
    const [nx, ny] = [11, 12];
    const vals = Array.from({ length: nx * ny }, () => rand());
    const g = (i: number, j: number) => vals[i * ny + j];
    const w = fourthOrder(0.1, 0.13);
    const results: number[][] = [];
    for (const make of Object.values(layouts)) {
      const lu = make(nx, ny);
      const lo = make(nx, ny);
      const out = new Float64Array(lo.length);
      apply(nx, ny, w, fill(nx, ny, lu, g), lu, out, lo);
      const row: number[] = [];
      for (let i = 2; i < nx - 2; i++) for (let j = 2; j < ny - 2; j++) row.push(out[lo.o + i * lo.sx + j * lo.sy]);
      results.push(row);
    }
    for (const r of results) expect(r).toEqual(results[0]);
  });

  it('writes nothing for n = 0 or fewer than 5 nodes along an axis, and returns out', () => {
    for (const [nx, ny] of [[0, 0], [0, 9], [9, 0], [1, 9], [4, 9], [9, 4], [3, 3], [4, 4]]) {
      const l = layouts['stride 1 (x slowest)'](nx, ny);
      const u = new Float64Array(Math.max(l.length, 1)).fill(1);
      const out = new Float64Array(Math.max(l.length, 1)).fill(SENTINEL);
      expect(cross9(nx, ny, 1, 1, 1, 1, -4, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0)).toBe(out);
      expect(Array.from(out).every((v) => v === SENTINEL)).toBe(true);
    }
  });

  it('turns a NaN into NaN at exactly the nodes whose stencil reaches it', () => {
    const [nx, ny] = [11, 12];
    const l = layouts['stride 1 (x slowest)'](nx, ny);
    const u = fill(nx, ny, l, (i, j) => i - 0.25 * j);
    const [pi, pj] = [5, 6];
    u[pi * ny + pj] = NaN;
    const out = new Float64Array(l.length);
    const w = fourthOrder(1, 1);
    cross9(nx, ny, w.x1, w.x2, w.y1, w.y2, w.c, u, l.sx, l.sy, 0, out, l.sx, l.sy, 0);
    for (let i = 2; i < nx - 2; i++) {
      for (let j = 2; j < ny - 2; j++) {
        const reaches = (i === pi && Math.abs(j - pj) <= 2) || (j === pj && Math.abs(i - pi) <= 2);
        expect(Number.isNaN(out[i * ny + j])).toBe(reaches);
      }
    }
  });

  it('is exact on polynomials of degree ≤ 5 in x and in y (integer weights, dyadic spacing: exact arithmetic)', () => {
    // 12h² times the fourth-order weights is (−1, 16, −30, 16, −1): integers.
    // With h = 1/8, nodes i·h and integer coefficients every sample and every
    // partial sum is k/2³⁰ with |k| < 2⁵³, so nothing rounds and the result
    // is 12h²·Δp exactly. Expected error: 0 (k = 0).
    const rand = prng(4);
    const h = 1 / 8;
    const [nx, ny] = [12, 11];
    const w: Weights = { x1: 16, x2: -1, y1: 16, y2: -1, c: -60 };
    for (let trial = 0; trial < 5; trial++) {
      const c = Array.from({ length: 36 }, () => Math.floor(rand() * 7) - 3);
      const p = (x: number, y: number) => {
        let s = 0;
        for (let a = 0; a < 6; a++) for (let b = 0; b < 6; b++) s += c[6 * a + b] * x ** a * y ** b;
        return s;
      };
      const lap = (x: number, y: number) => {
        let s = 0;
        for (let a = 0; a < 6; a++) {
          for (let b = 0; b < 6; b++) {
            if (a >= 2) s += c[6 * a + b] * a * (a - 1) * x ** (a - 2) * y ** b;
            if (b >= 2) s += c[6 * a + b] * b * (b - 1) * x ** a * y ** (b - 2);
          }
        }
        return s;
      };
      const l = layouts['stride 2'](nx, ny);
      const u = fill(nx, ny, l, (i, j) => p(i * h, j * h));
      const out = new Float64Array(l.length);
      apply(nx, ny, w, u, l, out, l);
      for (let i = 2; i < nx - 2; i++) {
        for (let j = 2; j < ny - 2; j++) expect(out[i * l.sx + j * l.sy]).toBe(12 * h * h * lap(i * h, j * h));
      }
    }
  });

  it('is exact on quintics to round-off with the fourth-order weights and unequal spacings', () => {
    // Δ(x⁵ − 3x²y³ + x y⁵ + y⁴) = 20x³ − 6y³ + 20x y³ − 18x²y + 12y².
    // Bound k·ε·W·P, W = Σ|weights| = (8/3 + 1/6)(1/dx² + 1/dy²) + |c0|,
    // P = max Σ|terms| of u: samples err by ≤ 48εP (evaluation, 4 terms of
    // ≤ 9 roundings; node rounding ≤ 5εP per axis, |x ∂p/∂x| ≤ 5Σ|terms|);
    // the stencil's own sums add ≤ 6εWP, 6 more spare for the reference. k = 60.
    const [dx, dy] = [0.09, 0.11];
    const [nx, ny] = [13, 12];
    const p = (x: number, y: number) => x ** 5 - 3 * x * x * y ** 3 + x * y ** 5 + y ** 4;
    const mag = (x: number, y: number) => {
      const [ax, ay] = [Math.abs(x), Math.abs(y)];
      return ax ** 5 + 3 * ax * ax * ay ** 3 + ax * ay ** 5 + ay ** 4;
    };
    const lap = (x: number, y: number) => 20 * x ** 3 - 6 * y ** 3 + 20 * x * y ** 3 - 18 * x * x * y + 12 * y * y;
    const l = layouts['x fastest, both negative'](nx, ny);
    const [x0, y0] = [-0.5, -0.6];
    const u = fill(nx, ny, l, (i, j) => p(x0 + i * dx, y0 + j * dy));
    const out = new Float64Array(l.length);
    const w = fourthOrder(dx, dy);
    apply(nx, ny, w, u, l, out, l);
    let P = 0;
    for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) P = Math.max(P, mag(x0 + i * dx, y0 + j * dy));
    const W = 2 * (Math.abs(w.x1) + Math.abs(w.x2) + Math.abs(w.y1) + Math.abs(w.y2)) + Math.abs(w.c);
    const tol = 60 * EPS * W * P;
    for (let i = 2; i < nx - 2; i++) {
      for (let j = 2; j < ny - 2; j++) {
        const got = out[l.o + i * l.sx + j * l.sy];
        expect(Math.abs(got - lap(x0 + i * dx, y0 + j * dy))).toBeLessThanOrEqual(tol);
      }
    }
  });

  it('converges at order 4 on a smooth function (observed order within 0.1 of 4)', () => {
    // u = eˣ sin 2y on [0, 1]²: Δu = −3u, leading error −(h⁴/90)(1 + (−64))u ≠ 0;
    // at h = 1/64 it is ≈ 1e-7, far above round-off (≈ ε·W·|u| ≈ 1e-11).
    const errs: number[] = [];
    for (const cells of [8, 16, 32, 64]) {
      const h = 1 / cells;
      const n = cells + 1;
      const l = layouts['stride 1 (x slowest)'](n, n);
      const f = (i: number, j: number) => Math.exp(i * h) * Math.sin(2 * j * h);
      const u = fill(n, n, l, f);
      const out = new Float64Array(l.length);
      const w = fourthOrder(h, h);
      apply(n, n, w, u, l, out, l);
      let e = 0;
      // the same points [1/4, 3/4]² on every grid: a max over a region that grows
      // with n would add a spurious O(h) factor (the max of eˣ moves)
      for (let i = cells / 4; i <= (3 * cells) / 4; i++) {
        for (let j = cells / 4; j <= (3 * cells) / 4; j++) e = Math.max(e, Math.abs(out[i * n + j] + 3 * f(i, j)));
      }
      errs.push(e);
    }
    for (let k = 1; k < errs.length; k++) {
      expect(Math.abs(Math.log2(errs[k - 1] / errs[k]) - 4)).toBeLessThan(0.1);
    }
  });
});
