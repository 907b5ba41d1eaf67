/**
 * Shared test support for the operator stage: an independent CSR product,
 * the round-off check of matrix-free apply against it, the closure rule of
 * the derivative rows (restated from the documentation, not imported), and
 * smooth test functions with their exact derivatives and Taylor tails.
 *
 * Round-off bound used throughout: a sum of n products computed in float64
 * in any order differs from the exact sum by at most γₙ·Σ|aᵢ||xᵢ|,
 * γₙ = nε/(1 − nε) ≈ nε (Higham, N. J. (2002). Accuracy and Stability of
 * Numerical Algorithms, 2nd ed., SIAM, §3.1). Two such sums of the same
 * terms in different orders therefore differ by at most ≈ 2nε·Σ|aᵢ||xᵢ|.
 */
import { observedOrders as studyOrders } from '../support/solve.js';
import { expect } from 'vitest';
import type { CsrMatrix, Grid, Operator } from '../../src/index.js';

export { SEED, eps, expectCode } from '../grid/helpers.js';
export { mulberry32 } from '../support/prng.js';

const EPS = Number.EPSILON;

/** y = A·x straight from the CSR definition, and the round-off scale (|A|·|x|)ᵣ. */
export function csrApply(m: CsrMatrix, x: ArrayLike<number>): { y: Float64Array; scale: Float64Array } {
  const y = new Float64Array(m.rows);
  const scale = new Float64Array(m.rows);
  for (let r = 0; r < m.rows; r++) {
    let s = 0;
    let a = 0;
    for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) {
      const v = m.values[q]! * x[m.colIdx[q]!]!;
      s += v;
      a += Math.abs(v);
    }
    y[r] = s;
    scale[r] = a;
  }
  return { y, scale };
}

/** The most stored entries in any row. */
export function maxRowNnz(m: CsrMatrix): number {
  let w = 0;
  for (let r = 0; r < m.rows; r++) w = Math.max(w, m.rowPtr[r + 1]! - m.rowPtr[r]!);
  return w;
}

/** A CSR matrix from a dense array, zeros left out (`cols` for a matrix with no rows). */
export function csrFromDense(d: number[][], cols = d[0]?.length ?? 0): CsrMatrix {
  const ptr = [0];
  const ci: number[] = [];
  const v: number[] = [];
  for (const row of d) {
    row.forEach((x, c) => {
      if (x !== 0) {
        ci.push(c);
        v.push(x);
      }
    });
    ptr.push(ci.length);
  }
  return { rows: d.length, cols, rowPtr: Int32Array.from(ptr), colIdx: Int32Array.from(ci), values: Float64Array.from(v) };
}

/** Dense copy of a small CSR matrix, for independent checks. */
export function toDense(m: CsrMatrix): number[][] {
  const d = Array.from({ length: m.rows }, () => new Array<number>(m.cols).fill(0));
  for (let r = 0; r < m.rows; r++) {
    for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) d[r]![m.colIdx[q]!]! += m.values[q]!;
  }
  return d;
}

/** Uniform values in [−1, 1) from a seeded generator. */
export function randomVector(rng: () => number, n: number): Float64Array {
  return Float64Array.from({ length: n }, () => 2 * rng() - 1);
}

/**
 * Checks op.apply(x) against the CSR product on a few seeded random x.
 *
 * Bound per row: |apply − csr| ≤ k·ε·scaleᵣ with k = 2·(nnz + 2) — two sums
 * of at most nnz terms in different orders (Higham 2002, §3.1), plus one
 * rounding of a scale factor each. `scale` defaults to (|A|·|x|)ᵣ; composite
 * operators whose matrix-free path multiplies factor by factor pass the
 * product of the factors' absolute values instead, and `terms` the total
 * number of products along that path.
 */
export function expectApplyMatchesCsr(
  op: Operator, rng: () => number,
  options: { scale?: (x: Float64Array) => Float64Array; terms?: number; trials?: number } = {},
): void {
  const m = op.matrix;
  const k = 2 * ((options.terms ?? maxRowNnz(m)) + 2);
  for (let t = 0; t < (options.trials ?? 2); t++) {
    const x = randomVector(rng, op.cols);
    const got = op.apply(x);
    const { y, scale } = csrApply(m, x);
    const s = options.scale?.(x) ?? scale;
    let worst = 0;
    for (let r = 0; r < op.rows; r++) {
      const lim = k * EPS * s[r]!;
      const d = Math.abs(got[r]! - y[r]!);
      if (!(d <= lim)) worst = Math.max(worst, d / Math.max(lim, Number.MIN_VALUE));
      expect(Number.isFinite(got[r]!)).toBe(true);
    }
    expect(worst, 'largest |apply − csr| / bound over rows').toBe(0);
  }
}

/** log₂(eₕ / e_{h/2}) for successive entries of a refinement sequence. */
export function observedOrders(errors: readonly number[]): number[] {
  return studyOrders(errors);
}

/**
 * Interior window [lo, hi] of derivative m at accuracy p, restated from the
 * documented closure rule: the centred stencil for even p (half-width
 * ⌊(m + 1)/2⌋ − 1 + p/2, the smallest centred set of that accuracy:
 * Fornberg 1988, Table 1), and for odd p the m + p offsets centred as nearly
 * as possible with the extra node on the + side.
 */
export function interiorWindow(m: number, p: number): [number, number] {
  if (p % 2 === 0) {
    const hw = Math.floor((m + 1) / 2) - 1 + p / 2;
    return [-hw, hw];
  }
  const n = m + p;
  const lo = -Math.floor((n - 1) / 2);
  return [lo, lo + n - 1];
}

/** Whether node i of n uses the interior window (else a closure of m + p nodes from the boundary). */
export function isInterior(i: number, n: number, m: number, p: number): boolean {
  const [lo, hi] = interiorWindow(m, p);
  return i + lo >= 0 && i + hi <= n - 1;
}

/** Node indices (i, j, k) of unknown r on a grid (x slowest). */
export function nodeIndex(g: Grid, r: number): number[] {
  const idx = new Array<number>(g.dimension).fill(0);
  for (let d = g.dimension - 1; d >= 0; d--) {
    idx[d] = r % g.shape[d]!;
    r = Math.floor(r / g.shape[d]!);
  }
  return idx;
}

/**
 * A plane-wave exponential f(x) = Im exp(Σ_d z_d·x_d + iφ), z_d complex:
 * sin(ωx + φ) is z = iω; e^{ax}·sin(bx + φ) is z = a + ib. Every derivative
 * is again of this form, ∂^α f = Im(Π z_d^{α_d} · exp(…)), which gives exact
 * derivatives and Taylor tails in closed form.
 */
export interface Wave {
  /** One complex rate [re, im] per axis. */
  readonly z: ReadonlyArray<readonly [number, number]>;
  /** The phase φ. */
  readonly phase: number;
}

function cmul(a: readonly [number, number], b: readonly [number, number]): [number, number] {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}

function cexpOf(w: Wave, x: readonly number[]): [number, number] {
  let re = 0;
  let im = w.phase;
  for (let d = 0; d < x.length; d++) {
    re += w.z[d]![0] * x[d]!;
    im += w.z[d]![1] * x[d]!;
  }
  const e = Math.exp(re);
  return [e * Math.cos(im), e * Math.sin(im)];
}

/** ∂^α f at x, α one derivative order per axis (all zero: f itself). */
export function waveDerivative(w: Wave, alpha: readonly number[], x: readonly number[]): number {
  let c: [number, number] = [1, 0];
  for (let d = 0; d < alpha.length; d++) for (let k = 0; k < alpha[d]!; k++) c = cmul(c, w.z[d]!);
  return cmul(c, cexpOf(w, x))[1];
}

/** e^{ζ(c)} = exp(Σ_d z_d·c_d + iφ) as [re, im]: the factor of every derivative of f at c. */
export function waveFactor(w: Wave, c: readonly number[]): [number, number] {
  return cexpOf(w, c);
}

/**
 * The Taylor tail of f about c: f(c + t) − (its Taylor polynomial of total
 * degree N − 1 about c) = Im(e^{ζ(c)}·Σ_{k≥N} sᵏ/k!), s = Σ_d z_d·t_d,
 * summed from the series itself, so it carries a few ulps of relative error
 * however small it is (no cancellation against the polynomial). `factor` is
 * waveFactor(w, c).
 */
export function waveTail(w: Wave, n: number, factor: readonly [number, number], t: readonly number[]): number {
  let sr = 0;
  let si = 0;
  for (let d = 0; d < t.length; d++) {
    sr += w.z[d]![0] * t[d]!;
    si += w.z[d]![1] * t[d]!;
  }
  // term = sⁿ/n!
  let tr = 1;
  let ti = 0;
  for (let k = 1; k <= n; k++) {
    const a = (tr * sr - ti * si) / k;
    ti = (tr * si + ti * sr) / k;
    tr = a;
  }
  let ar = 0;
  let ai = 0;
  for (let k = n; k < n + 80; k++) {
    ar += tr;
    ai += ti;
    if (Math.abs(tr) + Math.abs(ti) <= 1e-18 * (Math.abs(ar) + Math.abs(ai))) break;
    const a = (tr * sr - ti * si) / (k + 1);
    ti = (tr * si + ti * sr) / (k + 1);
    tr = a;
  }
  return factor[0] * ai + factor[1] * ar;
}

/**
 * Truncation error of every row of a grid operator A, free of the rounding
 * of sampled data.
 *
 * If every row of A is exact on polynomials of degree ≤ N − 1 in each
 * coordinate (test (a) of derivative.test.ts), then for row r at node c,
 * (A f)ᵣ − (Lf)(c) = (A R)ᵣ − (LR)(c) with R = f − T, T the Taylor polynomial
 * of total degree N − 1 of f about c; and (LR)(c) = 0 when L has order < N,
 * since R vanishes to order N at c. So the row's truncation error is
 * Σ_q a_rq·R(x_q), with |R(x_q)| ≈ |s|ᴺ/N! tiny across the window: the
 * rounding of samples of f (≈ ε·Σ|a|·|f|, which grows like h⁻ᵐ) drops out
 * and only the relative rounding of this short sum remains. This is the
 * identity behind test/stencil/convergence.test.ts, applied to each
 * assembled row. Column coordinates are unwrapped to the image nearest the
 * row's node on periodic axes.
 */
export function tailRowErrors(g: Grid, m: CsrMatrix, w: Wave, n: number): Float64Array {
  const out = new Float64Array(m.rows);
  const dim = g.dimension;
  const shape = g.shape;
  const c = new Array<number>(dim).fill(0);
  const t = new Array<number>(dim).fill(0);
  const ri = new Array<number>(dim).fill(0);
  for (let r = 0; r < m.rows; r++) {
    let rest = r;
    for (let d = dim - 1; d >= 0; d--) {
      ri[d] = rest % shape[d]!;
      rest = (rest - ri[d]!) / shape[d]!;
      c[d] = g.axes[d]!.coordinates[ri[d]!]!;
    }
    const factor = waveFactor(w, c);
    let s = 0;
    for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) {
      let col = m.colIdx[q]!;
      for (let d = dim - 1; d >= 0; d--) {
        const j = col % shape[d]!;
        col = (col - j) / shape[d]!;
        const a = g.axes[d]!;
        let dt = a.coordinates[j]! - c[d]!;
        if (a.periodic) {
          const period = a.to - a.from;
          if (dt > period / 2) dt -= period;
          else if (dt < -period / 2) dt += period;
        }
        t[d] = dt;
      }
      s += m.values[q]! * waveTail(w, n, factor, t);
    }
    out[r] = s;
  }
  return out;
}
