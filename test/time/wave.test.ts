import { describe, expect, it } from 'vitest';
import { grid, solveWave } from '../../src/index.js';
import { codeOf } from '../support/errors.js';
import { observedOrders } from '../support/solve.js';

const clamped = [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] as const;

function maxErr(f: { get(i: number): number }, n: number, exact: (x: number) => number): number {
  let e = 0;
  for (let i = 0; i <= n; i++) e = Math.max(e, Math.abs(f.get(i) - exact(i / n)));
  return e;
}

describe('leapfrog on the clamped string (standing modes: a fact of common practice, e.g. Strikwerda 2004, §8.2)', () => {
  it('standing mode cos(πt) sin(πx): second order with c·dt/h = 0.5 fixed', () => {
    const T = 1.3;
    const errs = [20, 40, 80, 160].map((n) => {
      const r = solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: (x) => Math.sin(Math.PI * x), boundary: clamped }, { dt: 0.5 / n, endTime: T });
      return maxErr(r.field, n, (x) => Math.cos(Math.PI * T) * Math.sin(Math.PI * x));
    });
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
  it('zero displacement, initial velocity sin(2πx): u = sin(2πx) sin(2πt)/(2π), second order (the Taylor first step)', () => {
    const T = 0.8;
    const errs = [20, 40, 80, 160].map((n) => {
      const r = solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: 0, velocity: (x) => Math.sin(2 * Math.PI * x), boundary: clamped }, { dt: 0.4 / n, endTime: T });
      return maxErr(r.field, n, (x) => (Math.sin(2 * Math.PI * x) * Math.sin(2 * Math.PI * T)) / (2 * Math.PI));
    });
    for (const o of observedOrders(errs)) expect(Math.abs(o - 2)).toBeLessThanOrEqual(0.1);
  });
  it('plucked string against d’Alembert (odd 2-periodic extension of the triangle); at c·dt/h = 1 leapfrog is exact on the grid', () => {
    // u₀ = triangle peaking 0.01 at x = 0.3; u(x, t) = ½[F(x − t) + F(x + t)], F the odd 2-periodic extension
    const tri = (x: number) => (x <= 0.3 ? (0.01 * x) / 0.3 : (0.01 * (1 - x)) / 0.7);
    const F = (x: number) => {
      const y = ((x % 2) + 2) % 2;
      return y <= 1 ? tri(y) : -tri(2 - y);
    };
    const n = 100;
    const T = 0.37;
    const r = solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: tri, boundary: clamped }, { dt: 1 / n, endTime: T, stabilityGuard: false });
    // dt' = T/⌈T/dt⌉ = 0.37/37 = 0.01 exactly c·dt = h: the scheme reproduces d'Alembert to round-off
    // at the nodes (common practice: the "magic time step"); 1e-12 of the 0.01 amplitude
    expect(r.dt).toBe(0.01);
    expect(maxErr(r.field, n, (x) => 0.5 * (F(x - T) + F(x + T)))).toBeLessThanOrEqual(1e-14);
    const r2 = solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: tri, boundary: clamped }, { dt: 0.5 / n, endTime: T });
    // at half the CFL step the kinks smear: a value check (error well under 10 % of the amplitude)
    expect(maxErr(r2.field, n, (x) => 0.5 * (F(x - T) + F(x + T)))).toBeLessThanOrEqual(1e-3);
  });
  it('conserves the discrete energy without damping, and loses it with damping', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 64 }, y: { from: 0, to: 1, cells: 64 } });
    const boundary = [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] as const;
    const initial = (x: number, y: number) => x * (1 - x) * y * y * (1 - y) * 50;
    const r = solveWave({ grid: g, initial, boundary }, { dt: 0.005, endTime: 2, recordEnergy: true });
    const e0 = r.energy[0]!;
    let drift = 0;
    for (const e of r.energy) drift = Math.max(drift, Math.abs(e - e0));
    // 400 steps of ~10 flops per node on values O(1): drift ~ steps·ε·E; 400·64·ε bounds it
    expect(drift).toBeLessThanOrEqual(400 * 64 * Number.EPSILON * e0);
    const damped = solveWave({ grid: g, initial, boundary, damping: 0.5 }, { dt: 0.005, endTime: 2, recordEnergy: true });
    expect(damped.energy[damped.energy.length - 1]!).toBeLessThan(0.5 * damped.energy[0]!);
  });
  it('the fused 2-D path (constant c, value faces) matches the general CSR path to round-off', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 24 }, y: { from: 0, to: 2, cells: 30 } });
    const boundary = [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0.5 }] as const;
    const initial = (x: number, y: number) => 0.5 + Math.sin(Math.PI * x) * Math.sin(Math.PI * y * 0.5) * (1 + x * y);
    const fast = solveWave({ grid: g, waveSpeed: 1.5, damping: 0.3, source: 2, initial, boundary }, { dt: 0.01, endTime: 1 });
    const general = solveWave({ grid: g, waveSpeed: () => 1.5, damping: 0.3, source: () => 2, initial, boundary }, { dt: 0.01, endTime: 1 });
    let e = 0;
    for (let i = 0; i < g.size; i++) e = Math.max(e, Math.abs(fast.field.data[i]! - general.field.data[i]!));
    // the two paths sum the same terms in a different order: 100 steps × a few ulps of values ~2
    expect(e).toBeLessThanOrEqual(100 * 16 * Number.EPSILON * 2);
  });
  it('CFL: the guard refuses c·dt/h > 1 in 1-D and > 1/√2 in 2-D (Courant, Friedrichs & Lewy 1928)', () => {
    const n = 40;
    expect(codeOf(() => solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: 0, boundary: clamped }, { dt: 1.02 / n, endTime: 1 }))).toBe('STEP_TOO_LARGE');
    const r = solveWave({ grid: grid({ x: { from: 0, to: 1, cells: n } }), initial: 0, boundary: clamped }, { dt: 0.99 / n, endTime: 0.1 });
    expect(Math.abs(r.stability.leapfrog - 1 / n)).toBeLessThanOrEqual(1e-15);
    const g2 = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
    const r2 = solveWave({ grid: g2, initial: 0, boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] }, { dt: 0.5 / n, endTime: 0.05 });
    expect(Math.abs(r2.stability.leapfrog - 1 / (Math.SQRT2 * n))).toBeLessThanOrEqual(1e-15);
  });
});
