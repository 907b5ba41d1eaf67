/**
 * Orders 1, 2, 4 and 6 in space recovered through the study API with the
 * library's own operators: derivative, laplacian, and discretize + banded
 * LU. Convergence criterion: observed order within 0.1 (Roache 1998).
 */
import { describe, it } from 'vitest';
import { derivative, discretize, factorBanded, grid, laplacian, solveBanded, solveTransient } from '../../src/index.js';
import { convergenceStudy, spacingsFor } from '../../src/verify/index.js';
import { expectOrder } from '../../src/testing.js';

describe('observed orders in space', () => {
  it('1: first derivative at accuracy 1 (two-point differences), L∞ over all nodes', () => {
    const s = convergenceStudy(({ spacing }) => {
      const g = grid({ x: { from: 0, to: 1, cells: Math.round(1 / spacing!) } });
      const u = Float64Array.from(g.x.coordinates, (x) => Math.sin(2 * x + 0.5));
      const du = derivative(g, { axis: 'x', derivative: 1, accuracy: 1 }).apply(u);
      return { grid: g, computed: du, exact: (x: number) => 2 * Math.cos(2 * x + 0.5) };
    }, { refine: 'space', spacings: spacingsFor(1, [16, 32, 64, 128]) });
    expectOrder(s, 1, { tolerance: 0.1 });
  });

  it('2: −(k u′)′ = f in 1-D with a value end and a convection end, discretize + banded LU', () => {
    const k = (x: number) => 1 + x * x;
    const u = (x: number) => Math.cos(3 * x) + x;
    const du = (x: number) => -3 * Math.sin(3 * x) + 1;
    const f = (x: number) => -(2 * x * du(x) + k(x) * -9 * Math.cos(3 * x));
    const h = 4;
    const s = convergenceStudy(({ spacing }) => {
      const g = grid({ x: { from: 0, to: 1, cells: Math.round(1 / spacing!) } });
      // at x = 1 the outward normal is +x: −k u′ = h(u − u∞) ⇒ u∞ = u + k u′/h
      const d = discretize(g, {
        conductivity: k,
        boundary: { xmin: { kind: 'dirichlet', value: u(0) }, xmax: { kind: 'robin', h, ambient: u(1) + (k(1) * du(1)) / h } },
      });
      const sys = d.system({ source: f });
      return { grid: g, computed: solveBanded(factorBanded(sys.matrix), sys.rhs), exact: u };
    }, { refine: 'space', spacings: spacingsFor(1, [10, 20, 40, 80]) });
    expectOrder(s, 2, { tolerance: 0.1 });
    expectOrder(s, 2, { norm: 'l2', tolerance: 0.1 });
  });

  it('4: 2-D Laplacian at accuracy 4 applied to a smooth field, biased closure rows included', () => {
    const s = convergenceStudy(({ spacing }) => {
      const n = Math.round(1 / spacing!);
      const g = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
      const v = new Float64Array(g.size);
      let r = 0;
      for (const x of g.x.coordinates) for (const y of g.axes[1]!.coordinates) v[r++] = Math.exp(x) * Math.sin(2 * y);
      const lap = laplacian(g, { accuracy: 4 }).apply(v);
      return { grid: g, computed: lap, exact: (x: number, y: number) => -3 * Math.exp(x) * Math.sin(2 * y) };
    }, { refine: 'space', spacings: spacingsFor(1, [8, 16, 32, 64]) });
    expectOrder(s, 4, { tolerance: 0.1 });
  });

  it('6: −u″ = f at accuracy 6 with a value end and a flux end, discretize + banded LU', () => {
    const u = (x: number) => Math.exp(x) * Math.sin(3 * x);
    const du = (x: number) => Math.exp(x) * (Math.sin(3 * x) + 3 * Math.cos(3 * x));
    const f = (x: number) => -Math.exp(x) * (-8 * Math.sin(3 * x) + 6 * Math.cos(3 * x));
    const s = convergenceStudy(({ spacing }) => {
      const g = grid({ x: { from: 0, to: 1, cells: Math.round(1 / spacing!) } });
      // flux at x = 1 (n = +x): q = −u′(1)
      const d = discretize(g, { accuracy: 6, boundary: { xmin: { kind: 'dirichlet', value: u(0) }, xmax: { kind: 'neumann', flux: -du(1) } } });
      const sys = d.system({ source: f });
      return { grid: g, computed: solveBanded(factorBanded(sys.matrix), sys.rhs), exact: u };
    }, { refine: 'space', spacings: spacingsFor(1, [16, 24, 36, 54]) });
    expectOrder(s, 6, { tolerance: 0.1 });
  });
});

describe('orders in time of the library’s own schemes, through the study (LeVeque 2007, ch. 9)', () => {
  // sin(πx) on 20 cells is an eigenvector of the 3-point Laplacian, eigenvalue −λ with
  // λ = (4/h²)·sin²(πh/2) (common practice), so e^{−λT} sin(πxᵢ) is the semi-discrete solution
  // and the study sees the time error alone.
  const n = 20;
  const h = 1 / n;
  const lambda = (4 / (h * h)) * Math.sin((Math.PI * h) / 2) ** 2;
  const T = 0.1;
  const run = (scheme: 'backward-euler' | 'crank-nicolson') => convergenceStudy(({ timeStep }) => {
    const g = grid({ x: { from: 0, to: 1, cells: n } });
    const r = solveTransient(
      { grid: g, initial: (x) => Math.sin(Math.PI * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] },
      { scheme, dt: timeStep!, endTime: T },
    );
    return { grid: g, computed: r.field.data, exact: (x: number) => Math.exp(-lambda * T) * Math.sin(Math.PI * x) };
  }, { refine: 'time', timeSteps: [1e-2, 5e-3, 2.5e-3, 1.25e-3] });
  it('backward Euler: order 1', () => expectOrder(run('backward-euler'), 1, { norm: 'linf' }));
  it('Crank–Nicolson: order 2', () => expectOrder(run('crank-nicolson'), 2, { norm: 'linf' }));
});
