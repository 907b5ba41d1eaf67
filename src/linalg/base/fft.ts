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
  /** cos(2πk/M), k = 0 … M/2 − 1. */
  readonly cos: Float64Array;
  /** sin(2πk/M), k = 0 … M/2 − 1. */
  readonly sin: Float64Array;
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
  const half = m >> 1;
  const cos = new Float64Array(half);
  const sin = new Float64Array(half);
  for (let k = 0; k < half; k++) {
    cos[k] = Math.cos((2 * Math.PI * k) / m);
    sin[k] = Math.sin((2 * Math.PI * k) / m);
  }
  return { m, reverse, cos, sin };
}

/**
 * In-place forward DFT Z_k = Σ_j z_j e^{−2πi jk/M} of (re, im), length M
 * of the plan.
 */
export function fft(p: FftPlan, re: Float64Array, im: Float64Array): void {
  const { m, reverse, cos, sin } = p;
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
  // length-2 butterflies first: no twiddles
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
  for (let len = 4; len <= m; len <<= 1) {
    const h = len >> 1;
    const step = m / len;
    for (let s = 0; s < m; s += len) {
      for (let k = 0, t = 0; k < h; k++, t += step) {
        const wr = cos[t];
        const wi = -sin[t];
        const a = s + k;
        const b = a + h;
        const xr = re[b] * wr - im[b] * wi;
        const xi = re[b] * wi + im[b] * wr;
        re[b] = re[a] - xr;
        im[b] = im[a] - xi;
        re[a] += xr;
        im[a] += xi;
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
  // y_j and y_{N−j} together: sin(πj/N) is the same for both, the antisymmetric half flips sign
  re[0] = 0;
  im[0] = 0;
  for (let j = 1; j <= h; j++) {
    const a = u[ou + (j - 1) * su];
    const b = u[ou + (n - j - 1) * su]; // x_{N−j}; for j = N/2 it is x_j itself, and y_j = 2x_j
    const c = v[ov + (j - 1) * sv];
    const d = v[ov + (n - j - 1) * sv];
    const sj = s[j];
    re[j] = sj * (a + b) + 0.5 * (a - b);
    im[j] = sj * (c + d) + 0.5 * (c - d);
    if (j < h) {
      re[n - j] = sj * (a + b) - 0.5 * (a - b);
      im[n - j] = sj * (c + d) - 0.5 * (c - d);
    }
  }
  fft(p.fft, re, im);
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
