/**
 * Strided copies of 0-D to 3-D views. No checks, no allocation: the public
 * wrappers in ../field.ts validate first. Element (i, j, k) of `a` is
 * `a[oa + i·sa0 + j·sa1 + k·sa2]`.
 *
 * @module
 */

/** out[i] = a[i] for i = 0 … n0 − 1. */
export function copy1(
  n0: number,
  a: Float64Array, sa0: number, oa: number,
  out: Float64Array, so0: number, oo: number,
): Float64Array {
  let ia = oa;
  let io = oo;
  for (let i = 0; i < n0; i++) {
    out[io] = a[ia];
    ia += sa0;
    io += so0;
  }
  return out;
}

/** out[i, j] = a[i, j], j fastest. */
export function copy2(
  n0: number, n1: number,
  a: Float64Array, sa0: number, sa1: number, oa: number,
  out: Float64Array, so0: number, so1: number, oo: number,
): Float64Array {
  for (let i = 0; i < n0; i++) {
    let ia = oa + i * sa0;
    let io = oo + i * so0;
    for (let j = 0; j < n1; j++) {
      out[io] = a[ia];
      ia += sa1;
      io += so1;
    }
  }
  return out;
}

/** out[i, j, k] = a[i, j, k], k fastest. */
export function copy3(
  n0: number, n1: number, n2: number,
  a: Float64Array, sa0: number, sa1: number, sa2: number, oa: number,
  out: Float64Array, so0: number, so1: number, so2: number, oo: number,
): Float64Array {
  for (let i = 0; i < n0; i++) {
    for (let j = 0; j < n1; j++) {
      let ia = oa + i * sa0 + j * sa1;
      let io = oo + i * so0 + j * so1;
      for (let k = 0; k < n2; k++) {
        out[io] = a[ia];
        ia += sa2;
        io += so2;
      }
    }
  }
  return out;
}
