/**
 * Boundary conditions applied to the diffusion operator: exact profiles,
 * symmetry, manufactured solutions, corners, heat balance.
 */
import { describe, expect, it } from 'vitest';
import {
  type BoundarySpec, csrIsSymmetric, discretize, grid, sampleField, tanhAxis, type Discretization, type Grid,
} from '../../src/index.js';
import { codeOf } from '../support/errors.js';
import { maxDiff, observedOrders, solveDirect } from '../support/solve.js';

const eps = Number.EPSILON;

/** Flat nodal values of a function on a grid. */
const nodal = (g: Grid, f: (...x: number[]) => number): Float64Array => sampleField(g, f as never).data;

describe('layered wall: series thermal resistance (Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., 2007, §3.1.2–3.1.3)', () => {
  // Invented wall: 62.5 mm of steel (k = 40 W/(m·K)) then 137.5 mm of mineral wool
  // (k = 0.04), 1000× lower; hot face held at 150 °C, cold face to air at −5 °C with
  // h = 10 W/(m²·K). 8 cells of 25 mm put the interface at 62.5 mm, midway between nodes.
  const L1 = 0.0625;
  const L2 = 0.1375;
  const k1 = 40;
  const k2 = 0.04;
  const h = 10;
  const hot = 150;
  const air = -5;
  const R = L1 / k1 + L2 / k2 + 1 / h; // m²·K/W, per unit area
  const q = (hot - air) / R; // W/m²
  const exact = (x: number): number => (x < L1 ? hot - (q * x) / k1 : hot - (q * L1) / k1 - (q * (x - L1)) / k2);
  const k = (x: number): number => (x < L1 ? k1 : k2);
  const boundary = { xmin: { kind: 'dirichlet', value: hot }, xmax: { kind: 'robin', h, ambient: air } } as const;

  it('reproduces the piecewise-linear profile and the heat flux in 1-D', () => {
    const g = grid({ x: { from: 0, to: L1 + L2, cells: 8 } });
    const d = discretize(g, { conductivity: k, boundary });
    const u = solveDirect(d.system());
    // cond(S) ≈ (k1/k2)·n² ≈ 6e4; 16·ε·cond·max|u| bounds the direct solve's error
    expect(maxDiff(u, nodal(g, exact))).toBeLessThanOrEqual(16 * eps * 6.4e4 * hot);
    const b = d.heatBalance(u);
    const flows = Object.fromEntries(b.faces.map((f) => [f.face, f.outflow]));
    expect(Math.abs(flows.xmax! - q)).toBeLessThanOrEqual(1e-9 * q);
    expect(Math.abs(flows.xmin! + q)).toBeLessThanOrEqual(1e-9 * q);
    expect(b.relative).toBeLessThanOrEqual(1e-12);
  });

  it('gives the same profile on every line of a 2-D wall with insulated top and bottom', () => {
    const g = grid({ x: { from: 0, to: L1 + L2, cells: 8 }, y: { from: 0, to: 0.5, cells: 5 } });
    const d = discretize(g, {
      conductivity: (x: number) => k(x),
      boundary: { ...boundary, ymin: { kind: 'neumann', flux: 0 }, ymax: { kind: 'neumann', flux: 0 } },
    });
    const u = solveDirect(d.system());
    expect(maxDiff(u, nodal(g, (x: number) => exact(x)))).toBeLessThanOrEqual(16 * eps * 6.4e4 * hot * 4);
    const b = d.heatBalance(u);
    // per unit depth: q times the 0.5 m height
    expect(Math.abs(b.faces.find((f) => f.face === 'xmax')!.outflow - 0.5 * q)).toBeLessThanOrEqual(1e-9 * q);
    expect(Math.abs(b.faces.find((f) => f.face === 'ymin')!.outflow)).toBe(0);
  });
});

describe('symmetry at accuracy 2 (CSR equals its transpose exactly)', () => {
  const cases: Array<[string, Grid]> = [
    ['uniform 2-D', grid({ x: { from: 0, to: 1, cells: 6 }, y: { from: 0, to: 2, cells: 5 } })],
    ['stretched 2-D', grid({ x: tanhAxis({ from: 0, to: 1, cells: 7, beta: 2, cluster: 'both' }), y: { nodes: [0, 0.1, 0.3, 0.7, 1] } })],
    ['3-D', grid({ x: { from: 0, to: 1, cells: 3 }, y: { from: 0, to: 1, cells: 4 }, z: { from: 0, to: 1, cells: 2 } })],
  ];
  const kinds = [
    { kind: 'dirichlet', value: 1 },
    { kind: 'neumann', flux: -2 },
    { kind: 'robin', h: 7, ambient: 3 },
  ] as const;
  for (const [name, g] of cases) {
    for (const c of kinds) {
      it(`${name}, variable k, ${c.kind} on every face but one value face`, () => {
        const faces = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'].slice(0, 2 * g.dimension);
        const spec = Object.fromEntries(faces.map((f, i) => [f, i === 0 ? { kind: 'dirichlet', value: 0 } : c]));
        const d = discretize(g, { conductivity: (x: number, y: number) => 1 + x + 3 * y * y, boundary: spec });
        const s = d.system({ source: 1 });
        expect(d.symmetric).toBe(true);
        expect(s.matrix.symmetric).toBe(true);
        expect(csrIsSymmetric(s.matrix.matrix, 0)).toBe(true);
      });
    }
  }
  it('accuracy 4 is not symmetric and says so', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 8 } });
    const d = discretize(g, { accuracy: 4, boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'neumann', flux: 1 }] });
    expect(d.symmetric).toBe(false);
    expect(csrIsSymmetric(d.system().matrix.matrix, 1e-12)).toBe(false);
  });
});

/** Manufactured solution u = eˣ sin(2y + 0.3) (+ z term in 3-D) with k(x, y) smooth. */
function manufactured(dim: 2 | 3, variableK: boolean) {
  const kf = (x: number, y: number) => (variableK ? 1 + 0.5 * x * y : 1);
  const kx = (x: number, y: number) => (variableK ? 0.5 * y : 0);
  const ky = (x: number, y: number) => (variableK ? 0.5 * x : 0);
  const u = (x: number, y: number, z = 0) => Math.exp(x) * Math.sin(2 * y + 0.3) * (dim === 3 ? Math.cos(z) : 1);
  const ux = (x: number, y: number, z = 0) => u(x, y, z);
  const uy = (x: number, y: number, z = 0) => 2 * Math.exp(x) * Math.cos(2 * y + 0.3) * (dim === 3 ? Math.cos(z) : 1);
  const uz = (x: number, y: number, z = 0) => (dim === 3 ? -Math.exp(x) * Math.sin(2 * y + 0.3) * Math.sin(z) : 0);
  const lap = (x: number, y: number, z = 0) => (1 - 4 - (dim === 3 ? 1 : 0)) * u(x, y, z);
  // f = −∇·(k∇u) = −(k Δu + kx ux + ky uy)
  const f = (x: number, y: number, z = 0) => -(kf(x, y) * lap(x, y, z) + kx(x, y) * ux(x, y, z) + ky(x, y) * uy(x, y, z));
  return { kf, u, ux, uy, uz, f };
}

function mmsError(n: number, p: number, dim: 2 | 3, variableK: boolean): { err: number; d: Discretization; sol: Float64Array } {
  const m = manufactured(dim, variableK);
  const ax = { from: 0, to: 1, cells: n };
  const g = dim === 2 ? grid({ x: ax, y: ax }) : grid({ x: ax, y: ax, z: ax });
  const hConv = 3;
  // −k ∂u/∂n = q with n outward: at xmin n = −x, so q = k·u_x; at xmax q = −k·u_x; likewise y, z.
  // convection at xmin: h(u − u∞) = k·u_x ⇒ u∞ = u − k·u_x/h
  const at = (fn: (x: number, y: number, z: number) => number) => (...a: number[]) => fn(a[0]!, a[1]!, dim === 3 ? a[2]! : 0);
  const spec: BoundarySpec = {
    xmin: { kind: 'robin', h: hConv, ambient: at((x, y, z) => m.u(x, y, z) - (m.kf(x, y) * m.ux(x, y, z)) / hConv) },
    xmax: { kind: 'neumann', flux: at((x, y, z) => -m.kf(x, y) * m.ux(x, y, z)) },
    ymin: { kind: 'dirichlet', value: at((x, y, z) => m.u(x, y, z)) },
    ymax: { kind: 'neumann', flux: at((x, y, z) => -m.kf(x, y) * m.uy(x, y, z)) },
    ...(dim === 3
      ? {
          zmin: { kind: 'neumann', flux: at((x, y, z) => m.kf(x, y) * m.uz(x, y, z)) } as const,
          zmax: { kind: 'robin', h: hConv, ambient: at((x, y, z) => m.u(x, y, z) + (m.kf(x, y) * m.uz(x, y, z)) / hConv) } as const,
        }
      : {}),
  };
  const d = discretize(g, {
    accuracy: p,
    conductivity: variableK ? (x: number, y: number) => m.kf(x, y) : 1,
    boundary: spec,
  });
  const source = at((x, y, z) => m.f(x, y, z));
  const sol = solveDirect(d.system({ source }));
  return { err: maxDiff(sol, nodal(g, at((x, y, z) => m.u(x, y, z)))), d, sol };
}

describe('manufactured solutions with value, flux and convection faces (order within 0.1, Roache 1998)', () => {
  it('2-D, variable k, accuracy 2: second order, heat balance to round-off', () => {
    const errs = [8, 16, 32, 64].map((n) => mmsError(n, 2, 2, true).err);
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
  it('2-D, constant k, accuracy 4: fourth order with one-sided flux closures', () => {
    const errs = [8, 16, 32, 64].map((n) => mmsError(n, 4, 2, false).err);
    const o = observedOrders(errs);
    // the coarsest pair is pre-asymptotic (3.79); the finer pairs are within 0.1
    for (const x of o.slice(1)) expect(Math.abs(x - 4)).toBeLessThanOrEqual(0.1);
  });
  it('2-D, constant k, accuracy 6: sixth order', () => {
    // measured p̂ = 5.77, 5.91 on 12 → 24 → 48 cells; at 96 cells round-off of the wide
    // one-sided closures takes over (p̂ = 5.1), so the study stops at 48
    const errs = [12, 24, 48].map((n) => mmsError(n, 6, 2, false).err);
    const o = observedOrders(errs);
    expect(Math.abs(o[o.length - 1]! - 6)).toBeLessThanOrEqual(0.1);
  });
  it('3-D, variable k, accuracy 2: second order', () => {
    const errs = [4, 8, 16].map((n) => mmsError(n, 2, 3, true).err);
    for (const o of observedOrders(errs).slice(-1)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
  it('the heat balance of each accuracy-2 solution closes to round-off', () => {
    for (const n of [8, 32]) {
      const { d, sol } = mmsError(n, 2, 2, true);
      const m = manufactured(2, true);
      const b = d.heatBalance(sol, { source: (x: number, y: number) => m.f(x, y) });
      // a direct solve leaves residuals ~ε·cond ≈ ε·n²; 64·ε·n² bounds their weighted sum
      expect(b.relative).toBeLessThanOrEqual(64 * eps * n * n);
      expect(Math.abs(b.source)).toBeGreaterThan(0.1);
    }
  });
});

describe('corners and the value-face rule', () => {
  it('a node on two value faces takes the mean of their values', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4 } });
    const d = discretize(g, {
      boundary: { xmin: { kind: 'dirichlet', value: 10 }, ymin: { kind: 'dirichlet', value: 30 }, xmax: { kind: 'neumann', flux: 0 }, ymax: { kind: 'neumann', flux: 0 } },
    });
    const gv = d.boundaryTerm();
    expect(gv[0]).toBe(20); // corner (0, 0)
    expect(gv[1]).toBe(10); // (0, 0.25) on xmin only
    expect(gv[5]).toBe(30); // (0.25, 0) on ymin only
    expect(d.prescribed[4]).toBe(1); // (0, 1): on xmin and the flux face ymax: value wins
    expect(d.constrained[24]).toBe(0); // (1, 1): two flux faces, a balance row
  });
  it('a corner on two flux faces takes each face’s flux over its share of the boundary', () => {
    // Insulated plate except a uniform flux into two faces meeting at a corner and a value
    // face opposite: the heat entering must leave through the value face, to round-off.
    const g = grid({ x: { from: 0, to: 2, cells: 6 }, y: { from: 0, to: 1, cells: 4 } });
    const d = discretize(g, {
      boundary: { xmin: { kind: 'neumann', flux: -3 }, ymin: { kind: 'neumann', flux: -5 }, xmax: { kind: 'dirichlet', value: 0 }, ymax: { kind: 'neumann', flux: 0 } },
    });
    const u = solveDirect(d.system());
    const b = d.heatBalance(u);
    const flow = Object.fromEntries(b.faces.map((f) => [f.face, f.outflow]));
    // −3 W/m² over xmin (length 1) and −5 over ymin (length 2): 13 W/m enter
    // prescribed flows are sums of a few products: exact to a few ulps
    expect(Math.abs(flow.xmin! + 3)).toBeLessThanOrEqual(8 * eps * 3);
    expect(Math.abs(flow.ymin! + 10)).toBeLessThanOrEqual(8 * eps * 10);
    expect(Math.abs(flow.xmax! - 13)).toBeLessThanOrEqual(64 * eps * 13 * 24);
  });
});

describe('time-dependent and position-dependent data', () => {
  it('boundaryTerm evaluates functions of position and time at the requested t', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 2 } });
    const d = discretize(g, { boundary: { xmin: { kind: 'dirichlet', value: (x: number, t: number) => 100 + t }, xmax: { kind: 'neumann', flux: (x: number, t: number) => x * t } } });
    const g0 = d.boundaryTerm(0);
    const g5 = d.boundaryTerm(5);
    expect(g0[0]).toBe(100);
    expect(g5[0]).toBe(105);
    // flux 5 W/m² leaving through a half cell of 0.25 m: −5/0.25 = −20
    expect(g5[2]).toBe(-20);
    expect(g0[2]).toBe(0);
  });
});

describe('bad input', () => {
  const g = grid({ x: { from: 0, to: 1, cells: 8 } });
  const bc = { xmin: { kind: 'dirichlet', value: 0 }, xmax: { kind: 'dirichlet', value: 1 } } as const;
  it('refuses non-positive conductivity, accuracy 4 with variable k or stretched axes, odd accuracy', () => {
    expect(codeOf(() => discretize(g, { conductivity: 0, boundary: bc }))).toBe('INVALID_COEFFICIENT');
    expect(codeOf(() => discretize(g, { conductivity: (x: number) => x - 0.5, boundary: bc }))).toBe('INVALID_COEFFICIENT');
    expect(codeOf(() => discretize(g, { conductivity: (x: number) => 1 + x, boundary: bc, accuracy: 4 }))).toBe('INVALID_ACCURACY');
    const gs = grid({ x: { nodes: [0, 0.1, 0.3, 0.6, 1, 1.5, 2.1, 2.8, 3.6] } });
    expect(codeOf(() => discretize(gs, { boundary: bc, accuracy: 4 }))).toBe('INVALID_ACCURACY');
    expect(codeOf(() => discretize(g, { boundary: bc, accuracy: 3 }))).toBe('INVALID_ACCURACY');
  });
  it('refuses too few nodes for the closure, and a field of the wrong shape', () => {
    const tiny = grid({ x: { from: 0, to: 1, cells: 3 } });
    expect(codeOf(() => discretize(tiny, { boundary: bc, accuracy: 6 }).operator.matrix)).toBe('TOO_FEW_NODES');
    const d = discretize(g, { boundary: bc });
    expect(codeOf(() => d.heatBalance(new Float64Array(3)))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => d.system({ source: sampleField(grid({ x: { from: 0, to: 1, cells: 4 } }), () => 1) }))).toBe('SHAPE_MISMATCH');
  });
  it('refuses a NaN from a boundary function, naming where', () => {
    const d = discretize(g, { boundary: { xmin: { kind: 'dirichlet', value: () => NaN }, xmax: { kind: 'neumann', flux: 0 } } });
    expect(codeOf(() => d.system())).toBe('NON_FINITE');
  });
});
