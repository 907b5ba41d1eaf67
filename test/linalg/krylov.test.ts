import { describe, expect, it } from 'vitest';
import {
  type CsrMatrix, NotConvergedError, fromCsr, advection, bicgstab, conjugateGradient, createKrylovWorkspace, diagonal, discretize, factorBanded, grid,
  incompleteCholesky, incompleteLU, jacobiPreconditioner, solveBanded, ssorPreconditioner, sum, scale, type LinearSystem,
} from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';
import { mulberry32 } from '../support/prng.js';

function plateSystem(n: number, k: number | ((x: number, y: number) => number) = 1): LinearSystem {
  const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
  return discretize(g, {
    conductivity: k,
    boundary: [
      { faces: ['xmin', 'ymin'], kind: 'dirichlet', value: 0 },
      { faces: 'xmax', kind: 'robin', h: 5, ambient: 1 },
      { faces: 'ymax', kind: 'neumann', flux: -2 },
    ],
  }).system({ source: (x: number, y: number) => Math.exp(x + y) });
}

const relErr = (a: Float64Array, b: Float64Array): number => {
  let num = 0;
  let den = 0;
  for (let i = 0; i < a.length; i++) {
    num = Math.max(num, Math.abs(a[i]! - b[i]!));
    den = Math.max(den, Math.abs(b[i]!));
  }
  return num / den;
};

describe('conjugate gradients (Hestenes & Stiefel 1952) and its preconditioners', () => {
  const s = plateSystem(24, (x, y) => 1 + 9 * x * y);
  const direct = solveBanded(factorBanded(s.matrix), s.rhs);
  const cases = [
    ['none', undefined],
    ['jacobi', jacobiPreconditioner(s.matrix)],
    ['ssor', ssorPreconditioner(s.matrix, 1.5)],
    ['ic0', incompleteCholesky(s.matrix)],
  ] as const;
  const iterations: Record<string, number> = {};
  for (const [name, M] of cases) {
    it(`${name}: agrees with the direct solve to the requested tolerance`, () => {
      const r = conjugateGradient(s.matrix, s.rhs, { preconditioner: M, tolerance: 1e-10 });
      expect(r.residual).toBeLessThanOrEqual(1e-10);
      // forward error ≤ κ·(relative residual); κ ≈ 10·(n/π)²·(k_max/k_min) ≈ 6e3 here
      expect(relErr(r.solution, direct)).toBeLessThanOrEqual(6e3 * 1e-10);
      expect(r.history.length).toBe(r.iterations + 1);
      expect(r.history[r.iterations]).toBe(r.residual);
      iterations[name] = r.iterations;
    });
  }
  it('stronger preconditioners need fewer iterations (IC(0) and SSOR beat none)', () => {
    expect(iterations.ic0!).toBeLessThan(iterations.none!);
    expect(iterations.ssor!).toBeLessThan(iterations.none!);
  });
  it('preconditioners are symmetric: ⟨M⁻¹a, b⟩ = ⟨a, M⁻¹b⟩ to round-off', () => {
    const rnd = mulberry32(3);
    const n = s.rhs.length;
    const a = Float64Array.from({ length: n }, () => rnd() - 0.5);
    const b = Float64Array.from({ length: n }, () => rnd() - 0.5);
    for (const [, M] of cases.slice(1)) {
      const ma = new Float64Array(n);
      const mb = new Float64Array(n);
      M!.apply(a, ma);
      M!.apply(b, mb);
      let x = 0;
      let y = 0;
      let scaleAbs = 0;
      for (let i = 0; i < n; i++) {
        x += ma[i]! * b[i]!;
        y += a[i]! * mb[i]!;
        scaleAbs += Math.abs(ma[i]! * b[i]!);
      }
      // two triangular solves of ~5 entries per row: 64·ε·Σ|terms| bounds the difference
      expect(Math.abs(x - y)).toBeLessThanOrEqual(64 * Number.EPSILON * scaleAbs);
    }
  });
  it('a workspace is reused, a starting guess is honoured, zero rhs returns zero at once', () => {
    const ws = createKrylovWorkspace(s.rhs.length);
    const r1 = conjugateGradient(s.matrix, s.rhs, { workspace: ws, preconditioner: cases[3][1] });
    const r2 = conjugateGradient(s.matrix, s.rhs, { workspace: ws, preconditioner: cases[3][1], x0: r1.solution });
    expect(r2.iterations).toBe(0);
    const z = conjugateGradient(s.matrix, new Float64Array(s.rhs.length));
    expect(z.iterations).toBe(0);
    expect(z.solution.every((v) => v === 0)).toBe(true);
  });
  it('throws NotConvergedError with the history at the iteration cap', () => {
    const e = errorOf(() => conjugateGradient(s.matrix, s.rhs, { maxIterations: 3, tolerance: 1e-12 }));
    expect(e).toBeInstanceOf(NotConvergedError);
    expect(e.code).toBe('NOT_CONVERGED');
    const h = (e as NotConvergedError).history;
    expect(h.length).toBe(4);
    expect(h[3]).toBeGreaterThan(1e-12);
  });
  it('refuses an indefinite matrix instead of returning garbage', () => {
    const e = errorOf(() => conjugateGradient(diagonal(Float64Array.of(1, -1, 2)), Float64Array.of(1, 1, 1)));
    expect(e.code).toBe('NOT_CONVERGED');
    expect(e.message).toMatch(/not positive definite/);
  });
});

describe('BiCGSTAB (van der Vorst 1992) on nonsymmetric systems', () => {
  // advection–diffusion: −Δu + b·∇u with upwind advection, cell Péclet ≈ 2
  const n = 24;
  const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
  const s0 = discretize(g, { boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] }).system({ source: 1 });
  const adv = advection(g, { velocity: [40, 20], scheme: 'upwind' }).matrix;
  // balance rows are volume-scaled: add V·(b·∇u) on them, leave the identity rows alone
  const V = 1 / (n * n);
  const rows = s0.matrix.matrix;
  const m = sum(s0.matrix, scale(fromMask(adv, rows), V));
  const direct = solveBanded(factorBanded(m), s0.rhs);
  for (const M of [undefined, incompleteLU(m), jacobiPreconditioner(m)]) {
    it(`${M?.name ?? 'none'}: agrees with the direct solve`, () => {
      const r = bicgstab(m, s0.rhs, { preconditioner: M, tolerance: 1e-10 });
      expect(r.residual).toBeLessThanOrEqual(1e-10);
      expect(relErr(r.solution, direct)).toBeLessThanOrEqual(1e-6);
    });
  }
  it('refuses bad sizes and NaN', () => {
    expect(codeOf(() => bicgstab(m, new Float64Array(3)))).toBe('SHAPE_MISMATCH');
    const b = Float64Array.from(s0.rhs);
    b[5] = NaN;
    expect(codeOf(() => bicgstab(m, b))).toBe('NON_FINITE');
    expect(codeOf(() => bicgstab(m, s0.rhs, { tolerance: 0 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => conjugateGradient(m, s0.rhs, { workspace: createKrylovWorkspace(4) }))).toBe('SHAPE_MISMATCH');
  });
});

/** The advection matrix with rows zeroed where `like` has an identity (boundary) row. */
function fromMask(adv: CsrMatrix, like: CsrMatrix) {
  const values = Float64Array.from(adv.values);
  for (let r = 0; r < adv.rows; r++) {
    const identity = like.rowPtr[r + 1]! - like.rowPtr[r]! === 1;
    if (identity) for (let p = adv.rowPtr[r]!; p < adv.rowPtr[r + 1]!; p++) values[p] = 0;
  }
  return fromCsr({ ...adv, values });
}
