/**
 * The catalogue of analytical solutions: eigenvalues of the plane wall
 * against Incropera et al. (2007), Table 5.1 and against their own
 * equations; limits and independent forms of the other solutions.
 */
import { describe, expect, it } from 'vitest';
import {
  erfc, membraneMode, planeWallCoefficient, planeWallOneTerm, planeWallRoot, planeWallTemperature, pluckedString,
  semiInfiniteConvection, semiInfiniteStep, separableDecay, sineDecay, stringMode,
} from '../../src/verify/index.js';
import { codeOf } from '../support/errors.js';
import table from '../reference/incropera-2007-table5.1.json';

const eps = Number.EPSILON;

describe('plane wall, Incropera et al. (2007), 6th ed., Table 5.1 (typed from memory, 4 decimals)', () => {
  for (const e of table.entries) {
    it(`Bi = ${e.biot}: ζ₁ = ${e.zeta1}, C₁ = ${e.c1}`, () => {
      const z = planeWallRoot(e.biot);
      const c = planeWallCoefficient(e.biot);
      // our root satisfies the equation itself: g(ζ) = ζ sin ζ − Bi cos ζ at a few ulps of its terms
      expect(Math.abs(z * Math.sin(z) - e.biot * Math.cos(z))).toBeLessThanOrEqual(16 * eps * Math.max(1, e.biot));
      expect(z).toBeGreaterThan(0);
      expect(z).toBeLessThan(Math.PI / 2);
      // the printed values round ours to 4 decimals
      expect(Math.abs(z - e.zeta1)).toBeLessThanOrEqual(0.5e-4);
      expect(Math.abs(c - e.c1)).toBeLessThanOrEqual(0.5e-4);
      // and the printed ζ₁ satisfies ζ tan ζ = Bi to the accuracy its rounding allows: |d(ζ tan ζ)/dζ|·0.5e-4
      const slope = Math.tan(e.zeta1) + e.zeta1 / Math.cos(e.zeta1) ** 2;
      expect(Math.abs(e.zeta1 * Math.tan(e.zeta1) - e.biot)).toBeLessThanOrEqual(slope * 0.5e-4);
    });
  }
  it('higher roots lie in ((n−1)π, (n−1)π + π/2) and tend to (n−1)π as n grows (Bi = 1)', () => {
    for (let n = 1; n <= 50; n++) {
      const z = planeWallRoot(1, n);
      expect(z).toBeGreaterThan((n - 1) * Math.PI);
      expect(z).toBeLessThan((n - 1) * Math.PI + Math.PI / 2);
      // a root within 2 ulps of z leaves a residual of about |g′|·2εz ≈ 2εz²
      expect(Math.abs(z * Math.sin(z) - Math.cos(z))).toBeLessThanOrEqual(8 * eps * z * (1 + z));
    }
  });
  it('the one-term form is within 2 % of the series at the midplane for Fo ≥ 0.2 (Incropera et al. 2007, §5.5.2), everywhere for Fo ≥ 0.3', () => {
    for (const bi of [0.1, 1, 10]) {
      for (const fo of [0.2, 0.3, 0.5, 2]) {
        for (const xs of fo === 0.2 ? [0] : [0, 0.5, 1]) {
          const full = planeWallTemperature(xs, fo, bi);
          expect(Math.abs(planeWallOneTerm(xs, fo, bi) - full)).toBeLessThanOrEqual(0.02 * full);
        }
      }
    }
  });
  it('the series gives θ* → 1 near Fo = 0 and satisfies the convection condition −∂θ/∂x* = Bi·θ at x* = 1', () => {
    expect(Math.abs(planeWallTemperature(0, 1e-4, 1) - 1)).toBeLessThanOrEqual(1e-12);
    const bi = 2;
    const fo = 0.3;
    const d = 1e-5; // central difference, error ~ d²·θ‴ ≈ 1e-10
    const grad = (planeWallTemperature(1, fo, bi) - planeWallTemperature(1 - 2 * d, fo, bi)) / (2 * d);
    // one-sided at the face: use the symmetric pair about 1 − d, then correct by nothing: O(d) bias
    expect(Math.abs(-grad - bi * planeWallTemperature(1 - d, fo, bi))).toBeLessThanOrEqual(1e-4);
  });
});

describe('semi-infinite solid (Carslaw & Jaeger 1959, §2.5, §2.7)', () => {
  it('surface step: 0 at the surface, → 1 deep inside', () => {
    expect(semiInfiniteStep(0, 1, 1)).toBe(0);
    expect(Math.abs(semiInfiniteStep(20, 1, 1) - 1)).toBeLessThanOrEqual(eps);
  });
  it('convection: h → ∞ recovers erfc η; small t stays finite where the textbook form overflows', () => {
    const x = 0.3;
    const t = 0.5;
    expect(Math.abs(semiInfiniteConvection(x, t, { diffusivity: 1, conductivity: 1, h: 1e12 }) - erfc(x / (2 * Math.sqrt(t))))).toBeLessThanOrEqual(1e-11);
    // textbook form: exp(hx/k + β²) = exp(1e3·0.3 + …) overflows; ours is fine
    const v = semiInfiniteConvection(0.3, 1, { diffusivity: 1, conductivity: 1, h: 1e3 });
    expect(Number.isFinite(v)).toBe(true);
    expect(Math.abs(v - erfc(0.15))).toBeLessThanOrEqual(1e-3);
  });
  it('convection agrees with the textbook form where that is safe', () => {
    for (const [x, t, h] of [[0, 1, 1], [0.5, 2, 3], [1, 0.1, 0.5]] as const) {
      const s = Math.sqrt(t);
      const textbook = erfc(x / (2 * s)) - Math.exp(h * x + h * h * t) * erfc(x / (2 * s) + h * s);
      // e^{…}·erfc vs e^{−η²}·erfcx: each side carries a few ulps of e^{…} (exponent ≤ 20 here)
      expect(Math.abs(semiInfiniteConvection(x, t, { diffusivity: 1, conductivity: 1, h }) - textbook)).toBeLessThanOrEqual(256 * eps);
    }
  });
});

describe('decay modes and waves satisfy their equations (central differences, step 1e-4, error ~1e-7)', () => {
  const d = 1e-4;
  const tol = 1e-6;
  it('sine decay: u_t = αu_xx', () => {
    const o = { length: 2, diffusivity: 0.3, mode: 2 };
    const [x, t] = [0.37, 0.4];
    const ut = (sineDecay(x, t + d, o) - sineDecay(x, t - d, o)) / (2 * d);
    const uxx = (sineDecay(x + d, t, o) - 2 * sineDecay(x, t, o) + sineDecay(x - d, t, o)) / (d * d);
    expect(Math.abs(ut - 0.3 * uxx)).toBeLessThanOrEqual(tol * 10);
  });
  it('2-D separable decay: u_t = αΔu', () => {
    const o = { width: 1, height: 2, diffusivity: 0.5, modes: [1, 3] as const };
    const [x, y, t] = [0.3, 0.7, 0.05];
    const u = (a: number, b: number, c: number) => separableDecay(a, b, c, o);
    const ut = (u(x, y, t + d) - u(x, y, t - d)) / (2 * d);
    const lap = (u(x + d, y, t) + u(x - d, y, t) + u(x, y + d, t) + u(x, y - d, t) - 4 * u(x, y, t)) / (d * d);
    expect(Math.abs(ut - 0.5 * lap)).toBeLessThanOrEqual(tol * 100);
  });
  it('string and membrane modes: u_tt = c²Δu', () => {
    const [x, y, t] = [0.31, 0.42, 0.27];
    const s = (a: number, b: number) => stringMode(a, b, 2, { length: 1.5, speed: 2 });
    const stt = (s(x, t + d) - 2 * s(x, t) + s(x, t - d)) / (d * d);
    const sxx = (s(x + d, t) - 2 * s(x, t) + s(x - d, t)) / (d * d);
    expect(Math.abs(stt - 4 * sxx)).toBeLessThanOrEqual(1e-4);
    const m = (a: number, b: number, c: number) => membraneMode(a, b, c, [2, 1], { width: 1, height: 0.8, speed: 1.5 });
    const mtt = (m(x, y, t + d) - 2 * m(x, y, t) + m(x, y, t - d)) / (d * d);
    const lap = (m(x + d, y, t) + m(x - d, y, t) + m(x, y + d, t) + m(x, y - d, t) - 4 * m(x, y, t)) / (d * d);
    expect(Math.abs(mtt - 2.25 * lap)).toBeLessThanOrEqual(1e-3);
  });
  it("plucked string: d'Alembert equals the Fourier series Σ 2HL²sin(nπa/L)/(n²π²a(L−a))·sin(nπx/L)cos(nπct/L)", () => {
    const L = 2;
    const a = 0.5;
    const H = 0.1;
    const c = 3;
    const series = (x: number, t: number) => {
      let s = 0;
      for (let n = 1; n <= 20000; n++) {
        s += ((2 * H * L * L * Math.sin((n * Math.PI * a) / L)) / (n * n * Math.PI * Math.PI * a * (L - a)))
          * Math.sin((n * Math.PI * x) / L) * Math.cos((n * Math.PI * c * t) / L);
      }
      return s;
    };
    for (const [x, t] of [[0.3, 0], [1.1, 0.2], [1.9, 0.9], [0.5, 1.7]] as const) {
      // the tail after N terms is below Σ_{n>N} 2HL²/(n²π²a(L−a)) ≈ 2HL²/(Nπ²a(L−a)) ≈ 5.4e-6
      expect(Math.abs(pluckedString(x, t, { length: L, at: a, height: H, speed: c }) - series(x, t))).toBeLessThanOrEqual(6e-6);
    }
    // released from rest, the shape returns after one period 2L/c
    expect(Math.abs(pluckedString(0.3, 2 * L / c, { length: L, at: a, height: H, speed: c }) - pluckedString(0.3, 0, { length: L, at: a, height: H, speed: c }))).toBeLessThanOrEqual(8 * eps);
  });
  it('refuses bad parameters', () => {
    expect(codeOf(() => planeWallRoot(0))).toBe('INVALID_OPTION');
    expect(codeOf(() => planeWallTemperature(0, 0, 1))).toBe('INVALID_OPTION');
    expect(codeOf(() => pluckedString(0.5, 0, { at: 1 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => sineDecay(0, 0, { mode: 1.5 }))).toBe('INVALID_OPTION');
  });
});
