/**
 * Applying a stencil to samples on a 1-D axis: uniform spacing, or a
 * stretched axis with one row of Fornberg weights per node.
 *
 * @module
 */
import ndarray, { type NdArray } from 'ndarray';
import { checkAllFinite, checkFinite, checkSpacing } from '../check.js';
import { NonFiniteValueError, NonIncreasingNodesError, ShapeMismatchError, TooFewNodesError } from '../errors.js';
import { applyRows, applyWeights } from './base/apply.js';
import { fornbergTable } from './fornberg.js';
import type { Stencil } from './stencil.js';

/** 1-D samples: a plain Float64Array, or a 1-D ndarray view over one. */
export type Samples = Float64Array | NdArray<Float64Array>;

interface View {
  n: number;
  data: Float64Array;
  stride: number;
  offset: number;
}

function view(name: string, a: Samples): View {
  if (a instanceof Float64Array) return { n: a.length, data: a, stride: 1, offset: 0 };
  if (a.shape.length !== 1) {
    throw new ShapeMismatchError(`${name} has shape [${a.shape.join(', ')}]; a 1-D array is required`);
  }
  return { n: a.shape[0]!, data: a.data, stride: a.stride[0]!, offset: a.offset };
}

function sameKindZeros<T extends Samples>(u: T, n: number): T {
  if (u instanceof Float64Array) return new Float64Array(n) as T;
  return ndarray(new Float64Array(n), [n]) as T;
}

function checkSamples(v: View, lo: number, hi: number, minOff: number, maxOff: number): void {
  if (hi <= lo) return; // the stencil fits nowhere: nothing is read
  for (let i = lo + minOff; i < hi + maxOff; i++) {
    const x = v.data[v.offset + i * v.stride];
    if (!Number.isFinite(x)) throw new NonFiniteValueError(`u[${i}]`, x);
  }
}

/** Interior node range [lo, hi) where every offset stays inside 0…n − 1. */
function interior(st: { offsets: readonly number[] }, n: number): [number, number, number, number] {
  const minOff = st.offsets[0]!;
  const maxOff = st.offsets[st.offsets.length - 1]!;
  const lo = Math.max(0, -minOff);
  const hi = Math.min(n, n - maxOff);
  return [lo, Math.max(lo, hi), minOff, maxOff];
}

/**
 * The stencil's derivative at every node where the whole stencil fits, on a
 * uniform axis of spacing `dx`:
 *
 * out[i] = dx⁻ᵐ Σⱼ wⱼ u[i + oⱼ],  error `leadingError`·dxᵖ·u⁽ᵐ⁺ᵖ⁾ + O(dxᵖ⁺¹).
 *
 * Nodes where the stencil would reach outside the array keep their value in
 * `out` (zero in a new array). Source: see {@link Stencil}.
 *
 * @param st - the stencil
 * @param u - samples at equally spaced nodes (Float64Array or 1-D ndarray)
 * @param dx - spacing (> 0, any unit)
 * @param out - where to write, same length as `u`; a new array of the same kind if absent
 * @returns `out`, or the new array
 * @example Array.from(applyStencil(centralStencil(2, 2), Float64Array.of(0, 1, 4, 9), 1)) // [0, 2, 2, 0]
 */
export function applyStencil<T extends Samples>(st: Stencil, u: T, dx: number, out?: T): T {
  checkSpacing('dx', dx);
  const vu = view('u', u);
  const y = out ?? sameKindZeros(u, vu.n);
  const vy = view('out', y);
  if (vy.n !== vu.n) throw new ShapeMismatchError(`out has ${vy.n} entries but u has ${vu.n}; give arrays of equal length`);
  const [lo, hi, minOff, maxOff] = interior(st, vu.n);
  checkSamples(vu, lo, hi, minOff, maxOff);
  const scale = 1 / dx ** st.derivative;
  checkFinite('dx⁻ᵐ', scale);
  applyWeights(lo, hi, st.weights as Float64Array, Int32Array.from(st.offsets), scale,
    vu.data, vu.stride, vu.offset, vy.data, vy.stride, vy.offset);
  return y;
}

/**
 * Per-node weights of one stencil shape on a stretched axis, ready to apply
 * many times. Row r holds the weights for node `first + r`.
 */
export interface NodeWeights {
  /** The derivative m the weights approximate. */
  readonly derivative: number;
  /** Integer offsets of the stencil, ascending. */
  readonly offsets: Readonly<Int32Array>;
  /** First node with a row. */
  readonly first: number;
  /** One past the last node with a row. */
  readonly end: number;
  /** Number of nodes on the axis. */
  readonly nodes: number;
  /** Row-major weights, (end − first) rows of offsets.length. */
  readonly weights: Readonly<Float64Array>;
}

/**
 * Fornberg weights of the stencil's derivative at every node of a stretched
 * axis where its offsets fit, on the actual coordinates x[i + oⱼ].
 *
 * On a node set of local spacing h the error is O(hᴺ⁻ᵐ) for N offsets; a
 * centred shape recovers its uniform-grid order p where the stretching is
 * smooth (the spacing ratio of neighbours is 1 + O(h)) — a fact of common
 * practice, shown by the stretched-grid tests. Source: Fornberg (1988).
 *
 * @param st - gives the derivative and the offsets; its unit-spacing weights are not used
 * @param x - node coordinates, strictly increasing, finite
 * @returns the weights table
 */
export function nodeWeights(st: Stencil, x: ArrayLike<number>): NodeWeights {
  checkAllFinite('x', x);
  for (let i = 1; i < x.length; i++) {
    if (!((x[i] as number) > (x[i - 1] as number))) throw new NonIncreasingNodesError(i, x[i - 1] as number, x[i] as number);
  }
  const n = x.length;
  const [lo, hi] = interior(st, n);
  const width = st.offsets.length;
  if (n < width) throw new TooFewNodesError(n, width, `a stencil of ${width} offsets`);
  const m = st.derivative;
  const w = new Float64Array((hi - lo) * width);
  const local = new Float64Array(width);
  for (let i = lo; i < hi; i++) {
    for (let k = 0; k < width; k++) local[k] = (x[i + st.offsets[k]!] as number);
    const t = fornbergTable(m, local, x[i] as number);
    w.set(t.subarray(m * width, (m + 1) * width), (i - lo) * width);
  }
  checkAllFinite('weights', w);
  return { derivative: m, offsets: Int32Array.from(st.offsets), first: lo, end: hi, nodes: n, weights: w };
}

/**
 * Applies per-node weights from {@link nodeWeights}:
 * out[i] = Σⱼ W[i][j] · u[i + oⱼ] at nodes `first … end − 1`; other entries
 * of `out` are untouched.
 *
 * @param nw - the weights table
 * @param u - samples on the same axis (length `nw.nodes`)
 * @param out - where to write, same length; a new array of the same kind if absent
 * @returns `out`, or the new array
 */
export function applyNodeWeights<T extends Samples>(nw: NodeWeights, u: T, out?: T): T {
  const vu = view('u', u);
  if (vu.n !== nw.nodes) {
    throw new ShapeMismatchError(`u has ${vu.n} entries but the weights were made for ${nw.nodes} nodes`);
  }
  const y = out ?? sameKindZeros(u, vu.n);
  const vy = view('out', y);
  if (vy.n !== vu.n) throw new ShapeMismatchError(`out has ${vy.n} entries but u has ${vu.n}; give arrays of equal length`);
  const o = nw.offsets as Int32Array;
  checkSamples(vu, nw.first, nw.end, o[0]!, o[o.length - 1]!);
  applyRows(nw.first, nw.end, nw.weights as Float64Array, o,
    vu.data, vu.stride, vu.offset, vy.data, vy.stride, vy.offset);
  return y;
}
