/**
 * Clustering helpers: strictly increasing nodes hitting both ends exactly,
 * the stated ratio of successive spacings (geometric), the stated formulas
 * (tanh, after Vinokur 1983), and their input checks.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type ClusterEnd, geometricAxis, grid, tanhAxis } from '../../src/grid/index.js';
import { SEED, eps, expectCode } from './helpers.js';

const ends: readonly ClusterEnd[] = ['from', 'to', 'both'];

function spacings(x: Float64Array): number[] {
  const h: number[] = [];
  for (let i = 1; i < x.length; i++) h.push(x[i]! - x[i - 1]!);
  return h;
}

function checkEndsAndOrder(x: Float64Array, from: number, to: number, cells: number): void {
  expect(x.length).toBe(cells + 1);
  expect(x[0]).toBe(from);
  expect(x[cells]).toBe(to);
  for (let i = 1; i <= cells; i++) expect(x[i]).toBeGreaterThan(x[i - 1]!);
}

/** Exponent e with hᵢ ∝ rᵉ for each cluster end (see geometricAxis). */
function exponent(cluster: ClusterEnd, i: number, n: number): number {
  if (cluster === 'from') return i;
  if (cluster === 'to') return n - 1 - i;
  return Math.min(i, n - 1 - i);
}

const interval = fc.tuple(
  fc.double({ min: -100, max: 100, noNaN: true }),
  fc.double({ min: 0.01, max: 100, noNaN: true }),
).map(([from, length]) => ({ from, to: from + length }));

describe('geometricAxis', () => {
  it('spacings 1, 2, 4 for ratio 2 on [0, 7]', () => {
    expect(Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'from' }).nodes)).toEqual([0, 1, 3, 7]);
    expect(Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'to' }).nodes)).toEqual([0, 4, 6, 7]);
    // both, odd n: 1.75, 3.5, 1.75
    expect(Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'both' }).nodes)).toEqual([0, 1.75, 5.25, 7]);
  });

  it('successive spacings have the stated ratio; ends exact; strictly increasing (property)', () => {
    fc.assert(
      fc.property(interval, fc.integer({ min: 1, max: 60 }), fc.double({ min: 0.8, max: 1.25, noNaN: true }),
        fc.constantFrom(...ends),
        ({ from, to }, cells, ratio, cluster) => {
          const x = geometricAxis({ from, to, cells, ratio, cluster }).nodes;
          checkEndsAndOrder(x, from, to, cells);
          // Node error δ: the fractions carry ≈ (n·|ln r| + 6) roundings of ε/2 (the
          // exponent's argument grows with n), and from + L·t adds three more, all
          // relative to X = max(|from|, |to|) ≥ L/2. A spacing is off by ≤ 2δ, so the
          // ratio of two neighbours is off by ≤ r·(2δ/hᵢ + 2δ/hᵢ₊₁).
          const X = Math.max(Math.abs(from), Math.abs(to));
          const delta = (cells * Math.abs(Math.log(ratio)) + 8) * eps * X;
          const h = spacings(x);
          for (let i = 0; i + 1 < cells; i++) {
            const want = ratio ** (exponent(cluster, i + 1, cells) - exponent(cluster, i, cells));
            const tol = want * (2 * delta / h[i]! + 2 * delta / h[i + 1]!);
            expect(Math.abs(h[i + 1]! / h[i]! - want)).toBeLessThanOrEqual(tol);
          }
          if (cluster === 'both') {
            for (let i = 0; i < cells; i++) expect(Math.abs(h[i]! - h[cells - 1 - i]!)).toBeLessThanOrEqual(4 * delta);
          }
        }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('ratio 1 is the uniform axis', () => {
    const x = geometricAxis({ from: 2, to: 5, cells: 12, ratio: 1, cluster: 'from' }).nodes;
    // i/n and from + L·t: three roundings of ≤ ε/2 of |x| ≤ 5
    for (let i = 0; i <= 12; i++) expect(Math.abs(x[i]! - (2 + (3 * i) / 12))).toBeLessThanOrEqual(2 * eps * 5);
  });

  it('a strong ratio keeps the finest cell: h₀ = L(r − 1)/(rⁿ − 1)', () => {
    const x = geometricAxis({ from: 0, to: 1, cells: 40, ratio: 1.5, cluster: 'from' }).nodes;
    const h0 = 0.5 / (1.5 ** 40 - 1);
    // x₁ − x₀ = x₁ with from = 0: its relative error is that of the fraction, (n·ln r + 6)·ε/2
    expect(Math.abs(x[1]! - h0)).toBeLessThanOrEqual((40 * Math.log(1.5) + 8) * eps * h0);
  });

  it('its nodes make a stretched grid axis', () => {
    const g = grid({ x: geometricAxis({ from: 0, to: 1, cells: 10, ratio: 1.2, cluster: 'both' }) });
    expect(g.x.uniform).toBe(false);
    expect(g.nx).toBe(11);
  });

  it('bad inputs', () => {
    const base = { from: 0, to: 1, cells: 8, ratio: 1.1, cluster: 'from' as const };
    for (const ratio of [0, -1, NaN, Infinity]) {
      const e = expectCode(() => geometricAxis({ ...base, ratio }), 'INVALID_CLUSTERING');
      expect((e as unknown as { parameter: string }).parameter).toBe('ratio');
    }
    for (const cells of [0, 2.5, -1, NaN]) expectCode(() => geometricAxis({ ...base, cells }), 'INVALID_CELLS');
    expectCode(() => geometricAxis({ ...base, from: 1, to: 1 }), 'INVALID_INTERVAL');
    expectCode(() => geometricAxis({ ...base, from: NaN }), 'NON_FINITE');
    expectCode(() => geometricAxis({ ...base, from: -1e308, to: 1e308 }), 'NON_FINITE');
    expectCode(() => geometricAxis({ ...base, cluster: 'middle' as 'from' }), 'INVALID_OPTION');
    // 1e10⁴⁹ overflows any float: the first cells vanish
    expectCode(() => geometricAxis({ ...base, cells: 50, ratio: 1e10 }), 'INVALID_CLUSTERING');
  });
});

describe('tanhAxis', () => {
  /** The maps as stated in the TSDoc, evaluated directly. */
  function formula(cluster: ClusterEnd, beta: number, xi: number): number {
    if (cluster === 'from') return 1 + Math.tanh(beta * (xi - 1)) / Math.tanh(beta);
    if (cluster === 'to') return Math.tanh(beta * xi) / Math.tanh(beta);
    return 0.5 * (1 + Math.tanh(beta * (xi - 0.5)) / Math.tanh(beta / 2));
  }

  it('follows the stated formula; ends exact; strictly increasing (property)', () => {
    fc.assert(
      fc.property(interval, fc.integer({ min: 1, max: 200 }), fc.double({ min: 0.05, max: 8, noNaN: true }),
        fc.constantFrom(...ends),
        ({ from, to }, cells, beta, cluster) => {
          const x = tanhAxis({ from, to, cells, beta, cluster }).nodes;
          checkEndsAndOrder(x, from, to, cells);
          const L = to - from;
          // Each side (the library's cancellation-free form and the formula here) takes
          // ≈ 8 roundings of ≤ ε/2 relative to |from| + L, and both inherit the rounding of
          // ξ = i/n, which moves x by up to L·max t′·ε/2 ≤ L·(β + 1)·ε/2. Hence (16 + 4β)·ε.
          const tol = (16 + 4 * beta) * eps * (Math.abs(from) + L);
          for (let i = 0; i <= cells; i++) {
            const want = from + L * formula(cluster, beta, i / cells);
            expect(Math.abs(x[i]! - want)).toBeLessThanOrEqual(tol);
          }
        }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('cells grow away from the clustered end(s); to is the mirror image of from', () => {
    const n = 64;
    const hf = spacings(tanhAxis({ from: 0, to: 1, cells: n, beta: 3, cluster: 'from' }).nodes);
    const ht = spacings(tanhAxis({ from: 0, to: 1, cells: n, beta: 3, cluster: 'to' }).nodes);
    const hb = spacings(tanhAxis({ from: 0, to: 1, cells: n, beta: 3, cluster: 'both' }).nodes);
    // node errors are a few ε on [0, 1]; spacings here are ≥ 1e-4, so 8ε never flips an order
    const tol = 8 * eps;
    for (let i = 0; i + 1 < n; i++) {
      expect(hf[i + 1]! - hf[i]!).toBeGreaterThan(-tol);
      expect(ht[i + 1]! - ht[i]!).toBeLessThan(tol);
      if (i + 1 < n / 2) expect(hb[i + 1]! - hb[i]!).toBeGreaterThan(-tol);
      if (i >= n / 2) expect(hb[i + 1]! - hb[i]!).toBeLessThan(tol);
    }
    expect(hf[n - 1]! / hf[0]!).toBeGreaterThan(50);
    for (let i = 0; i < n; i++) {
      expect(Math.abs(ht[i]! - hf[n - 1 - i]!)).toBeLessThanOrEqual(4 * eps);
      expect(Math.abs(hb[i]! - hb[n - 1 - i]!)).toBeLessThanOrEqual(4 * eps);
    }
  });

  it('smallest spacing ≈ 2βL/(n·sinh 2β) one-sided and βL/(n·sinh β) two-sided, to O(1/n)', () => {
    const n = 1000;
    const beta = 3;
    const L = 2;
    const h1 = spacings(tanhAxis({ from: 1, to: 3, cells: n, beta, cluster: 'from' }).nodes)[0]!;
    const h2 = spacings(tanhAxis({ from: 1, to: 3, cells: n, beta, cluster: 'both' }).nodes)[0]!;
    // h₀ = L·t(1/n) = L·t′(0)/n·(1 + O(β/n)): the relative gap stays below 3β/n
    expect(Math.abs(h1 / ((2 * beta * L) / (n * Math.sinh(2 * beta))) - 1)).toBeLessThan((3 * beta) / n);
    expect(Math.abs(h2 / ((beta * L) / (n * Math.sinh(beta))) - 1)).toBeLessThan((3 * beta) / n);
  });

  it('strong clustering keeps its digits at the fine end (no 1 + (≈ −1) cancellation)', () => {
    // β = 20, n = 100: the first spacing is ≈ 2·20/(100·sinh 40) ≈ 3.4e-18, far below ε on [0, 1]
    const x = tanhAxis({ from: 0, to: 1, cells: 100, beta: 20, cluster: 'from' }).nodes;
    const want = Math.sinh(20 * 0.01) / (Math.sinh(20) * Math.cosh(20 * 0.99)); // the same t(0.01), product form
    // both sides ≈ 10 roundings relative to the value itself, since from = 0
    expect(Math.abs(x[1]! - want)).toBeLessThanOrEqual(20 * eps * want);
    expect(x[1]).toBeGreaterThan(0);
  });

  it('bad inputs', () => {
    const base = { from: 0, to: 1, cells: 8, beta: 2, cluster: 'both' as const };
    for (const beta of [0, -1, NaN, Infinity]) {
      const e = expectCode(() => tanhAxis({ ...base, beta }), 'INVALID_CLUSTERING');
      expect((e as unknown as { parameter: string }).parameter).toBe('beta');
    }
    for (const cells of [0, 0.5, -2]) expectCode(() => tanhAxis({ ...base, cells }), 'INVALID_CELLS');
    expectCode(() => tanhAxis({ ...base, from: 3, to: 1 }), 'INVALID_INTERVAL');
    expectCode(() => tanhAxis({ ...base, to: Infinity }), 'NON_FINITE');
    expectCode(() => tanhAxis({ ...base, cluster: 'ends' as 'both' }), 'INVALID_OPTION');
    // β = 400 on [1, 2]: the first cell ≈ e⁻⁸⁰⁰ is far below an ulp of 1
    expectCode(() => tanhAxis({ from: 1, to: 2, cells: 10, beta: 400, cluster: 'from' }), 'INVALID_CLUSTERING');
  });
});
