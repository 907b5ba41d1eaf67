/**
 * Manufactured solutions: exact forcing and boundary data from hyper-dual
 * derivatives, checked by hand on simple cases and by the order of a
 * variable-k problem with convection faces (Roache 2002, J. Fluids Eng. 124, 4–10).
 */
import { describe, expect, it } from 'vitest';
import { discretize, factorBanded, grid, solveBanded } from '../../src/index.js';
import { HyperDual, convergenceStudy, manufacturedSolution, spacingsFor, studyTable } from '../../src/verify/index.js';
import { expectAsymptotic, expectOrder } from '../../src/testing.js';
import { codeOf } from '../support/errors.js';

const eps = Number.EPSILON;
/** |got − want| ≤ 32ε·max(1, |want|): a handful of hyper-dual operations, each a few roundings. */
const near = (got: number, want: number) => expect(Math.abs(got - want)).toBeLessThanOrEqual(32 * eps * Math.max(1, Math.abs(want)));

describe('forcing and boundary data by hand', () => {
  it('steady u = x²y, k = 1 + x: f = −∇·(k∇u) = −(2y(1 + x) + 2xy)', () => {
    const m = manufacturedSolution((x, y) => x.mul(x).mul(y), { dimension: 2, conductivity: (x) => x.add(1) });
    for (const [x, y] of [[0.3, 0.7], [1.2, -0.4]] as const) {
      near(m.heatSource(x, y), -(2 * y * (1 + x) + 2 * x * y));
      near(m.value(x, y), x * x * y);
      near(m.gradient(0)(x, y), 2 * x * y);
      near(m.conductivity(x, y), 1 + x);
    }
  });
  it('transient u = e^{−t} sin x, ρc = 2: f = 2u_t − u_xx = −e^{−t} sin x', () => {
    const m = manufacturedSolution((x, _y, _z, t) => t.neg().exp().mul(x.sin()), { dimension: 1, capacity: 2 });
    near(m.heatSource(0.4, 0.3), -Math.exp(-0.3) * Math.sin(0.4));
    near(m.rate(0.4, 0.3), -Math.exp(-0.3) * Math.sin(0.4));
  });
  it('wave u = sin x cos(2t), c = 2, γ = 0.5: f = u_tt + γu_t − c²u_xx = −γ·2 sin x sin 2t', () => {
    const m = manufacturedSolution((x, _y, _z, t) => x.sin().mul(t.mul(2).cos()), { dimension: 1 });
    near(m.waveSource({ speed: 2, damping: 0.5 })(0.7, 0.2), -0.5 * 2 * Math.sin(0.7) * Math.sin(0.4));
    near(m.waveSource({ speed: 2 })(0.7, 0.2), 0);
  });
  it('conditions: flux −k∂u/∂n with outward n, ambient u + (k/h)∂u/∂n', () => {
    const m = manufacturedSolution((x, y) => x.mul(x).add(y.mul(3)), { dimension: 2, conductivity: 3 });
    const b = m.boundary({ xmin: { kind: 'neumann' }, xmax: { kind: 'neumann' }, ymin: { kind: 'robin', h: 2 }, ymax: { kind: 'dirichlet' } });
    const f = (c: unknown, ...a: number[]) => (c as { flux: (...a: number[]) => number }).flux(...a);
    const spec = b as Record<string, unknown>;
    near(f(spec.xmax, 1, 0.5, 0), -3 * 2); // n = +x: −k·2x at x = 1
    near(f(spec.xmin, 0.5, 0.5, 0), 3 * 2 * 0.5); // n = −x: +k·2x
    const r = spec.ymin as { kind: string; h: number; ambient: (...a: number[]) => number };
    expect(r.kind).toBe('robin');
    // n = −y: ∂u/∂n = −3, so u∞ = u − (3/2)·3; check −k∂u/∂n = h(u − u∞)
    const [x, y] = [0.4, 0];
    near(3 * 3, 2 * (x * x - r.ambient(x, y, 0)));
    expect((spec.ymax as { kind: string }).kind).toBe('dirichlet');
  });
  it('refuses a bad dimension, face, or a function outside its domain', () => {
    expect(codeOf(() => manufacturedSolution((x) => x, { dimension: 4 as 1 }))).toBe('INVALID_OPTION');
    const m = manufacturedSolution((x) => x.log(), { dimension: 1 });
    expect(codeOf(() => m.condition('ymin', { kind: 'dirichlet' }))).toBe('INVALID_OPTION');
    expect(codeOf(() => m.value(-1))).toBe('HYPERDUAL_DOMAIN');
  });
});

describe('2-D variable k with convection faces: order 2 through discretize + banded LU', () => {
  // u and k are smooth and not reproduced exactly by the scheme
  const m = manufacturedSolution(
    (x, y) => x.exp().mul(y.mul(2).add(0.3).sin()).add(x.mul(y).tanh()),
    { dimension: 2, conductivity: (x, y) => x.mul(y).mul(0.5).add(1).add(x.sin().mul(0.2)) },
  );
  const boundary = m.boundary({
    xmin: { kind: 'robin', h: 3 },
    xmax: { kind: 'robin', h: (_x: number, y: number) => 2 + y },
    ymin: { kind: 'dirichlet' },
    ymax: { kind: 'neumann' },
  });
  const study = convergenceStudy(({ spacing }) => {
    const n = Math.round(1 / spacing!);
    const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
    const d = discretize(g, { conductivity: (x: number, y: number) => m.conductivity(x, y), boundary });
    const { matrix, rhs } = d.system({ source: m.heatSource });
    return { grid: g, computed: solveBanded(factorBanded(matrix), rhs), exact: (x: number, y: number) => m.value(x, y) };
  }, { refine: 'space', spacings: spacingsFor(1, [8, 16, 32, 64]) });
  it('L∞ and L2 orders within 0.1 of 2, in the asymptotic range', () => {
    expectOrder(study, 2, { norm: 'linf', tolerance: 0.1 });
    expectOrder(study, 2, { norm: 'l2', tolerance: 0.1 });
    expectOrder(study, 2, { norm: 'linf', tolerance: 0.1, using: 'finest' });
    expectAsymptotic(study, 'l2');
    expect(studyTable(study)).toContain('| L∞ |');
  });
});
