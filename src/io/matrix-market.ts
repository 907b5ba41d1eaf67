/**
 * Sparse matrices and vectors in the Matrix Market exchange format, so that
 * an assembled system can be handed to another solver stack (scipy, Julia,
 * PETSc, MATLAB) and read back.
 *
 * Source: Boisvert, R. F., Pozo, R. & Remington, K. (1996). The Matrix
 * Market Exchange Formats: Initial Design. NISTIR 5935, National Institute
 * of Standards and Technology.
 *
 * Written:
 * - matrices as `%%MatrixMarket matrix coordinate real general`, one
 *   `i j value` line per stored entry (1-based, row by row, columns
 *   ascending; explicit zeros kept), or `… real symmetric` with the lower
 *   triangle only (i ≥ j) when the matrix equals its transpose exactly;
 * - vectors (right-hand sides, solutions) as `%%MatrixMarket matrix array
 *   real general` of size n × 1, one value per line in node order (x slowest);
 * - numbers as the shortest decimal that reads back as the same float64
 *   (ECMAScript `String(x)`, −0 as `-0`), so a round trip is exact to the
 *   bit. NaN and ±Infinity are refused (NonFiniteOutputError).
 *
 * Read:
 * - the banner `%%MatrixMarket matrix <format> <field> <symmetry>` (the
 *   first token exactly, the others in any case); fields `real` and
 *   `integer` (read as float64: exact up to 2⁵³ in magnitude); symmetries
 *   `general`, `symmetric` and `skew-symmetric` (each stored entry below
 *   the diagonal is mirrored, negated for skew-symmetric). `complex`,
 *   `pattern` and `hermitian` are refused with UnsupportedMatrixMarketError;
 * - comment lines (starting with `%`) and blank lines anywhere after the
 *   banner; one entry per line;
 * - coordinate entries in any order; the result is a CSR matrix with
 *   columns ascending in each row, and repeated (i, j) entries summed in
 *   file order;
 * - every fault — banner, size line, an entry that is short, long, not a
 *   number, out of range or on the wrong side of the diagonal, too few or too
 *   many entries — throws MalformedMatrixMarketError with the 1-based line
 *   number (one past the last line when the text ends early).
 *
 * @module
 */
import {
  InvalidOptionError, MalformedMatrixMarketError, NonFiniteOutputError, NotSymmetricError, ShapeMismatchError,
  UnsupportedMatrixMarketError,
} from '../errors.js';
import { type CsrMatrix, checkCsr, csrTranspose } from '../operator/matrix.js';
import type { Operator, Vector } from '../operator/index.js';
import { checkArrayFinite, numberText } from './format.js';

/** Options of {@link matrixToMatrixMarket}. */
export interface MatrixMarketOptions {
  /**
   * `'auto'` (default): `symmetric` (lower triangle) when the matrix equals
   * its transpose exactly in pattern and bits, else `general`;
   * `'general'`: every stored entry; `'symmetric'`: the lower triangle, and
   * NotSymmetricError if the matrix is not exactly symmetric.
   */
  readonly symmetry?: 'auto' | 'general' | 'symmetric';
  /** Comment lines written after the banner, each prefixed with `% `. */
  readonly comments?: readonly string[];
}

/** Options of {@link vectorToMatrixMarket}. */
export interface VectorMarketOptions {
  /** Comment lines written after the banner, each prefixed with `% `. */
  readonly comments?: readonly string[];
}

function commentLines(comments: readonly string[] | undefined): string[] {
  const out: string[] = [];
  for (const c of comments ?? []) {
    if (typeof c !== 'string') throw new InvalidOptionError('comments', 'give an array of strings');
    for (const line of c.split(/\r?\n/)) out.push(line === '' ? '%' : `% ${line}`);
  }
  return out;
}

/** Whether `a` equals its transpose exactly: same pattern, bitwise-equal values. */
function exactlySymmetric(a: CsrMatrix): boolean {
  if (a.rows !== a.cols) return false;
  const t = csrTranspose(a);
  const n = a.rowPtr[a.rows]!;
  for (let r = 0; r <= a.rows; r++) if (a.rowPtr[r] !== t.rowPtr[r]) return false;
  for (let p = 0; p < n; p++) {
    if (a.colIdx[p] !== t.colIdx[p] || !Object.is(a.values[p], t.values[p])) return false;
  }
  return true;
}

function isOperator(a: CsrMatrix | Operator): a is Operator {
  return typeof (a as Operator).apply === 'function';
}

/**
 * A sparse matrix (or an operator's assembled CSR form) as Matrix Market
 * coordinate text (module doc). Row r, column c of the matrix is written as
 * `r+1 c+1 value`; for an operator on a grid, unknown (i, j, k) is row
 * (i·ny + j)·nz + k (x slowest).
 *
 * @param a - a CSR matrix, or an operator (its `matrix` is assembled if needed)
 * @param options - symmetry and comment lines
 * @returns the text, ending in a newline
 * @throws NonFiniteOutputError for a NaN or infinite entry (with its 0-based row and column);
 *   NotSymmetricError for `symmetry: 'symmetric'` on a matrix that is not exactly symmetric;
 *   ShapeMismatchError for an inconsistent CSR structure; InvalidOptionError for a bad option
 * @example matrixToMatrixMarket({ rows: 2, cols: 2, rowPtr: Int32Array.of(0, 1, 2), colIdx: Int32Array.of(0, 1), values: Float64Array.of(2, 3) }) // '%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 2\n2 2 3\n'
 */
export function matrixToMatrixMarket(a: CsrMatrix | Operator, options: Readonly<MatrixMarketOptions> = {}): string {
  const m = isOperator(a) ? a.matrix : a;
  checkCsr(m);
  const { rows, cols, rowPtr, colIdx, values } = m;
  const want = options.symmetry ?? 'auto';
  if (want !== 'auto' && want !== 'general' && want !== 'symmetric') {
    throw new InvalidOptionError('symmetry', `${JSON.stringify(want)}; use 'auto', 'general' or 'symmetric'`);
  }
  const nnz = rowPtr[rows]!;
  let bad = 0;
  let first = -1;
  for (let p = 0; p < nnz; p++) {
    if (!Number.isFinite(values[p]!)) {
      if (bad++ === 0) first = p;
    }
  }
  if (bad > 0) {
    let r = 0;
    while (rowPtr[r + 1]! <= first) r++;
    const c = colIdx[first]!;
    throw new NonFiniteOutputError('matrix values', bad, [r, c], values[first]!, `row ${r}, column ${c} (0-based)`);
  }
  let symmetric = false;
  if (want !== 'general') {
    symmetric = exactlySymmetric(m);
    if (want === 'symmetric' && !symmetric) {
      throw new NotSymmetricError(`the matrix written with symmetry 'symmetric' (only its lower triangle would be kept)`);
    }
  }
  let count = nnz;
  if (symmetric) {
    count = 0;
    for (let r = 0; r < rows; r++) for (let p = rowPtr[r]!; p < rowPtr[r + 1]!; p++) if (colIdx[p]! <= r) count++;
  }
  const lines = [
    `%%MatrixMarket matrix coordinate real ${symmetric ? 'symmetric' : 'general'}`,
    ...commentLines(options.comments),
    `${rows} ${cols} ${count}`,
  ];
  for (let r = 0; r < rows; r++) {
    for (let p = rowPtr[r]!; p < rowPtr[r + 1]!; p++) {
      const c = colIdx[p]!;
      if (symmetric && c > r) continue;
      lines.push(`${r + 1} ${c + 1} ${numberText(values[p]!)}`);
    }
  }
  return lines.join('\n') + '\n';
}

/**
 * A vector as Matrix Market array text: `%%MatrixMarket matrix array real
 * general`, size `n 1`, one value per line. An ndarray field is written in
 * the memory order of its shape, x slowest, whatever its strides — the
 * unknown ordering of the operators.
 *
 * @param v - a Float64Array, or an ndarray over one
 * @param options - comment lines
 * @returns the text, ending in a newline
 * @throws NonFiniteOutputError for a NaN or infinite entry (with its 0-based index)
 * @example vectorToMatrixMarket(Float64Array.of(1, 0.5)) // '%%MatrixMarket matrix array real general\n2 1\n1\n0.5\n'
 */
export function vectorToMatrixMarket(v: Vector, options: Readonly<VectorMarketOptions> = {}): string {
  const x = flatten(v);
  checkArrayFinite(x, 'vector');
  const lines = ['%%MatrixMarket matrix array real general', ...commentLines(options.comments), `${x.length} 1`];
  for (let p = 0; p < x.length; p++) lines.push(numberText(x[p]!));
  return lines.join('\n') + '\n';
}

/** The entries of a vector in memory order of its shape (C order). */
function flatten(v: Vector): Float64Array {
  if (v instanceof Float64Array) return v;
  if (v === null || typeof v !== 'object' || !(v.data instanceof Float64Array) || !Array.isArray(v.shape)) {
    throw new ShapeMismatchError('the vector is neither a Float64Array nor an ndarray over one; give one of those');
  }
  const shape = v.shape;
  const n = shape.reduce((p, c) => p * c, 1);
  const out = new Float64Array(n);
  const idx = new Array<number>(shape.length).fill(0);
  for (let p = 0; p < n; p++) {
    let off = v.offset;
    for (let d = 0; d < shape.length; d++) off += idx[d]! * v.stride[d]!;
    out[p] = v.data[off]!;
    for (let d = shape.length - 1; d >= 0; d--) {
      if (++idx[d]! < shape[d]!) break;
      idx[d] = 0;
    }
  }
  return out;
}

// ---------------------------------------------------------------------------
// reading

type ValueKind = 'real' | 'integer';
type Symmetry = 'general' | 'symmetric' | 'skew-symmetric';

interface Header {
  format: 'coordinate' | 'array';
  field: ValueKind;
  symmetry: Symmetry;
}

const REAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const INTEGER = /^[+-]?\d+$/;
const INDEX = /^\d+$/;

/** The text as lines (LF or CRLF), without a final empty line. */
function linesOf(text: string): string[] {
  if (typeof text !== 'string') throw new MalformedMatrixMarketError(1, 'the input is not text');
  const lines = text.split(/\r?\n/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  return lines;
}

function readBanner(lines: readonly string[]): Header {
  const bad = (why: string): never => {
    throw new MalformedMatrixMarketError(1, why);
  };
  if (lines.length === 0) bad('the text is empty; the first line must be the banner %%MatrixMarket matrix coordinate real general');
  const t = lines[0]!.trim().split(/\s+/);
  if (t[0] !== '%%MatrixMarket') {
    bad(`the banner is ${JSON.stringify(lines[0]!.slice(0, 60))}; the first line must start with %%MatrixMarket`);
  }
  if (t.length !== 5) bad(`the banner has ${t.length - 1} qualifier(s); it needs 4: object, format, field, symmetry`);
  const [object, format, field, symmetry] = t.slice(1).map((s) => s.toLowerCase()) as [string, string, string, string];
  if (object === 'vector') throw new UnsupportedMatrixMarketError(1, 'object "vector" is not read; store vectors as a matrix array of size n × 1');
  if (object !== 'matrix') bad(`object ${JSON.stringify(object)} is not a Matrix Market object; use matrix`);
  if (format !== 'coordinate' && format !== 'array') bad(`format ${JSON.stringify(format)} is neither coordinate nor array`);
  if (field === 'complex' || field === 'pattern') {
    throw new UnsupportedMatrixMarketError(1, `field ${field} is not read; quadrille reads real and integer matrices (convert the file to real)`);
  }
  if (field !== 'real' && field !== 'integer') bad(`field ${JSON.stringify(field)} is not one of real, integer, complex, pattern`);
  if (symmetry === 'hermitian') {
    throw new UnsupportedMatrixMarketError(1, 'symmetry hermitian is for complex matrices, which are not read; a real hermitian matrix is symmetric');
  }
  if (symmetry !== 'general' && symmetry !== 'symmetric' && symmetry !== 'skew-symmetric') {
    bad(`symmetry ${JSON.stringify(symmetry)} is not one of general, symmetric, skew-symmetric, hermitian`);
  }
  return { format: format as Header['format'], field: field as ValueKind, symmetry: symmetry as Symmetry };
}

/** Index of the next line after `from` that is neither a comment nor blank, or lines.length. */
function nextContent(lines: readonly string[], from: number): number {
  let p = from;
  while (p < lines.length) {
    const s = lines[p]!.trim();
    if (s !== '' && s[0] !== '%') return p;
    p++;
  }
  return p;
}

function readSize(lines: readonly string[], at: number, count: 2 | 3): number[] {
  const what = count === 3 ? 'rows columns entries' : 'rows columns';
  if (at >= lines.length) throw new MalformedMatrixMarketError(at + 1, `the text ends before the size line "${what}"`);
  const t = lines[at]!.trim().split(/\s+/);
  if (t.length !== count || !t.every((s) => INDEX.test(s))) {
    throw new MalformedMatrixMarketError(at + 1, `the size line is ${JSON.stringify(lines[at]!.trim())}; it must be ${count} whole numbers: ${what}`);
  }
  const v = t.map(Number);
  if (!v.every((x) => Number.isSafeInteger(x))) throw new MalformedMatrixMarketError(at + 1, 'a size is too large');
  return v;
}

function readValue(s: string, field: ValueKind, lineNo: number): number {
  const ok = field === 'integer' ? INTEGER.test(s) : REAL.test(s);
  if (!ok) {
    throw new MalformedMatrixMarketError(
      lineNo,
      `the value ${JSON.stringify(s)} is not ${field === 'integer' ? 'an integer' : 'a decimal number'} (NaN and Infinity are not allowed)`,
    );
  }
  const v = Number(s);
  if (!Number.isFinite(v)) throw new MalformedMatrixMarketError(lineNo, `the value ${s} overflows float64`);
  return v;
}

function readIndex(s: string, max: number, what: string, lineNo: number): number {
  if (!INDEX.test(s)) throw new MalformedMatrixMarketError(lineNo, `the ${what} index ${JSON.stringify(s)} is not a whole number`);
  const v = Number(s);
  if (!(v >= 1 && v <= max)) throw new MalformedMatrixMarketError(lineNo, `the ${what} index ${s} is outside 1…${max}`);
  return v - 1;
}

/** Throws if a non-comment, non-blank line follows the last expected entry. */
function checkEnd(lines: readonly string[], from: number, expected: number, what: string): void {
  const extra = nextContent(lines, from);
  if (extra < lines.length) {
    throw new MalformedMatrixMarketError(extra + 1, `more ${what} than the ${expected} declared on the size line`);
  }
}

/** CSR from 0-based triplets: columns ascending per row, duplicates summed in input order. */
function tripletsToCsr(rows: number, cols: number, ti: Int32Array, tj: Int32Array, tv: Float64Array, m: number): CsrMatrix {
  // two stable counting sorts (by column, then by row) give row-major order
  // with the input order kept among equal (i, j), so sums are in file order
  const byCol = new Int32Array(m);
  const cp = new Int32Array(cols + 1);
  for (let p = 0; p < m; p++) cp[tj[p]! + 1]!++;
  for (let c = 0; c < cols; c++) cp[c + 1]! += cp[c]!;
  for (let p = 0; p < m; p++) byCol[cp[tj[p]!]!++] = p;
  const rp = new Int32Array(rows + 1);
  for (let p = 0; p < m; p++) rp[ti[p]! + 1]!++;
  for (let r = 0; r < rows; r++) rp[r + 1]! += rp[r]!;
  const next = rp.slice(0, rows);
  const order = new Int32Array(m);
  for (let q = 0; q < m; q++) {
    const p = byCol[q]!;
    order[next[ti[p]!]!++] = p;
  }
  const rowPtr = new Int32Array(rows + 1);
  const colIdx = new Int32Array(m);
  const values = new Float64Array(m);
  let w = 0;
  let q = 0;
  for (let r = 0; r < rows; r++) {
    const start = w;
    for (; q < rp[r + 1]!; q++) {
      const p = order[q]!;
      if (w > start && colIdx[w - 1] === tj[p]) values[w - 1]! += tv[p]!;
      else {
        colIdx[w] = tj[p]!;
        values[w] = tv[p]!;
        w++;
      }
    }
    rowPtr[r + 1] = w;
  }
  return { rows, cols, rowPtr, colIdx: colIdx.slice(0, w), values: values.slice(0, w) };
}

/**
 * Reads a Matrix Market coordinate matrix (module doc) as CSR.
 *
 * @param text - the file's text (LF or CRLF line ends)
 * @returns the matrix: 0-based, columns ascending in each row, repeated entries summed,
 *   symmetric and skew-symmetric storage expanded to the full matrix; explicit zeros kept
 * @throws MalformedMatrixMarketError with the 1-based line of the fault;
 *   UnsupportedMatrixMarketError for complex, pattern or hermitian data, or an array
 *   (dense) file (read those with {@link vectorFromMatrixMarket} when they are vectors)
 * @example matrixFromMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 2\n2 1 -1\n').values // Float64Array [2, -1, -1]
 */
export function matrixFromMatrixMarket(text: string): CsrMatrix {
  const lines = linesOf(text);
  const h = readBanner(lines);
  if (h.format !== 'coordinate') {
    throw new UnsupportedMatrixMarketError(1, 'format array (dense) is not read as a sparse matrix; use vectorFromMatrixMarket for an n × 1 vector');
  }
  const at = nextContent(lines, 1);
  const [rows, cols, nnz] = readSize(lines, at, 3) as [number, number, number];
  if (h.symmetry !== 'general' && rows !== cols) {
    throw new MalformedMatrixMarketError(at + 1, `a ${h.symmetry} matrix must be square, but the size is ${rows} × ${cols}`);
  }
  // mirrored entries at most double the count; never trust nnz for more than the lines present
  const cap = Math.min(nnz, lines.length) * (h.symmetry === 'general' ? 1 : 2);
  const ti = new Int32Array(cap);
  const tj = new Int32Array(cap);
  const tv = new Float64Array(cap);
  let m = 0;
  let p = at + 1;
  for (let e = 0; e < nnz; e++) {
    p = nextContent(lines, p);
    if (p >= lines.length) {
      throw new MalformedMatrixMarketError(p + 1, `the text ends after ${e} of the ${nnz} entries declared on line ${at + 1}`);
    }
    const lineNo = p + 1;
    const t = lines[p]!.trim().split(/\s+/);
    if (t.length !== 3) {
      throw new MalformedMatrixMarketError(lineNo, `entry ${e + 1} has ${t.length} field(s); a ${h.field} coordinate entry is "row column value"`);
    }
    const i = readIndex(t[0]!, rows, 'row', lineNo);
    const j = readIndex(t[1]!, cols, 'column', lineNo);
    const v = readValue(t[2]!, h.field, lineNo);
    if (h.symmetry === 'symmetric' && j > i) {
      throw new MalformedMatrixMarketError(lineNo, `entry (${i + 1}, ${j + 1}) is above the diagonal; a symmetric file stores the lower triangle only (row ≥ column)`);
    }
    if (h.symmetry === 'skew-symmetric' && j >= i) {
      throw new MalformedMatrixMarketError(lineNo, `entry (${i + 1}, ${j + 1}) is not below the diagonal; a skew-symmetric file stores the strict lower triangle (row > column)`);
    }
    ti[m] = i;
    tj[m] = j;
    tv[m++] = v;
    if (h.symmetry !== 'general' && i !== j) {
      ti[m] = j;
      tj[m] = i;
      tv[m++] = h.symmetry === 'symmetric' ? v : -v;
    }
    p++;
  }
  checkEnd(lines, p, nnz, 'entries');
  return tripletsToCsr(rows, cols, ti, tj, tv, m);
}

/**
 * Reads a Matrix Market array of size n × 1 or 1 × n (a right-hand side, a
 * solution) as a vector.
 *
 * @param text - the file's text (LF or CRLF line ends)
 * @returns the n values in file order (for quadrille's own files, node order, x slowest)
 * @throws MalformedMatrixMarketError with the 1-based line of the fault;
 *   UnsupportedMatrixMarketError for a coordinate file, a matrix with more than one row
 *   and column, a symmetric array, or complex or pattern data
 * @example vectorFromMatrixMarket('%%MatrixMarket matrix array real general\n2 1\n1\n0.5\n') // Float64Array [1, 0.5]
 */
export function vectorFromMatrixMarket(text: string): Float64Array {
  const lines = linesOf(text);
  const h = readBanner(lines);
  if (h.format !== 'array') {
    throw new UnsupportedMatrixMarketError(1, 'format coordinate is a sparse matrix; read it with matrixFromMatrixMarket');
  }
  if (h.symmetry !== 'general') {
    throw new UnsupportedMatrixMarketError(1, `a ${h.symmetry} array is a square matrix, not a vector; write vectors as general n × 1 arrays`);
  }
  const at = nextContent(lines, 1);
  const [rows, cols] = readSize(lines, at, 2) as [number, number];
  if (rows !== 1 && cols !== 1) {
    throw new UnsupportedMatrixMarketError(at + 1, `a ${rows} × ${cols} array is a dense matrix; only n × 1 and 1 × n arrays are read, as vectors`);
  }
  const n = rows * cols;
  const out = new Float64Array(Math.min(n, lines.length));
  let p = at + 1;
  for (let e = 0; e < n; e++) {
    p = nextContent(lines, p);
    if (p >= lines.length) {
      throw new MalformedMatrixMarketError(p + 1, `the text ends after ${e} of the ${n} values declared on line ${at + 1}`);
    }
    const t = lines[p]!.trim().split(/\s+/);
    if (t.length !== 1) throw new MalformedMatrixMarketError(p + 1, `value ${e + 1} has ${t.length} fields; an array file has one value per line`);
    out[e] = readValue(t[0]!, h.field, p + 1);
    p++;
  }
  checkEnd(lines, p, n, 'values');
  return out;
}
