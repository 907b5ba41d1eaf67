/**
 * Diffusion-type transients: time order of each scheme against the exact
 * solution of the semi-discrete system, space order against the continuous
 * solution, the stability limit, and handbook solutions.
 */
import { describe, expect, it } from 'vitest';
import { grid, solveTransient, stabilityLimit, discretize, type TransientOptions } from '../../src/index.js';
import { codeOf } from '../support/errors.js';
import { mulberry32 } from '../support/prng.js';
import { observedOrders } from '../support/solve.js';

const L = 1;
const alpha = 1;
const dirichlet0 = [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] as const;

/** sin(πx/L) on a uniform grid of n cells is an eigenvector of the 3-point Laplacian
 * with eigenvalue −λ, λ = (4α/h²) sin²(πh/(2L)) (a fact of common practice), so the
 * semi-discrete solution is e^{−λt} sin(πxᵢ/L): the time error is isolated. */
function timeError(scheme: TransientOptions['scheme'], n: number, dt: number, T: number): number {
  const g = grid({ x: { from: 0, to: L, cells: n } });
  const r = solveTransient({ grid: g, conductivity: alpha, initial: (x) => Math.sin((Math.PI * x) / L), boundary: dirichlet0 }, { scheme, dt, endTime: T });
  const h = L / n;
  const lambda = ((4 * alpha) / (h * h)) * Math.sin((Math.PI * h) / (2 * L)) ** 2;
  let e = 0;
  for (let i = 0; i <= n; i++) e = Math.max(e, Math.abs(r.field.get(i) - Math.exp(-lambda * T) * Math.sin((Math.PI * i * h) / L)));
  return e;
}

describe('order in time against the semi-discrete solution (LeVeque 2007, ch. 9)', () => {
  const n = 20; // h = 0.05, h²/(2α) = 1.25e-3
  const T = 0.1;
  it('forward Euler: first order (αdt/h² from 0.4 down to 0.05, never 1/6)', () => {
    const errs = [1e-3, 5e-4, 2.5e-4, 1.25e-4].map((dt) => timeError('forward-euler', n, dt, T));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });
  it('backward Euler: first order', () => {
    const errs = [1e-2, 5e-3, 2.5e-3, 1.25e-3].map((dt) => timeError('backward-euler', n, dt, T));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });
  it('Crank–Nicolson: second order', () => {
    const errs = [1e-2, 5e-3, 2.5e-3, 1.25e-3].map((dt) => timeError('crank-nicolson', n, dt, T));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
  it('θ = 0.7: first order', () => {
    const errs = [1e-2, 5e-3, 2.5e-3, 1.25e-3].map((dt) => timeError({ theta: 0.7 }, n, dt, T));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });
});

describe('order in space against e^{−απ²t} sin(πx) (Carslaw & Jaeger 1959, §3.3)', () => {
  it('all schemes are second order in space with dt ∝ h²', () => {
    for (const scheme of ['crank-nicolson', 'backward-euler', 'forward-euler'] as const) {
      const errs = [10, 20, 40, 80].map((n) => {
        const h = L / n;
        const g = grid({ x: { from: 0, to: L, cells: n } });
        const T = 0.05;
        const r = solveTransient({ grid: g, initial: (x) => Math.sin(Math.PI * x), boundary: dirichlet0 }, { scheme, dt: 0.2 * h * h, endTime: T });
        let e = 0;
        for (let i = 0; i <= n; i++) e = Math.max(e, Math.abs(r.field.get(i) - Math.exp(-(Math.PI ** 2) * T) * Math.sin(Math.PI * i * h)));
        return e;
      });
      for (const o of observedOrders(errs)) expect(Math.abs(o - 2), scheme).toBeLessThanOrEqual(0.1);
    }
  });
});

describe('explicit stability limit', () => {
  it('Gershgorin gives the textbook limits h²/(2α) in 1-D and h²/(4α) in 2-D (LeVeque 2007, §9.3)', () => {
    const n = 16;
    const h = 1 / n;
    const g1 = grid({ x: { from: 0, to: 1, cells: n } });
    const d1 = discretize(g1, { conductivity: 2, boundary: dirichlet0 });
    const s1 = stabilityLimit(d1.operator, new Float64Array(g1.size).fill(1), d1.constrained as Uint8Array);
    expect(Math.abs(s1.forwardEuler - (h * h) / (2 * 2))).toBeLessThanOrEqual(1e-15);
    const g2 = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
    const d2 = discretize(g2, { boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] });
    const s2 = stabilityLimit(d2.operator, new Float64Array(g2.size).fill(1), d2.constrained as Uint8Array);
    expect(Math.abs(s2.forwardEuler - (h * h) / 4)).toBeLessThanOrEqual(1e-15);
    // the power estimate is below the bound and within 2 % of it (ρ = (8/h²)cos²(πh/2))
    expect(s2.power).toBeLessThanOrEqual(s2.gershgorin);
    expect(s2.power).toBeGreaterThan(0.95 * s2.gershgorin);
  });
  it('forward Euler from seeded noise decays 10 % under the limit and grows 10 % over it (guard off); the guard refuses', () => {
    const n = 20;
    const h = 1 / n;
    const g = grid({ x: { from: 0, to: 1, cells: n } });
    const rnd = mulberry32(42);
    const noise = Float64Array.from({ length: n + 1 }, (_, i) => (i === 0 || i === n ? 0 : rnd() - 0.5));
    const field = (dt: number) => solveTransient(
      { grid: g, initial: (x) => noise[Math.round(x / h)]!, boundary: dirichlet0 },
      { scheme: 'forward-euler', dt, endTime: 400 * dt, stabilityGuard: false },
    ).field;
    const limit = (h * h) / 2;
    const max = (f: { data: Float64Array }) => Math.max(...f.data.map(Math.abs));
    expect(max(field(0.9 * limit))).toBeLessThan(0.5);
    // true limit: 2/ρ with ρ = (4/h²)cos²(πh/2) is 0.6 % above the textbook one on 20 cells
    expect(max(field(1.1 * limit))).toBeGreaterThan(1e3);
    expect(codeOf(() => solveTransient({ grid: g, initial: 0, boundary: dirichlet0 }, { scheme: 'forward-euler', dt: 1.01 * limit, endTime: 1 }))).toBe('STEP_TOO_LARGE');
  });
});

/** Roots ζₙ of ζ tan ζ = Bi in ((n−1)π, (n−1)π + π/2), by bisection (written here, independent of the library). */
function roots(bi: number, count: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < count; k++) {
    let a = k * Math.PI + 1e-15;
    let b = k * Math.PI + Math.PI / 2 - 1e-15;
    for (let it = 0; it < 200; it++) {
      const m = 0.5 * (a + b);
      if (m * Math.tan(m) - bi > 0) b = m;
      else a = m;
    }
    out.push(0.5 * (a + b));
  }
  return out;
}

describe('plane wall cooled by convection on both faces (Incropera et al., 6th ed., §5.5, Table 5.1)', () => {
  // Table 5.1 values typed from memory; each is checked against ζ tan ζ = Bi below.
  const table = [
    { bi: 0.1, zeta: 0.3111, c: 1.0161 },
    { bi: 1, zeta: 0.8603, c: 1.1191 },
    { bi: 10, zeta: 1.4289, c: 1.262 },
  ];
  it('the remembered table values satisfy the eigenvalue equation to the printed digits', () => {
    for (const r of table) {
      const z = roots(r.bi, 1)[0]!;
      expect(Math.abs(z - r.zeta)).toBeLessThanOrEqual(6e-5);
      expect(Math.abs((4 * Math.sin(z)) / (2 * z + Math.sin(2 * z)) - r.c)).toBeLessThanOrEqual(6e-5);
    }
  });
  for (const { bi } of table) {
    it(`Bi = ${bi}: centre temperature at Fo = 0.2, 0.5, 1.0 matches the multi-term series`, () => {
      // half wall 0 ≤ x ≤ 1 (L = 1, α = k = ρc = 1): symmetry plane insulated, face at x = 1 to air at 0
      const n = 80;
      const g = grid({ x: { from: 0, to: 1, cells: n } });
      const r = solveTransient(
        { grid: g, initial: 1, boundary: { xmin: { kind: 'neumann', flux: 0 }, xmax: { kind: 'robin', h: bi, ambient: 0 } } },
        { scheme: 'crank-nicolson', dt: 1e-3, endTime: 1, outputTimes: [0.2, 0.5, 1.0], rannacherSteps: 2 },
      );
      const z = roots(bi, 60);
      for (const o of r.outputs) {
        let exact = 0;
        for (const zn of z) exact += ((4 * Math.sin(zn)) / (2 * zn + Math.sin(2 * zn))) * Math.exp(-zn * zn * o.time);
        // second order in h = 1/80 and dt = 1e-3: errors ~1e-5 (measured); 2e-4 allows the start-up
        expect(Math.abs(o.field.get(0) - exact)).toBeLessThanOrEqual(2e-4);
      }
    });
  }
});

/** erf by its Taylor series (converges for all x; used here for x ≤ 3). */
function erf(x: number): number {
  let term = x;
  let s = x;
  for (let k = 1; k < 200; k++) {
    term *= (-x * x) / k;
    const add = term / (2 * k + 1);
    s += add;
    if (Math.abs(add) < 1e-17 * Math.abs(s)) break;
  }
  return (2 / Math.sqrt(Math.PI)) * s;
}

describe('semi-infinite solid after a sudden surface temperature (Carslaw & Jaeger 1959, §2.4)', () => {
  it('matches erf(x/(2√(αt))) before the far boundary is felt', () => {
    // slab 0 ≤ x ≤ 1 at 0, face x = 0 raised to 1 at t = 0; at t = 0.01 the far face is 5√(αt) away
    const n = 400;
    const g = grid({ x: { from: 0, to: 1, cells: n } });
    const t = 0.01;
    const r = solveTransient(
      { grid: g, initial: 0, boundary: { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'neumann', flux: 0 } } },
      { scheme: 'crank-nicolson', dt: 2.5e-5, endTime: t, rannacherSteps: 4 },
    );
    let e = 0;
    for (let i = 1; i <= n / 4; i++) {
      const x = i / n;
      e = Math.max(e, Math.abs(r.field.get(i) - (1 - erf(x / (2 * Math.sqrt(t))))));
    }
    // measured 8.1e-6 (h = 2.5e-3, dt = 2.5e-5, second order in both); 5e-5 leaves room
    expect(e).toBeLessThanOrEqual(5e-5);
  });
});
