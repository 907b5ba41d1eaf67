/**
 * Finite-difference weights on arbitrary node sets by Fornberg's recursion,
 * in float64 and in exact rational arithmetic.
 *
 * Reference: Fornberg, B. (1988). Generation of finite difference formulas on
 * arbitrarily spaced grids. Math. Comp. 51(184), 699–706. The loop order
 * follows the compact form in Fornberg, B. (1998). Calculation of weights in
 * finite difference formulas. SIAM Rev. 40(3), 685–691.
 *
 * @module
 */
import { checkAllFinite, checkDerivative, checkFinite } from '../check.js';
import { DuplicateNodesError, TooFewNodesError, WeightOverflowError } from '../errors.js';
import { Rational, type RationalInput } from './rational.js';

function checkCount(derivative: number, count: number): void {
  if (count < derivative + 1) {
    throw new TooFewNodesError(count, derivative + 1, `derivative ${derivative}`);
  }
}

/**
 * Float64 weights of every derivative 0…m at `at`, by the recursion itself
 * (not by rounding exact weights). Row-major table: `c[k·n + j]` is the
 * weight of node j in derivative k. No checks; the caller validated.
 *
 * @internal
 */
export function fornbergTable(m: number, x: ArrayLike<number>, z: number): Float64Array {
  const n = x.length;
  const c = new Float64Array((m + 1) * n);
  let c1 = 1;
  let c4 = (x[0] as number) - z;
  c[0] = 1;
  for (let i = 1; i < n; i++) {
    const xi = x[i] as number;
    const mn = i < m ? i : m;
    let c2 = 1;
    const c5 = c4;
    c4 = xi - z;
    for (let j = 0; j < i; j++) {
      const c3 = xi - (x[j] as number);
      c2 *= c3;
      if (j === i - 1) {
        // new node i: built from node i−1's weights before they are updated below
        for (let k = mn; k >= 1; k--) {
          c[k * n + i] = (c1 * (k * c[(k - 1) * n + i - 1] - c5 * c[k * n + i - 1])) / c2;
        }
        c[i] = (-c1 * c5 * c[i - 1]) / c2;
      }
      for (let k = mn; k >= 1; k--) {
        c[k * n + j] = (c4 * c[k * n + j] - k * c[(k - 1) * n + j]) / c3;
      }
      c[j] = (c4 * c[j]) / c3;
    }
    c1 = c2;
  }
  return c;
}

/**
 * Exact weights of every derivative 0…m at `z`: the same recursion as
 * {@link fornbergTable} over rationals. `c[k][j]` is node j in derivative k.
 *
 * @internal
 */
export function exactTable(m: number, x: readonly Rational[], z: Rational): Rational[][] {
  const n = x.length;
  const c: Rational[][] = [];
  for (let k = 0; k <= m; k++) c.push(new Array<Rational>(n).fill(Rational.ZERO));
  let c1 = Rational.ONE;
  let c4 = x[0].sub(z);
  c[0][0] = Rational.ONE;
  for (let i = 1; i < n; i++) {
    const mn = Math.min(i, m);
    let c2 = Rational.ONE;
    const c5 = c4;
    c4 = x[i].sub(z);
    for (let j = 0; j < i; j++) {
      const c3 = x[i].sub(x[j]);
      c2 = c2.mul(c3);
      if (j === i - 1) {
        for (let k = mn; k >= 1; k--) {
          const kk = Rational.of(BigInt(k));
          c[k][i] = c1.mul(kk.mul(c[k - 1][i - 1]).sub(c5.mul(c[k][i - 1]))).div(c2);
        }
        c[0][i] = c1.neg().mul(c5).mul(c[0][i - 1]).div(c2);
      }
      for (let k = mn; k >= 1; k--) {
        const kk = Rational.of(BigInt(k));
        c[k][j] = c4.mul(c[k][j]).sub(kk.mul(c[k - 1][j])).div(c3);
      }
      c[0][j] = c4.mul(c[0][j]).div(c3);
    }
    c1 = c2;
  }
  return c;
}

/**
 * Weights wⱼ of the `derivative`-th derivative at `at` from values at `nodes`:
 *
 * u⁽ᵐ⁾(at) ≈ Σⱼ wⱼ · u(nodesⱼ).
 *
 * Exact for every polynomial of degree < nodes.length; for smooth u the error
 * is O(hᴺ⁻ᵐ) with N nodes and h their spread (one order more for symmetric
 * nodes and even N − m). Float64 throughout; the recursion is stable for at
 * least 30 nodes and derivatives up to 8 (see the stencil tests for the
 * measured worst case). Source: Fornberg (1988), Math. Comp. 51, 699–706.
 *
 * @param derivative - m ≥ 0, the order of the derivative
 * @param nodes - distinct, finite positions, any order and spacing; more than m of them
 * @param at - where the derivative is wanted (default 0)
 * @returns one weight per node, in the order of `nodes`
 * @example Array.from(fornbergWeights(2, [-1, 0, 1])) // [1, -2, 1]
 */
export function fornbergWeights(derivative: number, nodes: ArrayLike<number>, at = 0): Float64Array {
  checkDerivative(derivative);
  checkAllFinite('nodes', nodes);
  checkFinite('at', at);
  checkCount(derivative, nodes.length);
  checkDistinctNumbers(nodes);
  const n = nodes.length;
  const table = fornbergTable(derivative, nodes, at);
  const w = table.slice(derivative * n, (derivative + 1) * n);
  for (let j = 0; j < n; j++) {
    if (!Number.isFinite(w[j])) throw new WeightOverflowError(derivative, n);
  }
  return w;
}

/**
 * The weights of {@link fornbergWeights} in exact rational arithmetic.
 *
 * Node positions and `at` are read exactly by {@link Rational.from}: integers,
 * decimals as printed (`0.1` is 1/10), fraction strings (`"1/3"`), bigints or
 * Rationals. Source: Fornberg (1988), Math. Comp. 51, 699–706, the same
 * recursion over the rationals.
 *
 * @param derivative - m ≥ 0
 * @param nodes - distinct positions, more than m of them
 * @param at - where the derivative is wanted (default 0)
 * @returns the exact weights, one per node
 * @example exactWeights(1, [-2, -1, 0, 1, 2]).map(String) // ['1/12', '-2/3', '0', '2/3', '-1/12']
 */
export function exactWeights(
  derivative: number,
  nodes: readonly RationalInput[],
  at: RationalInput = 0,
): Rational[] {
  checkDerivative(derivative);
  const x = nodes.map((v) => Rational.from(v));
  const z = Rational.from(at);
  checkCount(derivative, x.length);
  for (let i = 0; i < x.length; i++) {
    for (let j = i + 1; j < x.length; j++) {
      if (x[i].equals(x[j])) throw new DuplicateNodesError(i, j, x[i].toString());
    }
  }
  return exactTable(derivative, x, z)[derivative];
}

/**
 * Throws DuplicateNodesError on the first repeated position (sorted scan, O(N log N)).
 *
 * @internal
 */
export function checkDistinctNumbers(nodes: ArrayLike<number>): void {
  const idx = Array.from({ length: nodes.length }, (_, i) => i);
  idx.sort((a, b) => (nodes[a] as number) - (nodes[b] as number));
  for (let k = 1; k < idx.length; k++) {
    const a = idx[k - 1];
    const b = idx[k];
    if (nodes[a] === nodes[b]) throw new DuplicateNodesError(Math.min(a, b), Math.max(a, b), String(nodes[a]));
  }
}
