/**
 * Operators: linear maps on fields with a matrix-free `apply` and an explicit
 * CSR form.
 *
 * Unknown ordering, used everywhere in quadrille: one unknown per stored grid
 * node, boundary nodes included, in the field's memory order — x slowest,
 * the last axis fastest — so node (i, j, k) of an nx × ny × nz grid is entry
 * (i·ny + j)·nz + k. Boundary conditions never remove nodes: a node with a
 * prescribed value keeps its row, which the boundary stage turns into an
 * identity (constraint) row.
 *
 * @module
 */
import ndarray, { type NdArray } from 'ndarray';
import { NonFiniteValueError, NotSymmetricError, ShapeMismatchError } from '../errors.js';
import { type CsrMatrix, checkCsr, csrIsSymmetric, csrKernel } from './matrix.js';

/** A vector of unknowns: a plain Float64Array, or an ndarray field over one. */
export type Vector = Float64Array | NdArray<Float64Array>;

/** A linear map y = A x between vectors of unknowns. */
export interface Operator {
  /** Number of outputs (rows of A). */
  readonly rows: number;
  /** Number of inputs (columns of A). */
  readonly cols: number;
  /** Field shape of an output (x first); its product is `rows`. */
  readonly shape: readonly number[];
  /** Whether A = Aᵀ exactly, as constructed (not a numerical test). */
  readonly symmetric: boolean;
  /**
   * The explicit CSR form, assembled on first use and then kept. Read it,
   * never write it: an operator without a matrix-free kernel multiplies
   * through these very arrays, and from its second product on through the
   * stencil runs found in them once (rows that are one stencil shifted),
   * which would not see a later change. Copy it to modify, and make a new
   * operator with `fromCsr`.
   */
  readonly matrix: CsrMatrix;
  /**
   * y = A x. `u` has `cols` entries (an ndarray is read in memory order of
   * its shape, x slowest); NaN or infinite entries are refused.
   *
   * @param u - the input; never modified
   * @param out - where to write `rows` entries; a new array of the same kind if absent
   * @returns `out`, or the new array
   */
  apply<T extends Vector>(u: T, out?: T): T;
  /**
   * y = A x on contiguous arrays with no checks and no allocation: the path
   * for hot loops that validated their data once. `x` and `y` must not overlap.
   *
   * @param x - `cols` entries
   * @param y - `rows` entries, overwritten
   */
  kernel(x: Float64Array, y: Float64Array): void;
}

/** What an operator is built from. @internal */
export interface OperatorParts {
  rows: number;
  cols: number;
  shape?: readonly number[];
  symmetric: boolean;
  /** Builds the CSR form; called at most once. */
  build: () => CsrMatrix;
  /** Matrix-free y = A x; defaults to the CSR product. */
  kernel?: (x: Float64Array, y: Float64Array) => void;
}

function isContiguous(a: NdArray<Float64Array>): boolean {
  let s = 1;
  for (let d = a.shape.length - 1; d >= 0; d--) {
    if (a.shape[d]! > 1 && a.stride[d] !== s) return false;
    s *= a.shape[d]!;
  }
  return true;
}

function sizeOf(a: Vector): number {
  return a instanceof Float64Array ? a.length : a.shape.reduce((p, c) => p * c, 1);
}

/** Contiguous view or gathered copy of a vector's entries in memory order. */
function gather(a: Vector): Float64Array {
  if (a instanceof Float64Array) return a;
  const n = sizeOf(a);
  if (isContiguous(a)) return a.data.subarray(a.offset, a.offset + n);
  const out = new Float64Array(n);
  const shape = a.shape;
  const idx = new Array<number>(shape.length).fill(0);
  for (let p = 0; p < n; p++) {
    let off = a.offset;
    for (let d = 0; d < shape.length; d++) off += idx[d]! * a.stride[d]!;
    out[p] = a.data[off]!;
    for (let d = shape.length - 1; d >= 0; d--) {
      if (++idx[d]! < shape[d]!) break;
      idx[d] = 0;
    }
  }
  return out;
}

/** Writes contiguous `src` into the vector `a` in memory order. */
function scatter(src: Float64Array, a: NdArray<Float64Array>): void {
  const shape = a.shape;
  const idx = new Array<number>(shape.length).fill(0);
  for (let p = 0; p < src.length; p++) {
    let off = a.offset;
    for (let d = 0; d < shape.length; d++) off += idx[d]! * a.stride[d]!;
    a.data[off] = src[p]!;
    for (let d = shape.length - 1; d >= 0; d--) {
      if (++idx[d]! < shape[d]!) break;
      idx[d] = 0;
    }
  }
}

/**
 * Throws NonFiniteValueError at the first NaN or infinite entry.
 *
 * @internal
 */
export function checkVectorFinite(what: string, x: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]!)) throw new NonFiniteValueError(`${what}[${i}]`, x[i]!);
  }
}

/**
 * Makes an Operator from its parts. Internal: public builders wrap it.
 *
 * @internal
 */
export function makeOperator(parts: OperatorParts): Operator {
  const { rows, cols, symmetric, build } = parts;
  const shape = Object.freeze([...(parts.shape ?? [rows])]);
  let csr: CsrMatrix | undefined;
  const matrixOf = (): CsrMatrix => (csr ??= build());
  let product: ((x: Float64Array, y: Float64Array) => Float64Array) | undefined;
  const kernel = parts.kernel ?? ((x: Float64Array, y: Float64Array) => void (product ??= csrKernel(matrixOf()))(x, y));
  const op: Operator = {
    rows,
    cols,
    shape,
    symmetric,
    get matrix() {
      return matrixOf();
    },
    kernel,
    apply<T extends Vector>(u: T, out?: T): T {
      const n = sizeOf(u);
      if (n !== cols) {
        throw new ShapeMismatchError(`the input has ${n} entries but the operator takes ${cols}; give one value per unknown`);
      }
      if (out !== undefined && sizeOf(out) !== rows) {
        throw new ShapeMismatchError(`out has ${sizeOf(out)} entries but the operator gives ${rows}`);
      }
      const x = gather(u);
      checkVectorFinite('u', x);
      let y: T;
      if (out !== undefined) y = out;
      else if (u instanceof Float64Array) y = new Float64Array(rows) as T;
      else y = ndarray(new Float64Array(rows), [...shape]) as T;
      const direct = y instanceof Float64Array || isContiguous(y);
      const target = y instanceof Float64Array ? y : direct ? y.data.subarray(y.offset, y.offset + rows) : new Float64Array(rows);
      // the kernel may not write into its own input
      const src = target.buffer === x.buffer && overlaps(target, x) ? x.slice() : x;
      kernel(src, target);
      if (!direct) scatter(target, y as NdArray<Float64Array>);
      return y;
    },
  };
  return Object.freeze(op);
}

function overlaps(a: Float64Array, b: Float64Array): boolean {
  const a0 = a.byteOffset;
  const a1 = a0 + a.byteLength;
  const b0 = b.byteOffset;
  const b1 = b0 + b.byteLength;
  return a0 < b1 && b0 < a1;
}

/**
 * An operator from an explicit CSR matrix (copied, then checked for
 * structure: ascending columns within rows, indices in range).
 *
 * @param m - the matrix
 * @param options - `symmetric`: declare A = Aᵀ (checked exactly); `shape`: field shape of outputs
 * @returns the operator
 * @example fromCsr({ rows: 1, cols: 2, rowPtr: Int32Array.of(0, 2), colIdx: Int32Array.of(0, 1), values: Float64Array.of(1, -1) }).apply(Float64Array.of(3, 1))[0] // 2
 */
export function fromCsr(m: CsrMatrix, options: Readonly<{ symmetric?: boolean; shape?: readonly number[] }> = {}): Operator {
  const csr: CsrMatrix = {
    rows: m.rows,
    cols: m.cols,
    rowPtr: Int32Array.from(m.rowPtr),
    colIdx: Int32Array.from(m.colIdx),
    values: Float64Array.from(m.values),
  };
  checkCsr(csr);
  checkVectorFinite('values', csr.values);
  const shape = options.shape ?? [csr.rows];
  if (shape.reduce((p, c) => p * c, 1) !== csr.rows) {
    throw new ShapeMismatchError(`shape [${shape.join(', ')}] holds ${shape.reduce((p, c) => p * c, 1)} entries but the matrix has ${csr.rows} rows`);
  }
  const symmetric = options.symmetric === true;
  if (symmetric && !csrIsSymmetric(csr, 0)) throw new NotSymmetricError('the matrix given to fromCsr');
  return makeOperator({ rows: csr.rows, cols: csr.cols, shape, symmetric, build: () => csr });
}
