/**
 * Straight-line Gauss–Seidel and residual loops over runs of rows that are
 * one stencil shifted: row i of a run holds w[k] at column i + off[k]
 * (offsets ascending, off[d] = 0 the diagonal, off[d − 1] = −1 and
 * off[d + 1] = +1), for the stencil sizes of node-centred grids: 3 (1-D),
 * 5 and 9 (2-D five-point and its Galerkin coarse form), 7 and 27 (3-D).
 * Every size has the same four loops, written out in full.
 *
 * Why straight-line: V8 re-checks a typed array on every pass of an inner
 * loop, and a loop over a row's handful of entries pays that per entry; with
 * the weights and offsets in locals a row costs its multiply-adds only, and
 * reads x and b but no matrix storage (the CSR form of the same sweep reads
 * 12 bytes per entry). Why the neighbour at −1 (+1 going backward) comes
 * last: it is the value the previous row just wrote, so keeping it in a
 * register and subtracting it last leaves one multiply and one subtraction
 * on the loop-carried dependency chain instead of the whole row.
 *
 * Each forward loop computes xᵢ = (bᵢ − Σ_{k≠d} w_k x_{i+off[k]}) / w_d in
 * ascending i, each backward loop the same in descending i; the zero-start
 * forward loop drops the terms k > d (x is taken as 0 beyond row i, whatever
 * it holds); the residual loop writes rᵢ = bᵢ − Σ_k w_k x_{i+off[k]}, and
 * the upper loop rᵢ = −Σ_{k>d} w_k x_{i+off[k]}, which is the residual
 * right after a zero-start forward sweep (that sweep makes (L + D)x = b
 * hold, so b − Ax = −Ux). No checks, no allocation. Source of the method: Saad, Y. (2003). Iterative
 * Methods for Sparse Linear Systems, 2nd ed., SIAM, §4.1.
 *
 * @module
 * @internal
 */

/** Forward Gauss–Seidel over rows s0 … e0 − 1 of a 3-entry stencil run. */
export function forward3(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o2 = off[2];
  const w2 = w[2];
  const c = w[0] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w2 * x[i + o2]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Forward Gauss–Seidel from x = 0 over rows s0 … e0 − 1 of a 3-entry stencil run (lower entries only). */
export function forwardZero3(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const c = w[0] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Backward Gauss–Seidel over rows e0 − 1 … s0 of a 3-entry stencil run. */
export function backward3(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const c = w[2] * dinv;
  let next = x[e0];
  for (let i = e0 - 1; i >= s0; i--) {
    next = (b[i] - w0 * x[i + o0]) * dinv - c * next;
    x[i] = next;
  }
}

/** r = b − A x over rows s0 … e0 − 1 of a 3-entry stencil run. */
export function residual3(s0: number, e0: number, off: Int32Array, w: Float64Array, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  for (let i = s0; i < e0; i++) {
    r[i] = b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2];
  }
}

/** Forward Gauss–Seidel over rows s0 … e0 − 1 of a 5-entry stencil run. */
export function forward5(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const c = w[1] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w3 * x[i + o3] - w4 * x[i + o4]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Forward Gauss–Seidel from x = 0 over rows s0 … e0 − 1 of a 5-entry stencil run (lower entries only). */
export function forwardZero5(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const c = w[1] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Backward Gauss–Seidel over rows e0 − 1 … s0 of a 5-entry stencil run. */
export function backward5(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o4 = off[4];
  const w4 = w[4];
  const c = w[3] * dinv;
  let next = x[e0];
  for (let i = e0 - 1; i >= s0; i--) {
    next = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w4 * x[i + o4]) * dinv - c * next;
    x[i] = next;
  }
}

/** r = b − A x over rows s0 … e0 − 1 of a 5-entry stencil run. */
export function residual5(s0: number, e0: number, off: Int32Array, w: Float64Array, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  for (let i = s0; i < e0; i++) {
    r[i] = b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4];
  }
}

/** Forward Gauss–Seidel over rows s0 … e0 − 1 of a 7-entry stencil run. */
export function forward7(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const c = w[2] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Forward Gauss–Seidel from x = 0 over rows s0 … e0 − 1 of a 7-entry stencil run (lower entries only). */
export function forwardZero7(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const c = w[2] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Backward Gauss–Seidel over rows e0 − 1 … s0 of a 7-entry stencil run. */
export function backward7(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const c = w[4] * dinv;
  let next = x[e0];
  for (let i = e0 - 1; i >= s0; i--) {
    next = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w5 * x[i + o5] - w6 * x[i + o6]) * dinv - c * next;
    x[i] = next;
  }
}

/** r = b − A x over rows s0 … e0 − 1 of a 7-entry stencil run. */
export function residual7(s0: number, e0: number, off: Int32Array, w: Float64Array, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  for (let i = s0; i < e0; i++) {
    r[i] = b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6];
  }
}

/** Forward Gauss–Seidel over rows s0 … e0 − 1 of a 9-entry stencil run. */
export function forward9(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const c = w[3] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Forward Gauss–Seidel from x = 0 over rows s0 … e0 − 1 of a 9-entry stencil run (lower entries only). */
export function forwardZero9(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const c = w[3] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Backward Gauss–Seidel over rows e0 − 1 … s0 of a 9-entry stencil run. */
export function backward9(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const c = w[5] * dinv;
  let next = x[e0];
  for (let i = e0 - 1; i >= s0; i--) {
    next = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8]) * dinv - c * next;
    x[i] = next;
  }
}

/** r = b − A x over rows s0 … e0 − 1 of a 9-entry stencil run. */
export function residual9(s0: number, e0: number, off: Int32Array, w: Float64Array, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  for (let i = s0; i < e0; i++) {
    r[i] = b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8];
  }
}

/** Forward Gauss–Seidel over rows s0 … e0 − 1 of a 27-entry stencil run. */
export function forward27(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const o9 = off[9];
  const w9 = w[9];
  const o10 = off[10];
  const w10 = w[10];
  const o11 = off[11];
  const w11 = w[11];
  const o14 = off[14];
  const w14 = w[14];
  const o15 = off[15];
  const w15 = w[15];
  const o16 = off[16];
  const w16 = w[16];
  const o17 = off[17];
  const w17 = w[17];
  const o18 = off[18];
  const w18 = w[18];
  const o19 = off[19];
  const w19 = w[19];
  const o20 = off[20];
  const w20 = w[20];
  const o21 = off[21];
  const w21 = w[21];
  const o22 = off[22];
  const w22 = w[22];
  const o23 = off[23];
  const w23 = w[23];
  const o24 = off[24];
  const w24 = w[24];
  const o25 = off[25];
  const w25 = w[25];
  const o26 = off[26];
  const w26 = w[26];
  const c = w[12] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8] - w9 * x[i + o9] - w10 * x[i + o10] - w11 * x[i + o11] - w14 * x[i + o14] - w15 * x[i + o15] - w16 * x[i + o16] - w17 * x[i + o17] - w18 * x[i + o18] - w19 * x[i + o19] - w20 * x[i + o20] - w21 * x[i + o21] - w22 * x[i + o22] - w23 * x[i + o23] - w24 * x[i + o24] - w25 * x[i + o25] - w26 * x[i + o26]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Forward Gauss–Seidel from x = 0 over rows s0 … e0 − 1 of a 27-entry stencil run (lower entries only). */
export function forwardZero27(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const o9 = off[9];
  const w9 = w[9];
  const o10 = off[10];
  const w10 = w[10];
  const o11 = off[11];
  const w11 = w[11];
  const c = w[12] * dinv;
  let prev = x[s0 - 1];
  for (let i = s0; i < e0; i++) {
    prev = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8] - w9 * x[i + o9] - w10 * x[i + o10] - w11 * x[i + o11]) * dinv - c * prev;
    x[i] = prev;
  }
}

/** Backward Gauss–Seidel over rows e0 − 1 … s0 of a 27-entry stencil run. */
export function backward27(s0: number, e0: number, off: Int32Array, w: Float64Array, dinv: number, b: Float64Array, x: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const o9 = off[9];
  const w9 = w[9];
  const o10 = off[10];
  const w10 = w[10];
  const o11 = off[11];
  const w11 = w[11];
  const o12 = off[12];
  const w12 = w[12];
  const o15 = off[15];
  const w15 = w[15];
  const o16 = off[16];
  const w16 = w[16];
  const o17 = off[17];
  const w17 = w[17];
  const o18 = off[18];
  const w18 = w[18];
  const o19 = off[19];
  const w19 = w[19];
  const o20 = off[20];
  const w20 = w[20];
  const o21 = off[21];
  const w21 = w[21];
  const o22 = off[22];
  const w22 = w[22];
  const o23 = off[23];
  const w23 = w[23];
  const o24 = off[24];
  const w24 = w[24];
  const o25 = off[25];
  const w25 = w[25];
  const o26 = off[26];
  const w26 = w[26];
  const c = w[14] * dinv;
  let next = x[e0];
  for (let i = e0 - 1; i >= s0; i--) {
    next = (b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8] - w9 * x[i + o9] - w10 * x[i + o10] - w11 * x[i + o11] - w12 * x[i + o12] - w15 * x[i + o15] - w16 * x[i + o16] - w17 * x[i + o17] - w18 * x[i + o18] - w19 * x[i + o19] - w20 * x[i + o20] - w21 * x[i + o21] - w22 * x[i + o22] - w23 * x[i + o23] - w24 * x[i + o24] - w25 * x[i + o25] - w26 * x[i + o26]) * dinv - c * next;
    x[i] = next;
  }
}

/** r = b − A x over rows s0 … e0 − 1 of a 27-entry stencil run. */
export function residual27(s0: number, e0: number, off: Int32Array, w: Float64Array, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const o0 = off[0];
  const w0 = w[0];
  const o1 = off[1];
  const w1 = w[1];
  const o2 = off[2];
  const w2 = w[2];
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  const o9 = off[9];
  const w9 = w[9];
  const o10 = off[10];
  const w10 = w[10];
  const o11 = off[11];
  const w11 = w[11];
  const o12 = off[12];
  const w12 = w[12];
  const o13 = off[13];
  const w13 = w[13];
  const o14 = off[14];
  const w14 = w[14];
  const o15 = off[15];
  const w15 = w[15];
  const o16 = off[16];
  const w16 = w[16];
  const o17 = off[17];
  const w17 = w[17];
  const o18 = off[18];
  const w18 = w[18];
  const o19 = off[19];
  const w19 = w[19];
  const o20 = off[20];
  const w20 = w[20];
  const o21 = off[21];
  const w21 = w[21];
  const o22 = off[22];
  const w22 = w[22];
  const o23 = off[23];
  const w23 = w[23];
  const o24 = off[24];
  const w24 = w[24];
  const o25 = off[25];
  const w25 = w[25];
  const o26 = off[26];
  const w26 = w[26];
  for (let i = s0; i < e0; i++) {
    r[i] = b[i] - w0 * x[i + o0] - w1 * x[i + o1] - w2 * x[i + o2] - w3 * x[i + o3] - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8] - w9 * x[i + o9] - w10 * x[i + o10] - w11 * x[i + o11] - w12 * x[i + o12] - w13 * x[i + o13] - w14 * x[i + o14] - w15 * x[i + o15] - w16 * x[i + o16] - w17 * x[i + o17] - w18 * x[i + o18] - w19 * x[i + o19] - w20 * x[i + o20] - w21 * x[i + o21] - w22 * x[i + o22] - w23 * x[i + o23] - w24 * x[i + o24] - w25 * x[i + o25] - w26 * x[i + o26];
  }
}

/** r = −U x (the entries right of the diagonal) over rows s0 … e0 − 1 of a 3-entry stencil run. */
export function upper3(s0: number, e0: number, off: Int32Array, w: Float64Array, x: Float64Array, r: Float64Array): void {
  const o2 = off[2];
  const w2 = w[2];
  for (let i = s0; i < e0; i++) {
    r[i] = - w2 * x[i + o2];
  }
}

/** r = −U x (the entries right of the diagonal) over rows s0 … e0 − 1 of a 5-entry stencil run. */
export function upper5(s0: number, e0: number, off: Int32Array, w: Float64Array, x: Float64Array, r: Float64Array): void {
  const o3 = off[3];
  const w3 = w[3];
  const o4 = off[4];
  const w4 = w[4];
  for (let i = s0; i < e0; i++) {
    r[i] = - w3 * x[i + o3] - w4 * x[i + o4];
  }
}

/** r = −U x (the entries right of the diagonal) over rows s0 … e0 − 1 of a 7-entry stencil run. */
export function upper7(s0: number, e0: number, off: Int32Array, w: Float64Array, x: Float64Array, r: Float64Array): void {
  const o4 = off[4];
  const w4 = w[4];
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  for (let i = s0; i < e0; i++) {
    r[i] = - w4 * x[i + o4] - w5 * x[i + o5] - w6 * x[i + o6];
  }
}

/** r = −U x (the entries right of the diagonal) over rows s0 … e0 − 1 of a 9-entry stencil run. */
export function upper9(s0: number, e0: number, off: Int32Array, w: Float64Array, x: Float64Array, r: Float64Array): void {
  const o5 = off[5];
  const w5 = w[5];
  const o6 = off[6];
  const w6 = w[6];
  const o7 = off[7];
  const w7 = w[7];
  const o8 = off[8];
  const w8 = w[8];
  for (let i = s0; i < e0; i++) {
    r[i] = - w5 * x[i + o5] - w6 * x[i + o6] - w7 * x[i + o7] - w8 * x[i + o8];
  }
}

/** r = −U x (the entries right of the diagonal) over rows s0 … e0 − 1 of a 27-entry stencil run. */
export function upper27(s0: number, e0: number, off: Int32Array, w: Float64Array, x: Float64Array, r: Float64Array): void {
  const o14 = off[14];
  const w14 = w[14];
  const o15 = off[15];
  const w15 = w[15];
  const o16 = off[16];
  const w16 = w[16];
  const o17 = off[17];
  const w17 = w[17];
  const o18 = off[18];
  const w18 = w[18];
  const o19 = off[19];
  const w19 = w[19];
  const o20 = off[20];
  const w20 = w[20];
  const o21 = off[21];
  const w21 = w[21];
  const o22 = off[22];
  const w22 = w[22];
  const o23 = off[23];
  const w23 = w[23];
  const o24 = off[24];
  const w24 = w[24];
  const o25 = off[25];
  const w25 = w[25];
  const o26 = off[26];
  const w26 = w[26];
  for (let i = s0; i < e0; i++) {
    r[i] = - w14 * x[i + o14] - w15 * x[i + o15] - w16 * x[i + o16] - w17 * x[i + o17] - w18 * x[i + o18] - w19 * x[i + o19] - w20 * x[i + o20] - w21 * x[i + o21] - w22 * x[i + o22] - w23 * x[i + o23] - w24 * x[i + o24] - w25 * x[i + o25] - w26 * x[i + o26];
  }
}
