/**
 * Strided kernels that apply a stencil along a 1-D array. No checks, no
 * allocation: the public wrappers in ../apply.ts validate first.
 *
 * @module
 */

/**
 * out[i] = s · Σₖ w[k] · u[i + o[k]] for i = lo … hi − 1 (node indices).
 * Element i of u is `u[ou + i·su]`, of out `out[oo + i·so]`.
 */
export function applyWeights(
  lo: number, hi: number, w: Float64Array, o: Int32Array, s: number,
  u: Float64Array, su: number, ou: number,
  out: Float64Array, so: number, oo: number,
): Float64Array {
  const width = w.length;
  let iu = ou + lo * su;
  let io = oo + lo * so;
  for (let i = lo; i < hi; i++) {
    let acc = 0;
    for (let k = 0; k < width; k++) acc += w[k] * u[iu + o[k] * su];
    out[io] = s * acc;
    iu += su;
    io += so;
  }
  return out;
}

/**
 * out[i] = Σₖ rows[(i − lo)·width + k] · u[i + o[k]] for i = lo … hi − 1:
 * one row of weights per node (a stretched axis).
 */
export function applyRows(
  lo: number, hi: number, rows: Float64Array, o: Int32Array,
  u: Float64Array, su: number, ou: number,
  out: Float64Array, so: number, oo: number,
): Float64Array {
  const width = o.length;
  let iu = ou + lo * su;
  let io = oo + lo * so;
  let r = 0;
  for (let i = lo; i < hi; i++) {
    let acc = 0;
    for (let k = 0; k < width; k++) acc += rows[r + k] * u[iu + o[k] * su];
    out[io] = acc;
    iu += su;
    io += so;
    r += width;
  }
  return out;
}
