/**
 * Time steppers for diffusion-type problems ρc ∂u/∂t = ∇·(k∇u) + f(x, t):
 * the θ-method, which is forward Euler at θ = 0, Crank–Nicolson at θ = ½
 * and backward Euler at θ = 1.
 *
 * With S = diag(V)·A the volume-scaled operator of the discretisation,
 * M = diag(ρc) and d(t) = g(t) + f(t) the boundary data and source, each
 * balance row advances by
 *
 *   (VM/dt − θS) uⁿ⁺¹ = (VM/dt + (1 − θ)S) uⁿ + V[θ dⁿ⁺¹ + (1 − θ) dⁿ],
 *
 * and each constraint row (a prescribed value, or a flux condition at
 * accuracy 4 and 6) is imposed at tⁿ⁺¹. Local error O(dt²) for θ ≠ ½ and
 * O(dt³) for θ = ½, so global order 1 and 2 in time; unconditionally stable
 * for θ ≥ ½, and for θ < ½ stable while dt·ρ(M⁻¹A)·(1 − 2θ) ≤ 2. Source:
 * Crank, J. & Nicolson, P. (1947), Proc. Camb. Phil. Soc. 43, 50–67;
 * LeVeque (2007), ch. 9; Strikwerda (2004), §6.3.
 *
 * With advection, ρc(∂u/∂t + b·∇u) = ∇·(k∇u) + f, the balance rows use
 * S − VMB in place of S, B the advection operator b·∇ (central or upwind);
 * constraint rows are unchanged. The step matrix is then nonsymmetric.
 *
 * Start-up: Crank–Nicolson damps the highest grid modes only weakly (its
 * amplification tends to −1), so after a discontinuous start (a thermal
 * shock) they oscillate from step to step. Rannacher, R. (1984), Numer.
 * Math. 43, 309–327, replaces the first steps by two backward-Euler half
 * steps each, which damps them and keeps second order.
 *
 * @module
 */
import { type Discretization, sampleSource, type Source } from '../boundary/discretize.js';
import { CsrBuilder, type CsrMatrix, csrKernel } from '../operator/matrix.js';
import { fusedTridiagonalStep, planTwistedStep, type TwistedPlan, twistedTridiagonalStep } from './base/tridiagonal-step.js';
import { type PreparedSolve, type StepSolver, prepareSolve } from './implicit.js';
import type { Stepper } from './stepper.js';

/** What the diffusion steppers are built from. @internal */
export interface DiffusionParts {
  readonly d: Discretization;
  /** ρc at every node. */
  readonly capacity: Float64Array;
  readonly source: Source | undefined;
  /** Whether boundary data or source depend on time (are functions). */
  readonly timeDependent: boolean;
  /** B = b·∇ at every node (module doc), or undefined without advection. */
  readonly advection?: CsrMatrix;
}

/** S, or S − VMB on the balance rows with advection (module doc). */
function stepOperator(p: DiffusionParts): CsrMatrix {
  const s = p.d.scaledOperator.matrix;
  const a = p.advection;
  if (a === undefined) return s;
  const n = s.rows;
  const V = p.d.volumes;
  const cons = p.d.constrained;
  const m = new CsrBuilder(n, n, s.values.length + a.values.length);
  for (let r = 0; r < n; r++) {
    for (let q = s.rowPtr[r]!; q < s.rowPtr[r + 1]!; q++) m.add(s.colIdx[q]!, s.values[q]!);
    if (!cons[r]) {
      const w = V[r]! * p.capacity[r]!;
      for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) m.add(a.colIdx[q]!, -w * a.values[q]!);
    }
    m.endRow();
  }
  return m.finish();
}

interface ThetaLevel {
  theta: number;
  dt: number;
  e: CsrMatrix;
  /** rhs = E u, through E's stencil runs from the second step on. */
  multiplyE: (x: Float64Array, y: Float64Array) => Float64Array;
  k: CsrMatrix;
  solve: PreparedSolve;
  /** Prescribed columns removed from K: (row, col, K_rc). */
  elimRow: Int32Array;
  elimCol: Int32Array;
  elimVal: Float64Array;
  /** 1-D fast path: E's diagonals and K's Thomas factors, when both are tridiagonal. */
  fused?: { es: Float64Array; ed: Float64Array; eu: Float64Array; a: Float64Array; inv: Float64Array; ratio: Float64Array };
  /**
   * The same step by the twisted factorisation (two recurrences at once,
   * interleaved coefficients), unless one of its pivots vanishes; then
   * `fused` is used.
   */
  twisted?: TwistedPlan;
}

function diagonalsOf(m: CsrMatrix): [Float64Array, Float64Array, Float64Array] | undefined {
  const n = m.rows;
  const s = new Float64Array(n);
  const d = new Float64Array(n);
  const u = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) {
      const c = m.colIdx[q]!;
      if (c === r - 1) s[r] = m.values[q]!;
      else if (c === r) d[r] = m.values[q]!;
      else if (c === r + 1) u[r] = m.values[q]!;
      else return undefined;
    }
  }
  return [s, d, u];
}

/**
 * K = VM/dt − θS and E = VM/dt + (1 − θ)S (module formula) row by row into
 * their final arrays, S's rows being sorted without repeats: the mass goes
 * onto the diagonal entry (inserted in column order when S has none), K's
 * prescribed columns move to the elimination list. The sums are formed as
 * mass + θ-part, as a row builder would.
 */
function stepMatrices(p: DiffusionParts, s: CsrMatrix, theta: number, dt: number): {
  e: CsrMatrix; k: CsrMatrix; elimRow: Int32Array; elimCol: Int32Array; elimVal: Float64Array;
} {
  const { d, capacity } = p;
  const n = s.rows;
  const V = d.volumes;
  const pres = d.prescribed;
  const cons = d.constrained;
  const { rowPtr, colIdx, values } = s;
  // a bound on the entries of K and of E: one per prescribed row, S's row plus a diagonal where it has none otherwise
  let elim = 0;
  let cap = 0;
  for (let r = 0; r < n; r++) {
    if (pres[r]) {
      cap++;
      continue;
    }
    let diagonal = false;
    for (let q = rowPtr[r]!; q < rowPtr[r + 1]!; q++) {
      const c = colIdx[q]!;
      if (c === r) diagonal = true;
      else if (pres[c]) elim++;
    }
    cap += rowPtr[r + 1]! - rowPtr[r]! + (diagonal ? 0 : 1);
  }
  const ePtr = new Int32Array(n + 1);
  const eCol = new Int32Array(cap);
  const eVal = new Float64Array(cap);
  const kPtr = new Int32Array(n + 1);
  const kCol = new Int32Array(cap);
  const kVal = new Float64Array(cap);
  let eCount = 0;
  let kCount = 0;
  const elimRow = new Int32Array(elim);
  const elimCol = new Int32Array(elim);
  const elimVal = new Float64Array(elim);
  elim = 0;
  const explicit = theta !== 1;
  for (let r = 0; r < n; r++) {
    if (pres[r]) {
      kCol[kCount] = r;
      kVal[kCount++] = 1;
    } else if (cons[r]) {
      for (let q = rowPtr[r]!; q < rowPtr[r + 1]!; q++) {
        const c = colIdx[q]!;
        if (pres[c] && c !== r) {
          elimRow[elim] = r;
          elimCol[elim] = c;
          elimVal[elim++] = values[q]!;
        } else {
          kCol[kCount] = c;
          kVal[kCount++] = values[q]!;
        }
      }
    } else {
      const mass = (V[r]! * capacity[r]!) / dt;
      let placed = false;
      for (let q = rowPtr[r]!; q < rowPtr[r + 1]!; q++) {
        const c = colIdx[q]!;
        const v = values[q]!;
        if (!placed && c >= r) {
          placed = true;
          if (c > r) {
            // S has no diagonal entry here: the mass alone
            eCol[eCount] = r;
            eVal[eCount++] = mass;
            kCol[kCount] = r;
            kVal[kCount++] = mass;
          } else {
            eCol[eCount] = r;
            eVal[eCount++] = explicit ? mass + (1 - theta) * v : mass;
            kCol[kCount] = r;
            kVal[kCount++] = theta === 0 ? mass : mass + -theta * v;
            continue;
          }
        }
        if (explicit) {
          eCol[eCount] = c;
          eVal[eCount++] = (1 - theta) * v;
        }
        if (theta === 0) continue;
        if (pres[c]) {
          // K_rc = −θ S_rc; K_rc·u_c(tⁿ⁺¹) moves to the right-hand side
          elimRow[elim] = r;
          elimCol[elim] = c;
          elimVal[elim++] = -theta * v;
        } else {
          kCol[kCount] = c;
          kVal[kCount++] = -theta * v;
        }
      }
      if (!placed) {
        eCol[eCount] = r;
        eVal[eCount++] = mass;
        kCol[kCount] = r;
        kVal[kCount++] = mass;
      }
    }
    ePtr[r + 1] = eCount;
    kPtr[r + 1] = kCount;
  }
  const trim = (col: Int32Array, val: Float64Array, count: number, ptr: Int32Array): CsrMatrix => ({
    rows: n, cols: n, rowPtr: ptr,
    colIdx: 8 * count >= 7 * cap ? col.subarray(0, count) : col.slice(0, count),
    values: 8 * count >= 7 * cap ? val.subarray(0, count) : val.slice(0, count),
  });
  const whole = elim === elimVal.length;
  return {
    e: trim(eCol, eVal, eCount, ePtr), k: trim(kCol, kVal, kCount, kPtr),
    elimRow: whole ? elimRow : elimRow.slice(0, elim), elimCol: whole ? elimCol : elimCol.slice(0, elim), elimVal: whole ? elimVal : elimVal.slice(0, elim),
  };
}

function buildLevel(p: DiffusionParts, s: CsrMatrix, theta: number, dt: number, solver: StepSolver, tolerance: number): ThetaLevel {
  const { d } = p;
  const n = s.rows;
  const pres = d.prescribed;
  const cons = d.constrained;
  const { e: em, k: km, elimRow, elimCol, elimVal } = stepMatrices(p, s, theta, dt);
  const symmetric = d.symmetric && p.advection === undefined;
  // forward Euler: K is diagonal unless flux conditions are constraint rows (accuracy 4, 6)
  let choice = solver;
  if (theta === 0 && solver === 'auto') {
    let onlyValues = true;
    for (let r = 0; r < n; r++) if (cons[r] && !pres[r]) onlyValues = false;
    choice = onlyValues ? 'direct' : 'bicgstab';
  }
  const solve = prepareSolve(d.grid, km, symmetric, pres as Uint8Array, { solver: choice, tolerance });
  let fused: ThetaLevel['fused'];
  let twisted: TwistedPlan | undefined;
  const kd = solve.tridiagonal;
  if (kd !== undefined) {
    const ed = diagonalsOf(em);
    if (ed !== undefined) {
      // K's plain factorisation (prepareSolve's, whose pivot check reports a singular K) for the fused step
      const f = kd.factors;
      fused = { es: ed[0], ed: ed[1], eu: ed[2], a: f.sub as Float64Array, inv: f.inversePivots as Float64Array, ratio: f.ratios as Float64Array };
      twisted = planTwistedStep(ed[0], ed[1], ed[2], kd.sub, kd.diag, kd.sup);
    }
  }
  return {
    theta, dt, e: em, multiplyE: csrKernel(em), k: km, solve, fused, twisted,
    elimRow, elimCol, elimVal,
  };
}

/**
 * A θ-method stepper (module formula), with optional Rannacher start-up.
 *
 * @internal
 */
export function createThetaStepper(
  p: DiffusionParts, u0: Float64Array, theta: number, dt: number,
  options: { solver: StepSolver; tolerance: number; rannacherSteps: number },
): Stepper & { readonly solver: string } {
  const { d } = p;
  const n = u0.length;
  const V = d.volumes;
  const pres = d.prescribed;
  const cons = d.constrained;
  const u = u0;
  const rhs = new Float64Array(n);
  const gNow = new Float64Array(n);
  const gNext = new Float64Array(n);
  const fNow = new Float64Array(n);
  const fNext = new Float64Array(n);
  const levels = new Map<string, ThetaLevel>();
  const s = stepOperator(p);
  const level = (th: number, h: number): ThetaLevel => {
    const key = `${th}:${h}`;
    let l = levels.get(key);
    if (l === undefined) {
      l = buildLevel(p, s, th, h, options.solver, options.tolerance);
      levels.set(key, l);
    }
    return l;
  };
  const main = level(theta, dt);
  const constant = !p.timeDependent;
  if (constant) {
    d.boundaryTerm(0, gNow);
    gNext.set(gNow);
    sampleSource(d.grid, p.source, 0, fNow);
    fNext.set(fNow);
  }
  let iterations = 0;
  // b: the data part of the right-hand side; with constant data it is built once per level
  const b = new Float64Array(n);
  const dataPart = (l: ThetaLevel, t: number, out: Float64Array): void => {
    if (!constant) {
      d.boundaryTerm(t, gNow);
      d.boundaryTerm(t + l.dt, gNext);
      sampleSource(d.grid, p.source, t, fNow);
      sampleSource(d.grid, p.source, t + l.dt, fNext);
    }
    const th = l.theta;
    for (let i = 0; i < n; i++) {
      if (pres[i] || cons[i]) out[i] = gNext[i]!;
      else out[i] = V[i]! * (th * (gNext[i]! + fNext[i]!) + (1 - th) * (gNow[i]! + fNow[i]!));
    }
    for (let q = 0; q < l.elimRow.length; q++) {
      // the eliminated entries K_rc of prescribed columns, times their values at tⁿ⁺¹
      out[l.elimRow[q]!]! -= l.elimVal[q]! * gNext[l.elimCol[q]!]!;
    }
  };
  const constB = new Map<ThetaLevel, Float64Array>();
  // whether the constant data part of a level is all zero (then the steps skip adding it)
  const constZero = new Map<ThetaLevel, boolean>();
  const zeroData = (l: ThetaLevel, data: Float64Array): boolean => {
    let z = constZero.get(l);
    if (z === undefined) {
      z = data.every((v) => v === 0);
      constZero.set(l, z);
    }
    return z;
  };
  let count = 0;
  for (let i = 0; i < n; i++) if (pres[i]) count++;
  const prescribedNodes = new Int32Array(count);
  for (let i = 0, q = 0; i < n; i++) if (pres[i]) prescribedNodes[q++] = i;
  /** One step at level l; returns Σu when the twisted step computed it (the driver's blow-up check), else undefined. */
  const one = (l: ThetaLevel, t: number): number | undefined => {
    let data: Float64Array = b;
    if (constant) {
      let c = constB.get(l);
      if (c === undefined) {
        c = new Float64Array(n);
        dataPart(l, t, c);
        constB.set(l, c);
      }
      data = c;
    } else {
      dataPart(l, t, b);
    }
    if (l.twisted !== undefined) {
      const sum = twistedTridiagonalStep(l.twisted, data, constant && zeroData(l, data), u);
      iterations = 0;
      return sum;
    }
    if (l.fused !== undefined) {
      const f = l.fused;
      fusedTridiagonalStep(n, f.es, f.ed, f.eu, data, f.a, f.inv, f.ratio, u);
      iterations = 0;
      return undefined;
    }
    l.multiplyE(u, rhs);
    if (!(constant && zeroData(l, data))) for (let i = 0; i < n; i++) rhs[i]! += data[i]!;
    // warm start at the prescribed values of tⁿ⁺¹
    for (let q = 0; q < prescribedNodes.length; q++) u[prescribedNodes[q]!] = gNext[prescribedNodes[q]!]!;
    iterations = l.solve.solve(rhs, u);
    return undefined;
  };
  return {
    scheme: theta === 0 ? 'forward-euler' : theta === 1 ? 'backward-euler' : theta === 0.5 ? 'crank-nicolson' : `theta(${theta})`,
    size: n,
    state: [u],
    solver: main.solve.name,
    get lastIterations() {
      return iterations;
    },
    advance(t: number, step: number): number | void {
      if (step < options.rannacherSteps && theta !== 1) {
        const half = level(1, dt / 2);
        one(half, t);
        const first = iterations;
        one(half, t + dt / 2);
        iterations += first;
      } else {
        return one(main, t);
      }
    },
  };
}
