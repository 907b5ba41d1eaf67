/**
 * Stencil-apply benchmarks (group `operator`), defined as in WORKLOADS.md:
 *
 * - W1: five-point Δ, n = 2048 interior, h = 1/(n + 1); u = sin(πx)sin(πy)
 *   stored padded ((n + 2)², zero halo), out n × n; max_err = max|Lu + 2π²u|.
 *   Variants: `matrix-free` (laplace5), `matrix-free-xfast` (the same data
 *   stored x-fastest, to show the layout does not matter), `naive-ndarray`
 *   (ndarray get/set, the baseline), `csr` (the product every CSR-backed
 *   operator uses, `csrKernel`: the CSR arrays inspected once for stencil
 *   runs, `inspect_s`, then multiplied through them — the work of scipy's
 *   `A @ x`, bit for bit the same result), `csr-plain` (the plain CSR loop,
 *   csrMatVec, no inspection) and `csr-offset` (x at offset 1: the
 *   general-stride path).
 * - W1b: the fourth-order nine-point cross, halo 2; the error skips the
 *   outermost interior ring (its second halo point is 0, not the odd
 *   extension of sin). Variants `matrix-free`, `naive-ndarray`.
 * - W2 `assemble-csr`: assembly of the 1024 × 1024 zero-Dirichlet five-point
 *   CSR matrix (time, entries, bytes); `assemble-discretize`: the same through
 *   the public `discretize` (value nodes kept as identity rows).
 *
 * @module
 */
import ndarray from 'ndarray';
import { assembleLaplace5, laplace5Nnz } from '../../src/operator/base/assemble-laplace.js';
import { cross9 } from '../../src/operator/base/cross9.js';
import { csrMatVec } from '../../src/operator/base/csr.js';
import { discretize, grid } from '../../src/index.js';
import { csrKernel } from '../../src/operator/matrix.js';
import { laplace5 } from '../../src/operator/base/laplace2d.js';
import { type BenchCase, type BenchContext, measure, note, peakRssMb, printLine } from '../harness.js';

const N = 2048;
const N_ASSEMBLY = 1024;

/** sin(πx)sin(πy) at the interior nodes, stored padded with a zero halo of width g, x slowest. */
function padded(n: number, g: number, xFastest = false): Float64Array {
  const m = n + 2 * g;
  const h = 1 / (n + 1);
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) s[i] = Math.sin(Math.PI * (i + 1) * h);
  const u = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const k = xFastest ? (j + g) * m + (i + g) : (i + g) * m + (j + g);
      u[k] = s[i] * s[j];
    }
  }
  return u;
}

/** max |out[i,j] + 2π²·u(i,j)| over interior nodes skip … n − 1 − skip; out is n × n, x slowest. */
function maxErr(out: Float64Array, n: number, skip: number): number {
  const h = 1 / (n + 1);
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) s[i] = Math.sin(Math.PI * (i + 1) * h);
  const c = 2 * Math.PI * Math.PI;
  let e = 0;
  for (let i = skip; i < n - skip; i++) {
    for (let j = skip; j < n - skip; j++) {
      const d = Math.abs(out[i * n + j] + c * s[i] * s[j]);
      if (!(d <= e)) e = d; // NaN propagates
    }
  }
  return e;
}

function mpts(n: number, seconds: number): number {
  return (n * n) / seconds / 1e6;
}

function runW1(ctx: Readonly<BenchContext>): void {
  const n = N;
  const m = n + 2;
  const h = 1 / (n + 1);
  const c = 1 / (h * h);
  const out = new Float64Array(n * n);
  // out holds the interior only: node (i, j) at (i − 1)·n + (j − 1)
  {
    const u = padded(n, 1);
    const { timing } = measure(() => laplace5(m, m, c, c, -4 * c, u, m, 1, 0, out, n, 1, -(n + 1)), { runs: ctx.runs });
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'matrix-free', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(out, n, 0) },
    });
  }
  {
    const u = padded(n, 1, true);
    out.fill(0);
    // out x-fastest as well: node (i, j) at (j − 1)·n + (i − 1); u and sin·sin are symmetric in i, j
    const { timing } = measure(() => laplace5(m, m, c, c, -4 * c, u, 1, m, 0, out, 1, n, -(n + 1)), { runs: ctx.runs });
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'matrix-free-xfast', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(out, n, 0) },
    });
  }
  {
    const U = ndarray(padded(n, 1), [m, m]);
    const O = ndarray(out, [n, n]);
    out.fill(0);
    const { timing } = measure(() => {
      for (let i = 1; i <= n; i++) {
        for (let j = 1; j <= n; j++) {
          O.set(i - 1, j - 1,
            (U.get(i - 1, j) + U.get(i + 1, j) + U.get(i, j - 1) + U.get(i, j + 1) - 4 * U.get(i, j)) * c);
        }
      }
      return out;
    }, { runs: 5, warmup: 1 });
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'naive-ndarray', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(out, n, 0) },
    });
  }
  {
    const rows = n * n;
    const nnz = laplace5Nnz(n, n);
    const rowPtr = new Int32Array(rows + 1);
    const colIdx = new Int32Array(nnz);
    const values = new Float64Array(nnz);
    assembleLaplace5(n, n, c, c, -4 * c, rowPtr, colIdx, values);
    const up = padded(n, 1);
    const x = new Float64Array(rows + 1); // element c at x[1 + c] for the offset variant
    for (let i = 0; i < n; i++) x.set(up.subarray((i + 1) * m + 1, (i + 1) * m + 1 + n), 1 + i * n);
    const x0 = x.subarray(1);
    const y = new Float64Array(rows);
    const bytes = rowPtr.byteLength + colIdx.byteLength + values.byteLength;
    // the first product reads the CSR arrays; the second inspects them (timed apart) and multiplies through the runs
    const multiply = csrKernel({ rows, cols: rows, rowPtr, colIdx, values });
    multiply(x0, y);
    const i0 = process.hrtime.bigint();
    multiply(x0, y);
    const inspect = Number(process.hrtime.bigint() - i0) / 1e9;
    const { timing } = measure(() => multiply(x0, y), { runs: ctx.runs });
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'csr', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(y, n, 0), nnz, csr_bytes: bytes, inspect_s: inspect },
    });
    y.fill(0);
    const tp = measure(() => csrMatVec(rows, rowPtr, colIdx, values, x0, 1, 0, y, 1, 0), { runs: ctx.runs }).timing;
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'csr-plain', path: 'ts', size: { n }, timing: tp,
      figures: { mpts_per_s: mpts(n, tp.median), max_err: maxErr(y, n, 0) },
    });
    y.fill(0);
    const t2 = measure(() => csrMatVec(rows, rowPtr, colIdx, values, x, 1, 1, y, 1, 0), { runs: ctx.runs }).timing;
    printLine({
      id: 'W1', impl: 'quadrille', variant: 'csr-offset', path: 'ts', size: { n }, timing: t2,
      figures: { mpts_per_s: mpts(n, t2.median), max_err: maxErr(y, n, 0) },
    });
  }
}

function runW1b(ctx: Readonly<BenchContext>): void {
  const n = N;
  const m = n + 4;
  const h = 1 / (n + 1);
  const c = 1 / (h * h);
  const c1 = (4 / 3) * c;
  const c2 = (-1 / 12) * c;
  const cc = -5 * c; // −5/2 per axis
  const out = new Float64Array(n * n);
  const u = padded(n, 2);
  // out holds nodes 2 … n + 1 of the padded array: node (i, j) at (i − 2)·n + (j − 2)
  {
    const { timing } = measure(
      () => cross9(m, m, c1, c2, c1, c2, cc, u, m, 1, 0, out, n, 1, -2 * (n + 1)), { runs: ctx.runs });
    printLine({
      id: 'W1b', impl: 'quadrille', variant: 'matrix-free', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(out, n, 1) },
    });
  }
  {
    const U = ndarray(u, [m, m]);
    const O = ndarray(out, [n, n]);
    out.fill(0);
    const { timing } = measure(() => {
      for (let i = 2; i < n + 2; i++) {
        for (let j = 2; j < n + 2; j++) {
          O.set(i - 2, j - 2,
            (c2 * (U.get(i - 2, j) + U.get(i + 2, j) + U.get(i, j - 2) + U.get(i, j + 2))
              + c1 * (U.get(i - 1, j) + U.get(i + 1, j) + U.get(i, j - 1) + U.get(i, j + 1))
              + cc * U.get(i, j)));
        }
      }
      return out;
    }, { runs: 5, warmup: 1 });
    printLine({
      id: 'W1b', impl: 'quadrille', variant: 'naive-ndarray', path: 'ts', size: { n }, timing,
      figures: { mpts_per_s: mpts(n, timing.median), max_err: maxErr(out, n, 1) },
    });
  }
}

function runAssembly(ctx: Readonly<BenchContext>): void {
  const n = N_ASSEMBLY;
  const h = 1 / (n + 1);
  const c = 1 / (h * h);
  const rows = n * n;
  const nnz = laplace5Nnz(n, n);
  const bytes = 4 * (rows + 1) + 4 * nnz + 8 * nnz;
  const mb = (b: number) => b / 2 ** 20;
  // `assemble-csr-fill` first, the fill alone into arrays made once: its
  // rss_over_base_mb (peak RSS − RSS before the arrays) is the memory the
  // assembly costs, to compare with arrays_mb. Then `assemble-csr`:
  // allocation (zero pages faulted in by the first write) plus the fill, as a
  // caller pays it (its RSS also holds arrays not yet collected).
  const base = process.memoryUsage().rss;
  {
    const rowPtr = new Int32Array(rows + 1);
    const colIdx = new Int32Array(nnz);
    const values = new Float64Array(nnz);
    const { timing } = measure(() => {
      const written = assembleLaplace5(n, n, c, c, -4 * c, rowPtr, colIdx, values);
      return written === nnz ? values[written - 1] : NaN;
    }, { runs: ctx.runs, warmup: 1 });
    const over = Math.max(0, peakRssMb() * 1024 * 1024 - base);
    printLine({
      id: 'W2', impl: 'quadrille', variant: 'assemble-csr-fill', path: 'ts', size: { n }, timing,
      figures: { nnz, arrays_mb: mb(bytes), rss_over_base_mb: mb(over) },
    });
  }
  {
    const { timing } = measure(() => {
      const rowPtr = new Int32Array(rows + 1);
      const colIdx = new Int32Array(nnz);
      const values = new Float64Array(nnz);
      const written = assembleLaplace5(n, n, c, c, -4 * c, rowPtr, colIdx, values);
      return written === nnz ? values[written - 1] : NaN;
    }, { runs: ctx.runs, warmup: 1 });
    printLine({
      id: 'W2', impl: 'quadrille', variant: 'assemble-csr', path: 'ts', size: { n }, timing,
      figures: { nnz, arrays_mb: mb(bytes) },
    });
  }
  {
    // the public path a caller takes: grid → discretize with four value faces → CSR
    // (n + 1 cells per side, so n × n interior unknowns; value nodes stay as identity rows)
    const g = grid({ x: { from: 0, to: 1, cells: n + 1 }, y: { from: 0, to: 1, cells: n + 1 } });
    const value = { kind: 'dirichlet', value: 0 } as const;
    let entries = 0;
    const { timing } = measure(() => {
      const d = discretize(g, { boundary: { xmin: value, xmax: value, ymin: value, ymax: value } });
      entries = d.operator.matrix.values.length;
      return entries;
    }, { runs: ctx.runs, warmup: 1 });
    printLine({
      id: 'W2', impl: 'quadrille', variant: 'assemble-discretize', path: 'ts', size: { n }, timing,
      figures: { nnz: entries },
    });
  }
  note(`W2 assembly: ${nnz} entries, ${mb(bytes).toFixed(1)} MiB (rowPtr and colIdx int32, values float64)`);
}

/** The operator group's cases, in run order. */
export const cases: readonly BenchCase[] = [
  { id: 'W1', group: 'operator', title: 'five-point apply n=2048: matrix-free, xfast, ndarray, CSR', run: runW1 },
  { id: 'W1b', group: 'operator', title: 'fourth-order nine-point cross n=2048: matrix-free, ndarray', run: runW1b },
  { id: 'W2', name: 'W2-assembly', group: 'operator', title: 'assembly of the 1024x1024 Dirichlet five-point CSR', run: runAssembly },
];
