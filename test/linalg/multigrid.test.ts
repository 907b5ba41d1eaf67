import { describe, expect, it } from 'vitest';
import {
  type Grid, NotConvergedError, discretize, factorBanded, grid, solveBanded,
} from '../../src/index.js';
import { createMultigrid, type Multigrid } from '../../src/linalg/multigrid.js';
import { axisTransfer, regularRows } from '../../src/linalg/base/coarsen.js';
import { galerkinProduct } from '../../src/linalg/base/galerkin.js';
import {
  findDiagonal, gaussSeidelBackward, gaussSeidelForward, levelMatrix, residual, upperResidual,
} from '../../src/linalg/base/smooth.js';
import { contractLine, expandLine } from '../../src/linalg/base/transfer.js';
import type { CsrMatrix } from '../../src/operator/matrix.js';
import { codeOf, errorOf } from '../support/errors.js';
import { mulberry32 } from '../support/prng.js';

const eps = Number.EPSILON;
const PI = Math.PI;
const ALL2 = ['xmin', 'xmax', 'ymin', 'ymax'] as const;
const ALL3 = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'] as const;

/** e^s·(sin πs)'' + 2(e^s)'(sin πs)' + (e^s)'' sin πs, over e^s: the 1-D factor of −Δ(e^{x+y} sin πx sin πy). */
function d2(s: number): number {
  return Math.sin(PI * s) + 2 * PI * Math.cos(PI * s) - PI * PI * Math.sin(PI * s);
}

/** W2's problem: −Δu = f, u = e^{x+y} sin πx sin πy, zero Dirichlet on the unit square (or cube). */
function poisson(cells: number, dim: 2 | 3 = 2) {
  const ax = { from: 0, to: 1, cells };
  const g: Grid = dim === 2 ? grid({ x: ax, y: ax }) : grid({ x: ax, y: ax, z: ax });
  const d = discretize(g, { boundary: [{ faces: dim === 2 ? [...ALL2] : [...ALL3], kind: 'dirichlet', value: 0 }] });
  const source = dim === 2
    ? (x: number, y: number) => -Math.exp(x + y) * (d2(x) * Math.sin(PI * y) + d2(y) * Math.sin(PI * x))
    : (x: number, y: number, z: number) => -Math.exp(x + y + z)
      * (d2(x) * Math.sin(PI * y) * Math.sin(PI * z) + d2(y) * Math.sin(PI * x) * Math.sin(PI * z) + d2(z) * Math.sin(PI * x) * Math.sin(PI * y));
  const s = d.system({ source });
  return { g, d, a: s.matrix, rhs: s.rhs };
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i]! * b[i]!;
  return s;
}

function norm(a: Float64Array): number {
  return Math.sqrt(dot(a, a));
}

function relDiff(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i]! - b[i]!) ** 2;
  return Math.sqrt(s) / norm(b);
}

function matvec(a: CsrMatrix, x: Float64Array): Float64Array {
  const y = new Float64Array(a.rows);
  for (let r = 0; r < a.rows; r++) {
    let s = 0;
    for (let p = a.rowPtr[r]!; p < a.rowPtr[r + 1]!; p++) s += a.values[p]! * x[a.colIdx[p]!]!;
    y[r] = s;
  }
  return y;
}

/** Conjugate gradients preconditioned by one multigrid cycle, from 0, to ‖r‖/‖b‖ ≤ tol; returns the iterations. */
function pcgIterations(a: CsrMatrix, b: Float64Array, mg: Multigrid, tol = 1e-8): { iterations: number; x: Float64Array } {
  const n = b.length;
  const x = new Float64Array(n);
  const r = Float64Array.from(b);
  const z = new Float64Array(n);
  mg.precondition(r, z);
  const p = Float64Array.from(z);
  let rz = dot(r, z);
  const bn = norm(b);
  for (let it = 1; it <= 200; it++) {
    const q = matvec(a, p);
    const alpha = rz / dot(p, q);
    for (let i = 0; i < n; i++) {
      x[i]! += alpha * p[i]!;
      r[i]! -= alpha * q[i]!;
    }
    if (norm(r) <= tol * bn) return { iterations: it, x };
    mg.precondition(r, z);
    const rzNew = dot(r, z);
    const beta = rzNew / rz;
    rz = rzNew;
    for (let i = 0; i < n; i++) p[i] = z[i]! + beta * p[i]!;
  }
  return { iterations: Infinity, x };
}

function random(n: number, seed: number): Float64Array {
  const rnd = mulberry32(seed);
  return Float64Array.from({ length: n }, () => rnd() - 0.5);
}

describe('createMultigrid: the hierarchy', () => {
  it('halves every axis down to coarsestSize: 64² cells → 65², 33², 17² nodes', () => {
    const { g, d, a } = poisson(64);
    const mg = createMultigrid(g, a, { prescribed: d.prescribed });
    expect(mg.levels).toBe(3);
    expect(mg.sizes).toEqual([65 * 65, 33 * 33, 17 * 17]);
    expect(createMultigrid(g, a, { coarsestSize: 100 }).sizes).toEqual([65 * 65, 33 * 33, 17 * 17, 9 * 9]);
  });
  it('solves a grid that cannot be halved (45² cells) directly, in one iteration, as banded LU does', () => {
    const { g, a, rhs } = poisson(45);
    const mg = createMultigrid(g, a);
    expect(mg.levels).toBe(1);
    const r = mg.solve(rhs);
    expect(r.iterations).toBe(1);
    const lu = solveBanded(factorBanded(a), rhs);
    // the same LU factors, one residual correction: cond ≈ cot²(π/90) ≈ 820, so 16·cond·ε bounds the difference
    expect(relDiff(r.solution, lu)).toBeLessThanOrEqual(16 * 820 * eps);
  });
  it('keeps coarsening an odd cell count when its direct solve would be expensive (99², 250², 1-D odd)', () => {
    for (const cells of [99, 250]) {
      const { g, d, a, rhs } = poisson(cells);
      const mg = createMultigrid(g, a, { prescribed: d.prescribed });
      expect(mg.levels).toBeGreaterThan(1);
      expect(mg.solve(rhs).iterations).toBeLessThanOrEqual(12);
    }
  });
  it('coarsens rectangles of non-power-of-two sizes together (48 × 96 cells → … → 4 × 7 nodes)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 48 }, y: { from: 0, to: 2, cells: 96 } });
    const d = discretize(g, { boundary: [{ faces: [...ALL2], kind: 'dirichlet', value: 0 }] });
    const { matrix, rhs } = d.system({ source: (x: number, y: number) => 1 + x * y });
    const mg = createMultigrid(g, matrix, { prescribed: d.prescribed });
    expect(mg.sizes).toEqual([49 * 97, 25 * 49, 13 * 25]);
    expect(mg.solve(rhs).iterations).toBeLessThanOrEqual(12);
  });
});

describe('grid-independent convergence (Brandt 1977; Trottenberg, Oosterlee & Schüller 2001)', () => {
  it('2-D: V(1,1)-cycles to 1e-8 stay ≤ 12 from 32² to 256² cells', () => {
    const counts = [32, 64, 128, 256].map((c) => {
      const { g, d, a, rhs } = poisson(c);
      return createMultigrid(g, a, { prescribed: d.prescribed }).solve(rhs).iterations;
    });
    for (const k of counts) expect(k).toBeLessThanOrEqual(12);
    expect(Math.max(...counts) - Math.min(...counts)).toBeLessThanOrEqual(1);
  });
  it('3-D: V(1,1)-cycles to 1e-8 stay ≤ 15 from 16³ to 64³ cells', () => {
    const counts = [16, 32, 64].map((c) => {
      const { g, d, a, rhs } = poisson(c, 3);
      return createMultigrid(g, a, { prescribed: d.prescribed }).solve(rhs).iterations;
    });
    for (const k of counts) expect(k).toBeLessThanOrEqual(15);
    expect(Math.max(...counts) - Math.min(...counts)).toBeLessThanOrEqual(2);
  });
  it('as a CG preconditioner: ≤ 10 iterations at 256² cells', () => {
    const { g, d, a, rhs } = poisson(256);
    const mg = createMultigrid(g, a, { prescribed: d.prescribed });
    expect(pcgIterations(a.matrix, rhs, mg).iterations).toBeLessThanOrEqual(10);
  });
});

describe('accuracy', () => {
  it('agrees with a banded-LU direct solve to within cond·tolerance', () => {
    for (const cells of [16, 32]) {
      const { g, d, a, rhs } = poisson(cells);
      const r = createMultigrid(g, a, { prescribed: d.prescribed }).solve(rhs, { tolerance: 1e-10 });
      const lu = solveBanded(factorBanded(a), rhs);
      // ‖x − x*‖/‖x*‖ ≤ cond·‖b − Ax‖/‖b‖; the volume-scaled five-point matrix has cond = cot²(πh/2)
      const cond = 1 / Math.tan(PI / (2 * cells)) ** 2;
      expect(relDiff(r.solution, lu)).toBeLessThanOrEqual(cond * 1e-10);
      expect(r.residual).toBeLessThanOrEqual(1e-10);
    }
  });
  it('converges to the exact solution at O(h²) (W2, 64² → 128² cells: error ratio ≈ 4)', () => {
    const errs = [64, 128].map((c) => {
      const { g, d, a, rhs } = poisson(c);
      const x = createMultigrid(g, a, { prescribed: d.prescribed }).solve(rhs).solution;
      let e = 0;
      const xs = g.x.coordinates;
      for (let i = 0; i <= c; i++) {
        for (let j = 0; j <= c; j++) e = Math.max(e, Math.abs(x[i * (c + 1) + j]! - Math.exp(xs[i]! + xs[j]!) * Math.sin(PI * xs[i]!) * Math.sin(PI * xs[j]!)));
      }
      return e;
    });
    expect(Math.log2(errs[0]! / errs[1]!)).toBeGreaterThan(1.9);
    expect(Math.log2(errs[0]! / errs[1]!)).toBeLessThan(2.1);
  });
});

describe('cycles and smoothers', () => {
  const { g, d, a, rhs } = poisson(128);
  const plain = createMultigrid(g, a, { prescribed: d.prescribed }).solve(rhs);
  it('W-cycles converge in no more cycles than V-cycles', () => {
    const r = createMultigrid(g, a, { prescribed: d.prescribed, cycle: 'W' }).solve(rhs);
    expect(r.iterations).toBeLessThanOrEqual(plain.iterations);
    expect(r.method).toBe('multigrid-W');
  });
  it('full multigrid reaches the discretisation error in its first pass', () => {
    const mg = createMultigrid(g, a, { prescribed: d.prescribed });
    const one = mg.solve(rhs, { fullMultigrid: true, tolerance: 0.5, maxIterations: 1 });
    expect(one.iterations).toBe(1);
    const c = 128;
    const xs = g.x.coordinates;
    let eOne = 0;
    let eConv = 0;
    for (let i = 0; i <= c; i++) {
      for (let j = 0; j <= c; j++) {
        const u = Math.exp(xs[i]! + xs[j]!) * Math.sin(PI * xs[i]!) * Math.sin(PI * xs[j]!);
        eOne = Math.max(eOne, Math.abs(one.solution[i * (c + 1) + j]! - u));
        eConv = Math.max(eConv, Math.abs(plain.solution[i * (c + 1) + j]! - u));
      }
    }
    // one FMG pass with a V(1,1)-cycle per level: within a small multiple of the truncation error
    expect(eOne).toBeLessThanOrEqual(2 * eConv);
    const full = mg.solve(rhs, { fullMultigrid: true });
    expect(full.iterations).toBeLessThanOrEqual(plain.iterations);
    expect(full.history[1]!).toBeLessThan(plain.history[1]!);
    expect(full.method).toBe('multigrid-V+fmg');
  });
  it('damped Jacobi and V(2,2) converge; more sweeps, fewer cycles', () => {
    const jac = createMultigrid(g, a, { prescribed: d.prescribed, smoother: 'jacobi' }).solve(rhs);
    expect(jac.iterations).toBeLessThanOrEqual(20);
    const v22 = createMultigrid(g, a, { prescribed: d.prescribed, preSmooth: 2, postSmooth: 2 }).solve(rhs);
    expect(v22.iterations).toBeLessThan(plain.iterations);
    const v10 = createMultigrid(g, a, { prescribed: d.prescribed, preSmooth: 1, postSmooth: 0 }).solve(rhs, { maxIterations: 40 });
    expect(v10.residual).toBeLessThanOrEqual(1e-8);
  });
  it('finds the identity rows by itself when no prescribed mask is given', () => {
    const r = createMultigrid(g, a).solve(rhs);
    expect(r.iterations).toBe(plain.iterations);
    // the same cycle: the same iterates to round-off
    expect(relDiff(r.solution, plain.solution)).toBeLessThanOrEqual(1e3 * eps);
  });
  it('records a history that starts at 1 (x0 = 0) and ends at the returned residual', () => {
    expect(plain.history.length).toBe(plain.iterations + 1);
    expect(plain.history[0]).toBe(1);
    expect(plain.history[plain.iterations]).toBe(plain.residual);
    for (let k = 1; k < plain.history.length; k++) expect(plain.history[k]!).toBeLessThan(plain.history[k - 1]!);
  });
  it('returns at once for b = 0 and for a starting guess that already solves the system', () => {
    const mg = createMultigrid(g, a, { prescribed: d.prescribed });
    const zero = mg.solve(new Float64Array(rhs.length));
    expect(zero.iterations).toBe(0);
    expect(zero.solution.every((v) => v === 0)).toBe(true);
    expect(mg.solve(rhs, { x0: plain.solution }).iterations).toBe(0);
  });
});

describe('coefficients, faces, axes', () => {
  it('k jumping 100× across a layer: converges alone and as a CG preconditioner, and agrees with LU', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 64 }, y: { from: 0, to: 1, cells: 64 } });
    const d = discretize(g, {
      conductivity: (_x: number, y: number) => (y > 0.3 && y < 0.6 ? 100 : 1),
      boundary: [{ faces: [...ALL2], kind: 'dirichlet', value: 0 }],
    });
    const { matrix, rhs } = d.system({ source: 1 });
    const mg = createMultigrid(g, matrix, { prescribed: d.prescribed });
    const r = mg.solve(rhs, { maxIterations: 80, tolerance: 1e-10 });
    // Galerkin coarse operators follow the jump, linear interpolation does not: slower than constant k
    expect(r.iterations).toBeLessThanOrEqual(60);
    expect(pcgIterations(matrix.matrix, rhs, mg).iterations).toBeLessThanOrEqual(16);
    const lu = solveBanded(factorBanded(matrix), rhs);
    // cond ≲ 100·cot²(π/128) ≈ 1.7e5; relative residual 1e-10
    expect(relDiff(r.solution, lu)).toBeLessThanOrEqual(1.7e5 * 1e-10);
  });
  it('Neumann and Robin faces (with one value face, and convection alone)', () => {
    const g = grid({ x: { from: 0, to: 2, cells: 64 }, y: { from: 0, to: 1, cells: 32 } });
    for (const boundary of [
      [{ faces: ['xmin'] as const, kind: 'dirichlet' as const, value: 1 },
        { faces: ['xmax', 'ymin'] as const, kind: 'neumann' as const, flux: 0.5 },
        { faces: ['ymax'] as const, kind: 'robin' as const, h: 10, ambient: 0 }],
      [{ faces: [...ALL2], kind: 'robin' as const, h: 3, ambient: 2 }],
    ]) {
      const d = discretize(g, { boundary: boundary.map((b) => ({ ...b, faces: [...b.faces] })) as never });
      const { matrix, rhs } = d.system({ source: (x: number) => 1 + x });
      const r = createMultigrid(g, matrix, { prescribed: d.prescribed }).solve(rhs, { tolerance: 1e-10 });
      expect(r.iterations).toBeLessThanOrEqual(16);
      const lu = solveBanded(factorBanded(matrix), rhs);
      // cond of these 65 × 33 systems is below 1e4 (Neumann faces raise it to ~ (L/h)²)
      expect(relDiff(r.solution, lu)).toBeLessThanOrEqual(1e4 * 1e-10);
    }
  });
  it('a periodic axis, a stretched axis and 1-D grids', () => {
    const cases: { g: Grid; faces: string[]; max: number; levels?: number }[] = [
      { g: grid({ x: { from: 0, to: 1, cells: 64, periodic: true }, y: { from: 0, to: 1, cells: 64 } }), faces: ['ymin', 'ymax'], max: 12 },
      // cells graded as (i/n)^1.5: aspect ratios up to ~30 near x = 0 slow point smoothing down
      { g: grid({ x: { nodes: Array.from({ length: 65 }, (_, i) => (i / 64) ** 1.5) }, y: { from: 0, to: 1, cells: 64 } }), faces: [...ALL2], max: 40 },
      { g: grid({ x: { from: 0, to: 3, cells: 1024 } }), faces: ['xmin', 'xmax'], max: 12 },
      // an odd cell count whose tridiagonal LU costs nothing: solved directly
      { g: grid({ x: { from: 0, to: 3, cells: 4095 } }), faces: ['xmin', 'xmax'], max: 1, levels: 1 },
    ];
    for (const { g, faces, max, levels } of cases) {
      const d = discretize(g, { boundary: [{ faces: faces as never, kind: 'dirichlet', value: 0 }] });
      const { matrix, rhs } = d.system({ source: (x: number) => Math.cos(3 * x) + 2 });
      const mg = createMultigrid(g, matrix, { prescribed: d.prescribed });
      if (levels === undefined) expect(mg.levels).toBeGreaterThan(1);
      else expect(mg.levels).toBe(levels);
      const r = mg.solve(rhs, { maxIterations: 60 });
      expect(r.iterations).toBeLessThanOrEqual(max);
    }
  });
});

describe('the preconditioner', () => {
  it('is symmetric to round-off (Gauss–Seidel and Jacobi, V and W) and positive definite', () => {
    // x on [0, 0.3]: a spacing that is not a binary fraction, so the stencil rows agree only to ~ε·cells
    const g = grid({ x: { from: 0, to: 0.3, cells: 48 }, y: { from: 0, to: 1, cells: 64 } });
    const d = discretize(g, { boundary: [{ faces: ['xmin', 'ymax'], kind: 'dirichlet', value: 0 }, { faces: ['xmax', 'ymin'], kind: 'neumann', flux: 1 }] });
    const { matrix } = d.system();
    for (const opts of [{}, { smoother: 'jacobi' as const }, { cycle: 'W' as const, preSmooth: 2, postSmooth: 2 }]) {
      const mg = createMultigrid(g, matrix, { prescribed: d.prescribed, ...opts });
      const r1 = random(g.size, 1);
      const r2 = random(g.size, 2);
      const z1 = new Float64Array(g.size);
      const z2 = new Float64Array(g.size);
      mg.precondition(r1, z1);
      mg.precondition(r2, z2);
      // each entry of Mr is a sum of ~10² rounded products per level; 1e3·ε·‖Mr‖·‖r‖ bounds the asymmetry
      // that rounding (and the few-ulp spread of the stencil rows) leaves
      const scale = Math.max(norm(z1) * norm(r2), norm(z2) * norm(r1));
      expect(Math.abs(dot(z1, r2) - dot(r1, z2))).toBeLessThanOrEqual(1e3 * eps * scale);
      expect(dot(z1, r1)).toBeGreaterThan(0);
      expect(dot(z2, r2)).toBeGreaterThan(0);
    }
  });
  it('gives identical results on repeated calls and leaves r unchanged (its workspaces are made once, in createMultigrid)', () => {
    const { g, d, a, rhs } = poisson(64);
    const mg = createMultigrid(g, a, { prescribed: d.prescribed });
    const r = Float64Array.from(rhs);
    const z1 = new Float64Array(r.length);
    const z2 = new Float64Array(r.length).fill(7);
    mg.precondition(r, z1);
    mg.solve(rhs);
    mg.precondition(r, z2);
    expect(Array.from(z2)).toEqual(Array.from(z1));
    expect(Array.from(r)).toEqual(Array.from(rhs));
  });
});

describe('errors', () => {
  const { g, d, a, rhs } = poisson(16);
  it('stops at maxIterations with NotConvergedError and its history', () => {
    const mg = createMultigrid(g, a, { prescribed: d.prescribed, coarsestSize: 50 });
    expect(mg.levels).toBeGreaterThan(1);
    const e = errorOf(() => mg.solve(rhs, { maxIterations: 1, tolerance: 1e-14 }));
    expect(e).toBeInstanceOf(NotConvergedError);
    expect(e.code).toBe('NOT_CONVERGED');
    const nc = e as NotConvergedError;
    expect(nc.iterations).toBe(1);
    expect(nc.history.length).toBe(2);
    expect(nc.history[0]).toBe(1);
    expect(nc.residual).toBe(nc.history[1]);
    expect(nc.residual).toBeGreaterThan(1e-14);
  });
  it('refuses a matrix that is not square or does not match the grid', () => {
    const m = a.matrix;
    const wide: CsrMatrix = { rows: m.rows, cols: m.cols + 1, rowPtr: m.rowPtr, colIdx: m.colIdx, values: m.values };
    expect(codeOf(() => createMultigrid(g, wide))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => createMultigrid(grid({ x: { from: 0, to: 1, cells: 15 }, y: { from: 0, to: 1, cells: 16 } }), a))).toBe('SHAPE_MISMATCH');
  });
  it('refuses a zero or missing diagonal', () => {
    const m = a.matrix;
    const values = Float64Array.from(m.values);
    const r = (m.rows >> 1) + 3;
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (m.colIdx[p] === r) values[p] = 0;
    const e = errorOf(() => createMultigrid(g, { ...m, values }));
    expect(e.code).toBe('ZERO_DIAGONAL');
    expect((e as unknown as { row: number }).row).toBe(r);
  });
  it('refuses bad options', () => {
    const bad: unknown[] = [
      { cycle: 'F' }, { smoother: 'sor' }, { preSmooth: -1 }, { postSmooth: 1.5 }, { preSmooth: 0, postSmooth: 0 },
      { coarsestSize: 0 }, { prescribed: new Uint8Array(g.size).fill(2) },
    ];
    for (const o of bad) expect(codeOf(() => createMultigrid(g, a, o as never))).toBe('INVALID_OPTION');
    expect(codeOf(() => createMultigrid(g, a, { prescribed: new Uint8Array(3) }))).toBe('SHAPE_MISMATCH');
    // a coarsest level whose banded LU would need gigabytes (41³ nodes, bandwidth 41²)
    const big = poisson(40, 3);
    expect(codeOf(() => createMultigrid(big.g, big.a, { coarsestSize: 1e9 }))).toBe('INVALID_OPTION');
  });
  it('refuses bad vectors in precondition and solve', () => {
    const mg = createMultigrid(g, a);
    const n = g.size;
    expect(codeOf(() => mg.precondition(new Float64Array(n - 1), new Float64Array(n)))).toBe('SHAPE_MISMATCH');
    const r = new Float64Array(n);
    expect(codeOf(() => mg.precondition(r, r))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => mg.solve(new Float64Array(n + 1)))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => mg.solve(rhs, { x0: new Float64Array(2) }))).toBe('SHAPE_MISMATCH');
    const nan = Float64Array.from(rhs);
    nan[5] = NaN;
    expect(codeOf(() => mg.solve(nan))).toBe('NON_FINITE');
    expect(codeOf(() => mg.solve(rhs, { tolerance: 0 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => mg.solve(rhs, { maxIterations: 0 }))).toBe('INVALID_OPTION');
  });
  it('stops early, as diverging, on a system Gauss–Seidel cannot smooth (accuracy 6 with flux rows)', () => {
    const g2 = grid({ x: { from: 0, to: 1, cells: 64 }, y: { from: 0, to: 1, cells: 64 } });
    const d6 = discretize(g2, {
      accuracy: 6,
      boundary: [{ faces: ['xmin', 'ymin'], kind: 'dirichlet', value: 0 }, { faces: ['xmax', 'ymax'], kind: 'neumann', flux: 1 }],
    });
    const s6 = d6.system({ source: 1 });
    const e = errorOf(() => createMultigrid(g2, s6.matrix, { prescribed: d6.prescribed }).solve(s6.rhs));
    expect(e.code).toBe('NOT_CONVERGED');
    expect((e as NotConvergedError).iterations).toBeLessThan(100);
    expect(e.message).toMatch(/diverges/);
  });
  it('reports a singular system (flux faces only) at set-up', () => {
    const g2 = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 8 } });
    const d2n = discretize(g2, { boundary: [{ faces: [...ALL2], kind: 'neumann', flux: 0 }] });
    expect(codeOf(() => createMultigrid(g2, d2n.system().matrix))).toBe('SINGULAR_MATRIX');
  });
});

describe('kernels', () => {
  it('the stencil-run sweeps agree with the CSR sweeps to round-off', () => {
    for (const [cells, dim] of [[24, 2], [8, 3], [40, 1]] as const) {
      const ax = { from: 0, to: 1, cells };
      const g = dim === 1 ? grid({ x: ax }) : dim === 2 ? grid({ x: ax, y: ax }) : grid({ x: ax, y: ax, z: ax });
      const d = discretize(g, { boundary: [{ faces: ['xmin'], kind: 'dirichlet', value: 1 }, { faces: (dim === 1 ? ['xmax'] : dim === 2 ? ALL2.slice(1) : ALL3.slice(1)) as never, kind: 'neumann', flux: 1 }] });
      const a = d.system().matrix.matrix;
      const n = a.rows;
      const dp = new Int32Array(n);
      const inv = new Float64Array(n);
      expect(findDiagonal(a, dp, inv)).toBe(-1);
      const fast = levelMatrix(a, dp, inv);
      const slow = levelMatrix(a, dp, inv, 0, false);
      expect(fast.runCount).toBeGreaterThan(0);
      expect(slow.runCount).toBe(0);
      const b = random(n, 3);
      const x0 = random(n, 4);
      const run = (m: typeof fast, k: (x: Float64Array) => void): Float64Array => {
        const x = Float64Array.from(x0);
        k(x);
        void m;
        return x;
      };
      // one sweep or residual: each entry a sum of ≤ 2·27 rounded products of O(1) numbers
      const tol = 64 * eps;
      const cmp = (u: Float64Array, v: Float64Array) => {
        for (let i = 0; i < n; i++) expect(Math.abs(u[i]! - v[i]!)).toBeLessThanOrEqual(tol * (1 + Math.abs(v[i]!)) * 8);
      };
      cmp(run(fast, (x) => gaussSeidelForward(fast, b, x, false)), run(slow, (x) => gaussSeidelForward(slow, b, x, false)));
      cmp(run(fast, (x) => gaussSeidelForward(fast, b, x, true)), run(slow, (x) => gaussSeidelForward(slow, b, x, true)));
      cmp(run(fast, (x) => gaussSeidelBackward(fast, b, x)), run(slow, (x) => gaussSeidelBackward(slow, b, x)));
      const r1 = new Float64Array(n);
      const r2 = new Float64Array(n);
      residual(fast, b, x0, r1);
      residual(slow, b, x0, r2);
      cmp(r1, r2);
      // after a zero-start forward sweep, b − Ax = −Ux
      const x = new Float64Array(n);
      gaussSeidelForward(fast, b, x, true);
      upperResidual(fast, x, r1);
      residual(slow, b, x, r2);
      cmp(r1, r2);
    }
  });
  it('the copied regular Galerkin rows equal the computed ones exactly (value, flux and mixed faces, 2-D and 3-D)', () => {
    const cases: { g: Grid; boundary: unknown; pin?: number }[] = [
      { g: poisson(32).g, boundary: [{ faces: [...ALL2], kind: 'dirichlet', value: 0 }] },
      { g: poisson(16, 3).g, boundary: [{ faces: [...ALL3], kind: 'dirichlet', value: 0 }] },
      { g: poisson(32).g, boundary: [{ faces: ['xmin', 'ymax'], kind: 'dirichlet', value: 1 }, { faces: ['xmax', 'ymin'], kind: 'neumann', flux: 1 }] },
      { g: poisson(16, 3).g, boundary: [{ faces: ['zmin'], kind: 'dirichlet', value: 1 }, { faces: ALL3.slice(0, 4), kind: 'robin', h: 2, ambient: 0 }, { faces: ['zmax'], kind: 'neumann', flux: 1 }] },
      // below: one interior node made a prescribed identity row, at an odd place (between coarse nodes)
      { g: poisson(32).g, boundary: [{ faces: [...ALL2], kind: 'dirichlet', value: 0 }], pin: 5 * 33 + 7 },
      { g: poisson(32).g, boundary: [{ faces: [...ALL2], kind: 'dirichlet', value: 0 }], pin: 6 * 33 + 8 },
    ];
    for (const { g, boundary, pin } of cases) {
      const d = discretize(g, { boundary: boundary as never });
      const m0 = d.system().matrix.matrix;
      const values = Float64Array.from(m0.values);
      const m: CsrMatrix = { ...m0, values };
      const prescribed = Uint8Array.from(d.prescribed);
      if (pin !== undefined) {
        prescribed[pin] = 1;
        for (let r = 0; r < m.rows; r++) {
          for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) {
            if (r === pin) values[q] = m.colIdx[q] === r ? 1 : 0;
            else if (m.colIdx[q] === pin) values[q] = 0;
          }
        }
      }
      const dim = g.dimension;
      const dp = new Int32Array(m.rows);
      const inv = new Float64Array(m.rows);
      findDiagonal(m, dp, inv);
      const lm = levelMatrix(m, dp, inv);
      const axes = [0, 1, 2].map((k) => {
        const c = k < dim ? g.axes[k]!.count : 1;
        return { count: c, periodic: false, pos: Float64Array.from({ length: c }, (_, i) => i), period: c - 1 };
      });
      const t = axes.map((x) => axisTransfer(x, x.count > 1));
      const mask = prescribed;
      const nc = t.reduce((p, x) => p * x.coarse.count, 1);
      const cmask = new Uint8Array(nc);
      const [N1, N2] = [t[1]!.coarse.count, t[2]!.coarse.count];
      const [n1, n2] = [axes[1]!.count, axes[2]!.count];
      for (let I = 0; I < t[0]!.coarse.count; I++) {
        for (let J = 0; J < N1; J++) {
          for (let K = 0; K < N2; K++) cmask[(I * N1 + J) * N2 + K] = mask[(t[0]!.fineOf[I]! * n1 + t[1]!.fineOf[J]!) * n2 + t[2]!.fineOf[K]!]!;
        }
      }
      const fixed = Int32Array.from([...mask.keys()].filter((i) => mask[i] === 1));
      const reg = regularRows(lm, axes, fixed, t, cmask);
      expect(reg).toBeInstanceOf(Uint8Array);
      expect(reg!.reduce((p, v) => p + (v > 0 ? 1 : 0), 0)).toBeGreaterThan(nc / 8);
      const fast = galerkinProduct(m, t, mask, cmask, reg);
      const slow = galerkinProduct(m, t, mask, cmask);
      expect(Array.from(fast.rowPtr)).toEqual(Array.from(slow.rowPtr));
      expect(Array.from(fast.colIdx)).toEqual(Array.from(slow.colIdx));
      expect(Array.from(fast.values)).toEqual(Array.from(slow.values));
    }
  });
  it('line restriction is the transpose of line interpolation, uniform and table paths alike', () => {
    for (const [nf, periodic] of [[17, false], [16, false], [12, true], [11, true]] as const) {
      const ax = { count: nf, periodic, pos: Float64Array.from({ length: nf }, (_, i) => i), period: nf };
      const t = axisTransfer(ax, true);
      const nc = t.coarse.count;
      const xc = random(nc, 5);
      const yf = random(nf, 6);
      const px = new Float64Array(nf);
      const pty = new Float64Array(nc);
      expandLine(nf, nc, t.c0, t.w0, t.c1, t.w1, false, xc, 0, px, 0, false);
      contractLine(nf, nc, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, false, yf, 0, pty, 0);
      // ⟨P x, y⟩ = ⟨x, Pᵀ y⟩: two sums of ~2n products of O(1) numbers
      expect(Math.abs(dot(px, yf) - dot(xc, pty))).toBeLessThanOrEqual(8 * nf * eps);
      if (nf === 17) {
        const pu = new Float64Array(nf);
        const qu = new Float64Array(nc);
        expandLine(nf, nc, t.c0, t.w0, t.c1, t.w1, true, xc, 0, pu, 0, false);
        contractLine(nf, nc, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, true, yf, 0, qu, 0);
        // the same products in the same order
        expect(Array.from(pu)).toEqual(Array.from(px));
        for (let i = 0; i < nc; i++) expect(Math.abs(qu[i]! - pty[i]!)).toBeLessThanOrEqual(4 * eps);
      }
    }
  });
});
