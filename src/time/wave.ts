/**
 * Leapfrog for wave-type problems u_tt = ∇·(c²∇u) − γ u_t + f(x, t).
 *
 * With A the discretised ∇·(c²∇u) (the diffusion operator with "conductivity"
 * c²), g its boundary data, and the damping term centred in time,
 *
 *   (1 + γdt/2) uⁿ⁺¹ = 2uⁿ − (1 − γdt/2) uⁿ⁻¹ + dt² (Auⁿ + gⁿ + fⁿ)
 *
 * on balance rows, constraint rows imposed at tⁿ⁺¹. Second order in time
 * and space; stable while dt·√ρ(−A) ≤ 2 (in 1-D with constant c, the CFL
 * condition c·dt/h ≤ 1). The first step is the Taylor step
 * u¹ = u⁰ + dt·v⁰ + (dt²/2)(Au⁰ + g⁰ + f⁰ − γv⁰), second order as well.
 * Without damping and forcing the discrete energy
 *
 *   Eⁿ⁺½ = ½ Σᵢ Vᵢ ((uᵢⁿ⁺¹ − uᵢⁿ)/dt)² − ½ (uⁿ⁺¹)ᵀ S uⁿ,   S = diag(V)·A,
 *
 * is conserved exactly (to round-off) for homogeneous value or flux faces.
 * Source: LeVeque (2007), §10.10; Strikwerda (2004), §8.2; the energy
 * identity follows by summing the scheme against uⁿ⁺¹ − uⁿ⁻¹ (common practice).
 *
 * @module
 */
import { type Discretization, sampleSource, type Source } from '../boundary/discretize.js';
import { CsrBuilder, type CsrMatrix, csrKernel } from '../operator/matrix.js';
import { leapfrog5 } from './base/leapfrog5.js';
import { prepareSolve, type PreparedSolve } from './implicit.js';
import type { Stepper } from './stepper.js';

/** What the leapfrog stepper is built from. @internal */
export interface WaveParts {
  readonly d: Discretization;
  readonly source: Source | undefined;
  readonly damping: number;
  readonly timeDependent: boolean;
  /**
   * The structured fast path, when it applies: a uniform 2-D grid, constant
   * c, accuracy 2, value faces only and constant data. cx = c²/dx², cy = c²/dy².
   */
  readonly structured?: { readonly cx: number; readonly cy: number; readonly f: number };
}

/** Solves the flux constraint rows (accuracy 4, 6) for the boundary values, given the rest. */
function constraintSolver(d: Discretization): ((u: Float64Array, c: Float64Array) => void) | undefined {
  const n = d.grid.size;
  const free: number[] = [];
  for (let r = 0; r < n; r++) if (d.constrained[r] && !d.prescribed[r]) free.push(r);
  if (free.length === 0) return undefined;
  // K = identity except the constraint rows; K u = rhs with rhs = u on other rows, c on constraint rows
  const a = d.operator.matrix;
  const b = new CsrBuilder(n, n, n + free.length * 8);
  for (let r = 0; r < n; r++) {
    if (d.constrained[r] && !d.prescribed[r]) for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) b.add(a.colIdx[q]!, a.values[q]!);
    else b.add(r, 1);
    b.endRow();
  }
  const k: CsrMatrix = b.finish();
  const solve: PreparedSolve = prepareSolve(d.grid, k, false, d.prescribed as Uint8Array, { solver: 'bicgstab', tolerance: 1e-13 });
  const rhs = new Float64Array(n);
  return (u, c) => {
    rhs.set(u);
    for (const r of free) rhs[r] = c[r]!;
    solve.solve(rhs, u);
  };
}

/**
 * The leapfrog stepper (module formula). State: [uⁿ, uⁿ⁻¹].
 *
 * @internal
 */
export function createLeapfrogStepper(p: WaveParts, u0: Float64Array, v0: Float64Array, dt: number): Stepper {
  const { d, damping: gamma } = p;
  const n = u0.length;
  const cons = d.constrained;
  const multiply = csrKernel(d.operator.matrix);
  const u = u0;
  const prev = new Float64Array(n);
  const next = new Float64Array(n);
  const au = new Float64Array(n);
  const g = new Float64Array(n);
  const gNext = new Float64Array(n);
  const f = new Float64Array(n);
  const constant = !p.timeDependent;
  if (constant) {
    d.boundaryTerm(0, g);
    gNext.set(g);
    sampleSource(d.grid, p.source, 0, f);
  }
  const fix = constraintSolver(d);
  const cp = 1 + (gamma * dt) / 2;
  const cm = 1 - (gamma * dt) / 2;
  const dt2 = dt * dt;
  const state = [u, prev];
  const st = p.structured;
  const [nx, ny] = d.grid.shape as readonly number[] as [number, number];
  return {
    scheme: 'leapfrog',
    size: n,
    state,
    lastIterations: 0,
    advance(t: number, step: number): number | void {
      if (st !== undefined && step > 0) {
        // one fused pass writes the new level over the oldest; then the two swap roles
        const sum = leapfrog5(nx, ny, st.cx, st.cy, -2 * (st.cx + st.cy), dt2, cm, 1 / cp, st.f, state[0]!, state[1]!);
        const t0 = state[0]!;
        state[0] = state[1]!;
        state[1] = t0;
        return sum;
      }
      const u = state[0]!;
      const prev = state[1]!;
      if (!constant) {
        d.boundaryTerm(t, g);
        d.boundaryTerm(t + dt, gNext);
        sampleSource(d.grid, p.source, t, f);
      }
      multiply(u, au);
      if (step === 0) {
        // Taylor start from the initial velocity
        for (let i = 0; i < n; i++) {
          next[i] = cons[i] ? gNext[i]! : u[i]! + dt * v0[i]! + 0.5 * dt2 * (au[i]! + g[i]! + f[i]! - gamma * v0[i]!);
        }
      } else {
        for (let i = 0; i < n; i++) {
          next[i] = cons[i] ? gNext[i]! : (2 * u[i]! - cm * prev[i]! + dt2 * (au[i]! + g[i]! + f[i]!)) / cp;
        }
      }
      if (fix) fix(next, gNext);
      prev.set(u);
      u.set(next);
      return undefined;
    },
  };
}

/**
 * The discrete energy Eⁿ⁺½ of the module formula for levels `uNew` = uⁿ⁺¹
 * and `uOld` = uⁿ (balance rows; prescribed nodes count as held).
 *
 * @internal
 */
export function leapfrogEnergy(d: Discretization, uNew: Float64Array, uOld: Float64Array, dt: number): number {
  const s = d.scaledOperator.matrix;
  let kinetic = 0;
  let potential = 0;
  for (let r = 0; r < s.rows; r++) {
    if (d.constrained[r]) continue;
    const v = (uNew[r]! - uOld[r]!) / dt;
    kinetic += d.volumes[r]! * v * v;
    let su = 0;
    for (let q = s.rowPtr[r]!; q < s.rowPtr[r + 1]!; q++) if (!d.constrained[s.colIdx[q]!]) su += s.values[q]! * uOld[s.colIdx[q]!]!;
    potential -= uNew[r]! * su;
  }
  return 0.5 * (kinetic + potential);
}
