/**
 * One implicit step of a 1-D scheme whose explicit part E and implicit part
 * K are both tridiagonal, fused: the right-hand side r = E·u + b is formed
 * inside the forward sweep of the elimination for K, and the back
 * substitution follows, in place. Two passes over the data instead of four.
 * No checks, no allocation in the step kernels.
 *
 * Two kernels:
 *
 * - {@link fusedTridiagonalStep}: the plain Thomas algorithm, one
 *   elimination from the top row down.
 * - {@link twistedTridiagonalStep}: a twisted ("burn at both ends")
 *   factorisation that eliminates from the top and from the bottom towards a
 *   middle row k, so that two independent recurrences run interleaved in one
 *   loop. Each row's update y ← r/p − m·y is a multiply and a subtract on
 *   the dependency chain, and two chains overlap, so the sweep costs about a
 *   quarter of the latency of the plain (r − a·y)·inv recurrence. E's
 *   diagonals are scaled by the pivots once, at set-up, and stored
 *   interleaved with them, so the forward sweep reads one coefficient stream
 *   per side (plus u, and b when it is not zero) instead of six.
 *
 * Sources: Golub, G. H. & Van Loan, C. F. (2013). Matrix Computations, 4th
 * ed., Johns Hopkins, §4.3 (banded and tridiagonal LU); twisted
 * factorisations: Meurant, G. (1992). A review on the inverse of symmetric
 * tridiagonal and block tridiagonal matrices. SIAM J. Matrix Anal. Appl.
 * 13(3), 707–728 (cited from memory). Stability without pivoting for
 * diagonally dominant matrices: Higham, N. J. (2002). Accuracy and Stability
 * of Numerical Algorithms, 2nd ed., SIAM, §9.5.
 *
 * @module
 */

/**
 * u ← K⁻¹(E·u + b), K factored as in `factorTridiagonal` (a: sub-diagonal,
 * inv: 1/pivots, ratio: super/pivot); E given by its three diagonals.
 */
export function fusedTridiagonalStep(
  n: number,
  es: Float64Array, ed: Float64Array, eu: Float64Array, b: Float64Array,
  a: Float64Array, inv: Float64Array, ratio: Float64Array,
  u: Float64Array,
): void {
  if (n === 0) return;
  let prevOld = 0; // u[i − 1] before this step
  let cur = u[0];
  let y = 0;
  for (let i = 0; i < n - 1; i++) {
    const next = u[i + 1];
    const r = es[i] * prevOld + ed[i] * cur + eu[i] * next + b[i];
    y = (r - a[i] * y) * inv[i];
    u[i] = y;
    prevOld = cur;
    cur = next;
  }
  const last = n - 1;
  y = (es[last] * prevOld + ed[last] * cur + b[last] - a[last] * y) * inv[last];
  u[last] = y;
  for (let i = n - 2; i >= 0; i--) u[i] -= ratio[i] * u[i + 1];
}

/**
 * A twisted factorisation of a tridiagonal K (sub-diagonal aᵢ, diagonal dᵢ,
 * super-diagonal cᵢ) with E's three diagonals (σᵢ, εᵢ, τᵢ), made once per
 * step size by {@link planTwistedStep} and used by
 * {@link twistedTridiagonalStep}.
 *
 * With the middle row k = ⌊(n − 1)/2⌋ and pᵢ the pivot of row i:
 *
 * - top rows i < k: pᵢ = βᵢ = dᵢ − aᵢ·cᵢ₋₁/βᵢ₋₁ (β₀ = d₀), mᵢ = aᵢ/βᵢ,
 *   `ratio[i]` = cᵢ/βᵢ;
 * - bottom rows i > k: pᵢ = δᵢ = dᵢ − cᵢ·aᵢ₊₁/δᵢ₊₁ (δₙ₋₁ = dₙ₋₁),
 *   mᵢ = cᵢ/δᵢ, `ratio[i]` = aᵢ/δᵢ;
 * - the middle row: pₖ = γₖ = dₖ − aₖ·cₖ₋₁/βₖ₋₁ − cₖ·aₖ₊₁/δₖ₊₁,
 *   mₖ = aₖ/γₖ, `mk2` = cₖ/γₖ.
 *
 * `coef[5i … 5i + 4]` = [σᵢ/pᵢ, εᵢ/pᵢ, τᵢ/pᵢ, 1/pᵢ, mᵢ] (each a product by the
 * rounded 1/pᵢ).
 */
export interface TwistedPlan {
  readonly n: number;
  /** The middle row k = ⌊(n − 1)/2⌋. */
  readonly k: number;
  /** Interleaved forward coefficients, 5 per row (above). */
  readonly coef: Float64Array;
  /** The back-substitution multipliers, 1 per row (above). */
  readonly ratio: Float64Array;
  /** cₖ/γₖ. */
  readonly mk2: number;
}

/**
 * Builds the twisted factorisation of K (see {@link TwistedPlan}).
 * Allocates; call once per step size. A pivot |β|, |δ| or |γ| ≤
 * 8ε·(|aᵢ| + |dᵢ| + |cᵢ|) — the threshold of `factorTridiagonal` — is taken
 * as zero and the plan is refused (`undefined`): the caller then keeps the
 * plain Thomas path, whose own check reports a singular K. For a
 * diagonally dominant K (the θ-method's K = M/dt − θS is an M-matrix) every
 * pivot of either elimination is at least the row's dominance margin, so
 * the plan is refused only where the plain factorisation is doubtful too.
 *
 * @param es - E's sub-diagonal (index 0 unused)
 * @param ed - E's diagonal
 * @param eu - E's super-diagonal (index n − 1 unused)
 * @param sub - K's sub-diagonal aᵢ (index 0 unused)
 * @param diag - K's diagonal dᵢ
 * @param sup - K's super-diagonal cᵢ (index n − 1 unused)
 * @returns the plan, or `undefined` when a pivot vanishes
 */
export function planTwistedStep(
  es: ArrayLike<number>, ed: ArrayLike<number>, eu: ArrayLike<number>,
  sub: ArrayLike<number>, diag: ArrayLike<number>, sup: ArrayLike<number>,
): TwistedPlan | undefined {
  const n = diag.length;
  const k = n > 0 ? (n - 1) >> 1 : 0;
  const coef = new Float64Array(5 * n);
  const ratio = new Float64Array(n);
  const A = (i: number): number => (i > 0 ? sub[i] : 0);
  const C = (i: number): number => (i < n - 1 ? sup[i] : 0);
  const S = (i: number): number => (i > 0 ? es[i] : 0);
  const U = (i: number): number => (i < n - 1 ? eu[i] : 0);
  const tiny = (p: number, i: number): boolean =>
    !(Math.abs(p) > 8 * Number.EPSILON * (Math.abs(A(i)) + Math.abs(diag[i]) + Math.abs(C(i))));
  const store = (i: number, pivot: number, mult: number): void => {
    const inv = 1 / pivot;
    coef[5 * i] = S(i) * inv;
    coef[5 * i + 1] = ed[i] * inv;
    coef[5 * i + 2] = U(i) * inv;
    coef[5 * i + 3] = inv;
    coef[5 * i + 4] = mult / pivot;
  };
  let mk2 = 0;
  if (n > 0) {
    let prev = 0; // cᵢ₋₁/βᵢ₋₁
    for (let i = 0; i < k; i++) {
      const beta = diag[i] - A(i) * prev;
      if (tiny(beta, i)) return undefined;
      store(i, beta, A(i));
      ratio[i] = C(i) / beta;
      prev = ratio[i];
    }
    let next = 0; // aᵢ₊₁/δᵢ₊₁
    for (let i = n - 1; i > k; i--) {
      const delta = diag[i] - C(i) * next;
      if (tiny(delta, i)) return undefined;
      store(i, delta, C(i));
      ratio[i] = A(i) / delta;
      next = ratio[i];
    }
    const gamma = diag[k] - A(k) * prev - C(k) * next;
    if (tiny(gamma, k)) return undefined;
    store(k, gamma, A(k));
    mk2 = C(k) / gamma;
  }
  return { n, k, coef, ratio, mk2 };
}

/**
 * u ← K⁻¹(E·u + b) with the twisted factorisation `p`, in place.
 *
 * Forward from both ends at once, with E's diagonals already divided by the
 * pivot: yᵢ = (σᵢ/βᵢ)uᵢ₋₁ + (εᵢ/βᵢ)uᵢ + (τᵢ/βᵢ)uᵢ₊₁ + bᵢ/βᵢ − (aᵢ/βᵢ)·yᵢ₋₁
 * (top), zᵢ the same with δᵢ and − (cᵢ/δᵢ)·zᵢ₊₁ (bottom); the middle row
 * xₖ = rₖ/γₖ − (aₖ/γₖ)·yₖ₋₁ − (cₖ/γₖ)·zₖ₊₁; then back substitution outwards,
 * xᵢ = yᵢ − (cᵢ/βᵢ)·xᵢ₊₁ (i < k) and xᵢ = zᵢ − (aᵢ/δᵢ)·xᵢ₋₁ (i > k).
 * About 5n multiplies and 4n adds forward, n + n back. Rounding differs from
 * the plain Thomas step by the order of evaluation (the scaling by 1/pᵢ
 * moves into the coefficients): backward stable for diagonally dominant K
 * (Higham §9.5), agreement with it to a few ε·cond(K) relative to the
 * magnitudes in E·u. Deterministic: the same plan and input give the same
 * bits.
 *
 * @param p - the plan from {@link planTwistedStep}
 * @param b - the data part of the right-hand side, length n
 * @param bZero - whether every bᵢ is +0 or −0 (then b is not read)
 * @param u - uⁿ in, uⁿ⁺¹ out, length n
 * @returns Σᵢ uⁿ⁺¹ᵢ (in the order of the back substitution), for the
 *   caller's blow-up check without another pass: NaN or ±∞ in u makes it
 *   non-finite
 */
export function twistedTridiagonalStep(p: TwistedPlan, b: Float64Array, bZero: boolean, u: Float64Array): number {
  const n = p.n;
  if (n === 0) return 0;
  const k = p.k;
  const c = p.coef;
  const ratio = p.ratio;
  let tPrev = 0; // old u(j − 1), top side
  let tCur = u[0]; // old u(j)
  let y = 0;
  let bNext = 0; // old u(i + 1), bottom side
  let bCur = u[n - 1]; // old u(i)
  let z = 0;
  if (bZero) {
    for (let j = 0; j < k; j++) {
      const next = u[j + 1];
      const q = 5 * j;
      y = c[q] * tPrev + c[q + 1] * tCur + c[q + 2] * next - c[q + 4] * y;
      u[j] = y;
      tPrev = tCur;
      tCur = next;
      const i = n - 1 - j;
      const prev = u[i - 1];
      const w = 5 * i;
      z = c[w] * prev + c[w + 1] * bCur + c[w + 2] * bNext - c[w + 4] * z;
      u[i] = z;
      bNext = bCur;
      bCur = prev;
    }
  } else {
    for (let j = 0; j < k; j++) {
      const next = u[j + 1];
      const q = 5 * j;
      y = c[q] * tPrev + c[q + 1] * tCur + c[q + 2] * next + b[j] * c[q + 3] - c[q + 4] * y;
      u[j] = y;
      tPrev = tCur;
      tCur = next;
      const i = n - 1 - j;
      const prev = u[i - 1];
      const w = 5 * i;
      z = c[w] * prev + c[w + 1] * bCur + c[w + 2] * bNext + b[i] * c[w + 3] - c[w + 4] * z;
      u[i] = z;
      bNext = bCur;
      bCur = prev;
    }
  }
  const even = n - 1 - k > k; // one more bottom row (k + 1) than top rows
  if (even) {
    const i = k + 1;
    const prev = u[k];
    const w = 5 * i;
    z = c[w] * prev + c[w + 1] * bCur + c[w + 2] * bNext + b[i] * c[w + 3] - c[w + 4] * z;
    u[i] = z;
    bNext = bCur;
  }
  // the middle row: old u(k − 1), u(k), u(k + 1) are tPrev, tCur, bNext
  const w = 5 * k;
  const xk = c[w] * tPrev + c[w + 1] * tCur + c[w + 2] * bNext + b[k] * c[w + 3] - c[w + 4] * y - p.mk2 * z;
  u[k] = xk;
  let xt = xk;
  let xb = xk;
  let st = xk; // two partial sums, off the recurrences' chains
  let sb = 0;
  if (even) {
    xb = u[k + 1] - ratio[k + 1] * xk;
    u[k + 1] = xb;
    sb = xb;
  }
  for (let j = k - 1; j >= 0; j--) {
    xt = u[j] - ratio[j] * xt;
    u[j] = xt;
    st += xt;
    const i = n - 1 - j;
    xb = u[i] - ratio[i] * xb;
    u[i] = xb;
    sb += xb;
  }
  return st + sb;
}
