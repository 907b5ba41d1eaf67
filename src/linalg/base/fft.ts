/**
 * Radix-2 fast Fourier transform and the discrete sine transform built on
 * it, for the sine-transform solver. No checks, no allocation after the
 * plan is made.
 *
 * The FFT is the iterative decimation-in-time Cooley–Tukey algorithm
 * (Cooley, J. W. & Tukey, J. W. (1965). An algorithm for the machine
 * calculation of complex Fourier series. Math. Comp. 19, 297–301), with a
 * bit-reversal table and a twiddle table made once per length. Accuracy:
 * the error of a length-M transform grows like ε·log₂M·‖x‖ (a fact of the
 * trade for Cooley–Tukey with accurate twiddles).
 *
 * The DST-I of x₁ … x_{N−1}, N a power of 2,
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

/** Tables of one FFT length. @internal */
export interface FftPlan {
  /** Transform length M, a power of 2. */
  readonly m: number;
  /** Bit-reversed index of every position. */
  readonly reverse: Int32Array;
  /** Whether log₂M is odd: then a length-2 stage comes before the radix-4 stages. */
  readonly oddStage: boolean;
  /**
   * Twiddles of the radix-4 stages with twiddles (quarter length h ≥ 2), stage
   * after stage, six per k = 0 … h − 1: cos and −sin of 2πk/4h, 2·2πk/4h, 3·2πk/4h.
   */
  readonly twiddles: Float64Array;
}

/** The tables for length m (a power of 2, m ≥ 2). @internal */
export function fftPlan(m: number): FftPlan {
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
  return { m, reverse, oddStage, twiddles };
}

/**
 * In-place forward DFT Z_k = Σ_j z_j e^{−2πi jk/M} of (re, im), length M
 * of the plan.
 */
export function fft(p: FftPlan, re: Float64Array, im: Float64Array): void {
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

/** Tables of one DST-I length: the FFT of length N and sin(πj/N). @internal */
export interface DstPlan {
  /** The FFT of length N. */
  readonly fft: FftPlan;
  /** sin(πj/N), j = 0 … N − 1. */
  readonly half: Float64Array;
}

/** The tables of the DST-I of N − 1 values (N a power of 2, N ≥ 2). @internal */
export function dstPlan(n: number): DstPlan {
  const half = new Float64Array(n);
  for (let j = 0; j < n; j++) half[j] = Math.sin((Math.PI * j) / n);
  return { fft: fftPlan(n), half };
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
  const rev = p.fft.reverse;
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
  fftReversed(p.fft, re, im);
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
