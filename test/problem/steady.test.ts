import { describe, expect, it } from 'vitest';
import { grid, plateWithHeatedEdge, solveSteady, type SteadySolver } from '../../src/index.js';
import { codeOf } from '../support/errors.js';
import { observedOrders } from '../support/solve.js';

const eps = Number.EPSILON;
const heatedTop = [
  { faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 0 },
  { faces: 'ymax', kind: 'dirichlet', value: 1 },
] as const;

describe('square plate, one edge at 1 and three at 0 (Carslaw & Jaeger 1959, §5.2; Incropera et al. 2007, §4.2)', () => {
  it('the centre is exactly 1/4 on every grid with an even number of cells (superposition of the four rotations)', () => {
    for (const n of [2, 4, 8, 16, 32, 64]) {
      const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
      const r = solveSteady({ grid: g, boundary: heatedTop }, { solver: { method: 'direct' } });
      // banded LU on a matrix of condition ≈ 0.4·n²: 16·ε·n² bounds the error at the centre
      expect(Math.abs(r.field.get(n / 2, n / 2) - 0.25)).toBeLessThanOrEqual(16 * eps * n * n);
    }
  });
  it('point values converge at second order to the Fourier series', () => {
    const points = [[0.5, 0.75], [0.25, 0.5], [0.75, 0.25]] as const;
    const errs = points.map(() => [] as number[]);
    for (const n of [16, 32, 64, 128]) {
      const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
      const r = solveSteady({ grid: g, boundary: heatedTop }, { tolerance: 1e-12 });
      points.forEach(([x, y], k) => errs[k]!.push(Math.abs(r.field.get(x * n, y * n) - plateWithHeatedEdge(x, y))));
    }
    for (const e of errs) for (const o of observedOrders(e)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
});

/** u = eˣ sin(2y + 0.3) (· cos z in 3-D); −Δu = (3 or 4)·u… with the sign of each dimension. */
function mms(dim: 2 | 3, n: number, accuracy: number, solver?: SteadySolver) {
  const lapFactor = dim === 2 ? 1 - 4 : 1 - 4 - 1;
  const u = (x: number, y: number, z = 0) => Math.exp(x) * Math.sin(2 * y + 0.3) * (dim === 3 ? Math.cos(z) : 1);
  const ax = { from: 0, to: 1, cells: n };
  const g = dim === 2 ? grid({ x: ax, y: ax }) : grid({ x: ax, y: ax, z: ax });
  const at = (f: (x: number, y: number, z: number) => number) => (...a: number[]) => f(a[0]!, a[1]!, dim === 3 ? a[2]! : 0);
  const boundary = {
    xmin: { kind: 'dirichlet', value: at(u) },
    xmax: { kind: 'neumann', flux: at((x, y, z) => -u(x, y, z)) },
    ymin: { kind: 'robin', h: 2, ambient: at((x, y, z) => u(x, y, z) - (2 * Math.exp(x) * Math.cos(2 * y + 0.3) * (dim === 3 ? Math.cos(z) : 1)) / 2) },
    ymax: { kind: 'dirichlet', value: at(u) },
    ...(dim === 3 ? { zmin: { kind: 'dirichlet', value: at(u) } as const, zmax: { kind: 'dirichlet', value: at(u) } as const } : {}),
  } as const;
  const r = solveSteady({ grid: g, boundary, accuracy, source: at((x, y, z) => -lapFactor * u(x, y, z)) }, { solver, tolerance: 1e-12 });
  let e = 0;
  const d = r.field.data;
  let i = 0;
  for (let a = 0; a <= n; a++) for (let b = 0; b <= n; b++) for (let c = 0; c <= (dim === 3 ? n : 0); c++) {
    e = Math.max(e, Math.abs(d[i++]! - u(a / n, b / n, c / n)));
  }
  return { e, r };
}

describe('manufactured solutions through solveSteady (order within 0.1, Roache 1998)', () => {
  it('accuracy 2 in 2-D with the default solver (cg+multigrid)', () => {
    const runs = [16, 32, 64, 128].map((n) => mms(2, n, 2));
    expect(runs[0]!.r.solver).toBe('cg+multigrid');
    for (const o of observedOrders(runs.map((r) => r.e))) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
    for (const { r } of runs) expect(r.heatBalance!.relative).toBeLessThanOrEqual(1e-9);
  });
  it('accuracy 4 in 2-D with the default nonsymmetric solver (bicgstab+ilu0)', () => {
    const runs = [16, 32, 64].map((n) => mms(2, n, 4));
    expect(runs[0]!.r.solver).toBe('bicgstab+ilu0');
    expect(runs[0]!.r.heatBalance).toBeUndefined();
    for (const o of observedOrders(runs.map((r) => r.e))) expect(Math.abs(o - 4)).toBeLessThanOrEqual(0.1);
  });
  it('accuracy 2 in 3-D', () => {
    const errs = [8, 16, 32].map((n) => mms(3, n, 2).e);
    expect(Math.abs(observedOrders(errs)[1]! - 2)).toBeLessThanOrEqual(0.1);
  });
});

describe('every solver gives the same answer', () => {
  it('direct, CG with each preconditioner, BiCGSTAB and multigrid agree to the tolerance', () => {
    const solvers: SteadySolver[] = [
      { method: 'direct' },
      { method: 'cg', preconditioner: 'none' }, { method: 'cg', preconditioner: 'jacobi' }, { method: 'cg', preconditioner: 'ssor' },
      { method: 'cg', preconditioner: 'ic0' }, { method: 'cg', preconditioner: 'multigrid' },
      { method: 'bicgstab', preconditioner: 'ilu0' }, { method: 'bicgstab', preconditioner: 'multigrid' },
      { method: 'multigrid' }, { method: 'multigrid', cycle: 'W' }, { method: 'multigrid', fullMultigrid: true },
    ];
    const ref = mms(2, 32, 2, { method: 'direct' }).r.field.data;
    for (const s of solvers) {
      const d = mms(2, 32, 2, s).r.field.data;
      let e = 0;
      for (let i = 0; i < d.length; i++) e = Math.max(e, Math.abs(d[i]! - ref[i]!));
      // relative residual 1e-12 × condition ≈ 0.4·32² ≈ 4e2, on values of size ~3
      expect(e, JSON.stringify(s)).toBeLessThanOrEqual(1e-12 * 4e2 * 3 * 10);
    }
  });
});

describe('pure-flux problems', () => {
  const g = grid({ x: { from: 0, to: 2, cells: 16 }, y: { from: 0, to: 1, cells: 8 } });
  it('balanced data: the zero-mean solution, with the heat balance closed', () => {
    // 5 W/m³ over 2 m² leaves through xmax (1 m long): 10 W/m out
    const r = solveSteady({ grid: g, source: 5, boundary: [{ faces: ['xmin', 'ymin', 'ymax'], kind: 'neumann', flux: 0 }, { faces: 'xmax', kind: 'neumann', flux: 10 }] });
    let mean = 0;
    const V = r.discretization.volumes;
    for (let i = 0; i < g.size; i++) mean += V[i]! * r.field.data[i]!;
    expect(Math.abs(mean)).toBeLessThanOrEqual(1e-10);
    expect(r.removedImbalance).toBeLessThanOrEqual(1e-14);
    expect(r.heatBalance!.relative).toBeLessThanOrEqual(1e-9);
    // the exact solution is u = −(5/2)x²/k + c (1-D in x): check its curvature
    const d2 = r.field.get(10, 4) - 2 * r.field.get(9, 4) + r.field.get(8, 4);
    expect(Math.abs(d2 / (0.125 * 0.125) + 5)).toBeLessThanOrEqual(1e-6);
  });
  it('unbalanced data is refused with the imbalance', () => {
    expect(codeOf(() => solveSteady({ grid: g, source: 5, boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'neumann', flux: 0 }] }))).toBe('INCOMPATIBLE_FLUX');
  });
  it('conjugate gradients are refused for a nonsymmetric system; bad tolerances are refused', () => {
    const bc = [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] as const;
    expect(codeOf(() => solveSteady({ grid: g, boundary: bc, accuracy: 4 }, { solver: { method: 'cg' } }))).toBe('INVALID_OPTION');
    expect(codeOf(() => solveSteady({ grid: g, boundary: bc }, { solver: { method: 'cg', preconditioner: 'none' }, tolerance: 2 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => solveSteady({ grid: g, boundary: bc, source: 1 }, { solver: { method: 'cg', preconditioner: 'none' }, maxIterations: 2, tolerance: 1e-12 }))).toBe('NOT_CONVERGED');
  });
});
