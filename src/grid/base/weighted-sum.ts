/**
 * Tensor-product weighted sums Σ wx[i]·wy[j]·wz[k]·f[i, j, k] over strided
 * 1-D to 3-D views. No checks, no allocation: ../integrate.ts validates
 * first. Element (i, j, k) of `f` is `f[of + i·s0 + j·s1 + k·s2]`.
 *
 * The sum is nested, innermost axis first, so the round-off grows with
 * nx + ny + nz rather than with nx·ny·nz.
 *
 * @module
 */

/** Σᵢ wx[i]·f[i]. */
export function weightedSum1(
  nx: number, wx: Float64Array,
  f: Float64Array, s0: number, of: number,
): number {
  let acc = 0;
  let idx = of;
  for (let i = 0; i < nx; i++) {
    acc += wx[i] * f[idx];
    idx += s0;
  }
  return acc;
}

/** Σᵢ wx[i]·Σⱼ wy[j]·f[i, j]. */
export function weightedSum2(
  nx: number, ny: number, wx: Float64Array, wy: Float64Array,
  f: Float64Array, s0: number, s1: number, of: number,
): number {
  let acc = 0;
  for (let i = 0; i < nx; i++) {
    let row = 0;
    let idx = of + i * s0;
    for (let j = 0; j < ny; j++) {
      row += wy[j] * f[idx];
      idx += s1;
    }
    acc += wx[i] * row;
  }
  return acc;
}

/** Σᵢ wx[i]·Σⱼ wy[j]·Σₖ wz[k]·f[i, j, k]. */
export function weightedSum3(
  nx: number, ny: number, nz: number, wx: Float64Array, wy: Float64Array, wz: Float64Array,
  f: Float64Array, s0: number, s1: number, s2: number, of: number,
): number {
  let acc = 0;
  for (let i = 0; i < nx; i++) {
    let plane = 0;
    for (let j = 0; j < ny; j++) {
      let line = 0;
      let idx = of + i * s0 + j * s1;
      for (let k = 0; k < nz; k++) {
        line += wz[k] * f[idx];
        idx += s2;
      }
      plane += wy[j] * line;
    }
    acc += wx[i] * plane;
  }
  return acc;
}
