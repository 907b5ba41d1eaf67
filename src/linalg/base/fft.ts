/**
 * Fast Fourier transforms of lengths 2ᵃ·3ᵇ·5ᶜ and the discrete sine
 * transform built on them, for the sine-transform solver. No checks, no
 * allocation after the plan is made.
 *
 * Powers of 2 take the in-place iterative decimation-in-time Cooley–Tukey
 * algorithm in radix-4 stages (Cooley, J. W. & Tukey, J. W. (1965). An
 * algorithm for the machine calculation of complex Fourier series. Math.
 * Comp. 19, 297–301), with a bit-reversal table and twiddle tables made once
 * per length; other lengths the self-sorting mixed-radix form
 * ({@link fftMixed}). Accuracy: the error of a length-M transform grows like
 * ε·log M·‖x‖ (a fact of the trade for Cooley–Tukey with accurate
 * twiddles).
 *
 * The DST-I of x₁ … x_{N−1}, N even (and a length {@link fftPlan} takes),
 *
 *   S_k = Σ_{j=1}^{N−1} x_j sin(π j k / N),  k = 1 … N − 1,
 *
 * takes one real DFT of length N (not 2N, the odd extension): with
 * x₀ = x_N = 0 and
 *
 *   y_j = sin(πj/N)·(x_j + x_{N−j}) + ½(x_j − x_{N−j}),  j = 0 … N − 1,
 *
 * R_k = Σ y_j cos(2πjk/N) and I_k = Σ y_j sin(2πjk/N) give
 * S_{2k} = I_k, S₁ = R₀/2 and S_{2k+1} = S_{2k−1} + R_k (the symmetric part
 * of y carries the odd-index terms through 2 sin A cos B = sin(A + B) −
 * sin(A − B), the antisymmetric part the even ones). Two real rows share one
 * complex FFT (z = y + i·y′, Y_k = (Z_k + conj Z_{N−k})/2,
 * Y′_k = (Z_k − conj Z_{N−k})/(2i)). The running sum adds an error of about
 * ε·√N relative. The DST-I is its own inverse up to the factor 2/N.
 * Source: Press, W. H. et al. (2007). Numerical Recipes, 3rd ed.,
 * Cambridge, §12.3 (two real transforms in one complex one, real FFTs) and
 * §12.4 (the sine transform by this pre-processing); the identities are
 * re-derived in the comments of {@link dst2}.
 *
 * @module
 * @internal
 */
import { InvalidOptionError } from '../../errors.js';

/** One pass of the mixed-radix FFT (see {@link fftMixed}). @internal */
export interface MixedStage {
  /** Radix of the pass: 2, 3, 4 or 5. */
  readonly radix: number;
  /** Stride s: the product of the radices of the passes before. */
  readonly s: number;
  /** m = n/radix, n the sub-transform length at this pass (M/s). */
  readonly m: number;
  /** cos and −sin of 2πpk/n for p = 0 … m − 1, k = 1 … radix − 1 (2(radix − 1) per p). */
  readonly twiddles: Float64Array;
}

/** Tables of one FFT length. @internal */
export interface FftPlan {
  /** Transform length M: a power of 2, or a product of 2, 3 and 5. */
  readonly m: number;
  /** Powers of 2: the bit-reversed index of every position (empty otherwise). */
  readonly reverse: Int32Array;
  /** Powers of 2: whether log₂M is odd; then a length-2 stage comes before the radix-4 stages. */
  readonly oddStage: boolean;
  /**
   * Powers of 2: twiddles of the radix-4 stages with twiddles (quarter length
   * h ≥ 2), stage after stage, six per k = 0 … h − 1: cos and −sin of 2πk/4h,
   * 2·2πk/4h, 3·2πk/4h.
   */
  readonly twiddles: Float64Array;
  /** Other lengths: the passes of the self-sorting mixed-radix FFT; undefined for powers of 2. */
  readonly stages: readonly MixedStage[] | undefined;
  /** Other lengths: the second buffer the passes alternate with (real and imaginary parts). */
  readonly spareRe: Float64Array;
  readonly spareIm: Float64Array;
}

/** Whether m ≥ 1 has no prime factor other than 2, 3 and 5, the lengths {@link fftPlan} takes. @internal */
export function fftLength(m: number): boolean {
  if (!Number.isSafeInteger(m) || m < 1) return false;
  for (const f of [2, 3, 5]) while (m % f === 0) m /= f;
  return m === 1;
}

/** The tables for length m (a power of 2 with m ≥ 2, or any m ≥ 2 with {@link fftLength}). @internal */
export function fftPlan(m: number): FftPlan {
  if (!(m >= 2 && fftLength(m))) throw new InvalidOptionError('length', `no FFT plan for ${m}: give m ≥ 2 with no prime factor but 2, 3 and 5`);
  if ((m & (m - 1)) !== 0) return mixedPlan(m);
  let bits = 0;
  while ((1 << bits) < m) bits++;
  const reverse = new Int32Array(m);
  for (let i = 0; i < m; i++) {
    let r = 0;
    for (let b = 0; b < bits; b++) if (i & (1 << b)) r |= 1 << (bits - 1 - b);
    reverse[i] = r;
  }
  const oddStage = (bits & 1) === 1;
  const count: number[] = [];
  for (let h = oddStage ? 2 : 4; 4 * h <= m; h *= 4) count.push(h);
  const twiddles = new Float64Array(6 * count.reduce((a, b) => a + b, 0));
  let o = 0;
  for (const h of count) {
    for (let k = 0; k < h; k++) {
      for (let q = 1; q <= 3; q++) {
        const t = (2 * Math.PI * q * k) / (4 * h);
        twiddles[o++] = Math.cos(t);
        twiddles[o++] = -Math.sin(t);
      }
    }
  }
  const none = new Float64Array(0);
  return { m, reverse, oddStage, twiddles, stages: undefined, spareRe: none, spareIm: none };
}

function mixedPlan(m: number): FftPlan {
  // radices: 4s first, then a 2, then 3s and 5s
  const radices: number[] = [];
  let rest = m;
  while (rest % 4 === 0) {
    radices.push(4);
    rest /= 4;
  }
  if (rest % 2 === 0) {
    radices.push(2);
    rest /= 2;
  }
  for (const f of [3, 5]) {
    while (rest % f === 0) {
      radices.push(f);
      rest /= f;
    }
  }
  const stages: MixedStage[] = [];
  let n = m;
  let s = 1;
  for (const radix of radices) {
    const sub = n / radix;
    const twiddles = new Float64Array(2 * (radix - 1) * sub);
    let o = 0;
    for (let p = 0; p < sub; p++) {
      for (let k = 1; k < radix; k++) {
        const t = (2 * Math.PI * p * k) / n;
        twiddles[o++] = Math.cos(t);
        twiddles[o++] = -Math.sin(t);
      }
    }
    stages.push({ radix, s, m: sub, twiddles });
    n = sub;
    s *= radix;
  }
  return {
    m, reverse: new Int32Array(0), oddStage: false, twiddles: new Float64Array(0), stages,
    spareRe: new Float64Array(m), spareIm: new Float64Array(m),
  };
}

/**
 * In-place forward DFT Z_k = Σ_j z_j e^{−2πi jk/M} of (re, im), length M
 * of the plan.
 */
export function fft(p: FftPlan, re: Float64Array, im: Float64Array): void {
  if (p.stages !== undefined) {
    fftMixed(p, re, im);
    return;
  }
  const { m, reverse } = p;
  for (let i = 0; i < m; i++) {
    const j = reverse[i];
    if (j > i) {
      const tr = re[i];
      re[i] = re[j];
      re[j] = tr;
      const ti = im[i];
      im[i] = im[j];
      im[j] = ti;
    }
  }
  fftReversed(p, re, im);
}

/**
 * The butterflies of {@link fft} on input already in bit-reversed order.
 * Decimation in time, two radix-2 stages (halves h and 2h) at a time as one
 * radix-4 stage: with a₀ … a₃ = z at s + k, s + k + h, s + k + 2h, s + k + 3h
 * and w = e^{−2πik/4h},
 *
 *   A₁ = w²a₁, A₂ = wa₂, A₃ = w³a₃, b± = a₀ ± A₁, c± = A₂ ± A₃,
 *   z ← b₊ + c₊, b₋ − i·c₋, b₊ − c₊, b₋ + i·c₋,
 *
 * which is the two radix-2 stages with W_{2h}^k = w² and W_{4h}^{k+h} =
 * −i·w multiplied out (three complex products instead of four, half the
 * passes). A length-2 stage comes first when log₂M is odd. Source: the
 * radix-4 decimation-in-time butterfly, a fact of the trade (e.g. Van Loan,
 * C. (1992). Computational Frameworks for the Fast Fourier Transform.
 * SIAM, §1.4 and §2.3).
 */
function fftReversed(p: FftPlan, re: Float64Array, im: Float64Array): void {
  const { m, twiddles } = p;
  let h: number;
  if (p.oddStage) {
    for (let i = 0; i < m; i += 2) {
      const ar = re[i];
      const ai = im[i];
      const br = re[i + 1];
      const bi = im[i + 1];
      re[i] = ar + br;
      im[i] = ai + bi;
      re[i + 1] = ar - br;
      im[i + 1] = ai - bi;
    }
    h = 2;
  } else {
    // h = 1: every twiddle is 1
    for (let i = 0; i < m; i += 4) {
      const a0r = re[i];
      const a0i = im[i];
      const a1r = re[i + 1];
      const a1i = im[i + 1];
      const a2r = re[i + 2];
      const a2i = im[i + 2];
      const a3r = re[i + 3];
      const a3i = im[i + 3];
      const bpr = a0r + a1r;
      const bpi = a0i + a1i;
      const bmr = a0r - a1r;
      const bmi = a0i - a1i;
      const cpr = a2r + a3r;
      const cpi = a2i + a3i;
      const cmr = a2r - a3r;
      const cmi = a2i - a3i;
      re[i] = bpr + cpr;
      im[i] = bpi + cpi;
      re[i + 1] = bmr + cmi;
      im[i + 1] = bmi - cmr;
      re[i + 2] = bpr - cpr;
      im[i + 2] = bpi - cpi;
      re[i + 3] = bmr - cmi;
      im[i + 3] = bmi + cmr;
    }
    h = 4;
  }
  for (let o = 0; 4 * h <= m; o += 6 * h, h *= 4) {
    const span = 4 * h;
    for (let s = 0; s < m; s += span) {
      for (let k = 0, t = o; k < h; k++, t += 6) {
        const w1r = twiddles[t];
        const w1i = twiddles[t + 1];
        const w2r = twiddles[t + 2];
        const w2i = twiddles[t + 3];
        const w3r = twiddles[t + 4];
        const w3i = twiddles[t + 5];
        const i0 = s + k;
        const i1 = i0 + h;
        const i2 = i1 + h;
        const i3 = i2 + h;
        const a0r = re[i0];
        const a0i = im[i0];
        let xr = re[i1];
        let xi = im[i1];
        const A1r = w2r * xr - w2i * xi;
        const A1i = w2r * xi + w2i * xr;
        xr = re[i2];
        xi = im[i2];
        const A2r = w1r * xr - w1i * xi;
        const A2i = w1r * xi + w1i * xr;
        xr = re[i3];
        xi = im[i3];
        const A3r = w3r * xr - w3i * xi;
        const A3i = w3r * xi + w3i * xr;
        const bpr = a0r + A1r;
        const bpi = a0i + A1i;
        const bmr = a0r - A1r;
        const bmi = a0i - A1i;
        const cpr = A2r + A3r;
        const cpi = A2i + A3i;
        const cmr = A2r - A3r;
        const cmi = A2i - A3i;
        re[i0] = bpr + cpr;
        im[i0] = bpi + cpi;
        re[i1] = bmr + cmi;
        im[i1] = bmi - cmr;
        re[i2] = bpr - cpr;
        im[i2] = bpi - cpi;
        re[i3] = bmr - cmi;
        im[i3] = bmi + cmr;
      }
    }
  }
}

/**
 * The forward DFT of {@link fft} for lengths with factors 2, 3 and 5: the
 * self-sorting (Stockham) form of Cooley–Tukey, which needs no digit
 * reversal. A pass of radix r on sub-transforms of length n = r·m at stride
 * s maps x to y by
 *
 *   y[q + s(rp + k)] = w_n^{pk} · Σ_{j<r} ω_r^{jk} · x[q + s(p + jm)],
 *   p < m, q < s, k < r, w_n = e^{−2πi/n}, ω_r = e^{−2πi/r},
 *
 * which is decimation in frequency: the r outputs of each p are the length-r
 * DFT of its inputs, turned by the twiddles. The passes alternate between
 * (re, im) and the plan's spare buffer; the result is copied back when it
 * ends in the spare. The radix-3 and radix-5 DFTs take the symmetric and
 * antisymmetric sums of inputs j and r − j (2 cos·sums and 2 sin·differences
 * per pair). Accuracy as for the power-of-2 path, ε·log M·‖x‖. Source:
 * Van Loan, C. (1992). Computational Frameworks for the Fast Fourier
 * Transform. SIAM, §1.7 (the Stockham framework) and §2.3 (radix-p
 * butterflies); the small-DFT identities are a fact of the trade.
 *
 * @internal
 */
export function fftMixed(p: FftPlan, re: Float64Array, im: Float64Array): void {
  let xr = re;
  let xi = im;
  let yr = p.spareRe;
  let yi = p.spareIm;
  for (const st of p.stages!) {
    if (st.radix === 4) pass4(st, xr, xi, yr, yi);
    else if (st.radix === 2) pass2(st, xr, xi, yr, yi);
    else if (st.radix === 3) pass3(st, xr, xi, yr, yi);
    else pass5(st, xr, xi, yr, yi);
    const tr = xr;
    const ti = xi;
    xr = yr;
    xi = yi;
    yr = tr;
    yi = ti;
  }
  if (xr !== re) {
    re.set(xr);
    im.set(xi);
  }
}

function pass2(st: MixedStage, xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
  const { s, m, twiddles: w } = st;
  for (let p = 0; p < m; p++) {
    const w1r = w[2 * p];
    const w1i = w[2 * p + 1];
    const i0 = s * p;
    const i1 = s * (p + m);
    const o0 = s * 2 * p;
    const o1 = o0 + s;
    for (let q = 0; q < s; q++) {
      const ar = xr[i0 + q];
      const ai = xi[i0 + q];
      const br = xr[i1 + q];
      const bi = xi[i1 + q];
      yr[o0 + q] = ar + br;
      yi[o0 + q] = ai + bi;
      const dr = ar - br;
      const di = ai - bi;
      yr[o1 + q] = w1r * dr - w1i * di;
      yi[o1 + q] = w1r * di + w1i * dr;
    }
  }
}

function pass4(st: MixedStage, xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
  const { s, m, twiddles: w } = st;
  for (let p = 0; p < m; p++) {
    const t = 6 * p;
    const w1r = w[t];
    const w1i = w[t + 1];
    const w2r = w[t + 2];
    const w2i = w[t + 3];
    const w3r = w[t + 4];
    const w3i = w[t + 5];
    const i0 = s * p;
    const i1 = s * (p + m);
    const i2 = s * (p + 2 * m);
    const i3 = s * (p + 3 * m);
    const o0 = s * 4 * p;
    const o1 = o0 + s;
    const o2 = o1 + s;
    const o3 = o2 + s;
    for (let q = 0; q < s; q++) {
      const a0r = xr[i0 + q];
      const a0i = xi[i0 + q];
      const a1r = xr[i1 + q];
      const a1i = xi[i1 + q];
      const a2r = xr[i2 + q];
      const a2i = xi[i2 + q];
      const a3r = xr[i3 + q];
      const a3i = xi[i3 + q];
      // y_k = Σ a_j (−i)^{jk}
      const s02r = a0r + a2r;
      const s02i = a0i + a2i;
      const d02r = a0r - a2r;
      const d02i = a0i - a2i;
      const s13r = a1r + a3r;
      const s13i = a1i + a3i;
      const d13r = a1r - a3r;
      const d13i = a1i - a3i;
      yr[o0 + q] = s02r + s13r;
      yi[o0 + q] = s02i + s13i;
      // y1 = d02 − i·d13, y3 = d02 + i·d13, y2 = s02 − s13
      const y1r = d02r + d13i;
      const y1i = d02i - d13r;
      const y2r = s02r - s13r;
      const y2i = s02i - s13i;
      const y3r = d02r - d13i;
      const y3i = d02i + d13r;
      yr[o1 + q] = w1r * y1r - w1i * y1i;
      yi[o1 + q] = w1r * y1i + w1i * y1r;
      yr[o2 + q] = w2r * y2r - w2i * y2i;
      yi[o2 + q] = w2r * y2i + w2i * y2r;
      yr[o3 + q] = w3r * y3r - w3i * y3i;
      yi[o3 + q] = w3r * y3i + w3i * y3r;
    }
  }
}

const SIN3 = Math.sqrt(3) / 2;

function pass3(st: MixedStage, xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
  const { s, m, twiddles: w } = st;
  for (let p = 0; p < m; p++) {
    const t = 4 * p;
    const w1r = w[t];
    const w1i = w[t + 1];
    const w2r = w[t + 2];
    const w2i = w[t + 3];
    const i0 = s * p;
    const i1 = s * (p + m);
    const i2 = s * (p + 2 * m);
    const o0 = s * 3 * p;
    const o1 = o0 + s;
    const o2 = o1 + s;
    for (let q = 0; q < s; q++) {
      const a0r = xr[i0 + q];
      const a0i = xi[i0 + q];
      const tr = xr[i1 + q] + xr[i2 + q];
      const ti = xi[i1 + q] + xi[i2 + q];
      const dr = xr[i1 + q] - xr[i2 + q];
      const di = xi[i1 + q] - xi[i2 + q];
      yr[o0 + q] = a0r + tr;
      yi[o0 + q] = a0i + ti;
      // y1,2 = a0 − t/2 ∓ i·(√3/2)·d
      const mr = a0r - 0.5 * tr;
      const mi = a0i - 0.5 * ti;
      const nr = SIN3 * di;
      const ni = -SIN3 * dr;
      const y1r = mr + nr;
      const y1i = mi + ni;
      const y2r = mr - nr;
      const y2i = mi - ni;
      yr[o1 + q] = w1r * y1r - w1i * y1i;
      yi[o1 + q] = w1r * y1i + w1i * y1r;
      yr[o2 + q] = w2r * y2r - w2i * y2i;
      yi[o2 + q] = w2r * y2i + w2i * y2r;
    }
  }
}

const C5A = Math.cos((2 * Math.PI) / 5);
const C5B = Math.cos((4 * Math.PI) / 5);
const S5A = Math.sin((2 * Math.PI) / 5);
const S5B = Math.sin((4 * Math.PI) / 5);

function pass5(st: MixedStage, xr: Float64Array, xi: Float64Array, yr: Float64Array, yi: Float64Array): void {
  const { s, m, twiddles: w } = st;
  for (let p = 0; p < m; p++) {
    const t = 8 * p;
    const i0 = s * p;
    const i1 = s * (p + m);
    const i2 = s * (p + 2 * m);
    const i3 = s * (p + 3 * m);
    const i4 = s * (p + 4 * m);
    const o0 = s * 5 * p;
    for (let q = 0; q < s; q++) {
      const a0r = xr[i0 + q];
      const a0i = xi[i0 + q];
      const t1r = xr[i1 + q] + xr[i4 + q];
      const t1i = xi[i1 + q] + xi[i4 + q];
      const t2r = xr[i2 + q] + xr[i3 + q];
      const t2i = xi[i2 + q] + xi[i3 + q];
      const t3r = xr[i1 + q] - xr[i4 + q];
      const t3i = xi[i1 + q] - xi[i4 + q];
      const t4r = xr[i2 + q] - xr[i3 + q];
      const t4i = xi[i2 + q] - xi[i3 + q];
      yr[o0 + q] = a0r + t1r + t2r;
      yi[o0 + q] = a0i + t1i + t2i;
      // y1,4 = b1 ∓ i·d1, y2,3 = b2 ∓ i·d2
      const b1r = a0r + C5A * t1r + C5B * t2r;
      const b1i = a0i + C5A * t1i + C5B * t2i;
      const b2r = a0r + C5B * t1r + C5A * t2r;
      const b2i = a0i + C5B * t1i + C5A * t2i;
      const d1r = S5A * t3r + S5B * t4r;
      const d1i = S5A * t3i + S5B * t4i;
      const d2r = S5B * t3r - S5A * t4r;
      const d2i = S5B * t3i - S5A * t4i;
      // −i·d = (d_i, −d_r)
      const y1r = b1r + d1i;
      const y1i = b1i - d1r;
      const y4r = b1r - d1i;
      const y4i = b1i + d1r;
      const y2r = b2r + d2i;
      const y2i = b2i - d2r;
      const y3r = b2r - d2i;
      const y3i = b2i + d2r;
      let o = o0 + s + q;
      yr[o] = w[t] * y1r - w[t + 1] * y1i;
      yi[o] = w[t] * y1i + w[t + 1] * y1r;
      o += s;
      yr[o] = w[t + 2] * y2r - w[t + 3] * y2i;
      yi[o] = w[t + 2] * y2i + w[t + 3] * y2r;
      o += s;
      yr[o] = w[t + 4] * y3r - w[t + 5] * y3i;
      yi[o] = w[t + 4] * y3i + w[t + 5] * y3r;
      o += s;
      yr[o] = w[t + 6] * y4r - w[t + 7] * y4i;
      yi[o] = w[t + 6] * y4i + w[t + 7] * y4r;
    }
  }
}

/** Tables of one DST-I length: the FFT of length N and sin(πj/N). @internal */
export interface DstPlan {
  /** The FFT of length N. */
  readonly fft: FftPlan;
  /** sin(πj/N), j = 0 … N − 1. */
  readonly half: Float64Array;
  /** The identity permutation 0 … N − 1 (where the mixed-radix FFT takes its input). */
  readonly natural: Int32Array;
}

/** The tables of the DST-I of N − 1 values (N ≥ 2 even, with {@link fftLength}). @internal */
export function dstPlan(n: number): DstPlan {
  const half = new Float64Array(n);
  for (let j = 0; j < n; j++) half[j] = Math.sin((Math.PI * j) / n);
  const fftp = fftPlan(n);
  return { fft: fftp, half, natural: fftp.stages === undefined ? new Int32Array(0) : Int32Array.from({ length: n }, (_, j) => j) };
}

/**
 * DST-I (module formula) of two sequences of N − 1 values at once:
 * x_j = u[ou + (j − 1)·su], x′_j = v[ov + (j − 1)·sv], j = 1 … N − 1; the
 * transforms overwrite them in place. `re` and `im` are scratch of length N.
 */
export function dst2(
  p: DstPlan, re: Float64Array, im: Float64Array,
  u: Float64Array, ou: number, su: number, v: Float64Array, ov: number, sv: number,
): void {
  const n = p.fft.m;
  const s = p.half;
  const h = n >> 1;
  // y_j and y_{N−j} together: sin(πj/N) is the same for both, the antisymmetric half flips sign;
  // written straight to their bit-reversed places, so the FFT needs no permutation pass
  // natural order for the mixed-radix FFT, which sorts itself
  const rev = p.fft.stages === undefined ? p.fft.reverse : p.natural;
  re[0] = 0;
  im[0] = 0;
  for (let j = 1; j <= h; j++) {
    const a = u[ou + (j - 1) * su];
    const b = u[ou + (n - j - 1) * su]; // x_{N−j}; for j = N/2 it is x_j itself, and y_j = 2x_j
    const c = v[ov + (j - 1) * sv];
    const d = v[ov + (n - j - 1) * sv];
    const sj = s[j];
    const rj = rev[j];
    re[rj] = sj * (a + b) + 0.5 * (a - b);
    im[rj] = sj * (c + d) + 0.5 * (c - d);
    if (j < h) {
      const rk = rev[n - j];
      re[rk] = sj * (a + b) - 0.5 * (a - b);
      im[rk] = sj * (c + d) - 0.5 * (c - d);
    }
  }
  if (p.fft.stages === undefined) fftReversed(p.fft, re, im);
  else fftMixed(p.fft, re, im);
  // Y_k = R_k − i·I_k (forward sign) from Z: Re Y = (Re Z_k + Re Z_{N−k})/2, Im Y = (Im Z_k − Im Z_{N−k})/2;
  // Re Y′ = (Im Z_k + Im Z_{N−k})/2, Im Y′ = −(Re Z_k − Re Z_{N−k})/2
  // k = 0: R₀ = Re Z₀ (y), Im Z₀ (y′); S₁ = R₀/2
  let oddU = 0.5 * re[0];
  let oddV = 0.5 * im[0];
  u[ou] = oddU;
  v[ov] = oddV;
  for (let k = 1; k < h; k++) {
    const zr = re[k];
    const zi = im[k];
    const wr = re[n - k];
    const wi = im[n - k];
    const ru = 0.5 * (zr + wr); // R_k of y
    const iu = -0.5 * (zi - wi); // I_k of y
    const rv = 0.5 * (zi + wi); // R_k of y′
    const iv = 0.5 * (zr - wr); // I_k of y′
    // S_{2k} at element 2k − 1, S_{2k+1} at element 2k
    u[ou + (2 * k - 1) * su] = iu;
    v[ov + (2 * k - 1) * sv] = iv;
    oddU += ru;
    oddV += rv;
    u[ou + 2 * k * su] = oddU;
    v[ov + 2 * k * sv] = oddV;
  }
}
