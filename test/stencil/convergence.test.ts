/**
 * Observed order of every named stencil up to accuracy 6 on a smooth function,
 * and the measured error against the predicted leading term C·hᵖ·u⁽ᵐ⁺ᵖ⁾.
 *
 * u(x) = exp(0.8x) + sin(1.3x + 0.4), evaluated around x₀ = 0.3, where no
 * derivative up to order 14 is near zero.
 *
 * Round-off: with samples of u itself the computed error carries
 * ≈ ε·Σ|wⱼ|·|u| / hᵐ of rounding, which overtakes the truncation error
 * C·hᵖ·u⁽ᵐ⁺ᵖ⁾ below h_min = (10⁴·ε·Σ|wⱼ|·|u| / |C·u⁽ᵐ⁺ᵖ⁾|)^(1/(m+p)). For the
 * high orders h_min is so large that four halvings no longer fit inside the
 * asymptotic range (for m = 4, p = 6, h_min ≈ 0.15). So the main test samples
 * the Taylor tail r = u − Tₙ₋₁ of u about x₀, summed from its series without
 * cancellation: a stencil of N nodes is exact on the Taylor polynomial Tₙ₋₁
 * (degree N − 1), so Σ wⱼ r(x₀ + oⱼh) / hᵐ is exactly the truncation error of
 * the stencil on u, free of the rounding of u's samples. That identity is the
 * polynomial-exactness property tested in properties.test.ts. A second test
 * uses samples of u itself where the range h₀ … h₀/8 lies above h_min.
 */
import { describe, expect, it } from 'vitest';
import { observedOrders } from '../support/solve.js';
import { type Stencil, applyStencil, backwardStencil, centralStencil, forwardStencil } from '../../src/index.js';

const X0 = 0.3;
/** k-th derivative of u at x. */
const du = (k: number, x: number): number =>
  0.8 ** k * Math.exp(0.8 * x) + 1.3 ** k * Math.sin(1.3 * x + 0.4 + (k * Math.PI) / 2);

/** Taylor tail Σ_{k≥N} u⁽ᵏ⁾(x₀) tᵏ/k!, summed until terms fall below 1e-18 of the sum. */
function tail(n: number, t: number): number {
  let term = 1;
  for (let k = 1; k <= n; k++) term *= t / k;
  let s = 0;
  for (let k = n; k < n + 80; k++) {
    const v = du(k, X0) * term;
    s += v;
    if (Math.abs(v) <= 1e-18 * Math.abs(s)) break;
    term *= t / (k + 1);
  }
  return s;
}

const named: Array<[string, Stencil]> = [];
for (let m = 1; m <= 4; m++) for (const p of [2, 4, 6]) named.push([`central m=${m} p=${p}`, centralStencil(m, p)]);
for (let m = 1; m <= 2; m++) {
  for (let p = 1; p <= 6; p++) {
    named.push([`forward m=${m} p=${p}`, forwardStencil(m, p)]);
    named.push([`backward m=${m} p=${p}`, backwardStencil(m, p)]);
  }
}

/** Applies the stencil at node index `c` of samples f(oh) laid out on a uniform array. */
function errorAt(st: Stencil, h: number, f: (t: number) => number, exact: number): number {
  const lo = st.offsets[0]!;
  const hi = st.offsets[st.offsets.length - 1]!;
  const u = new Float64Array(hi - lo + 1);
  for (let i = 0; i < u.length; i++) u[i] = f((i + lo) * h);
  const out = applyStencil(st, u, h);
  return out[-lo]! - exact;
}

/** Pair orders through the library's convergence study (errors signed here, so their magnitudes). */
function orders(errs: number[]): number[] {
  return observedOrders(errs.map(Math.abs));
}

describe('observed order of the named stencils (Roache 1998: p̂ = log₂(e_h / e_{h/2}) within 0.1)', () => {
  // h₀ … h₀/8 = 0.025 … 0.003125: asymptotic for every stencil here. At h₀ = 0.05 the
  // one-sided stencils of accuracy ≥ 4 still show the next term (p̂ = 4.87 for backward m = 1, p = 5).
  const H0 = 0.025;
  for (const [name, st] of named) {
    it(`${name}: order within 0.1 on h = ${H0}…${H0 / 8} and error within 10 % of leadingError·hᵖ·u⁽ᵐ⁺ᵖ⁾`, () => {
      const n = st.offsets.length;
      const errs = [0, 1, 2, 3].map((l) => errorAt(st, H0 / 2 ** l, (t) => tail(n, t), 0));
      for (const p of orders(errs)) expect(Math.abs(p - st.accuracy)).toBeLessThanOrEqual(0.1);
      const hf = H0 / 8;
      const predicted = st.leadingError.toNumber() * hf ** st.accuracy * du(st.derivative + st.accuracy, X0);
      expect(Math.abs(errs[3]! / predicted - 1)).toBeLessThanOrEqual(0.1);
    });
  }
});

describe('observed order on samples of u itself, where truncation dominates round-off', () => {
  // h₀ = 8·h_min (module comment), used where that is ≤ 0.05 so the coarsest level is
  // asymptotic: central p = 2 for m ≤ 2, one-sided p ≤ 3 for m = 1 and p ≤ 2 for m = 2.
  const cases = named.filter(([, st]) => hMin(st) * 8 <= 0.05);
  function hMin(st: Stencil): number {
    const sumw = st.weights.reduce((a, w) => a + Math.abs(w), 0);
    const c = Math.abs(st.leadingError.toNumber() * du(st.derivative + st.accuracy, X0));
    return ((1e4 * Number.EPSILON * sumw * Math.abs(du(0, X0))) / c) ** (1 / (st.derivative + st.accuracy));
  }
  it('covers the low orders', () => expect(cases.length).toBe(12));
  for (const [name, st] of cases) {
    it(`${name}: order within 0.1 on h = 8·h_min … h_min`, () => {
      const h0 = 8 * hMin(st);
      const exact = du(st.derivative, X0);
      const errs = [0, 1, 2, 3].map((l) => errorAt(st, h0 / 2 ** l, (t) => du(0, X0 + t), exact));
      for (const p of orders(errs)) expect(Math.abs(p - st.accuracy)).toBeLessThanOrEqual(0.1);
    });
  }
});
