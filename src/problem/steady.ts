/**
 * Steady problems: −∇·(k∇u) = f with per-face conditions, assembled and
 * solved in one call, with the diagnostics an engineer checks first.
 *
 * Default solver, chosen from the problem:
 * - 1-D: a direct solve (Thomas when the system is tridiagonal, banded LU
 *   otherwise);
 * - 2-D with constant coefficients (accuracy 2), prescribed values on both
 *   edges of an axis with an even number of cells with no prime factor
 *   above 5 (2ᵏ, 10, 12, 100, …) and values or fluxes on the other two, or
 *   3-D with such y and z and values or fluxes on the x faces (no
 *   convection anywhere): the sine-transform direct solver (Hockney 1965;
 *   Swarztrauber 1977), O(N log N), refined against the matrix to the
 *   tolerance;
 * - symmetric systems (accuracy 2) on uniform 2-D / 3-D grids: conjugate
 *   gradients preconditioned by one multigrid V-cycle;
 * - symmetric systems on stretched grids: conjugate gradients with IC(0);
 * - nonsymmetric systems (accuracy 4 and 6 closures): BiCGSTAB with ILU(0).
 *
 * Pure-flux problems (every face a flux face, no value or convection face)
 * have a solution only if the sources and boundary flows balance; the
 * solution is then fixed up to a constant. quadrille checks the discrete
 * balance, refuses data that miss it by more than `compatibilityTolerance`,
 * removes a smaller remainder (of the size of the quadrature error of the
 * data) by a uniform correction of the source, reports it, and returns the
 * solution of zero mean (∫u dV = 0 by the control volumes).
 *
 * @module
 */
import { IncompatibleFluxError, InvalidAccuracyError, InvalidOptionError } from '../errors.js';
import type { Field, Grid } from '../grid/index.js';
import ndarray from 'ndarray';
import {
  type BoundaryConditions, type BoundarySpec, type Discretization, type HeatBalance, type LinearSystem, type Source, discretize,
} from '../boundary/index.js';
import type { Coefficient } from '../operator/index.js';
import { CsrBuilder } from '../operator/matrix.js';
import { makeOperator } from '../operator/operator.js';
import { factorBanded, solveBanded } from '../linalg/banded.js';
import { bicgstab, conjugateGradient } from '../linalg/krylov.js';
import { createMultigrid } from '../linalg/multigrid.js';
import { incompleteCholesky, incompleteLU, jacobiPreconditioner, ssorPreconditioner, type Preconditioner } from '../linalg/preconditioners.js';
import type { SolveResult } from '../linalg/result.js';
import { factorTridiagonal, solveTridiagonal } from '../linalg/thomas.js';
import { coordinateSpread, createSineTransformSolver, sineStencil } from '../linalg/sine-transform.js';

/** A solver named by method alone: chosen from the problem, or a direct solve. */
export interface SimpleSolver {
  /**
   * 'auto' (module doc), 'direct' (Thomas or banded LU) or 'sine-transform'
   * (the fast direct solver of constant-coefficient 2-D plates and 3-D
   * blocks with values across an axis, or y and z, whose cell counts are
   * even with no prime factor above 5, and values or fluxes elsewhere; see
   * `sine-transform.ts`).
   */
  readonly method: 'auto' | 'direct' | 'sine-transform';
}

/** Preconditioned conjugate gradients (symmetric systems). */
export interface CgSolver {
  /** Discriminant. */
  readonly method: 'cg';
  /** Preconditioner (default 'multigrid'). */
  readonly preconditioner?: 'none' | 'jacobi' | 'ssor' | 'ic0' | 'multigrid';
}

/** Preconditioned BiCGSTAB (any system). */
export interface BicgstabSolver {
  /** Discriminant. */
  readonly method: 'bicgstab';
  /** Preconditioner (default 'ilu0'). */
  readonly preconditioner?: 'none' | 'jacobi' | 'ilu0' | 'multigrid';
}

/** Multigrid cycles as the solver (uniform grids). */
export interface MultigridSolver {
  /** Discriminant. */
  readonly method: 'multigrid';
  /** 'V' (default) or 'W'. */
  readonly cycle?: 'V' | 'W';
  /** Start with full multigrid. */
  readonly fullMultigrid?: boolean;
}

/** How to solve the steady system. */
export type SteadySolver = SimpleSolver | CgSolver | BicgstabSolver | MultigridSolver;

/** A steady conduction (or potential) problem. */
export interface SteadyProblem {
  /** The grid. */
  readonly grid: Grid;
  /** k > 0 (W/(m·K)); constant, function of position, or nodal field (default 1). */
  readonly conductivity?: Coefficient;
  /** Volumetric source f (W/m³): constant, function of coordinates, or nodal field (default 0). */
  readonly source?: Source;
  /** The condition of every face. */
  readonly boundary: BoundarySpec | BoundaryConditions;
  /** 2 (default), 4 or 6. */
  readonly accuracy?: number;
}

/** Solver settings of {@link solveSteady}. */
export interface SteadyOptions {
  /** The solver (default `{ method: 'auto' }`, see the module doc). */
  readonly solver?: SteadySolver;
  /** Relative residual ‖b − Au‖/‖b‖ to reach (default 1e-10). */
  readonly tolerance?: number;
  /** Iteration cap of the iterative solvers. */
  readonly maxIterations?: number;
  /** Pure-flux problems: largest relative imbalance of the data accepted (default 1e-6). */
  readonly compatibilityTolerance?: number;
}

/** The solution of a steady problem and its diagnostics. */
export interface SteadyResult {
  /** u at every node, shape `grid.shape`, x slowest. */
  readonly field: Field;
  /** The discretisation that was solved. */
  readonly discretization: Discretization;
  /** The solver that ran, e.g. `'cg+multigrid'` or `'thomas'`. */
  readonly solver: string;
  /** Iterations (0 for direct solves). */
  readonly iterations: number;
  /** Final relative residual ‖b − Au‖/‖b‖ of the system. */
  readonly residual: number;
  /** Relative residual per iteration (one entry for direct solves). */
  readonly history: Float64Array;
  /** Heat balance (accuracy 2; undefined at higher accuracy). */
  readonly heatBalance: HeatBalance | undefined;
  /** Pure-flux problems: the relative imbalance of the data that was removed; 0 otherwise. */
  readonly removedImbalance: number;
  /** Wall-clock seconds: assembly, solver set-up, solve, total. */
  readonly seconds: SteadyTimes;
}

/** Wall-clock seconds of the parts of a steady solve. */
export interface SteadyTimes {
  /** Discretisation and system assembly. */
  readonly assembly: number;
  /** Solver set-up (factorisation, preconditioner, multigrid hierarchy). */
  readonly setup: number;
  /** The solve itself. */
  readonly solve: number;
  /** Everything, heat balance included. */
  readonly total: number;
}

const now = (): number => performance.now() / 1000;

function isTridiagonal(s: LinearSystem): boolean {
  const m = s.matrix.matrix;
  for (let r = 0; r < m.rows; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (Math.abs(m.colIdx[p]! - r) > 1) return false;
  }
  return true;
}

/** Pins node `pin` to 0 (identity row, column eliminated) in a copy of the system. */
function pinned(s: LinearSystem, pin: number): LinearSystem {
  const m = s.matrix.matrix;
  const b = new CsrBuilder(m.rows, m.cols, m.values.length);
  for (let r = 0; r < m.rows; r++) {
    if (r === pin) b.add(r, 1);
    else for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (m.colIdx[p] !== pin) b.add(m.colIdx[p]!, m.values[p]!);
    b.endRow();
  }
  const csr = b.finish();
  const rhs = Float64Array.from(s.rhs);
  rhs[pin] = 0;
  return { matrix: makeOperator({ rows: m.rows, cols: m.cols, shape: s.matrix.shape, symmetric: s.matrix.symmetric, build: () => csr }), rhs };
}

/**
 * Builds and solves a steady problem −∇·(k∇u) = f (module doc for the
 * default solver and pure-flux problems). Accuracy: that of the
 * discretisation (2, 4 or 6), see `discretize`.
 *
 * @param problem - grid, conductivity, source, boundary, accuracy
 * @param options - solver, tolerance, iteration cap
 * @returns the field and its diagnostics
 * @example solveSteady({ grid: grid({ x: { from: 0, to: 1, cells: 4 } }), boundary: { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'dirichlet', value: 0 } } }).field.get(2) // 0.5
 */
export function solveSteady(problem: Readonly<SteadyProblem>, options: Readonly<SteadyOptions> = {}): SteadyResult {
  const t0 = now();
  const g = problem.grid;
  const d = discretize(g, { conductivity: problem.conductivity, boundary: problem.boundary, accuracy: problem.accuracy });
  let system = d.system({ source: problem.source });
  system.matrix.matrix; // assemble now, so that the assembly time is counted here
  const tol = options.tolerance ?? 1e-10;
  const pureFlux = d.conditions.faces.every((f) => f.condition.kind === 'neumann');
  let removedImbalance = 0;
  const prescribed = Uint8Array.from(d.prescribed);
  let pin = -1;
  if (pureFlux) {
    if (d.accuracy !== 2) {
      throw new InvalidAccuracyError(d.accuracy, 'pure-flux problems are solved at accuracy 2, where their balance can be checked exactly');
    }
    // S·1 = 0 for the volume-scaled rows, so the data balance iff Σ rhs = 0
    let sum = 0;
    let scale = 0;
    for (let i = 0; i < g.size; i++) {
      sum += system.rhs[i]!;
      scale += Math.abs(system.rhs[i]!);
    }
    const rel = scale > 0 ? Math.abs(sum) / scale : 0;
    const limit = options.compatibilityTolerance ?? 1e-6;
    if (rel > limit) throw new IncompatibleFluxError(sum, scale, limit);
    removedImbalance = rel;
    let vol = 0;
    for (let i = 0; i < g.size; i++) vol += d.volumes[i]!;
    const rhs = Float64Array.from(system.rhs, (v, i) => v - (sum * d.volumes[i]!) / vol);
    pin = 0;
    system = pinned({ matrix: system.matrix, rhs }, pin);
    prescribed[pin] = 1;
  }
  const t1 = now();

  const choice = options.solver ?? { method: 'auto' };
  const uniform = g.axes.every((a) => a.uniform);
  let method: SteadySolver = choice;
  const sine = g.dimension >= 2 && pin < 0 && uniform && (choice.method === 'auto' || choice.method === 'sine-transform')
    ? sineStencil(g.shape, system.matrix.matrix, prescribed, coordinateSpread(g.axes)) : undefined;
  if (choice.method === 'sine-transform' && sine === undefined) {
    throw new InvalidOptionError('solver', 'the sine-transform solver needs a uniform grid, constant conductivity, accuracy 2, a value on both faces of an axis with an even number of cells with no prime factor above 5 (2ᵏ, 10, 12, 100, …; y and z in 3-D), and a value or a flux on the other faces (no convection); use auto or cg');
  }
  if (choice.method === 'auto') {
    if (g.dimension === 1) method = { method: 'direct' };
    else if (sine !== undefined) method = { method: 'sine-transform' };
    else if (d.symmetric) method = { method: 'cg', preconditioner: uniform ? 'multigrid' : 'ic0' };
    else method = { method: 'bicgstab', preconditioner: 'ilu0' };
  }
  if (method.method === 'cg' && !d.symmetric) {
    throw new InvalidOptionError('solver', `conjugate gradients need a symmetric system, but accuracy ${d.accuracy} closures are not symmetric; use bicgstab`);
  }
  const iterative = { tolerance: tol, maxIterations: options.maxIterations };
  const mgFor = () => createMultigrid(g, system.matrix, { prescribed });
  let run: () => SolveResult;
  let setupEnd: number;
  switch (method.method) {
    case 'direct': {
      if (isTridiagonal(system)) {
        const m = system.matrix.matrix;
        const n = m.rows;
        const sub = new Float64Array(n);
        const diag = new Float64Array(n);
        const sup = new Float64Array(n);
        for (let r = 0; r < n; r++) {
          for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) {
            const c = m.colIdx[p]!;
            if (c === r - 1) sub[r] = m.values[p]!;
            else if (c === r) diag[r] = m.values[p]!;
            else sup[r] = m.values[p]!;
          }
        }
        const f = factorTridiagonal(sub, diag, sup);
        setupEnd = now();
        run = () => directResult('thomas', system, solveTridiagonal(f, system.rhs));
      } else {
        const lu = factorBanded(system.matrix);
        setupEnd = now();
        run = () => directResult('banded-lu', system, solveBanded(lu, system.rhs));
      }
      break;
    }
    case 'cg': {
      const pc = method.preconditioner ?? 'multigrid';
      const M = preconditionerFor(pc, system, mgFor);
      setupEnd = now();
      run = () => conjugateGradient(system.matrix, system.rhs, { ...iterative, preconditioner: M });
      break;
    }
    case 'bicgstab': {
      const pc = method.preconditioner ?? 'ilu0';
      const M = preconditionerFor(pc, system, mgFor);
      setupEnd = now();
      run = () => bicgstab(system.matrix, system.rhs, { ...iterative, preconditioner: M });
      break;
    }
    case 'sine-transform': {
      const st = createSineTransformSolver(g.shape, system.matrix.matrix, sine!, tol);
      setupEnd = now();
      run = () => {
        const t = now();
        const x = new Float64Array(system.rhs.length);
        const r = st.solve(system.rhs, x);
        return { solution: x, iterations: r.solves, residual: r.residual, history: r.history.slice(), method: 'sine-transform', seconds: now() - t };
      };
      break;
    }
    case 'multigrid': {
      const mg = createMultigrid(g, system.matrix, { prescribed, cycle: method.cycle });
      setupEnd = now();
      run = () => mg.solve(system.rhs, { ...iterative, fullMultigrid: method.fullMultigrid });
      break;
    }
    case 'auto':
      throw new InvalidOptionError('solver', 'internal: auto was not resolved');
    default: {
      const unreachable: never = method;
      throw new InvalidOptionError('solver', `${JSON.stringify((unreachable as { method?: unknown }).method)} is not a method; use auto, direct, sine-transform, cg, bicgstab or multigrid`);
    }
  }
  const result = run();
  const t3 = now();
  const u = result.solution;
  if (pin >= 0) {
    // zero mean by the control volumes
    let m = 0;
    let vol = 0;
    for (let i = 0; i < g.size; i++) {
      m += d.volumes[i]! * u[i]!;
      vol += d.volumes[i]!;
    }
    m /= vol;
    for (let i = 0; i < g.size; i++) u[i]! -= m;
  }
  const field = ndarray(u, [...g.shape]);
  const heatBalance = d.accuracy === 2 ? d.heatBalance(u, { source: problem.source }) : undefined;
  return {
    field,
    discretization: d,
    solver: result.method,
    iterations: result.iterations,
    residual: result.residual,
    history: result.history,
    heatBalance,
    removedImbalance,
    seconds: { assembly: t1 - t0, setup: setupEnd - t1, solve: t3 - setupEnd, total: now() - t0 },
  };
}

function preconditionerFor(name: string, s: LinearSystem, mg: () => { precondition(r: Float64Array, z: Float64Array): void }): Preconditioner | undefined {
  switch (name) {
    case 'none':
      return undefined;
    case 'jacobi':
      return jacobiPreconditioner(s.matrix);
    case 'ssor':
      return ssorPreconditioner(s.matrix, 1.5);
    case 'ic0':
      return incompleteCholesky(s.matrix);
    case 'ilu0':
      return incompleteLU(s.matrix);
    case 'multigrid': {
      const m = mg();
      return { name: 'multigrid', symmetric: true, apply: (r, z) => m.precondition(r, z) };
    }
    default:
      throw new InvalidOptionError('preconditioner', `${JSON.stringify(name)} is not known; use none, jacobi, ssor, ic0, ilu0 or multigrid`);
  }
}

function directResult(method: string, s: LinearSystem, x: Float64Array): SolveResult {
  const t = s.matrix.kernel;
  const r = new Float64Array(x.length);
  t(x, r);
  let num = 0;
  let den = 0;
  for (let i = 0; i < x.length; i++) {
    num += (s.rhs[i]! - r[i]!) ** 2;
    den += s.rhs[i]! ** 2;
  }
  const residual = den > 0 ? Math.sqrt(num / den) : 0;
  return { solution: x, iterations: 0, residual, history: Float64Array.of(residual), method, seconds: 0 };
}
