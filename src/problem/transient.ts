/**
 * Transient problems in one call: diffusion type ρc ∂u/∂t = ∇·(k∇u) + f(x, t),
 * optionally with advection by a velocity b, by the θ-method family, and
 * wave type u_tt = ∇·(c²∇u) − γu_t + f(x, t) by
 * leapfrog, with every boundary condition of the boundary stage (data may
 * depend on time) and the run driver's outputs, probes, progress,
 * cancellation and checkpoints.
 *
 * Stability guard: explicit schemes (forward Euler, θ < ½, leapfrog) are
 * checked against the Gershgorin limit of the operator before the first
 * step (see `stabilityLimit`); a larger step is refused with
 * StepTooLargeError unless `stabilityGuard: false` is passed, for
 * experiments. Implicit steps (θ ≥ ½) are set up once per step size —
 * Thomas in 1-D, multigrid-preconditioned CG in 2-D/3-D, warm-started.
 *
 * Advection. With a velocity b the equation is the energy equation of a
 * medium in bulk motion, ρc(∂u/∂t + b·∇u) = ∇·(k∇u) + f: ρc multiplies the
 * advection term because the moving medium carries its enthalpy ρc·u
 * (Incropera, F. P., DeWitt, D. P., Bergman, T. L. & Lavine, A. S. (2007).
 * Fundamentals of Heat and Mass Transfer, 6th ed., Wiley, ch. 6, the energy
 * equation with bulk motion), in advective (non-conservative) form, exact for
 * ∇·b = 0. b·∇u is differenced by the `advection` operator, central (error
 * O(h²), may oscillate where the cell Péclet number |bₐ|hₐ/α exceeds 2) or
 * first-order upwind (error O(h), monotone, artificial diffusion |bₐ|hₐ/2),
 * as in Patankar, S. V. (1980). Numerical Heat Transfer and Fluid Flow,
 * Hemisphere, ch. 5. Rows: value-prescribed nodes stay held; a flux or
 * convection face prescribes the conductive flux −k∂u/∂n only, and its
 * node's balance row carries the advection term with the operator's own
 * closure there (central: the one-sided second-order difference; upwind:
 * the upwind difference, or at an inflow node the one-sided difference
 * into the domain). A zero-flux face is thus the usual outflow condition;
 * give inflow faces a value. Advection is discretised at accuracy 2 only,
 * so `accuracy` must be 2. The step matrix is nonsymmetric: implicit steps
 * use Thomas or banded LU in 1-D and BiCGSTAB with ILU(0) in 2-D/3-D;
 * `solver: 'cg'` is refused. Explicit steps are guarded by the advective
 * limit as well (`advectionDiffusionLimit` in the stability module): with
 * central differences dt ≤ min(h²/(2α), 2α/|b|²) in 1-D, so a step is
 * refused whatever its size as α → 0; with upwind
 * dt·Σₐ(2α/hₐ² + |bₐ|/hₐ) ≤ 1. `result.peclet` reports the cell Péclet
 * numbers.
 *
 * @module
 */
import ndarray from 'ndarray';
import { type BoundaryConditions, type BoundarySpec, type Discretization, type Source, discretize } from '../boundary/index.js';
import { InvalidAccuracyError, InvalidOptionError, ShapeMismatchError, StepTooLargeError } from '../errors.js';
import type { Field, Grid } from '../grid/index.js';
import type { Coefficient } from '../operator/index.js';
import { type AdvectionOptions, type PecletReport, type Velocity, advection, cellPeclet } from '../operator/advection.js';
import { forEachNode, nodeCoordinates, sampleCoefficient, sampleNodal } from '../operator/diffusion.js';
import { CsrBuilder, type CsrMatrix } from '../operator/matrix.js';
import { type Operator, makeOperator } from '../operator/operator.js';
import { createThetaStepper } from '../time/diffusion.js';
import type { StepSolver } from '../time/implicit.js';
import { type Checkpoint, type RunOptions, type RunResult, runStepper, stepPlan } from '../time/run.js';
import { type StabilityLimit, advectionDiffusionLimit, stabilityLimit } from '../time/stability.js';
import { createLeapfrogStepper, leapfrogEnergy } from '../time/wave.js';

/** Initial data: a constant, a function of the node's coordinates, or a nodal field. */
export type Initial = number | ((...coordinates: number[]) => number) | Field;

/** A diffusion-type transient problem. */
export interface TransientProblem {
  /** The grid. */
  readonly grid: Grid;
  /** k > 0 (W/(m·K)), default 1. */
  readonly conductivity?: Coefficient;
  /** ρc > 0 (J/(m³·K)), default 1. */
  readonly heatCapacity?: Coefficient;
  /** f (W/m³): constant, function of coordinates then time, or field; default 0. */
  readonly source?: Source;
  /** The condition of every face (data may depend on time). */
  readonly boundary: BoundarySpec | BoundaryConditions;
  /** Spatial accuracy 2 (default), 4 or 6. */
  readonly accuracy?: number;
  /** u at the start time. */
  readonly initial: Initial;
  /**
   * b (m/s): one component per axis, each a constant or a function of the
   * node's coordinates (steady); adds ρc·b·∇u to the left-hand side (module
   * doc). Default: no advection.
   */
  readonly velocity?: Velocity;
  /** Differencing of b·∇u: 'central' (default, accuracy 2) or 'upwind' (accuracy 1, monotone). Only with `velocity`. */
  readonly advectionScheme?: AdvectionOptions['scheme'];
}

/** The θ-method with a weight of one's own. */
export interface ThetaScheme {
  /** θ in [0, 1]: 0 forward Euler, ½ Crank–Nicolson, 1 backward Euler. */
  readonly theta: number;
}

/** The time scheme of a diffusion-type run. */
export type DiffusionScheme = 'forward-euler' | 'backward-euler' | 'crank-nicolson' | ThetaScheme;

/** Options of {@link solveTransient}. */
export interface TransientOptions extends RunOptions {
  /** The scheme. */
  readonly scheme: DiffusionScheme;
  /** Requested step (s); the run uses dt' = (end − start)/⌈(end − start)/dt⌉ ≤ dt. */
  readonly dt: number;
  /** Crank–Nicolson / θ: replace the first steps by two backward-Euler half steps each (Rannacher 1984); default 0. */
  readonly rannacherSteps?: number;
  /** Refuse explicit steps above the stability limit (default true). */
  readonly stabilityGuard?: boolean;
  /** Implicit-step solver (default 'auto'). */
  readonly solver?: StepSolver;
  /** Relative residual of iterative implicit solves (default 1e-10). */
  readonly tolerance?: number;
  /** Continue a run from this checkpoint (same problem and times). */
  readonly resume?: Checkpoint;
}

/** A transient run's result with the stability estimate of explicit schemes. */
export interface TransientResult extends RunResult {
  /** The spectral estimates (explicit schemes only); with advection its part in `stability.advection`. */
  readonly stability: StabilityLimit | undefined;
  /**
   * With a velocity: the largest cell Péclet numbers |bₐ|hₐ/α, α = k/ρc
   * (the smallest α when it varies, so an upper bound); `centralMayOscillate`
   * flags Pe > 2, where central differences may oscillate. Undefined
   * without a velocity.
   */
  readonly peclet: PecletReport | undefined;
  /** The discretisation used. */
  readonly discretization: Discretization;
  /**
   * The linear solve of the main steps (see `solver` of the options):
   * 'thomas' (tridiagonal, including forward Euler's diagonal system),
   * 'banded-lu' (other systems under 'direct', 1-D by default),
   * 'sine-transform', 'cg+multigrid', 'cg+ic0' or 'bicgstab+ilu0'.
   */
  readonly solver: string;
}

function sampleInitial(g: Grid, v: Initial, what: string): Float64Array {
  return sampleNodal(g, v, what, (x, _kind, where) => {
    if (!Number.isFinite(x)) throw new InvalidOptionError(what, `${x}${where()} is not finite; give finite values`);
  });
}

interface AdvectionParts {
  scheme: AdvectionOptions['scheme'];
  /** B = b·∇ at every node. */
  matrix: CsrMatrix;
  /** |b|² at every node. */
  speedSquared: Float64Array;
  peclet: PecletReport;
}

/** Checks the advection inputs and builds B, |b|² and the Péclet report. */
function advectionParts(problem: Readonly<TransientProblem>, accuracy: number, diffusivity: () => Float64Array): AdvectionParts | undefined {
  const g = problem.grid;
  const v = problem.velocity;
  if (v === undefined) {
    if (problem.advectionScheme !== undefined) {
      throw new InvalidOptionError('advectionScheme', `"${problem.advectionScheme}" is given without a velocity; give velocity too, or drop advectionScheme`);
    }
    return undefined;
  }
  const alpha = diffusivity();
  const axes = g.axes.map((a) => a.name).join(', ');
  if (!Array.isArray(v) || v.length !== g.dimension) {
    const got = Array.isArray(v) ? `${v.length} component(s)` : `a ${typeof v}`;
    throw new InvalidOptionError('velocity', `${got} given on a ${g.dimension}-D grid; give ${g.dimension}, one per axis (${axes}), in m/s`);
  }
  v.forEach((c, a) => {
    if (typeof c === 'number' && !Number.isFinite(c)) {
      throw new InvalidOptionError('velocity', `component ${g.axes[a]!.name} is ${c}; give a finite speed in m/s (0 for none)`);
    }
    if (typeof c !== 'number' && typeof c !== 'function') {
      throw new InvalidOptionError('velocity', `component ${g.axes[a]!.name} is a ${typeof c}; give a number or a function of the coordinates`);
    }
  });
  const scheme = problem.advectionScheme ?? 'central';
  if (scheme !== 'central' && scheme !== 'upwind') {
    throw new InvalidOptionError('advectionScheme', `${JSON.stringify(scheme)} is not a scheme; use "central" or "upwind"`);
  }
  if (accuracy !== 2) {
    throw new InvalidAccuracyError(accuracy, 'advection is differenced at accuracy 2 (central) or 1 (upwind); use accuracy 2 with a velocity');
  }
  // the operator checks every sampled value (NonFiniteValueError for functions)
  const matrix = advection(g, { velocity: v, scheme }).matrix;
  const speedSquared = new Float64Array(g.size);
  forEachNode(g, (r, i, j, k) => {
    for (const c of v) {
      const b = typeof c === 'number' ? c : c(...nodeCoordinates(g, i, j, k));
      speedSquared[r]! += b * b;
    }
  });
  let aMin = Infinity;
  for (let i = 0; i < alpha.length; i++) aMin = Math.min(aMin, alpha[i]!);
  return { scheme, matrix, speedSquared, peclet: cellPeclet(g, v, aMin) };
}

function usesFunctions(bc: BoundaryConditions, source: Source | undefined): boolean {
  return typeof source === 'function' || bc.faces.some(({ condition: c }) =>
    (c.kind === 'dirichlet' && typeof c.value === 'function') ||
    (c.kind === 'neumann' && typeof c.flux === 'function') ||
    (c.kind === 'robin' && typeof c.ambient === 'function'));
}

function checkResume(c: Checkpoint | undefined, scheme: string, start: number, end: number, dt: number, n: number, vectors: number): void {
  if (c === undefined) return;
  if (c.format !== 'quadrille-checkpoint' || c.scheme !== scheme || c.startTime !== start || c.endTime !== end || c.dt !== dt) {
    throw new InvalidOptionError('resume', `the checkpoint is of a ${c.scheme} run ${c.startTime} → ${c.endTime} s with dt ${c.dt}, this run is ${scheme} ${start} → ${end} s with dt ${dt}; resume with the same times, step and scheme`);
  }
  if (c.state.length !== vectors || c.state.some((v) => v.length !== n)) {
    throw new ShapeMismatchError(`the checkpoint holds ${c.state.length} vector(s) of ${c.state[0]?.length} values; this run needs ${vectors} of ${n}`);
  }
}

/**
 * Runs a diffusion-type transient problem (module doc).
 *
 * @param problem - grid, coefficients, source, boundary, initial field
 * @param options - scheme, dt, end time, outputs, probes, hooks
 * @returns the final field, outputs, probe series and a checkpoint
 * @example solveTransient({ grid: grid({ x: { from: 0, to: 1, cells: 20 } }), initial: (x) => Math.sin(Math.PI * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] }, { scheme: 'crank-nicolson', dt: 1e-3, endTime: 0.1 }).steps // 100
 */
export function solveTransient(problem: Readonly<TransientProblem>, options: Readonly<TransientOptions>): TransientResult {
  const g = problem.grid;
  const d = discretize(g, { conductivity: problem.conductivity, boundary: problem.boundary, accuracy: problem.accuracy });
  const capacity = sampleCoefficient(g, problem.heatCapacity ?? 1, 'heatCapacity');
  // α = k/ρc, needed only with advection (cell Péclet numbers and its stability limits)
  let alpha: Float64Array | undefined;
  const diffusivity = (): Float64Array => {
    if (alpha === undefined) {
      const k = d.conductivity;
      alpha = new Float64Array(k.length);
      for (let i = 0; i < k.length; i++) alpha[i] = k[i]! / capacity[i]!;
    }
    return alpha;
  };
  const adv = advectionParts(problem, d.accuracy, diffusivity);
  const start = options.startTime ?? 0;
  const plan = stepPlan(start, options.endTime, options.dt);
  const s = options.scheme;
  const theta = s === 'forward-euler' ? 0 : s === 'backward-euler' ? 1 : s === 'crank-nicolson' ? 0.5 : s?.theta;
  if (!(typeof theta === 'number' && theta >= 0 && theta <= 1)) {
    throw new InvalidOptionError('scheme', 'use "forward-euler", "backward-euler", "crank-nicolson" or { theta } with 0 ≤ θ ≤ 1');
  }
  const rannacher = options.rannacherSteps ?? 0;
  if (!(Number.isSafeInteger(rannacher) && rannacher >= 0)) throw new InvalidOptionError('rannacherSteps', `${rannacher} is not a whole number ≥ 0`);
  let stability: StabilityLimit | undefined;
  if (theta < 0.5) {
    const cons = d.constrained as Uint8Array;
    stability = adv === undefined
      ? stabilityLimit(d.operator, capacity, cons)
      : advectionDiffusionLimit(d.operator, totalOperator(d.operator.matrix, adv.matrix, capacity, cons, g.shape), adv.scheme, capacity, cons, diffusivity(), adv.speedSquared);
    const limit = stability.forwardEuler / (1 - 2 * theta);
    if (options.stabilityGuard !== false && plan.dt > limit) {
      const a = stability.advection;
      let why: string | undefined;
      if (a !== undefined && a.scheme === 'central' && a.advective <= a.diffusive) {
        // as α → 0 this limit goes to 0: no step is stable, so name the way out
        why = `the advective limit 2α/|b|² of central differencing, ${a.advective.toPrecision(6)} s, binds, below the diffusive ${a.diffusive.toPrecision(6)} s; ` +
          `with advectionScheme: 'upwind' the limit is dt·Σₐ(2α/hₐ² + |bₐ|/hₐ) ≤ 1 instead`;
      } else if (a !== undefined && a.scheme === 'upwind') {
        why = 'diffusion with upwind advection, dt·Σₐ(2α/hₐ² + |bₐ|/hₐ) ≤ 1';
      }
      throw new StepTooLargeError(plan.dt, limit, theta === 0 ? 'forward Euler' : `θ = ${theta}`, why);
    }
  }
  const u = sampleInitial(g, problem.initial, 'initial');
  const stepper = createThetaStepper(
    { d, capacity, source: problem.source, timeDependent: usesFunctions(d.conditions, problem.source), advection: adv?.matrix },
    u, theta, plan.dt,
    { solver: options.solver ?? 'auto', tolerance: options.tolerance ?? 1e-10, rannacherSteps: rannacher },
  );
  checkResume(options.resume, stepper.scheme, start, options.endTime, plan.dt, g.size, 1);
  if (options.resume) u.set(options.resume.state[0]!);
  const result = runStepper(g, stepper, plan, options, options.resume?.step ?? 0);
  return { ...result, stability, peclet: adv?.peclet, discretization: d, solver: stepper.solver };
}

/** A − diag(ρc)·B on the balance rows, A on the constraint rows. */
function totalOperator(a: CsrMatrix, b: CsrMatrix, capacity: Float64Array, constrained: Uint8Array, shape: readonly number[]): Operator {
  const n = a.rows;
  const m = new CsrBuilder(n, n, a.values.length + b.values.length);
  for (let r = 0; r < n; r++) {
    for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) m.add(a.colIdx[q]!, a.values[q]!);
    if (!constrained[r]) for (let q = b.rowPtr[r]!; q < b.rowPtr[r + 1]!; q++) m.add(b.colIdx[q]!, -capacity[r]! * b.values[q]!);
    m.endRow();
  }
  const csr = m.finish();
  return makeOperator({ rows: n, cols: n, shape, symmetric: false, build: () => csr });
}

/** A wave-type transient problem u_tt = ∇·(c²∇u) − γu_t + f. */
export interface WaveProblem {
  /** The grid. */
  readonly grid: Grid;
  /** Wave speed c > 0 (m/s): constant, function of position or field (default 1). */
  readonly waveSpeed?: Coefficient;
  /** Linear damping γ ≥ 0 (1/s), default 0. */
  readonly damping?: number;
  /** f (m/s²): constant, function of coordinates then time, or field; default 0. */
  readonly source?: Source;
  /** The condition of every face (a clamped end is a value face, a free end a zero-flux face). */
  readonly boundary: BoundarySpec | BoundaryConditions;
  /** Spatial accuracy 2 (default), 4 or 6. */
  readonly accuracy?: number;
  /** Initial displacement. */
  readonly initial: Initial;
  /** Initial velocity (default 0). */
  readonly velocity?: Initial;
}

/** Options of {@link solveWave}. */
export interface WaveOptions extends RunOptions {
  /** Requested step (s); the run uses dt' ≤ dt (see the run driver). */
  readonly dt: number;
  /** Refuse steps above the CFL limit (default true). */
  readonly stabilityGuard?: boolean;
  /** Record the discrete energy after every step (one extra operator product per step; default false). */
  readonly recordEnergy?: boolean;
  /** Continue a run from this checkpoint. */
  readonly resume?: Checkpoint;
}

/** A wave run's result with its energy history. */
export interface WaveResult extends RunResult {
  /** The CFL estimates. */
  readonly stability: StabilityLimit;
  /** The discretisation of ∇·(c²∇u). */
  readonly discretization: Discretization;
  /** Discrete energy Eⁿ⁺½ after each step (module doc of the wave stepper), aligned with `times` from index 1; empty unless `recordEnergy`. */
  readonly energy: Float64Array;
}

/**
 * Runs a wave-type problem by leapfrog with a second-order Taylor first
 * step (see the wave stepper for the formula, accuracy and energy).
 *
 * @param problem - grid, wave speed, damping, boundary, initial displacement and velocity
 * @param options - dt, end time, outputs, probes, hooks
 * @returns the final displacement, outputs, probe series, energy, checkpoint
 * @example solveWave({ grid: grid({ x: { from: 0, to: 1, cells: 50 } }), initial: (x) => Math.sin(Math.PI * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] }, { dt: 0.01, endTime: 1 }).steps // 100
 */
export function solveWave(problem: Readonly<WaveProblem>, options: Readonly<WaveOptions>): WaveResult {
  const g = problem.grid;
  const c = sampleCoefficient(g, problem.waveSpeed ?? 1, 'waveSpeed');
  const c2 = c.map((v) => v * v);
  const d = discretize(g, {
    conductivity: typeof problem.waveSpeed === 'number' || problem.waveSpeed === undefined ? (problem.waveSpeed ?? 1) ** 2 : (ndarrayOf(g, c2) as Field),
    boundary: problem.boundary,
    accuracy: problem.accuracy,
  });
  const gamma = problem.damping ?? 0;
  if (!(Number.isFinite(gamma) && gamma >= 0)) throw new InvalidOptionError('damping', `${gamma} is not a finite number ≥ 0`);
  const start = options.startTime ?? 0;
  const plan = stepPlan(start, options.endTime, options.dt);
  const stability = stabilityLimit(d.operator, new Float64Array(g.size).fill(1), d.constrained as Uint8Array);
  if (options.stabilityGuard !== false && plan.dt > stability.leapfrog) {
    throw new StepTooLargeError(plan.dt, stability.leapfrog, 'leapfrog (CFL)');
  }
  const u = sampleInitial(g, problem.initial, 'initial');
  const v0 = sampleInitial(g, problem.velocity ?? 0, 'velocity');
  const timeDependent = usesFunctions(d.conditions, problem.source);
  const uniform2d = g.dimension === 2 && g.axes.every((a) => a.uniform && !a.periodic);
  const structured = uniform2d && (d.accuracy === 2) && typeof (problem.waveSpeed ?? 1) === 'number' && !timeDependent &&
    (problem.source === undefined || typeof problem.source === 'number') && d.conditions.faces.every((f) => f.condition.kind === 'dirichlet')
    ? { cx: c2[0]! / g.dx! ** 2, cy: c2[0]! / g.dy! ** 2, f: (problem.source as number | undefined) ?? 0 }
    : undefined;
  const stepper = createLeapfrogStepper({ d, source: problem.source, damping: gamma, timeDependent, structured }, u, v0, plan.dt);
  checkResume(options.resume, 'leapfrog', start, options.endTime, plan.dt, g.size, 2);
  if (options.resume) {
    stepper.state[0]!.set(options.resume.state[0]!);
    stepper.state[1]!.set(options.resume.state[1]!);
  }
  const energy = new Float64Array(options.recordEnergy ? plan.steps - (options.resume?.step ?? 0) : 0);
  let k = 0;
  const userHook = options.onStep;
  const result = runStepper(g, stepper, plan, options.recordEnergy ? {
    ...options,
    onStep: (view) => {
      energy[k++] = leapfrogEnergy(d, stepper.state[0]!, stepper.state[1]!, plan.dt);
      if (userHook) userHook(view);
    },
  } : options, options.resume?.step ?? 0);
  return { ...result, stability, discretization: d, energy: energy.slice(0, k) };
}

function ndarrayOf(g: Grid, v: Float64Array): Field {
  return ndarray(v, [...g.shape]);
}
