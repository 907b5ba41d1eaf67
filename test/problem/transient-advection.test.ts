/**
 * Advection in diffusion-type transients, ρc(∂u/∂t + b·∇u) = ∇·(k∇u) + f:
 * observed orders against closed forms (periodic and Dirichlet, 1-D and
 * 2-D), the explicit stability guard with its advective limit, the cell
 * Péclet report, and input checks.
 */
import { describe, expect, it } from 'vitest';
import { grid, solveTransient, type TransientOptions, type TransientProblem } from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';
import { mulberry32 } from '../support/prng.js';
import { observedOrders } from '../support/solve.js';

const eps = Number.EPSILON;
const k = 2 * Math.PI; // wavenumber of one period on [0, 1)

/** Max-norm distance of a run on a periodic axis of n cells from u(x). */
function periodicError(n: number, b: number, alpha: number, scheme: TransientOptions['scheme'], dt: number, T: number,
  advectionScheme: 'central' | 'upwind', exact: (x: number) => number): number {
  const g = grid({ x: { from: 0, to: 1, cells: n, periodic: true } });
  const r = solveTransient(
    { grid: g, conductivity: alpha, velocity: [b], advectionScheme, initial: (x) => Math.sin(k * x), boundary: [] },
    { scheme, dt, endTime: T },
  );
  let e = 0;
  for (let i = 0; i < n; i++) e = Math.max(e, Math.abs(r.field.get(i) - exact(i / n)));
  return e;
}

/**
 * u = e^{−αk²t} sin(k(x − bt)) solves u_t + b u_x = α u_xx on a periodic
 * axis (a closed form, fact of the trade: a decaying travelling wave).
 */
const travellingWave = (b: number, alpha: number, t: number) => (x: number) => Math.exp(-alpha * k * k * t) * Math.sin(k * (x - b * t));

/**
 * The semi-discrete solution with central differences: e^{ikx} is an
 * eigenvector of both periodic (circulant) difference matrices, the second
 * difference with eigenvalue −(4/h²)sin²(kh/2) and the central first
 * difference with i·sin(kh)/h (Strikwerda 2004, ch. 2), so
 * uᵢ(t) = e^{−αλt} sin(kxᵢ − ωt), λ = (4/h²)sin²(kh/2), ω = b·sin(kh)/h,
 * and the time error is isolated.
 */
const semiDiscrete = (n: number, b: number, alpha: number, t: number) => {
  const h = 1 / n;
  const lambda = (4 / (h * h)) * Math.sin((k * h) / 2) ** 2;
  const omega = (b * Math.sin(k * h)) / h;
  return (x: number) => Math.exp(-alpha * lambda * t) * Math.sin(k * x - omega * t);
};

describe('periodic axis: u_t + b u_x = α u_xx against e^{−αk²t} sin(k(x − bt)), k = 2π', () => {
  const b = 1;
  const alpha = 0.01;
  it('Crank–Nicolson with central advection: second order in space and time together (dt = h)', () => {
    const T = 0.25;
    const errs = [16, 32, 64, 128, 256].map((n) => periodicError(n, b, alpha, 'crank-nicolson', 1 / n, T, 'central', travellingWave(b, alpha, T)));
    const orders = observedOrders(errs);
    expect(orders.length).toBe(4);
    for (const o of orders) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });

  it('Crank–Nicolson: second order in time against the semi-discrete solution', () => {
    const n = 32;
    const T = 0.4;
    const errs = [0.02, 0.01, 0.005, 0.0025].map((dt) => periodicError(n, b, alpha, 'crank-nicolson', dt, T, 'central', semiDiscrete(n, b, alpha, T)));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });

  it('backward Euler: first order in time against the semi-discrete solution', () => {
    const n = 32;
    const T = 0.4;
    const errs = [0.004, 0.002, 0.001, 0.0005].map((dt) => periodicError(n, b, alpha, 'backward-euler', dt, T, 'central', semiDiscrete(n, b, alpha, T)));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });

  it('upwind advection: first order in space (Crank–Nicolson, dt = h, whose O(dt²) error is two orders below)', () => {
    const T = 0.25;
    const errs = [64, 128, 256, 512].map((n) => periodicError(n, b, alpha, 'crank-nicolson', 1 / n, T, 'upwind', travellingWave(b, alpha, T)));
    for (const o of observedOrders(errs)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });

  it('ρc multiplies the advection term: k = 2α with ρc = 2 gives the run of k = α with ρc = 1', () => {
    const n = 32;
    const g = grid({ x: { from: 0, to: 1, cells: n, periodic: true } });
    const run = (kc: number, rc: number) => solveTransient(
      { grid: g, conductivity: kc, heatCapacity: rc, velocity: [b], initial: (x) => Math.sin(k * x), boundary: [] },
      { scheme: 'crank-nicolson', dt: 0.01, endTime: 0.2 },
    ).field.data;
    const one = run(alpha, 1);
    const two = run(2 * alpha, 2);
    // same matrices up to a factor 2 per row: 20 steps of a direct solve, 100ε of a unit amplitude is ample
    for (let i = 0; i < n; i++) expect(Math.abs(one[i]! - two[i]!)).toBeLessThanOrEqual(100 * eps);
    // and the wave has moved: without advection (or at speed b/ρc) it would be elsewhere
    const exact = travellingWave(b, alpha, 0.2);
    let e = 0;
    for (let i = 0; i < n; i++) e = Math.max(e, Math.abs(two[i]! - exact(i / n)));
    expect(e).toBeLessThan(0.05); // central O(h²) phase error at n = 32: (kh)²/6·k·b·T ≈ 0.008
  });
});

describe('2-D, doubly periodic, velocity at 30° to the x axis', () => {
  it('Crank–Nicolson with central advection: second order in space and time (dt = h), BiCGSTAB steps', () => {
    const speed = 1;
    const bx = speed * Math.cos(Math.PI / 6);
    const by = speed * Math.sin(Math.PI / 6);
    const alpha = 0.01;
    const T = 0.125; // a whole number of steps dt = h on every grid, so that dt halves with h
    // u = e^{−α|κ|²t} sin(κ·(x − bt)), κ = (2π, 2π): the same closed form along κ
    const exact = (x: number, y: number) => Math.exp(-alpha * 2 * k * k * T) * Math.sin(k * (x - bx * T) + k * (y - by * T));
    const errs = [16, 32, 64, 128].map((n) => {
      const g = grid({ x: { from: 0, to: 1, cells: n, periodic: true }, y: { from: 0, to: 1, cells: n, periodic: true } });
      const r = solveTransient(
        { grid: g, conductivity: alpha, velocity: [bx, () => by], initial: (x, y) => Math.sin(k * x + k * y), boundary: [] },
        { scheme: 'crank-nicolson', dt: 1 / n, endTime: T, tolerance: 1e-12 },
      );
      expect(r.iterations).toBeGreaterThan(0); // an iterative (BiCGSTAB) solve ran
      let e = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) e = Math.max(e, Math.abs(r.field.get(i, j) - exact(i / n, j / n)));
      return e;
    });
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });

  it('conjugate gradients are refused for the nonsymmetric step', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 8, periodic: true }, y: { from: 0, to: 1, cells: 8, periodic: true } });
    const e = errorOf(() => solveTransient({ grid: g, velocity: [1, 0], initial: 0, boundary: [] }, { scheme: 'backward-euler', dt: 0.1, endTime: 0.1, solver: 'cg' }));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toMatch(/bicgstab/);
  });
});

describe('value and flux faces: steady state reached by backward Euler', () => {
  const b = 1;
  const steady = (n: number, alpha: number, advectionScheme: 'central' | 'upwind', boundary: TransientProblem['boundary']) => solveTransient(
    { grid: grid({ x: { from: 0, to: 1, cells: n } }), conductivity: alpha, velocity: [b], advectionScheme, initial: 0, boundary },
    { scheme: 'backward-euler', dt: 1e4, endTime: 1e5 }, // 10 steps of 10⁴ s: the transient (time scale ≤ 1 s) is gone to round-off
  ).field;
  const values = { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'dirichlet', value: 0 } } as const;
  // Patankar (1980), §5.2: the exact 1-D convection–diffusion profile between two values,
  // (u − u₀)/(u_L − u₀) = (e^{Pe·x/L} − 1)/(e^{Pe} − 1), Pe = bL/α
  const profile = (alpha: number) => (x: number) => 1 - (Math.exp((b * x) / alpha) - 1) / (Math.exp(b / alpha) - 1);
  const err = (u: { get(i: number): number }, n: number, exact: (x: number) => number) => {
    let e = 0;
    for (let i = 0; i <= n; i++) e = Math.max(e, Math.abs(u.get(i) - exact(i / n)));
    return e;
  };

  it('value faces, Pe = 10: central second order, upwind first order', () => {
    const alpha = 0.1;
    const central = [16, 32, 64, 128].map((n) => err(steady(n, alpha, 'central', values), n, profile(alpha)));
    for (const o of observedOrders(central)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
    const upwind = [128, 256, 512, 1024].map((n) => err(steady(n, alpha, 'upwind', values), n, profile(alpha)));
    for (const o of observedOrders(upwind)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });

  it('a flux face at the outflow carries the advection term with the one-sided closure and keeps the order', () => {
    // u(0) = 0, −k u'(1) = q: integrating α u'' = b u' twice gives u = A(e^{bx/α} − 1), A = −(q/k)(α/b)e^{−b/α}
    const alpha = 0.5;
    const q = -1;
    const A = (-q / alpha) * (alpha / b) * Math.exp(-b / alpha);
    const exact = (x: number) => A * (Math.exp((b * x) / alpha) - 1);
    const bc = { xmin: { kind: 'dirichlet', value: 0 }, xmax: { kind: 'neumann', flux: q } } as const;
    const central = [32, 64, 128, 256].map((n) => err(steady(n, alpha, 'central', bc), n, exact));
    for (const o of observedOrders(central)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
    const upwind = [32, 64, 128, 256].map((n) => err(steady(n, alpha, 'upwind', bc), n, exact));
    for (const o of observedOrders(upwind)) expect(Math.abs(o - 1)).toBeLessThanOrEqual(0.1);
  });
});

describe('explicit stability guard with advection', () => {
  // Forward Euler with central differences on a periodic grid (von Neumann, Hirsch 2007 vol. 1;
  // Hindmarsh, Gresho & Griffiths 1984): stable iff dt ≤ h²/(2α) and dt ≤ 2α/b². The advective
  // limit is the binding one iff 2α/b² < h²/(2α), i.e. iff the cell Péclet number bh/α > 2 —
  // so the test needs Pe > 2 (here Pe = 4: advective 0.025 s, diffusive 0.1 s). For Pe ≤ 2
  // the diffusive limit binds and Gershgorin alone is exact.
  const n = 20;
  const h = 1 / n;
  const b = 1;
  const alpha = (b * h) / 4; // Pe = 4
  const g = grid({ x: { from: 0, to: 1, cells: n, periodic: true } });
  const rnd = mulberry32(2024);
  const noise = Float64Array.from({ length: n }, () => rnd() - 0.5);
  const start = Math.max(...noise.map(Math.abs));
  const problem = (advectionScheme: 'central' | 'upwind'): TransientProblem => ({
    grid: g, conductivity: alpha, velocity: [b], advectionScheme, initial: (x) => noise[Math.round(x / h) % n]!, boundary: [],
  });
  const maxAbs = (dt: number, advectionScheme: 'central' | 'upwind', steps: number) => Math.max(
    ...solveTransient(problem(advectionScheme), { scheme: 'forward-euler', dt, endTime: steps * dt, stabilityGuard: false }).field.data.map(Math.abs),
  );

  it('central: the limit is min(h²/(2α), 2α/b²) = 2α/b², to round-off', () => {
    const r = solveTransient(problem('central'), { scheme: 'forward-euler', dt: 0.01, endTime: 0.1 });
    const s = r.stability!;
    const want = (2 * alpha) / (b * b);
    // one division each side, k/ρc with ρc = 1 exact: 2ε relative
    expect(Math.abs(s.advection!.advective - want)).toBeLessThanOrEqual(2 * eps * want);
    expect(Math.abs(s.forwardEuler - want)).toBeLessThanOrEqual(2 * eps * want);
    // the diffusive part is the Gershgorin limit h²/(2α): a row sum of 3 entries, each 1/h² rounded, 8ε
    expect(Math.abs(s.advection!.diffusive - (h * h) / (2 * alpha))).toBeLessThanOrEqual(8 * eps * ((h * h) / (2 * alpha)));
    expect(s.advection!.scheme).toBe('central');
    // Gershgorin on the whole (not diagonally dominant) matrix would allow 2/ρ_G = 2/(2α/h² + b/h) = 0.0667 s, unsafe
    expect(2 / s.gershgorin).toBeGreaterThan(2.5 * want);
  });

  it('central: from seeded noise, 0.8× the limit stays bounded and 1.3× grows (guard off)', () => {
    const limit = (2 * alpha) / (b * b);
    // at 0.8×: |g|² = (1 − 2r s)² + ν² sin²θ < 1 for every θ ≠ 0; the mean (θ = 0) is kept
    expect(maxAbs(0.8 * limit, 'central', 800)).toBeLessThan(start);
    // at 1.3×: |g|² ≈ 1 + (ν² − 2r)θ² > 1 for the long waves, ≈ 1.3 % growth a step at θ = 2π·2/20
    expect(maxAbs(1.3 * limit, 'central', 800)).toBeGreaterThan(100 * start);
  });

  it('central: the guard refuses 1.3× the advective limit with STEP_TOO_LARGE, naming dt, the limit and the fixes', () => {
    const limit = (2 * alpha) / (b * b);
    const e = errorOf(() => solveTransient(problem('central'), { scheme: 'forward-euler', dt: 1.3 * limit, endTime: 1 }));
    expect(e.code).toBe('STEP_TOO_LARGE');
    expect(e.message).toMatch(/^dt = 0\.03\d* s exceeds/);
    expect(e.message).toContain(limit.toPrecision(6));
    expect(e.message).toMatch(/upwind/);
    expect(e.message).toMatch(/implicit/);
    // θ = 0.25 doubles the limit (the θ-method disc has radius 1/(1 − 2θ))
    expect(() => solveTransient(problem('central'), { scheme: { theta: 0.25 }, dt: 1.5 * limit, endTime: 0.5 })).not.toThrow();
    expect(codeOf(() => solveTransient(problem('central'), { scheme: { theta: 0.25 }, dt: 2.5 * limit, endTime: 0.5 }))).toBe('STEP_TOO_LARGE');
  });

  it('central with (almost) no diffusion: every step is refused, α = 1e-12 gives a limit of 2e-12 s', () => {
    const e = errorOf(() => solveTransient({ grid: g, conductivity: 1e-12, velocity: [b], initial: 0, boundary: [] }, { scheme: 'forward-euler', dt: 1e-6, endTime: 1e-5 }));
    expect(e.code).toBe('STEP_TOO_LARGE');
    expect((e as unknown as { dtMax: number }).dtMax).toBeLessThanOrEqual(2e-12 * (1 + 2 * eps));
    expect(e.message).toMatch(/upwind/);
  });

  it('upwind: the limit is 1/(2α/h² + |b|/h) to round-off; 0.8× bounded, 1.3× grows, and is refused', () => {
    const want = 1 / ((2 * alpha) / (h * h) + b / h);
    const s = solveTransient(problem('upwind'), { scheme: 'forward-euler', dt: 0.01, endTime: 0.1 }).stability!;
    // a row sum of 3 entries, each rounded, then 2/Σ: 8ε relative
    expect(Math.abs(s.forwardEuler - want)).toBeLessThanOrEqual(8 * eps * want);
    expect(Math.abs(s.advection!.advective - want)).toBeLessThanOrEqual(8 * eps * want);
    expect(s.advection!.scheme).toBe('upwind');
    // for upwind Gershgorin is exact (upwind = central with diffusion α + bh/2, whose limit 1/(2α/h² + b/h) binds)
    expect(maxAbs(0.8 * want, 'upwind', 400)).toBeLessThan(start);
    expect(maxAbs(1.3 * want, 'upwind', 400)).toBeGreaterThan(100 * start);
    expect(codeOf(() => solveTransient(problem('upwind'), { scheme: 'forward-euler', dt: 1.3 * want, endTime: 1 }))).toBe('STEP_TOO_LARGE');
  });

  it('upwind in 2-D: dt·Σₐ(2α/hₐ² + |bₐ|/hₐ) ≤ 1 to round-off', () => {
    const nx = 16;
    const ny = 8;
    const g2 = grid({ x: { from: 0, to: 1, cells: nx, periodic: true }, y: { from: 0, to: 1, cells: ny, periodic: true } });
    const bx = 0.7;
    const by = -0.4;
    const a2 = 0.003;
    const s = solveTransient(
      { grid: g2, conductivity: a2, velocity: [bx, by], advectionScheme: 'upwind', initial: 0, boundary: [] },
      { scheme: 'forward-euler', dt: 1e-3, endTime: 1e-2 },
    ).stability!;
    const want = 1 / ((2 * a2) * (nx * nx + ny * ny) + Math.abs(bx) * nx + Math.abs(by) * ny);
    // a row sum of 5 entries, each rounded: 12ε relative
    expect(Math.abs(s.forwardEuler - want)).toBeLessThanOrEqual(12 * eps * want);
  });
});

describe('cell Péclet report', () => {
  it('reports Pe = |b|h/α and flags central differences above 2; undefined without velocity', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 20 } });
    const boundary = { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'neumann', flux: 0 } } as const;
    const r = solveTransient({ grid: g, conductivity: 0.0125, velocity: [1], initial: 0, boundary }, { scheme: 'crank-nicolson', dt: 0.01, endTime: 0.05 });
    expect(Math.abs(r.peclet!.max - 4)).toBeLessThanOrEqual(4 * eps * 4); // 0.05/0.0125, two roundings
    expect(r.peclet!.centralMayOscillate).toBe(true);
    expect(r.stability).toBeUndefined(); // implicit: no explicit limit
    const slow = solveTransient({ grid: g, conductivity: 0.1, velocity: [1], initial: 0, boundary }, { scheme: 'crank-nicolson', dt: 0.01, endTime: 0.05 });
    expect(slow.peclet!.centralMayOscillate).toBe(false);
    const none = solveTransient({ grid: g, initial: 0, boundary }, { scheme: 'crank-nicolson', dt: 0.01, endTime: 0.05 });
    expect(none.peclet).toBeUndefined();
  });
});

describe('bad input', () => {
  const g = grid({ x: { from: 0, to: 1, cells: 10 } });
  const boundary = { xmin: { kind: 'dirichlet', value: 0 }, xmax: { kind: 'dirichlet', value: 0 } } as const;
  const run = (extra: Partial<TransientProblem>, options: Partial<TransientOptions> = {}) => () =>
    solveTransient({ grid: g, initial: 0, boundary, ...extra }, { scheme: 'backward-euler', dt: 0.1, endTime: 0.1, ...options });

  it('wrong number of components: INVALID_OPTION with the count given, the count needed and the axes', () => {
    const e = errorOf(run({ velocity: [1, 2] }));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toContain('2 component(s)');
    expect(e.message).toContain('1-D');
    expect(e.message).toContain('give 1');
  });

  it('non-finite constant component: INVALID_OPTION naming the axis and the value', () => {
    const e = errorOf(run({ velocity: [Number.NaN] }));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toContain('component x is NaN');
    expect(e.message).toContain('finite');
    expect(codeOf(run({ velocity: [Infinity] }))).toBe('INVALID_OPTION');
  });

  it('non-finite value of a velocity function: NON_FINITE from the advection operator, with the node', () => {
    const e = errorOf(run({ velocity: [(x: number) => (x > 0.5 ? Number.NaN : 1)] }));
    expect(e.code).toBe('NON_FINITE');
    expect(e.message).toMatch(/velocity component 0 at node \d+ is NaN/);
  });

  it('unknown differencing, differencing without a velocity, accuracy 4 with a velocity', () => {
    const bad = errorOf(run({ velocity: [1], advectionScheme: 'downwind' as 'upwind' }));
    expect(bad.code).toBe('INVALID_OPTION');
    expect(bad.message).toContain('"downwind"');
    expect(codeOf(run({ advectionScheme: 'upwind' }))).toBe('INVALID_OPTION');
    const acc = errorOf(run({ velocity: [1], accuracy: 4 }));
    expect(acc.code).toBe('INVALID_ACCURACY');
    expect(acc.message).toContain('use accuracy 2');
  });
});
