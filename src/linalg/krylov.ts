/**
 * Krylov solvers: preconditioned conjugate gradients for symmetric positive
 * definite systems, BiCGSTAB for nonsymmetric ones.
 *
 * - CG: Hestenes, M. R. & Stiefel, E. (1952). J. Res. Nat. Bur. Standards
 *   49(6), 409–436; the preconditioned form of Saad (2003), Algorithm 9.1.
 *   In exact arithmetic the error falls at least like
 *   2((√κ − 1)/(√κ + 1))ᵏ in the A-norm, κ the condition number of M⁻¹A.
 * - BiCGSTAB: van der Vorst, H. A. (1992). SIAM J. Sci. Stat. Comput. 13(2),
 *   631–644, right-preconditioned.
 *
 * Both stop on the true relative residual ‖b − Ax‖/‖b‖: when the updated
 * residual says converged, the true one is computed, and if rounding has
 * let the two drift apart the iteration restarts from the true residual.
 * They never return an unconverged answer: they throw NotConvergedError
 * with the residual history.
 *
 * @module
 */
import { NotConvergedError, ShapeMismatchError } from '../errors.js';
import type { CsrMatrix } from '../operator/matrix.js';
import { type Operator, checkVectorFinite, makeOperator } from '../operator/operator.js';
import type { Preconditioner } from './preconditioners.js';
import { type IterativeOptions, type SolveResult, checkIterative } from './result.js';

/** Vectors reused across solves of one size, so iterations allocate nothing. */
export interface KrylovWorkspace {
  /** Unknowns per vector. */
  readonly size: number;
  /** The work vectors. @internal */
  readonly v: readonly Float64Array[];
  /** Residual history buffer, grown to the largest iteration cap seen. @internal */
  history: Float64Array;
}

/**
 * Work vectors for {@link conjugateGradient} and {@link bicgstab} on systems
 * of `n` unknowns: make one per size and pass it to every solve.
 *
 * @param n - unknowns
 * @returns the workspace (8 vectors of n doubles)
 * @example createKrylovWorkspace(10).size // 10
 */
export function createKrylovWorkspace(n: number): KrylovWorkspace {
  if (!(Number.isSafeInteger(n) && n >= 1)) throw new ShapeMismatchError(`a workspace needs a whole number of unknowns ≥ 1, got ${n}`);
  return { size: n, v: Array.from({ length: 8 }, () => new Float64Array(n)), history: new Float64Array(0) };
}

/** Options of the Krylov solvers. */
export interface KrylovOptions extends IterativeOptions {
  /** M ≈ A, applied as z = M⁻¹ r (default: none). */
  readonly preconditioner?: Preconditioner;
  /** Starting guess (default 0); not modified. */
  readonly x0?: Float64Array;
  /**
   * Reused vectors from {@link createKrylovWorkspace}. With a workspace the
   * returned `history` is a view into it, valid until its next solve.
   */
  readonly workspace?: KrylovWorkspace;
  /** Where to write the solution (may be `x0` itself); a new array if absent. */
  readonly out?: Float64Array;
}

function dot(a: Float64Array, b: Float64Array, n: number): number {
  let s0 = 0;
  let s1 = 0;
  let i = 0;
  // two accumulators: independent chains for the CPU, and a little less rounding
  for (; i + 1 < n; i += 2) {
    s0 += a[i]! * b[i]!;
    s1 += a[i + 1]! * b[i + 1]!;
  }
  if (i < n) s0 += a[i]! * b[i]!;
  return s0 + s1;
}

/** r = b − A x; returns ‖r‖/‖b‖. */
function trueResidual(op: Operator, b: Float64Array, x: Float64Array, r: Float64Array, n: number, bnorm: number): number {
  op.kernel(x, r);
  for (let i = 0; i < n; i++) r[i] = b[i]! - r[i]!;
  return Math.sqrt(dot(r, r, n)) / bnorm;
}

function asOperator(a: Operator | CsrMatrix): Operator {
  if ('kernel' in a) return a;
  return makeOperator({ rows: a.rows, cols: a.cols, symmetric: false, build: () => a });
}

function prepare(a: Operator | CsrMatrix, b: Float64Array, o: KrylovOptions) {
  const op = asOperator(a);
  const n = op.rows;
  if (op.cols !== n) throw new ShapeMismatchError(`the matrix is ${n} × ${op.cols}; a solve needs a square matrix`);
  if (b.length !== n) throw new ShapeMismatchError(`b has ${b.length} entries but the matrix has ${n} rows`);
  checkVectorFinite('b', b);
  if (o.x0 !== undefined) {
    if (o.x0.length !== n) throw new ShapeMismatchError(`x0 has ${o.x0.length} entries but the matrix has ${n} rows`);
    checkVectorFinite('x0', o.x0);
  }
  const ws = o.workspace ?? createKrylovWorkspace(n);
  if (ws.size !== n) throw new ShapeMismatchError(`the workspace holds ${ws.size} unknowns but the system has ${n}`);
  if (o.out !== undefined && o.out.length !== n) throw new ShapeMismatchError(`out has ${o.out.length} entries but the system has ${n}`);
  return { op, n, ws };
}

/** Solution vector and history buffer of one solve. */
function buffers(n: number, maxIt: number, o: KrylovOptions, ws: KrylovWorkspace): { x: Float64Array; history: Float64Array } {
  const x = o.out ?? new Float64Array(n);
  if (o.x0 !== undefined) {
    if (o.x0 !== x) x.set(o.x0);
  } else {
    x.fill(0);
  }
  if (o.workspace === undefined) return { x, history: new Float64Array(maxIt + 1) };
  if (ws.history.length < maxIt + 1) ws.history = new Float64Array(maxIt + 1);
  return { x, history: ws.history };
}

function finalHistory(h: Float64Array, count: number, o: KrylovOptions): Float64Array {
  return o.workspace === undefined ? h.slice(0, count) : h.subarray(0, count);
}

/**
 * Solves A x = b for symmetric positive definite A by preconditioned
 * conjugate gradients (module sources). Set-up free; one matrix product,
 * one preconditioner application and two dot products per iteration.
 *
 * @param a - SPD matrix (Operator or CSR)
 * @param b - right-hand side
 * @param options - tolerance (default 1e-8), maxIterations (default 2n, at least 100, at most 10⁵), preconditioner, x0, workspace
 * @returns the converged solution and its history
 * @example conjugateGradient(diagonal(Float64Array.of(2, 4)), Float64Array.of(2, 4)).solution // [1, 1]
 */
export function conjugateGradient(a: Operator | CsrMatrix, b: Float64Array, options: Readonly<KrylovOptions> = {}): SolveResult {
  const { op, n, ws } = prepare(a, b, options);
  const { tol, maxIt } = checkIterative(options, Math.min(100_000, Math.max(100, 2 * n)));
  const M = options.preconditioner;
  const method = M === undefined ? 'cg' : `cg+${M.name}`;
  const t0 = performance.now();
  const [r, z, p, q] = ws.v as [Float64Array, Float64Array, Float64Array, Float64Array];
  const { x, history } = buffers(n, maxIt, options, ws);
  const bnorm = Math.sqrt(dot(b, b, n));
  if (bnorm === 0) return { solution: x.fill(0), iterations: 0, residual: 0, history: history.subarray(0, 1), method, seconds: 0 };
  const residual = (): number => trueResidual(op, b, x, r, n, bnorm);
  let rel = residual();
  history[0] = rel;
  let it = 0;
  while (rel > tol && it < maxIt) {
    // (re)start the search from the current residual
    if (M) M.apply(r, z);
    else z.set(r);
    p.set(z);
    let rz = dot(r, z, n);
    while (it < maxIt) {
      op.kernel(p, q);
      const pq = dot(p, q, n);
      if (!(pq > 0)) {
        throw new NotConvergedError(method, it, rel, tol, history.slice(0, it + 1),
          `pᵀAp = ${pq} ≤ 0: the matrix (or preconditioner) is not positive definite; use bicgstab`);
      }
      const alpha = rz / pq;
      for (let i = 0; i < n; i++) {
        x[i]! += alpha * p[i]!;
        r[i]! -= alpha * q[i]!;
      }
      it++;
      rel = Math.sqrt(dot(r, r, n)) / bnorm;
      history[it] = rel;
      if (!Number.isFinite(rel)) break;
      if (rel <= tol) break;
      if (M) M.apply(r, z);
      else z.set(r);
      const rzNew = dot(r, z, n);
      const beta = rzNew / rz;
      rz = rzNew;
      for (let i = 0; i < n; i++) p[i] = z[i]! + beta * p[i]!;
    }
    if (!Number.isFinite(rel)) break;
    // confirm with the true residual; restart if the recurrence drifted
    rel = residual();
    history[it] = rel;
  }
  if (!(rel <= tol)) {
    throw new NotConvergedError(method, it, rel, tol, history.slice(0, it + 1),
      Number.isFinite(rel) ? 'raise maxIterations, use a stronger preconditioner (multigrid), or check the system' : 'the iteration produced non-finite values');
  }
  return { solution: x, iterations: it, residual: rel, history: finalHistory(history, it + 1, options), method, seconds: (performance.now() - t0) / 1000 };
}

/**
 * Solves A x = b for general (nonsymmetric) A by right-preconditioned
 * BiCGSTAB (module source). Two matrix products and two preconditioner
 * applications per iteration; may break down (ρ or ω = 0), which is reported.
 *
 * @param a - square matrix (Operator or CSR)
 * @param b - right-hand side
 * @param options - tolerance (default 1e-8), maxIterations (default 2n, at least 100, at most 10⁵), preconditioner, x0, workspace
 * @returns the converged solution and its history
 * @example bicgstab(diagonal(Float64Array.of(2, 4)), Float64Array.of(2, 4)).solution // [1, 1]
 */
export function bicgstab(a: Operator | CsrMatrix, b: Float64Array, options: Readonly<KrylovOptions> = {}): SolveResult {
  const { op, n, ws } = prepare(a, b, options);
  const { tol, maxIt } = checkIterative(options, Math.min(100_000, Math.max(100, 2 * n)));
  const M = options.preconditioner;
  const method = M === undefined ? 'bicgstab' : `bicgstab+${M.name}`;
  const t0 = performance.now();
  const [r, rh, p, v, s, t, ph, sh] = ws.v as Float64Array[] as [
    Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array,
  ];
  const { x, history } = buffers(n, maxIt, options, ws);
  const bnorm = Math.sqrt(dot(b, b, n));
  if (bnorm === 0) return { solution: x.fill(0), iterations: 0, residual: 0, history: history.subarray(0, 1), method, seconds: 0 };
  const residual = (): number => trueResidual(op, b, x, r, n, bnorm);
  let rel = residual();
  history[0] = rel;
  let it = 0;
  let why = 'raise maxIterations or use a stronger preconditioner (ILU(0), multigrid)';
  let stalls = 0;
  outer: while (rel > tol && it < maxIt) {
    const start = rel;
    rh.set(r);
    let rho = 1;
    let alpha = 1;
    let omega = 1;
    v.fill(0);
    p.fill(0);
    while (it < maxIt) {
      const rho1 = dot(rh, r, n);
      if (rho1 === 0 || !Number.isFinite(rho1)) {
        why = 'breakdown (ρ = 0): restart with another starting guess, or use a direct solve';
        break;
      }
      const beta = (rho1 / rho) * (alpha / omega);
      for (let i = 0; i < n; i++) p[i] = r[i]! + beta * (p[i]! - omega * v[i]!);
      if (M) M.apply(p, ph);
      else ph.set(p);
      op.kernel(ph, v);
      const rv = dot(rh, v, n);
      if (rv === 0) {
        why = 'breakdown (r̂ᵀv = 0)';
        break;
      }
      alpha = rho1 / rv;
      for (let i = 0; i < n; i++) s[i] = r[i]! - alpha * v[i]!;
      it++;
      const srel = Math.sqrt(dot(s, s, n)) / bnorm;
      if (srel <= tol) {
        for (let i = 0; i < n; i++) x[i]! += alpha * ph[i]!;
        rel = srel;
        history[it] = rel;
        break;
      }
      if (M) M.apply(s, sh);
      else sh.set(s);
      op.kernel(sh, t);
      const tt = dot(t, t, n);
      omega = tt > 0 ? dot(t, s, n) / tt : 0;
      for (let i = 0; i < n; i++) {
        x[i]! += alpha * ph[i]! + omega * sh[i]!;
        r[i] = s[i]! - omega * t[i]!;
      }
      rel = Math.sqrt(dot(r, r, n)) / bnorm;
      history[it] = rel;
      rho = rho1;
      if (!Number.isFinite(rel)) break outer;
      if (rel <= tol) break;
      if (omega === 0) {
        why = 'breakdown (ω = 0)';
        break;
      }
    }
    rel = residual();
    history[it] = rel;
    // a restart that gains nothing twice running will not gain later
    if (rel > tol && !(rel < start)) {
      if (++stalls >= 2) break;
    } else {
      stalls = 0;
    }
  }
  if (!(rel <= tol)) throw new NotConvergedError(method, it, rel, tol, history.slice(0, it + 1), why);
  return { solution: x, iterations: it, residual: rel, history: finalHistory(history, it + 1, options), method, seconds: (performance.now() - t0) / 1000 };
}
