/**
 * Convergence studies: orders from synthetic errors, studies in space, in
 * time and in both, the rendered table, CSV and SVG, and refusals.
 */
import { describe, expect, it } from 'vitest';
import { grid, studyPlot } from '../../src/index.js';
import {
  convergenceStudy, errorNorms, sineDecay, spacingsFor, studyCsv, studyTable,
} from '../../src/verify/index.js';
import { expectAsymptotic, expectOrder } from '../../src/testing.js';
import { codeOf, errorOf } from '../support/errors.js';

const eps = Number.EPSILON;

describe('orders from errors given by the caller', () => {
  it('e = 3h² + h³ with unequal ratios: pair orders p̂ = ln(e₁/e₂)/ln(h₁/h₂), fit near 2, asymptotic', () => {
    const spacings = [0.1, 0.06, 0.05, 0.02, 0.011];
    const e = (h: number) => 3 * h * h + h ** 3;
    const s = convergenceStudy(({ spacing }) => ({ linf: e(spacing!), l2: 0.5 * e(spacing!) }), { refine: 'space', spacings });
    expect(s.norms).toEqual(['l2', 'linf']);
    s.pairs.forEach((p, i) => {
      const want = Math.log(e(spacings[i]!) / e(spacings[i + 1]!)) / Math.log(spacings[i]! / spacings[i + 1]!);
      expect(Math.abs(p.orders.linf! - want)).toBeLessThanOrEqual(8 * eps * want);
    });
    expect(Math.abs(s.fits.linf!.order - 2)).toBeLessThanOrEqual(0.05);
    expect(s.fits.linf!.standardError).toBeGreaterThan(0);
    expect(s.asymptotic.linf).toBe(true);
    expectOrder(s, 2, { tolerance: 0.05 });
    expectOrder(s, 2, { norm: 'l2', using: 'finest', tolerance: 0.02 });
  });
  it('an exact power law fits with zero standard error and the right constant', () => {
    const s = convergenceStudy(({ spacing }) => ({ linf: 7 * spacing! ** 4 }), { refine: 'space', spacings: spacingsFor(1, [4, 8, 16, 32]) });
    // logs of exact powers: a few ε of the log magnitudes
    expect(Math.abs(s.fits.linf!.order - 4)).toBeLessThanOrEqual(1e-12);
    expect(s.fits.linf!.standardError).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(s.fits.linf!.constant - 7)).toBeLessThanOrEqual(1e-10);
  });
  it('a pre-asymptotic study (order still climbing) is flagged and expectAsymptotic throws', () => {
    const s = convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 + 0.5 * spacing! }), { refine: 'space', spacings: [1, 0.5, 0.25] });
    expect(s.asymptotic.linf).toBe(false);
    expect(codeOf(() => expectAsymptotic(s))).toBe('NOT_ASYMPTOTIC');
  });
});

describe('studies of real computations', () => {
  it('space: trapezoid-weighted L2 and L∞ of a perturbation c·h² sin(πx) are order 2', () => {
    const s = convergenceStudy(({ spacing }) => {
      const g = grid({ x: { from: 0, to: 1, cells: Math.round(1 / spacing!) } });
      const computed = Float64Array.from(g.x.coordinates, (x) => Math.sin(Math.PI * x) + spacing! ** 2 * Math.sin(Math.PI * x));
      return { grid: g, computed, exact: (x: number) => Math.sin(Math.PI * x) };
    }, { refine: 'space', spacings: spacingsFor(1, [8, 16, 32, 64]) });
    // ‖h² sin πx‖₂ = h²/√2 up to the trapezoid rule's own error (exact for sin² on these grids)
    expect(Math.abs(s.levels[3]!.errors.l2! - (1 / 64) ** 2 / Math.SQRT2)).toBeLessThanOrEqual(1e-12);
    expectOrder(s, 2, { norm: 'l2', tolerance: 1e-6 });
    expectOrder(s, 2, { norm: 'linf', tolerance: 1e-6 });
  });
  it('time: backward Euler for y′ = −y is order 1 in dt', () => {
    const s = convergenceStudy(({ timeStep }) => {
      const n = Math.round(1 / timeStep!);
      let y = 1;
      for (let i = 0; i < n; i++) y /= 1 + timeStep!;
      return { linf: Math.abs(y - Math.exp(-1)) };
    }, { refine: 'time', timeSteps: [0.1, 0.05, 0.025, 0.0125] });
    expect(s.levels[0]!.spacing).toBeUndefined();
    expectOrder(s, 1, { tolerance: 0.05 });
  });
  it('both: forward Euler + 3-point Laplacian for u_t = u_xx with dt = 0.4h², order 2 in h against sineDecay', () => {
    const s = convergenceStudy(({ spacing, timeStep }) => {
      const h = spacing!;
      const dt = timeStep!;
      const g = grid({ x: { from: 0, to: 1, cells: Math.round(1 / h) } });
      const x = g.x.coordinates;
      let u = Float64Array.from(x, (v) => sineDecay(v, 0));
      let w = new Float64Array(u.length);
      const T = 0.1;
      const steps = Math.round(T / dt);
      const lam = (T / steps) / (h * h);
      for (let k = 0; k < steps; k++) {
        for (let i = 1; i < u.length - 1; i++) w[i] = u[i]! + lam * (u[i - 1]! - 2 * u[i]! + u[i + 1]!);
        [u, w] = [w, u];
      }
      return { grid: g, computed: u, exact: (v: number) => sineDecay(v, T) };
    }, { refine: 'both', spacings: spacingsFor(1, [10, 20, 40]), timeStep: (h) => 0.4 * h * h });
    // dt = 0.4·h² with h = 1/20: one multiplication of exact-ish values, a few ulps
    expect(Math.abs(s.levels[1]!.timeStep! - 0.4 / 400)).toBeLessThanOrEqual(4 * Number.EPSILON * (0.4 / 400));
    expectOrder(s, 2, { tolerance: 0.1, norm: 'l2' });
  });
});

describe('rendering', () => {
  const s = convergenceStudy(({ spacing }) => ({ l2: spacing! ** 2, linf: 2 * spacing! ** 2, quantity: spacing! ** 4 }), {
    refine: 'both', spacings: [0.2, 0.1, 0.05], timeStep: (h) => h / 2,
  });
  it('markdown: one row per level, orders from the second row, a fit table', () => {
    const t = studyTable(s);
    const lines = t.split('\n');
    expect(lines[0]).toBe('| level | h | dt | L2 error | L2 order | L∞ error | L∞ order | quantity error | quantity order |');
    expect(lines[2]).toContain('| 0 | 2.000e-1 | 1.000e-1 | 4.000e-2 |  |');
    expect(lines[3]).toContain('2.000');
    expect(t).toContain('| quantity | 4.000 |');
    expect(t).toContain('| yes |');
  });
  it('CSV: header and full-precision values', () => {
    const c = studyCsv(s).trimEnd().split('\n');
    expect(c[0]).toBe('level,h,dt,l2,l2_order,linf,linf_order,quantity,quantity_order');
    expect(c).toHaveLength(4);
    expect(c[1]!.split(',')[4]).toBe('');
    expect(Number(c[2]!.split(',')[4])).toBeCloseTo(2, 12);
  });
  it('SVG: standalone document, one path per norm, dashed reference slopes, tick labels, escaped title', () => {
    const svg = studyPlot(s, { title: 'a < b & c', slopes: [2, 4] });
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.endsWith('</svg>')).toBe(true);
    expect(svg.match(/class="norm"/g)).toHaveLength(3);
    expect(svg.match(/class="reference"/g)).toHaveLength(2);
    expect(svg).toContain('stroke-dasharray');
    expect(svg).toContain('slope 4');
    expect(svg).toContain('a &lt; b &amp; c');
    expect(svg).toContain('spacing h');
    expect(svg).not.toMatch(/NaN|Infinity/);
  });
});

describe('refusals', () => {
  const ok = ({ spacing }: { spacing: number | undefined }) => ({ linf: spacing! });
  it('too few levels, a small or reversed ratio, a zero error, mixed norms', () => {
    expect(codeOf(() => convergenceStudy(ok, { refine: 'space', spacings: [0.2, 0.1] }))).toBe('TOO_FEW_LEVELS');
    const r = errorOf(() => convergenceStudy(ok, { refine: 'space', spacings: [0.2, 0.1, 0.095] }));
    expect(r.code).toBe('REFINEMENT_RATIO');
    expect(r.message).toContain('1.1');
    expect(codeOf(() => convergenceStudy(ok, { refine: 'space', spacings: [0.1, 0.2, 0.4] }))).toBe('REFINEMENT_RATIO');
    expect(codeOf(() => convergenceStudy(() => ({ linf: 0 }), { refine: 'space', spacings: [0.4, 0.2, 0.1] }))).toBe('UNUSABLE_ERROR_NORM');
    expect(codeOf(() => convergenceStudy(({ index }) => (index === 0 ? { linf: 1 } : { l2: 1 }), { refine: 'space', spacings: [0.4, 0.2, 0.1] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => convergenceStudy(ok, { refine: 'both', spacings: [0.4, 0.2, 0.1], timeStep: () => -1 }))).toBe('INVALID_OPTION');
  });
  it('errorNorms checks lengths', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 2 } });
    expect(codeOf(() => errorNorms(g, [1, 2], () => 0))).toBe('SHAPE_MISMATCH');
  });
});
