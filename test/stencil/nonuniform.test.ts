/**
 * Weights on non-uniform node sets, against values derived by hand from the
 * Lagrange interpolating polynomial (derivations below), in exact arithmetic
 * (`exactWeights`) and in float64 (`fornbergWeights`).
 *
 * The weight of node xⱼ for the m-th derivative at a is Lⱼ⁽ᵐ⁾(a), where
 * Lⱼ(x) = Πₖ≠ⱼ (x − xₖ)/(xⱼ − xₖ) is the Lagrange basis polynomial: the
 * interpolant p(x) = Σⱼ u(xⱼ) Lⱼ(x) has p⁽ᵐ⁾(a) = Σⱼ Lⱼ⁽ᵐ⁾(a) u(xⱼ).
 *
 * ── Set A: nodes −1, 0, 2 ───────────────────────────────────────────────
 *
 *   L₋₁(x) = (x − 0)(x − 2) / ((−1 − 0)(−1 − 2)) = (x² − 2x) / 3
 *   L₀(x)  = (x + 1)(x − 2) / ((0 + 1)(0 − 2))   = −(x² − x − 2) / 2
 *   L₂(x)  = (x + 1)(x − 0) / ((2 + 1)(2 − 0))   = (x² + x) / 6
 *
 *   First derivatives:  L₋₁′ = (2x − 2)/3,  L₀′ = −(2x − 1)/2,  L₂′ = (2x + 1)/6
 *     at x = 0:    −2/3,  1/2,  1/6      (sum 0; on u = x: 2/3 + 0 + 2/6 = 1)
 *     at x = 1/2:  −1/3,  0,    1/3      (sum 0; on u = x: 1/3 + 2/3 = 1;
 *                                         on u = x²: −1/3 + 4/3 = 1 = 2·(1/2))
 *
 *   Second derivatives (constant, a quadratic's L″ does not depend on x):
 *     L₋₁″ = 2/3,  L₀″ = −1,  L₂″ = 1/3, at x = 0 and at x = 1/2 alike
 *                                        (sum 0; on u = x²: 2/3 + 4/3 = 2)
 *
 * ── Set B: nodes 0, 1/2, 3/2, 3 (asymmetric), first derivative at 0 ─────
 *
 *   a = x₀ = 0 is itself a node, which makes the derivative of each Lⱼ at a
 *   easy: write Lⱼ(x) = Πₖ≠ⱼ (x − xₖ) / Dⱼ with Dⱼ = Πₖ≠ⱼ (xⱼ − xₖ).
 *
 *   j = 0: L₀ = Πₖ≠₀ (x − xₖ)/(x₀ − xₖ), so L₀′(x₀) = Σₖ≠₀ 1/(x₀ − xₖ)
 *          = 1/(−1/2) + 1/(−3/2) + 1/(−3) = −2 − 2/3 − 1/3 = −3
 *   j ≠ 0: the numerator has the factor (x − x₀), which vanishes at x₀, so
 *          Lⱼ′(x₀) = Πₖ≠ⱼ,₀ (x₀ − xₖ) / Dⱼ
 *     j = 1 (x = 1/2): num (0 − 3/2)(0 − 3) = 9/2
 *                      D   (1/2)(1/2 − 3/2)(1/2 − 3) = (1/2)(−1)(−5/2) = 5/4
 *                      weight (9/2)/(5/4) = 18/5
 *     j = 2 (x = 3/2): num (0 − 1/2)(0 − 3) = 3/2
 *                      D   (3/2)(3/2 − 1/2)(3/2 − 3) = (3/2)(1)(−3/2) = −9/4
 *                      weight (3/2)/(−9/4) = −2/3
 *     j = 3 (x = 3):   num (0 − 1/2)(0 − 3/2) = 3/4
 *                      D   (3)(3 − 1/2)(3 − 3/2) = (3)(5/2)(3/2) = 45/4
 *                      weight (3/4)/(45/4) = 1/15
 *   Weights −3, 18/5, −2/3, 1/15.
 *   Checks: sum −3 + 18/5 − 2/3 + 1/15 = (−45 + 54 − 10 + 1)/15 = 0;
 *           u = x:  18/5·1/2 − 2/3·3/2 + 1/15·3 = 9/5 − 1 + 1/5 = 1;
 *           u = x²: 18/5·1/4 − 2/3·9/4 + 1/15·9 = 9/10 − 3/2 + 3/5 = 0;
 *           u = x³: 18/5·1/8 − 2/3·27/8 + 1/15·27 = 9/20 − 9/4 + 9/5 = 0.
 */
import { describe, expect, it } from 'vitest';
import { exactWeights, fornbergWeights, Rational } from '../../src/index.js';

interface Case {
  name: string;
  derivative: number;
  /** Node positions as exact fraction text, in the order the weights are given. */
  nodes: string[];
  at: string;
  /** The hand-derived weights above. */
  weights: string[];
}

const CASES: Case[] = [
  { name: 'set A, first derivative at 0', derivative: 1, nodes: ['-1', '0', '2'], at: '0', weights: ['-2/3', '1/2', '1/6'] },
  { name: 'set A, first derivative at 1/2', derivative: 1, nodes: ['-1', '0', '2'], at: '1/2', weights: ['-1/3', '0', '1/3'] },
  { name: 'set A, second derivative at 0', derivative: 2, nodes: ['-1', '0', '2'], at: '0', weights: ['2/3', '-1', '1/3'] },
  { name: 'set A, second derivative at 1/2', derivative: 2, nodes: ['-1', '0', '2'], at: '1/2', weights: ['2/3', '-1', '1/3'] },
  { name: 'set B, first derivative at 0', derivative: 1, nodes: ['0', '1/2', '3/2', '3'], at: '0', weights: ['-3', '18/5', '-2/3', '1/15'] },
];

/** Every node here is a dyadic fraction, so the float64 node is exact. */
function toFloat(text: string): number {
  const [p, q] = text.split('/');
  return Number(p) / Number(q ?? '1');
}

function factorial(k: number): bigint {
  let f = 1n;
  for (let i = 2; i <= k; i++) f *= BigInt(i);
  return f;
}

describe('non-uniform nodes: weights equal the hand-derived Lagrange derivatives', () => {
  for (const c of CASES) {
    describe(c.name, () => {
      it('the hand values satisfy the Taylor conditions Σⱼ wⱼ (xⱼ − a)ᵏ = m!·δₖₘ, k < N', () => {
        // Guards the derivation above against slips in arithmetic.
        const a = Rational.from(c.at);
        const d = c.nodes.map((x) => Rational.from(x).sub(a));
        const w = c.weights.map((s) => Rational.from(s));
        for (let k = 0; k < c.nodes.length; k++) {
          let s = Rational.ZERO;
          for (let j = 0; j < w.length; j++) {
            let pk = Rational.ONE;
            for (let i = 0; i < k; i++) pk = pk.mul(d[j]!);
            s = s.add(w[j]!.mul(pk));
          }
          const want = k === c.derivative ? Rational.of(factorial(k)) : Rational.ZERO;
          expect(s.toString(), `k = ${k}`).toBe(want.toString());
        }
      });

      it('exactWeights equals them exactly, whatever form the nodes are given in', () => {
        expect(exactWeights(c.derivative, c.nodes, c.at).map(String)).toEqual(c.weights);
        // the same positions as float64 numbers (dyadic, so read exactly) …
        expect(exactWeights(c.derivative, c.nodes.map(toFloat), toFloat(c.at)).map(String)).toEqual(c.weights);
        // … and as Rationals
        expect(exactWeights(c.derivative, c.nodes.map((x) => Rational.from(x)), Rational.from(c.at)).map(String))
          .toEqual(c.weights);
      });

      it('fornbergWeights equals them to round-off', () => {
        const got = fornbergWeights(c.derivative, c.nodes.map(toFloat), toFloat(c.at));
        const want = c.weights.map(toFloat);
        const n = want.length;
        const scale = Math.max(...want.map(Math.abs));
        // Each weight passes through at most N − 1 updates of ≤ 4 roundings
        // (two products, a difference, a quotient); an allowance of 2 for
        // cancellation gives k = 8N (24 or 32 ulps of max|w| here). `want`
        // itself is within ½ ulp of the exact weight. Measured: 0 ulps.
        const tol = 8 * n * Number.EPSILON * scale;
        expect(got.length).toBe(n);
        for (let j = 0; j < n; j++) {
          expect(Math.abs(got[j]! - want[j]!), `weight ${j}`).toBeLessThanOrEqual(tol);
        }
      });

      it('permuting the nodes permutes the weights', () => {
        const order = c.nodes.map((_, i) => i).reverse();
        const got = exactWeights(c.derivative, order.map((i) => c.nodes[i]!), c.at).map(String);
        expect(got).toEqual(order.map((i) => c.weights[i]!));
      });
    });
  }
});
