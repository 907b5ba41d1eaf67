/**
 * Trapezoidal integration: the weights, exactness for piecewise-linear
 * (multilinear) data to round-off, second-order convergence for smooth
 * functions, and on periodic axes exactness for trigonometric polynomials of
 * degree below the node count with geometric convergence for analytic
 * periodic functions — the known spectral accuracy of the periodic
 * trapezoidal rule (Trefethen, L. N. & Weideman, J. A. C. (2014). The
 * exponentially convergent trapezoidal rule. SIAM Rev. 56(3), 385–458).
 *
 * Round-off model used for the tolerances (u = ε/2, one rounding): each
 * weight carries ≤ 3u (two subtractions for the widths, one addition; the
 * halving is exact), each product w·f one more, and the nested sums of
 * integrate() ≤ (nx + ny + nz)·u relative to Σ|w·f|, plus two products per
 * extra axis. So |integrate − exact trapezoid| ≤ (nx + ny + nz + 12)·u·Σ|w·f|;
 * tests use ε (= 2u) in place of u, a factor two of room.
 */
import fc from 'fast-check';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  type Grid, type GridSpec, grid, integrate, sampleField, tanhAxis, trapezoidWeights, zeros,
} from '../../src/grid/index.js';
import { SEED, eps, expectCode } from './helpers.js';

/** Σ wᵢ·|fᵢ| in 1-D, the scale of the round-off of a weighted sum. */
function absSum1(w: Float64Array, f: (i: number) => number): number {
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i]! * Math.abs(f(i));
  return s;
}

/** Strictly increasing nodes: a start and positive widths (property input). */
const nodesArb = fc.tuple(
  fc.double({ min: -10, max: 10, noNaN: true }),
  fc.array(fc.double({ min: 1e-3, max: 2, noNaN: true }), { minLength: 1, maxLength: 60 }),
).map(([start, widths]) => {
  const x = [start];
  for (const w of widths) x.push(x[x.length - 1]! + w);
  return x;
});

/** f(x) = a + b·x + Σ cₖ·|x − ckₖ|, piecewise linear with kinks at the given points. */
interface PiecewiseLinear {
  a: number;
  b: number;
  kinks: Array<[number, number]>; // [cₖ, position]
}

function evalPl(p: PiecewiseLinear, x: number): number {
  let v = p.a + p.b * x;
  for (const [c, at] of p.kinks) v += c * Math.abs(x - at);
  return v;
}

/** ∫_A^B f in closed form, and the magnitude its own rounding scales with. */
function exactPl(p: PiecewiseLinear, A: number, B: number): { value: number; scale: number } {
  let value = p.a * (B - A) + (p.b * (B * B - A * A)) / 2;
  let scale = Math.abs(p.a) * (B - A) + Math.abs(p.b) * (A * A + B * B);
  for (const [c, at] of p.kinks) {
    const s = ((at - A) ** 2 + (B - at) ** 2) / 2;
    value += c * s;
    scale += Math.abs(c) * 2 * s;
  }
  return { value, scale };
}

/** Σ wᵢ·(|a| + |b·xᵢ| + Σ|cₖ|·|xᵢ − posₖ|): what the samples' own rounding scales with. */
function sampleScale(p: PiecewiseLinear, x: ArrayLike<number>, w: Float64Array): number {
  return absSum1(w, (i) => {
    const xi = x[i] as number;
    let v = Math.abs(p.a) + Math.abs(p.b * xi);
    for (const [c, at] of p.kinks) v += Math.abs(c) * Math.abs(xi - at);
    return v;
  });
}

/**
 * A coefficient in [−m, m], flushed to 0 below 1e-100: the relative round-off
 * model of the tolerances does not hold for subnormal results, which carry an
 * absolute error of their own; a field's data never lives there.
 */
const coef = (m: number) => fc.double({ min: -m, max: m, noNaN: true }).map((v) => (Math.abs(v) < 1e-100 ? 0 : v));

const plArb = (nodes: number[]) => fc.record({
  a: coef(5),
  b: coef(5),
  kinks: fc.array(fc.tuple(coef(5), fc.constantFrom(...nodes)), { maxLength: 6 }),
});

describe('trapezoidWeights', () => {
  it('uniform: h/2 at the ends, h inside; periodic uniform: h everywhere', () => {
    expect(Array.from(trapezoidWeights(grid({ x: { from: 0, to: 2, cells: 4 } }).x))).toEqual([0.25, 0.5, 0.5, 0.5, 0.25]);
    expect(Array.from(trapezoidWeights(grid({ x: { from: 0, to: 2, cells: 4, periodic: true } }).x))).toEqual([0.5, 0.5, 0.5, 0.5]);
    expect(Array.from(trapezoidWeights(grid({ x: { from: 0, to: 2, cells: 1 } }).x))).toEqual([1, 1]);
    expect(Array.from(trapezoidWeights(grid({ x: { from: 0, to: 2, cells: 1, periodic: true } }).x))).toEqual([2]);
  });

  it('stretched: half the cells on each side; periodic stretched wraps round', () => {
    expect(Array.from(trapezoidWeights(grid({ x: { nodes: [0, 1, 3, 7] } }).x))).toEqual([0.5, 1.5, 3, 2]);
    // cells 1, 2, 4 with the last closing the loop: node 0 has cells 4 (wrap) and 1 around it
    expect(Array.from(trapezoidWeights(grid({ x: { nodes: [0, 1, 3, 7], periodic: true } }).x))).toEqual([2.5, 1.5, 3]);
  });

  it('sum to to − from (property)', () => {
    fc.assert(
      fc.property(nodesArb, fc.boolean(), (nodes, periodic) => {
        const a = grid({ x: { nodes, periodic } }).x;
        const w = trapezoidWeights(a);
        expect(w.length).toBe(a.count);
        const L = a.to - a.from;
        let s = 0;
        for (const v of w) s += v;
        // each weight ≤ 3u off and the sum adds n roundings, all relative to L (weights > 0),
        // against L = to − from itself rounded once; |x| ≤ 130 here, so widths carry ≤ u·130 each
        const X = Math.max(Math.abs(a.from), Math.abs(a.to));
        expect(Math.abs(s - L)).toBeLessThanOrEqual((a.count + 4) * eps * L + a.cells * eps * X);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });
});

describe('exactness for piecewise-linear data', () => {
  it('1-D stretched: ∫ (a + bx + Σ cₖ|x − xⱼₖ|) exact to round-off (property)', () => {
    fc.assert(
      fc.property(nodesArb.chain((nodes) => fc.tuple(fc.constant(nodes), plArb(nodes))), ([nodes, p]) => {
        const g = grid({ x: { nodes } });
        const got = integrate(g, sampleField(g, (x) => evalPl(p, x)));
        const A = nodes[0]!;
        const B = nodes[nodes.length - 1]!;
        const want = exactPl(p, A, B);
        const w = trapezoidWeights(g.x);
        // integrate: (n + 12)·ε·Σ|w·f| (header); each sample f(xᵢ) carries
        // (2 + 2·kinks)·u of Σ|terms|; the closed form ≈ 4u of its own scale.
        const k = nodes.length + 2 * p.kinks.length + 16;
        const tol = k * eps * (sampleScale(p, nodes, w) + want.scale);
        expect(Math.abs(got - want.value)).toBeLessThanOrEqual(tol);
      }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('2-D: ∫∫ p(x)·q(y) = P·Q and ∫∫ (a + bx + cy + dxy) exact to round-off (property)', () => {
    fc.assert(
      fc.property(
        nodesArb.chain((xs) => nodesArb.chain((ys) => fc.tuple(fc.constant(xs), fc.constant(ys), plArb(xs), plArb(ys)))),
        fc.array(coef(3), { minLength: 4, maxLength: 4 }),
        ([xs, ys, p, q], [a, b, c, d]) => {
          const g = grid({ x: { nodes: xs }, y: { nodes: ys } });
          const [A, B, C, D] = [xs[0]!, xs[xs.length - 1]!, ys[0]!, ys[ys.length - 1]!];
          const wx = trapezoidWeights(g.x);
          const wy = trapezoidWeights(g.y);
          const P = exactPl(p, A, B);
          const Q = exactPl(q, C, D);
          const sp = sampleScale(p, xs, wx) + P.scale;
          const sq = sampleScale(q, ys, wy) + Q.scale;
          // product data: the 1-D bounds of both factors, multiplied (each factor's
          // error times the other's magnitude), plus the nested sums over nx + ny.
          const k = xs.length + ys.length + 2 * (p.kinks.length + q.kinks.length) + 32;
          const got = integrate(g, sampleField(g, (x, y) => evalPl(p, x) * evalPl(q, y)));
          expect(Math.abs(got - P.value * Q.value)).toBeLessThanOrEqual(k * eps * sp * sq);

          const bil = integrate(g, sampleField(g, (x, y) => a! + b! * x + c! * y + d! * x * y));
          const Lx = B - A;
          const Ly = D - C;
          const mx = (A * A + B * B);
          const my = (C * C + D * D);
          const want = a! * Lx * Ly + (b! * (B * B - A * A) * Ly) / 2 + (c! * (D * D - C * C) * Lx) / 2
            + (d! * (B * B - A * A) * (D * D - C * C)) / 4;
          // scale ≥ ∫∫ (|a| + |bx| + |cy| + |dxy|), using ∫_A^B |x| dx ≤ (A² + B²)/2 ≤ mx; it also
          // bounds the rounding of the closed form (B² − A² is off by u·(A² + B²))
          const scale = Math.abs(a!) * Lx * Ly + Math.abs(b!) * mx * Ly + Math.abs(c!) * my * Lx + Math.abs(d!) * mx * my;
          expect(Math.abs(bil - want)).toBeLessThanOrEqual((xs.length + ys.length + 24) * eps * scale);
        }),
      { seed: SEED, numRuns: 200 },
    );
  });

  it('3-D uniform: a trilinear function exactly', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 7 }, y: { from: -1, to: 2, cells: 5 }, z: { nodes: [0, 0.1, 0.5, 2] } });
    const got = integrate(g, sampleField(g, (x, y, z) => 1 + 2 * x - y + 3 * z + x * y * z));
    // ∫ over [0,1]×[−1,2]×[0,2]: volume 6; ∫x = 0.5·3·2; ∫y = 1·1.5·2; ∫z = 1·3·2; ∫xyz = 0.5·1.5·2
    const want = 6 + 2 * 3 - 3 + 3 * 6 + 1.5;
    // (nx + ny + nz + 12)·ε of Σ|w·f| ≤ 6·(1 + 2 + 2 + 6 + 4)
    expect(Math.abs(got - want)).toBeLessThanOrEqual((8 + 6 + 4 + 12) * eps * 6 * 15);
  });

  it('periodic: a hat whose kinks sit on nodes integrates exactly', () => {
    const g = grid({ x: { from: 0, to: 8, cells: 8, periodic: true } });
    expect(integrate(g, sampleField(g, (x) => Math.max(0, 1 - Math.abs(x - 4) / 2)))).toBe(2);
  });
});

/** Observed orders log₂(e_h / e_{h/2}) over successive halvings. */
function orders(errors: number[]): number[] {
  const p: number[] = [];
  for (let i = 1; i < errors.length; i++) p.push(Math.log2(errors[i - 1]! / errors[i]!));
  return p;
}

describe('second-order convergence for smooth functions', () => {
  const e1 = Math.E - 1;

  it('1-D uniform: ∫₀¹ eˣ = e − 1, error → (h²/12)(f′(1) − f′(0)) (Euler–Maclaurin)', () => {
    const errors: number[] = [];
    for (const n of [8, 16, 32, 64, 128]) {
      const g = grid({ x: { from: 0, to: 1, cells: n } });
      const err = integrate(g, sampleField(g, Math.exp)) - e1;
      const h = 1 / n;
      // next Euler–Maclaurin term −h⁴/720·(f‴(1) − f‴(0)) makes the relative gap ≈ h²/60
      expect(Math.abs(err / ((h * h / 12) * e1) - 1)).toBeLessThanOrEqual(h * h / 30);
      errors.push(Math.abs(err));
    }
    for (const p of orders(errors)) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.1);
  });

  it('1-D tanh-stretched axis keeps order 2', () => {
    const errors: number[] = [];
    for (const n of [8, 16, 32, 64, 128]) {
      const g = grid({ x: tanhAxis({ from: 0, to: 1, cells: n, beta: 2, cluster: 'both' }) });
      errors.push(Math.abs(integrate(g, sampleField(g, Math.exp)) - e1));
    }
    for (const p of orders(errors)) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.1);
  });

  it('2-D and 3-D: ∫∫ eˣ sin y = (e − 1)(1 − cos 2), ∫∫∫ e^(x+y+z) = (e − 1)³', () => {
    const err2: number[] = [];
    const err3: number[] = [];
    for (const n of [4, 8, 16, 32, 64]) {
      const g2 = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 2, cells: n } });
      err2.push(Math.abs(integrate(g2, sampleField(g2, (x, y) => Math.exp(x) * Math.sin(y))) - e1 * (1 - Math.cos(2))));
      if (n <= 32) {
        const u = { from: 0, to: 1, cells: n };
        const g3 = grid({ x: u, y: u, z: u });
        err3.push(Math.abs(integrate(g3, sampleField(g3, (x, y, z) => Math.exp(x + y + z))) - e1 ** 3));
      }
    }
    for (const p of orders(err2)) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.1);
    for (const p of orders(err3)) expect(Math.abs(p - 2)).toBeLessThanOrEqual(0.1);
  });
});

/** I_k(1) = Σₘ (1/2)^(2m+k) / (m!·(m+k)!), the modified Bessel function at 1. */
function besselI1(k: number): number {
  let term = 0.5 ** k;
  for (let j = 2; j <= k; j++) term /= j;
  let s = 0;
  for (let m = 0; m < 40; m++) {
    s += term;
    term *= 0.25 / ((m + 1) * (m + 1 + k));
  }
  return s;
}

describe('periodic axis: spectral accuracy', () => {
  it('exact for trigonometric polynomials of degree < n on [from, to) (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 40 }).chain((n) => fc.tuple(
          fc.constant(n),
          // degree K ≤ n − 1: K + 1 pairs (a_k, b_k), b_0 unused
          fc.integer({ min: 0, max: n - 1 }).chain((K) => fc.array(
            fc.tuple(coef(1), coef(1)),
            { minLength: K + 1, maxLength: K + 1 })),
        )),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        ([n, coeffs], from, L) => {
          const to = from + L;
          const K = coeffs.length - 1; // degrees 0 … n − 1
          const g = grid({ x: { from, to, cells: n, periodic: true } });
          const f = (x: number) => {
            const t = (2 * Math.PI * (x - from)) / L;
            let v = coeffs[0]![0];
            for (let k = 1; k <= K; k++) v += coeffs[k]![0] * Math.cos(k * t) + coeffs[k]![1] * Math.sin(k * t);
            return v;
          };
          const got = integrate(g, sampleField(g, f));
          const want = L * coeffs[0]![0];
          // θ = 2π(x − from)/L is off by Δθ ≤ 2π·(2ε·X/L + 3ε) (x itself ≈ ε·X, four roundings);
          // cos(kθ) then by k·Δθ + ε; the sum of 2K + 1 terms adds (2K + 1)·u of A = Σ|coefficients|;
          // integrate adds (n + 12)·u·L·A.
          const X = Math.max(Math.abs(from), Math.abs(to));
          const A = coeffs.reduce((s, [a, b]) => s + Math.abs(a) + Math.abs(b), 0);
          const dTheta = 2 * Math.PI * (2 * X / L + 3) * eps;
          const tol = L * A * (K * dTheta + (2 * K + 2) * eps + (n + 12) * eps);
          expect(Math.abs(got - want)).toBeLessThanOrEqual(tol);
        }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('degree n aliases onto the constant: the bound above is sharp', () => {
    const n = 6;
    const g = grid({ x: { from: 0, to: 2 * Math.PI, cells: n, periodic: true } });
    // cos(n·xⱼ) = 1 at every node, so the rule returns 2π instead of 0
    expect(Math.abs(integrate(g, sampleField(g, (x) => Math.cos(n * x))) - 2 * Math.PI)).toBeLessThan(1e-13);
  });

  it('∫₀^2π e^(cos x) = 2π·I₀(1): error 4π·Σₘ I_mn(1), geometric in n, round-off by n = 16', () => {
    const exact = 2 * Math.PI * besselI1(0);
    let previous = Infinity;
    for (const n of [2, 3, 4, 5, 6, 7, 8]) {
      const g = grid({ x: { from: 0, to: 2 * Math.PI, cells: n, periodic: true } });
      const err = integrate(g, sampleField(g, (x) => Math.exp(Math.cos(x)))) - exact;
      // aliasing of the Fourier coefficients I_k(1) of e^(cos x) onto k = 0
      let predicted = 0;
      for (let m = 1; m * n < 60; m++) predicted += 4 * Math.PI * besselI1(m * n);
      // round-off ≈ (n + 12)·ε·2π·e, negligible against 1e-6·predicted for n ≤ 8
      expect(Math.abs(err / predicted - 1)).toBeLessThanOrEqual(1e-6);
      expect(Math.abs(err)).toBeLessThan(previous / 4);
      previous = Math.abs(err);
    }
    const g = grid({ x: { from: 0, to: 2 * Math.PI, cells: 16, periodic: true } });
    const err16 = integrate(g, sampleField(g, (x) => Math.exp(Math.cos(x)))) - exact;
    // 4π·I₁₆(1) ≈ 5e-18: only round-off is left, (n + 12)·ε·Σ|w·f| ≤ 28·ε·2π·e, plus exp/cos ulps
    expect(Math.abs(err16)).toBeLessThanOrEqual(32 * eps * 2 * Math.PI * Math.E);
  });

  it('2-D, one periodic axis: ∫∫ (x + cos 3y + x·sin y) over [0,1]×[0,2π) = π', () => {
    const g = grid({ x: { nodes: [0, 0.3, 0.35, 1] }, y: { from: 0, to: 2 * Math.PI, cells: 7, periodic: true } });
    const got = integrate(g, sampleField(g, (x, y) => x + Math.cos(3 * y) + x * Math.sin(y)));
    // samples ≈ 3 in size with ≈ 4u each plus the angle rounding 3·ε·2π; sum (4 + 7 + 12)·u of Σ|w·f| ≤ 2π·3
    expect(Math.abs(got - Math.PI)).toBeLessThanOrEqual(64 * eps * 2 * Math.PI * 3);
  });
});

describe('integrate: layout independence and errors', () => {
  it('gives the same value on a strided view', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 3 }, y: { nodes: [0, 1, 3] } });
    const f = sampleField(g, (x, y) => x * x + y);
    const t = ndarray(new Float64Array(12), [3, 4]).transpose(1, 0);
    sampleField(g, (x, y) => x * x + y, t);
    expect(integrate(g, t)).toBe(integrate(g, f));
  });

  it('refuses wrong shapes, non-fields, non-finite values and overflow', () => {
    const spec: GridSpec = { x: { from: 0, to: 10, cells: 2 }, y: { from: 0, to: 1, cells: 3 } };
    const g: Grid = grid(spec);
    expectCode(() => integrate(g, zeros(grid({ x: { from: 0, to: 1, cells: 3 } }))), 'SHAPE_MISMATCH');
    expectCode(() => integrate(g, ndarray(new Float64Array(12), [4, 3])), 'SHAPE_MISMATCH');
    expectCode(() => integrate(g, new Float64Array(12) as never), 'INVALID_FIELD');
    const f = zeros(g);
    f.set(1, 2, NaN);
    const e = expectCode(() => integrate(g, f), 'NON_FINITE');
    expect(e.message).toContain('field[1, 2]');
    f.set(1, 2, 1e308);
    f.set(2, 2, 1e308);
    const o = expectCode(() => integrate(g, f), 'NON_FINITE');
    expect(o.message).toContain('overflows');
  });
});
