import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  QuadrilleError, applyNodeWeights, applyStencil, centralStencil, forwardStencil, nodeWeights, stencil,
} from '../../src/index.js';
import { applyRows, applyWeights } from '../../src/stencil/base/apply.js';

const eps = Number.EPSILON;
const code = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    if (e instanceof QuadrilleError) return e.code;
    throw e;
  }
  return 'no error';
};

describe('applyWeights kernel (strided, no checks)', () => {
  const w = Float64Array.of(1, -2, 1);
  const o = Int32Array.of(-1, 0, 1);
  const sq = (n: number) => Float64Array.from({ length: n }, (_, i) => i * i);

  it('stride 1: second difference of i² is 2 inside, boundary untouched', () => {
    const out = new Float64Array(6).fill(-7);
    const r = applyWeights(1, 5, w, o, 1, sq(6), 1, 0, out, 1, 0);
    expect(r).toBe(out);
    expect(Array.from(out)).toEqual([-7, 2, 2, 2, 2, -7]);
  });
  it('stride 2 and offset on both sides', () => {
    const u = new Float64Array(13);
    for (let i = 0; i < 6; i++) u[1 + 2 * i] = i * i;
    const out = new Float64Array(20);
    applyWeights(1, 5, w, o, 0.5, u, 2, 1, out, 3, 2);
    for (let i = 1; i < 5; i++) expect(out[2 + 3 * i]).toBe(1);
    expect(out[2]).toBe(0);
  });
  it('negative stride walks the array backwards', () => {
    const u = sq(6).reverse(); // u[5 − i] = i²
    const out = new Float64Array(6);
    applyWeights(1, 5, w, o, 1, u, -1, 5, out, -1, 5);
    expect(Array.from(out)).toEqual([0, 2, 2, 2, 2, 0]);
  });
  it('empty range writes nothing', () => {
    const out = new Float64Array(2).fill(3);
    applyWeights(1, 1, w, o, 1, new Float64Array(2), 1, 0, out, 1, 0);
    expect(Array.from(out)).toEqual([3, 3]);
  });
  it('NaN in gives NaN out (the wrapper is the one that refuses)', () => {
    const u = sq(5);
    u[2] = NaN;
    const out = new Float64Array(5);
    applyWeights(1, 4, w, o, 1, u, 1, 0, out, 1, 0);
    expect(Number.isNaN(out[1])).toBe(true);
    expect(Number.isNaN(out[3])).toBe(true);
  });
  it('applyRows uses one row of weights per node', () => {
    const rows = Float64Array.of(1, -2, 1, 2, -4, 2);
    const out = new Float64Array(4);
    expect(applyRows(1, 3, rows, o, sq(4), 1, 0, out, 1, 0)).toBe(out);
    expect(Array.from(out)).toEqual([0, 2, 4, 0]);
  });
});

describe('applyStencil (uniform axis)', () => {
  it('is exact on polynomials of degree < N, up to round-off', () => {
    const st = centralStencil(2, 4); // exact on degree ≤ 5
    const h = 0.1;
    const x = Float64Array.from({ length: 21 }, (_, i) => i * h);
    const u = x.map((t) => t ** 5 - 2 * t ** 3 + t);
    const out = applyStencil(st, u, h);
    for (let i = 2; i < 19; i++) {
      const want = 20 * x[i]! ** 3 - 12 * x[i]!;
      // Σ|wⱼ uⱼ|/h² ≈ 8|u|/h² of terms cancel to the result: 16·ε of that bounds the sum's rounding
      const scale = (8 * Math.max(...u.map(Math.abs))) / (h * h);
      expect(Math.abs(out[i]! - want)).toBeLessThanOrEqual(16 * eps * scale);
    }
    expect(out[0]).toBe(0);
    expect(out[20]).toBe(0);
  });

  it('accepts 1-D ndarray views with stride and offset, and writes into out', () => {
    const data = new Float64Array(20);
    for (let i = 0; i < 6; i++) data[18 - 3 * i] = i * i; // reversed, stride −3
    const u = ndarray(data, [6], [-3], 18);
    const out = ndarray(new Float64Array(6), [6]);
    const r = applyStencil(centralStencil(2, 2), u, 1, out);
    expect(r).toBe(out);
    expect(Array.from(out.data)).toEqual([0, 2, 2, 2, 2, 0]);
    const fresh = applyStencil(centralStencil(2, 2), u, 1);
    expect(fresh.shape).toEqual([6]);
    expect(Array.from(fresh.data)).toEqual([0, 2, 2, 2, 2, 0]);
  });

  it('arrays shorter than the stencil give an untouched out', () => {
    const out = applyStencil(centralStencil(2, 4), Float64Array.of(1, 2, 3), 1);
    expect(Array.from(out)).toEqual([0, 0, 0]);
    expect(applyStencil(centralStencil(1, 2), new Float64Array(0), 1).length).toBe(0);
  });

  it('one-sided stencils write the nodes where they fit', () => {
    const out = applyStencil(forwardStencil(1, 2), Float64Array.of(0, 1, 4, 9, 16), 1);
    // −3/2 u₀ + 2u₁ − 1/2 u₂ is exact on quadratics: d/dx i² = 2i
    expect(Array.from(out)).toEqual([0, 2, 4, 0, 0]);
  });

  it('refuses NaN samples, bad spacing and mismatched out, with codes', () => {
    const st = centralStencil(2, 2);
    expect(code(() => applyStencil(st, Float64Array.of(0, NaN, 1), 1))).toBe('NON_FINITE');
    expect(code(() => applyStencil(st, Float64Array.of(0, 1, 2), 0))).toBe('INVALID_SPACING');
    expect(code(() => applyStencil(st, Float64Array.of(0, 1, 2), -1))).toBe('INVALID_SPACING');
    expect(code(() => applyStencil(st, Float64Array.of(0, 1, 2), 1, new Float64Array(2)))).toBe('SHAPE_MISMATCH');
    expect(code(() => applyStencil(st, ndarray(new Float64Array(4), [2, 2]), 1))).toBe('SHAPE_MISMATCH');
  });

  it('leaves its input untouched', () => {
    const u = Float64Array.of(1, 4, 9, 16);
    const copy = Float64Array.from(u);
    applyStencil(centralStencil(2, 2), u, 0.5);
    expect(u).toEqual(copy);
  });
});

describe('nodeWeights / applyNodeWeights (stretched axis)', () => {
  it('is exact on quadratics for 3-point stencils on any node spacing', () => {
    const x = Float64Array.of(0, 0.1, 0.25, 0.45, 0.7, 1.0);
    const u = x.map((t) => 3 * t * t - t + 2);
    const d1 = applyNodeWeights(nodeWeights(centralStencil(1, 2), x), u);
    const d2 = applyNodeWeights(nodeWeights(centralStencil(2, 2), x), u);
    for (let i = 1; i < 5; i++) {
      // weights ~ 1/h (h ≥ 0.1) on values ≤ 4: 64·ε·Σ|wu| bounds the 3-term sum and the weights' rounding
      expect(Math.abs(d1[i]! - (6 * x[i]! - 1))).toBeLessThanOrEqual(64 * eps * (3 * 4) / 0.1);
      expect(Math.abs(d2[i]! - 6)).toBeLessThanOrEqual(64 * eps * (3 * 4) / 0.01);
    }
    expect(d1[0]).toBe(0);
  });

  it('central stencil keeps second order on a smoothly stretched axis', () => {
    const errs: number[] = [];
    for (const n of [20, 40, 80, 160]) {
      // x = ξ² + ξ on ξ uniform in [0, 1]: smooth stretching, spacing ratio 1 + O(h)
      const x = Float64Array.from({ length: n + 1 }, (_, i) => (i / n) ** 2 + i / n);
      const u = x.map(Math.sin);
      const d2 = applyNodeWeights(nodeWeights(centralStencil(2, 2), x), u);
      let e = 0;
      for (let i = 1; i < n; i++) e = Math.max(e, Math.abs(d2[i]! + Math.sin(x[i]!)));
      errs.push(e);
    }
    for (let k = 1; k < errs.length; k++) expect(Math.abs(Math.log2(errs[k - 1]! / errs[k]!) - 2)).toBeLessThan(0.1);
  });

  it('refuses non-increasing or non-finite nodes and mismatched samples', () => {
    const st = centralStencil(2, 2);
    expect(code(() => nodeWeights(st, [0, 1, 1, 2]))).toBe('NON_INCREASING_NODES');
    expect(code(() => nodeWeights(st, [0, 2, 1]))).toBe('NON_INCREASING_NODES');
    expect(code(() => nodeWeights(st, [0, Infinity, 3]))).toBe('NON_FINITE');
    expect(code(() => nodeWeights(stencil(2, [-2, -1, 0, 1, 2]), [0, 1, 2]))).toBe('TOO_FEW_NODES');
    const nw = nodeWeights(st, [0, 1, 2, 3]);
    expect(code(() => applyNodeWeights(nw, new Float64Array(3)))).toBe('SHAPE_MISMATCH');
    expect(code(() => applyNodeWeights(nw, Float64Array.of(0, 1, NaN, 0)))).toBe('NON_FINITE');
  });
});
