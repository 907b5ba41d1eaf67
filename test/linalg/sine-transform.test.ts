import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../support/prng.js';
import { dst2, dstPlan, fft, fftLength, fftPlan } from '../../src/linalg/base/fft.js';
import { createSineTransformSolver, sineStencil } from '../../src/linalg/sine-transform.js';
import { discretize, grid, solveSteady, solveTransient } from '../../src/index.js';
import type { CsrMatrix } from '../../src/operator/matrix.js';

const EPS = Number.EPSILON;
const allValue = (v: number | ((...c: number[]) => number) = 0) =>
  [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'] as const, kind: 'dirichlet' as const, value: v }];

function random(n: number, seed: number): Float64Array {
  const r = mulberry32(seed);
  return Float64Array.from({ length: n }, () => 2 * r() - 1);
}

/** max |a − b| / max |b|. */
function relativeDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let diff = 0;
  let big = 0;
  for (let i = 0; i < b.length; i++) {
    diff = Math.max(diff, Math.abs(a[i]! - b[i]!));
    big = Math.max(big, Math.abs(b[i]!));
  }
  return diff / big;
}

const allFaces = (v: number | ((...c: number[]) => number) = 0) =>
  [{ faces: ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'] as const, kind: 'dirichlet' as const, value: v }];

function residual(a: CsrMatrix, x: Float64Array, b: Float64Array): number {
  let rr = 0;
  let bb = 0;
  for (let i = 0; i < a.rows; i++) {
    let s = 0;
    for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) s += a.values[p]! * x[a.colIdx[p]!]!;
    rr += (b[i]! - s) ** 2;
    bb += b[i]! ** 2;
  }
  return Math.sqrt(rr / bb);
}

describe('fft and dst2 against their defining sums', () => {
  it('fft equals Σ z_j e^{−2πijk/M} for M = 2 … 1024 (error ≲ ε·log₂M·‖z‖, common practice for Cooley–Tukey)', () => {
    for (let m = 2; m <= 1024; m *= 2) {
      const re = random(m, m);
      const im = random(m, m + 1);
      const wr = new Float64Array(m);
      const wi = new Float64Array(m);
      for (let k = 0; k < m; k++) {
        for (let j = 0; j < m; j++) {
          const t = (-2 * Math.PI * j * k) / m;
          wr[k] += re[j]! * Math.cos(t) - im[j]! * Math.sin(t);
          wi[k] += re[j]! * Math.sin(t) + im[j]! * Math.cos(t);
        }
      }
      fft(fftPlan(m), re, im);
      let err = 0;
      for (let k = 0; k < m; k++) err = Math.max(err, Math.abs(re[k]! - wr[k]!), Math.abs(im[k]! - wi[k]!));
      // the direct sums carry about m·ε·‖z‖∞ themselves
      expect(err).toBeLessThan(8 * m * EPS * Math.sqrt(m));
    }
  });

  it('the mixed-radix fft equals the defining sum for lengths with factors 2, 3 and 5 (3 … 360)', () => {
    for (const m of [3, 5, 6, 9, 10, 12, 15, 18, 20, 24, 25, 27, 30, 40, 45, 48, 60, 75, 100, 120, 125, 150, 240, 360]) {
      expect(fftLength(m)).toBe(true);
      const re = random(m, 7 * m);
      const im = random(m, 7 * m + 1);
      const wr = new Float64Array(m);
      const wi = new Float64Array(m);
      for (let k = 0; k < m; k++) {
        for (let j = 0; j < m; j++) {
          const t = (-2 * Math.PI * ((j * k) % m)) / m;
          wr[k] += re[j]! * Math.cos(t) - im[j]! * Math.sin(t);
          wi[k] += re[j]! * Math.sin(t) + im[j]! * Math.cos(t);
        }
      }
      fft(fftPlan(m), re, im);
      let err = 0;
      for (let k = 0; k < m; k++) err = Math.max(err, Math.abs(re[k]! - wr[k]!), Math.abs(im[k]! - wi[k]!));
      expect(err, `M = ${m}`).toBeLessThan(8 * m * EPS * Math.sqrt(m));
    }
    for (const m of [7, 11, 14, 21, 49, 0, 1.5]) expect(fftLength(m), `${m}`).toBe(false);
    expect(fftLength(1)).toBe(true);
    // a plan is refused for a length it would get wrong
    for (const m of [1, 7, 14]) expect(() => fftPlan(m)).toThrow(expect.objectContaining({ code: 'INVALID_OPTION' }));
  });

  it('dst2 gives S_k = Σ x_j sin(πjk/N) for both sequences, N = 2 … 128 (powers of 2 and mixed 6 … 120), in place and strided', () => {
    for (const n of [2, 4, 6, 8, 10, 12, 16, 20, 30, 32, 64, 100, 120, 128]) {
      const count = n - 1;
      const x = random(count, 3 * n);
      const y = random(count, 3 * n + 1);
      const want = (v: Float64Array, k: number): number => {
        let s = 0;
        for (let j = 1; j < n; j++) s += v[j - 1]! * Math.sin((Math.PI * j * k) / n);
        return s;
      };
      // x at stride 3 from offset 2, y contiguous
      const u = new Float64Array(2 + 3 * count).fill(99);
      for (let j = 0; j < count; j++) u[2 + 3 * j] = x[j]!;
      const v = Float64Array.from(y);
      dst2(dstPlan(n), new Float64Array(n), new Float64Array(n), u, 2, 3, v, 0, 1);
      for (let k = 1; k < n; k++) {
        expect(Math.abs(u[2 + 3 * (k - 1)]! - want(x, k))).toBeLessThan(16 * n * EPS);
        expect(Math.abs(v[k - 1]! - want(y, k))).toBeLessThan(16 * n * EPS);
      }
      // the entries between the strided ones are untouched
      expect(u[0]).toBe(99);
      expect(u[3]).toBe(99);
      // applied twice it is (N/2)·identity
      dst2(dstPlan(n), new Float64Array(n), new Float64Array(n), v, 0, 1, u, 2, 3);
      for (let j = 0; j < count; j++) expect(Math.abs((2 / n) * v[j]! - y[j]!)).toBeLessThan(16 * n * EPS);
    }
  });
});

describe('sineStencil: which matrices the transform solves', () => {
  it('accepts the constant-k plate with a value on every edge, unequal spacings, and reads its stencil', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 16 }, y: { from: 0, to: 3, cells: 8 } });
    const d = discretize(g, { conductivity: 2.5, boundary: allValue(1) });
    const s = sineStencil(g.shape, d.system({}).matrix.matrix, Uint8Array.from(d.prescribed));
    expect(s).toBeDefined();
    // volume-scaled rows (V = dx·dy): w_x = −k·dy/dx, w_y = −k·dx/dy, d = −2(w_x + w_y)
    const dx = 1 / 16;
    const dy = 3 / 8;
    expect(s!.wx).toBeCloseTo(-2.5 * dy / dx, 12);
    expect(s!.wy).toBeCloseTo(-2.5 * dx / dy, 12);
    expect(s!.d).toBeCloseTo(-2 * (s!.wx + s!.wy), 12);
  });

  it('refuses cell counts the FFT does not take (odd, or a prime factor above 5; in 3-D on y or z), a convection edge, flux edges across both axes, variable k and accuracy 4', () => {
    const check = (g: ReturnType<typeof grid>, opts: Parameters<typeof discretize>[1]) => {
      const d = discretize(g, opts);
      return sineStencil(g.shape, d.system({}).matrix.matrix, Uint8Array.from(d.prescribed));
    };
    const sq = (cells: number) => grid({ x: { from: 0, to: 1, cells }, y: { from: 0, to: 1, cells } });
    expect(check(sq(14), { boundary: allValue() })).toBeUndefined();
    expect(check(sq(9), { boundary: allValue() })).toBeUndefined();
    expect(check(sq(12), { boundary: allValue() })).toMatchObject({ lines: 0, fluxEnds: [false, false] });
    // a flux edge on the lines axis is taken (x transformed, lines along y ending in the flux edge) …
    expect(check(sq(16), {
      boundary: [{ faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 0 }, { faces: ['ymax'], kind: 'neumann', flux: 1 }],
    })).toMatchObject({ lines: 1, fluxEnds: [false, true] });
    // … but not when no axis has values at both ends, nor a convection edge
    expect(check(sq(16), {
      boundary: [{ faces: ['xmin', 'ymin'], kind: 'dirichlet', value: 0 }, { faces: ['xmax', 'ymax'], kind: 'neumann', flux: 1 }],
    })).toBeUndefined();
    expect(check(sq(16), {
      boundary: [{ faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 0 }, { faces: ['ymax'], kind: 'robin', h: 10, ambient: 0 }],
    })).toBeUndefined();
    expect(check(sq(16), { conductivity: (x: number) => 1 + x, boundary: allValue() })).toBeUndefined();
    expect(check(sq(16), { accuracy: 4, boundary: allValue() })).toBeUndefined();
    // 3-D: y and z must both suit (x carries the lines)
    const block = (cx: number, cy: number, cz: number) => {
      const g3 = grid({ x: { from: 0, to: 1, cells: cx }, y: { from: 0, to: 1, cells: cy }, z: { from: 0, to: 1, cells: cz } });
      const d3 = discretize(g3, { boundary: allFaces() });
      return sineStencil(g3.shape, d3.system({}).matrix.matrix, Uint8Array.from(d3.prescribed));
    };
    expect(block(7, 4, 4)).toMatchObject({ lines: 0, fluxEnds: [false, false] });
    // 3-D flux faces only on x (the lines axis), never on a transformed y or z face
    const fluxBlock = (faces: ('xmin' | 'ymin' | 'zmax')[]) => {
      const g3 = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4 }, z: { from: 0, to: 1, cells: 4 } });
      const all = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'] as const;
      const d3 = discretize(g3, { boundary: [
        { faces: all.filter((f) => !(faces as string[]).includes(f)), kind: 'dirichlet', value: 0 },
        { faces, kind: 'neumann', flux: 1 },
      ] });
      return sineStencil(g3.shape, d3.system({}).matrix.matrix, Uint8Array.from(d3.prescribed));
    };
    expect(fluxBlock(['xmin'])).toMatchObject({ lines: 0, fluxEnds: [true, false] });
    expect(fluxBlock(['ymin'])).toBeUndefined();
    expect(fluxBlock(['zmax'])).toBeUndefined();
    expect(block(4, 7, 4)).toBeUndefined();
    expect(block(4, 4, 9)).toBeUndefined();
  });
});

describe('the sine-transform solve', () => {
  it('square plate, one edge at 1 and three at 0: the centre is exactly 1/4 (superposition of the four rotated problems, a fact of the trade that holds for the discrete 5-point problem too)', () => {
    for (const cells of [2, 4, 8, 16, 32, 64, 128]) {
      const g = grid({ x: { from: 0, to: 1, cells }, y: { from: 0, to: 1, cells } });
      const r = solveSteady({
        grid: g,
        boundary: [{ faces: ['xmin'], kind: 'dirichlet', value: 1 }, { faces: ['xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }],
      }, { tolerance: 1e-14 });
      expect(r.solver).toBe('sine-transform');
      const c = cells / 2;
      const centre = r.field.get(c, c);
      expect(Math.abs(centre - 0.25)).toBeLessThan(16 * EPS * cells * cells);
    }
  });

  it('agrees with multigrid-preconditioned CG on a manufactured source with non-binary spacings (refinement reaches the tolerance)', () => {
    const g = grid({ x: { from: 0, to: 0.3, cells: 64 }, y: { from: -0.7, to: 0.1, cells: 32 } });
    const problem = {
      grid: g,
      conductivity: 3,
      source: (x: number, y: number) => Math.exp(x - y) * Math.cos(7 * x * y),
      boundary: allValue((x: number, y: number) => x * x - y),
    };
    const a = solveSteady(problem, { tolerance: 1e-13 });
    const b = solveSteady(problem, { tolerance: 1e-13, solver: { method: 'cg', preconditioner: 'multigrid' } });
    expect(a.solver).toBe('sine-transform');
    expect(a.residual).toBeLessThanOrEqual(1e-13);
    expect(relativeDifference(a.field.data, b.field.data)).toBeLessThan(1e-10);
    // the heat balance closes as for any solver of the conservative system
    expect(a.heatBalance!.relative).toBeLessThan(1e-9);
  });

  it('needs a suitable cell count (even, prime factors 2, 3, 5) on one axis only, either one (y transformed in place, x through a transposed copy), any line count, odd or even, down to one', () => {
    // [x cells, y cells]: y transformed with 11, 4, 1, 31 and 8 lines; x transformed (y unsuitable) with 4, 2, 6, 10 lines; both suit
    for (const [cx, cy] of [[12, 16], [5, 8], [2, 8], [32, 20], [9, 12], [2, 5], [16, 3], [10, 7], [30, 11], [8, 8]] as const) {
      const g = grid({ x: { from: 0, to: 0.9, cells: cx }, y: { from: 0.2, to: 1.1, cells: cy } });
      const problem = {
        grid: g,
        conductivity: 1.7,
        source: (x: number, y: number) => Math.cos(3 * x + 2 * y),
        boundary: allValue((x: number, y: number) => x - y * y),
      };
      const a = solveSteady(problem, { tolerance: 1e-13 });
      const b = solveSteady(problem, { tolerance: 1e-13, solver: { method: 'cg', preconditioner: 'multigrid' } });
      expect(a.solver).toBe('sine-transform');
      expect(a.residual).toBeLessThanOrEqual(1e-13);
      // the transform solve is direct: one solve, no refinement needed on these small grids
      expect(a.iterations, `${cx} × ${cy}`).toBe(1);
      expect(relativeDifference(a.field.data, b.field.data), `${cx} × ${cy}`).toBeLessThan(1e-10);
    }
  });

  it('accepts a plate far from the origin, whose spacings jitter by ε·max|x|/h rather than ε·N', () => {
    const g = grid({ x: { from: 10.1, to: 10.8, cells: 64 }, y: { from: -3.3, to: -3.1, cells: 16 } });
    const problem = { grid: g, source: 1, boundary: allValue((x: number, y: number) => x + y) };
    const a = solveSteady(problem, { tolerance: 1e-12 });
    const b = solveSteady(problem, { tolerance: 1e-12, solver: { method: 'cg', preconditioner: 'multigrid' } });
    expect(a.solver).toBe('sine-transform');
    expect(relativeDifference(a.field.data, b.field.data)).toBeLessThan(1e-9);
  });

  it('accepts long axes whose spacings are not binary fractions (stencils differ by about 0.1–0.3·N·ε) and refines them to the tolerance', () => {
    for (const [cx, cy, len] of [[300, 16, 1], [1000, 10, 1], [256, 16, 0.9]] as const) {
      const g = grid({ x: { from: 0, to: len, cells: cx }, y: { from: 0.1, to: 1, cells: cy } });
      const problem = { grid: g, source: (x: number, y: number) => Math.sin(9 * x) + y, boundary: allValue((x: number) => x) };
      const a = solveSteady(problem, { tolerance: 1e-13 });
      const b = solveSteady(problem, { tolerance: 1e-13, solver: { method: 'cg', preconditioner: 'multigrid' } });
      expect(a.solver, `${cx} × ${cy}`).toBe('sine-transform');
      expect(a.residual).toBeLessThanOrEqual(1e-13);
      expect(a.iterations).toBeLessThanOrEqual(2);
      expect(relativeDifference(a.field.data, b.field.data), `${cx} × ${cy}`).toBeLessThan(1e-9);
    }
  });

  it('3-D blocks: a sine transform over y and z, lines along x; the cube centre with one face at 1 and five at 0 is exactly 1/6 (superposition, as in 2-D)', () => {
    for (const cells of [2, 4, 6, 8, 10, 12, 16]) {
      const g = grid({ x: { from: 0, to: 1, cells }, y: { from: 0, to: 1, cells }, z: { from: 0, to: 1, cells } });
      const r = solveSteady({
        grid: g,
        boundary: [{ faces: ['zmax'], kind: 'dirichlet', value: 1 }, { faces: ['xmin', 'xmax', 'ymin', 'ymax', 'zmin'], kind: 'dirichlet', value: 0 }],
      }, { tolerance: 1e-14 });
      expect(r.solver).toBe('sine-transform');
      const c = cells / 2;
      expect(Math.abs(r.field.get(c, c, c) - 1 / 6), `${cells}³`).toBeLessThan(16 * EPS * cells * cells);
    }
    // unequal sizes and spacings, a source and a varying edge value, against multigrid-preconditioned CG
    for (const [cx, cy, cz] of [[5, 4, 6], [3, 10, 2], [9, 8, 12], [12, 2, 20]] as const) {
      const g = grid({ x: { from: 0, to: 0.7, cells: cx }, y: { from: -0.2, to: 0.5, cells: cy }, z: { from: 1, to: 2.1, cells: cz } });
      const problem = {
        grid: g,
        conductivity: 2.2,
        source: (x: number, y: number, z: number) => Math.cos(2 * x + y - z),
        boundary: allFaces((x: number, y: number, z: number) => x * y - z),
      };
      const a = solveSteady(problem, { tolerance: 1e-13 });
      const b = solveSteady(problem, { tolerance: 1e-13, solver: { method: 'cg', preconditioner: 'multigrid' } });
      expect(a.solver).toBe('sine-transform');
      expect(a.iterations, `${cx} × ${cy} × ${cz}`).toBe(1);
      expect(relativeDifference(a.field.data, b.field.data), `${cx} × ${cy} × ${cz}`).toBeLessThan(1e-10);
    }
  });

  it('flux (insulated or heated) edges on the lines axis: rows of half weight, solved in the line systems; 2-D either way round and 3-D', () => {
    type Face = 'xmin' | 'xmax' | 'ymin' | 'ymax' | 'zmin' | 'zmax';
    const cases: [number[], Face[], Face[]][] = [
      // [cells], flux faces, value faces
      [[12, 16], ['xmin', 'xmax'], ['ymin', 'ymax']],
      [[12, 16], ['xmax'], ['xmin', 'ymin', 'ymax']],
      [[9, 20], ['xmin'], ['xmax', 'ymin', 'ymax']],
      [[2, 8], ['xmin', 'xmax'], ['ymin', 'ymax']],
      [[16, 7], ['ymin', 'ymax'], ['xmin', 'xmax']],
      [[10, 3], ['ymin'], ['ymax', 'xmin', 'xmax']],
      [[7, 4, 6], ['xmin', 'xmax'], ['ymin', 'ymax', 'zmin', 'zmax']],
      [[4, 8, 2], ['xmax'], ['xmin', 'ymin', 'ymax', 'zmin', 'zmax']],
    ];
    for (const [cells, fluxFaces, valueFaces] of cases) {
      const axis = (e: number) => ({ from: 0.1 * e, to: 0.1 * e + 0.6 + 0.3 * e, cells: cells[e]! });
      const g = cells.length === 2 ? grid({ x: axis(0), y: axis(1) }) : grid({ x: axis(0), y: axis(1), z: axis(2) });
      const problem = {
        grid: g,
        conductivity: 1.3,
        source: (...x: number[]) => Math.cos(x[0]! - 2 * x[1]!) + (x[2] ?? 0),
        boundary: [
          { faces: valueFaces, kind: 'dirichlet' as const, value: (...x: number[]) => x[0]! - x[1]! * x[1]! },
          { faces: fluxFaces, kind: 'neumann' as const, flux: (...x: number[]) => 0.5 + x[0]! * x[1]! },
        ],
      };
      const a = solveSteady(problem, { tolerance: 1e-13 });
      const b = solveSteady(problem, { tolerance: 1e-13, solver: { method: 'cg', preconditioner: 'multigrid' } });
      const what = `${cells.join(' × ')}, flux on ${fluxFaces.join(', ')}`;
      expect(a.solver, what).toBe('sine-transform');
      expect(a.iterations, what).toBe(1);
      expect(relativeDifference(a.field.data, b.field.data), what).toBeLessThan(1e-10);
      // the heat balance closes as for any solver of the conservative system
      expect(a.heatBalance!.relative, what).toBeLessThan(1e-9);
    }
    // Crank–Nicolson steps of a plate with two insulated edges equal the CG steps
    const g = grid({ x: { from: 0, to: 1, cells: 24 }, y: { from: 0, to: 1, cells: 32 } });
    const wall = {
      grid: g,
      initial: (x: number, y: number) => Math.cos(3 * x) * y * (1 - y),
      boundary: [{ faces: ['ymin', 'ymax'] as Face[], kind: 'dirichlet' as const, value: 0 }, { faces: ['xmin', 'xmax'] as Face[], kind: 'neumann' as const, flux: 0 }],
    };
    const opts = { scheme: 'crank-nicolson' as const, dt: 1e-3, endTime: 0.02, tolerance: 1e-12 };
    const p = solveTransient(wall, opts);
    const q = solveTransient(wall, { ...opts, solver: 'cg' });
    expect([p.solver, q.solver]).toEqual(['sine-transform', 'cg+multigrid']);
    expect(p.iterations).toBe(p.steps);
    expect(relativeDifference(p.field.data, q.field.data)).toBeLessThan(1e-10);
  });

  it('refuses a stencil that is not diagonally dominant (Thomas without pivoting needs it)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 8 } });
    const d = discretize(g, { boundary: allValue() });
    const a = d.system({}).matrix.matrix;
    expect(sineStencil(g.shape, a, Uint8Array.from(d.prescribed))).toMatchObject({ d: 4, wx: -1, wy: -1 });
    // the same pattern with the diagonal halved: |d| = 2 < 2|w_x| + 2|w_y| = 4
    const half = Float64Array.from(a.values);
    for (let r = 0; r < a.rows; r++) {
      if (d.prescribed[r]) continue;
      for (let p = a.rowPtr[r]!; p < a.rowPtr[r + 1]!; p++) if (a.colIdx[p] === r) half[p] = half[p]! / 2;
    }
    expect(sineStencil(g.shape, { ...a, values: half }, Uint8Array.from(d.prescribed))).toBeUndefined();
  });

  it('solves to the requested relative residual against the matrix itself, and refines when the stencil differs in the last bits', () => {
    const g = grid({ x: { from: 0, to: 0.7, cells: 32 }, y: { from: 0, to: 1.3, cells: 64 } });
    const d = discretize(g, { conductivity: 0.9, boundary: allValue() });
    const sys = d.system({ source: 1 });
    const a = sys.matrix.matrix;
    const s = sineStencil(g.shape, a, Uint8Array.from(d.prescribed))!;
    const b = random(a.rows, 17);
    for (let i = 0; i < a.rows; i++) if (d.prescribed[i]) b[i] = 0;
    const solver = createSineTransformSolver(g.shape, a, s, 1e-14);
    const x = new Float64Array(a.rows);
    const out = solver.solve(b, x);
    expect(out.residual).toBeLessThanOrEqual(1e-14);
    expect(residual(a, x, b)).toBeLessThanOrEqual(1e-14);
    expect(out.history[0]).toBe(1);
    // a stencil that is off by 1e-9 relative is corrected by refinement steps
    const off = createSineTransformSolver(g.shape, a, { d: s.d * (1 + 1e-9), wx: s.wx, wy: s.wy }, 1e-12);
    const r = off.solve(b, x);
    expect(r.solves).toBeGreaterThan(1);
    expect(residual(a, x, b)).toBeLessThanOrEqual(1e-12);
    // and one that is far off fails loudly instead of returning a wrong answer
    const bad = createSineTransformSolver(g.shape, a, { d: s.d * 3, wx: s.wx, wy: s.wy }, 1e-12);
    expect(() => bad.solve(b, x)).toThrow(expect.objectContaining({ code: 'NOT_CONVERGED' }));
  });

  it('is chosen for Crank–Nicolson steps of a constant-coefficient plate and matches the CG steps', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 32 }, y: { from: 0, to: 1, cells: 32 } });
    const problem = { grid: g, initial: (x: number, y: number) => 16 * x * (1 - x) * y * (1 - y), boundary: allValue() };
    const opts = { scheme: 'crank-nicolson' as const, dt: 1e-3, endTime: 0.02, tolerance: 1e-12 };
    const a = solveTransient(problem, opts);
    const b = solveTransient(problem, { ...opts, solver: 'cg' });
    expect([a.solver, b.solver]).toEqual(['sine-transform', 'cg+multigrid']);
    // one direct solve a step (iterations count transform solves)
    expect(a.iterations).toBe(a.steps);
    // a 1-D rod steps by Thomas, forward Euler's diagonal system too
    const rod = { grid: grid({ x: { from: 0, to: 1, cells: 8 } }), initial: 0, boundary: [{ faces: ['xmin', 'xmax'] as const, kind: 'dirichlet' as const, value: 1 }] };
    expect(solveTransient(rod, { scheme: 'crank-nicolson', dt: 1e-3, endTime: 1e-2 }).solver).toBe('thomas');
    expect(solveTransient(rod, { scheme: 'forward-euler', dt: 1e-3, endTime: 1e-2 }).solver).toBe('thomas');
    let diff = 0;
    for (let i = 0; i < g.size; i++) diff = Math.max(diff, Math.abs(a.field.data[i]! - b.field.data[i]!));
    expect(diff).toBeLessThan(1e-10);
    // short backward-Euler steps: strongly dominant lines whose pivots reach their fixed point early,
    // after which the solver keeps one pivot row per mode
    const be = { scheme: 'backward-euler' as const, dt: 1e-7, endTime: 5e-7, tolerance: 1e-13 };
    const c = solveTransient(problem, be);
    const e = solveTransient(problem, { ...be, solver: 'cg' });
    expect(c.iterations).toBe(c.steps);
    // time-dependent edge values and a source, with Rannacher start-up (backward-Euler half steps, a second level)
    const heated = {
      grid: g,
      initial: 0,
      source: (x: number, y: number, t: number) => 50 * Math.exp(-t) * x * y,
      boundary: allValue((x: number, y: number, t: number) => Math.sin(3 * t) * (1 + x - y)),
    };
    const hs = { scheme: 'crank-nicolson' as const, dt: 2e-3, endTime: 0.04, tolerance: 1e-12, rannacherSteps: 2 };
    const h1 = solveTransient(heated, hs);
    const h2 = solveTransient(heated, { ...hs, solver: 'cg' });
    expect(h1.solver).toBe('sine-transform');
    expect(relativeDifference(h1.field.data, h2.field.data)).toBeLessThan(1e-10);
    // and a 3-D block's Crank–Nicolson steps
    const g3 = grid({ x: { from: 0, to: 1, cells: 6 }, y: { from: 0, to: 1, cells: 8 }, z: { from: 0, to: 2, cells: 10 } });
    const cube = { grid: g3, initial: (x: number, y: number, z: number) => x * (1 - x) * y * (1 - y) * z * (2 - z), boundary: allFaces() };
    const p3 = solveTransient(cube, opts);
    const q3 = solveTransient(cube, { ...opts, solver: 'cg' });
    expect([p3.solver, q3.solver]).toEqual(['sine-transform', 'cg+multigrid']);
    expect(relativeDifference(p3.field.data, q3.field.data)).toBeLessThan(1e-10);
    diff = 0;
    for (let i = 0; i < g.size; i++) diff = Math.max(diff, Math.abs(c.field.data[i]! - e.field.data[i]!));
    expect(diff).toBeLessThan(1e-12);
    expect(() => solveTransient({ ...problem, conductivity: (x: number) => 1 + x }, { ...opts, solver: 'sine-transform' }))
      .toThrow(expect.objectContaining({ code: 'INVALID_OPTION' }));
  });

  it('solveSteady with solver sine-transform on a plate it cannot solve explains why', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 14 }, y: { from: 0, to: 1, cells: 9 } });
    expect(() => solveSteady({ grid: g, boundary: allValue() }, { solver: { method: 'sine-transform' } }))
      .toThrow(/even number of cells with no prime factor above 5/);
  });
});
