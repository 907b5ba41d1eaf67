/**
 * Richardson extrapolation and the Grid Convergence Index: the worked
 * example of Celik et al. (2008), examples computed by hand, and the flags.
 */
import { describe, expect, it } from 'vitest';
import {
  apparentOrder, gridConvergenceIndex, representativeSpacing, richardsonExtrapolation,
} from '../../src/verify/index.js';
import { codeOf } from '../support/errors.js';
import celik from '../reference/celik-2008-table1.json';

const eps = Number.EPSILON;

/** |got − printed| within half a unit of the printed last digit. */
function toPrinted(got: number, printed: number, decimals: number): void {
  expect(Math.abs(got - printed)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
}

describe('Celik et al. (2008), J. Fluids Eng. 130(7), 078001, Table 1, column 1 (typed from memory)', () => {
  const h = celik.cells.map((n) => representativeSpacing(n, 2));
  const g = gridConvergenceIndex(celik.phi, h);
  it('ratios: r21 = 1.5, r32 = √(8000/4500) = 4/3', () => {
    expect(Math.abs(g.ratio21 - 1.5)).toBeLessThanOrEqual(4 * eps);
    expect(Math.abs(g.ratio32! - 4 / 3)).toBeLessThanOrEqual(4 * eps);
  });
  it('reproduces p, φ_ext, e_a, e_ext and GCI_fine to the printed digits', () => {
    toPrinted(g.order, celik.printed.p, 2);
    toPrinted(g.extrapolated, celik.printed.phiExt21, 4);
    toPrinted(100 * g.approximateError, celik.printed.ea21Percent, 1);
    toPrinted(100 * g.extrapolatedError, celik.printed.eext21Percent, 1);
    toPrinted(100 * g.gciFine, celik.printed.gciFine21Percent, 1);
    expect(g.convergence).toBe('monotone');
    expect(g.oscillatory).toBe(false);
    expect(g.divergent).toBe(false);
  });
  it('p is a fixed point of p = |ln|ε32/ε21| + q(p)|/ln r21 to 1e-13', () => {
    const { order: p } = g;
    const q = Math.log((1.5 ** p - 1) / ((4 / 3) ** p - 1));
    expect(Math.abs(p - Math.abs(Math.log(Math.abs(g.change32! / g.change21)) + q) / Math.log(1.5))).toBeLessThanOrEqual(1e-13);
  });
});

describe('examples computed by hand', () => {
  it('equal ratios r = 2: φ = 1 + 0.01h² on h = 1, 2, 4 gives p = 2, φ_ext = 1, GCI = 1.25·(0.03/1.01)/3', () => {
    // ε21 = 0.03, ε32 = 0.12: p = ln 4/ln 2 = 2; φ_ext = (4·1.01 − 1.04)/3 = 1;
    // e_a = 0.03/1.01 = 0.0297029…; e_ext = 0.01/1 = 0.01; GCI = 1.25·e_a/3 = 0.0123762…
    const g = gridConvergenceIndex([1.01, 1.04, 1.16], [1, 2, 4]);
    // inputs carry 1 ulp each; the differences ε amplify that by ~1/0.03 relative
    const tol = 64 * eps;
    expect(g.iterations).toBe(0);
    expect(Math.abs(g.order - 2)).toBeLessThanOrEqual(1e-13);
    expect(Math.abs(g.extrapolated - 1)).toBeLessThanOrEqual(tol);
    expect(Math.abs(g.approximateError - 0.03 / 1.01)).toBeLessThanOrEqual(1e-14);
    expect(Math.abs(g.extrapolatedError - 0.01)).toBeLessThanOrEqual(1e-14);
    expect(Math.abs(g.gciFine - (1.25 * (0.03 / 1.01)) / 3)).toBeLessThanOrEqual(1e-14);
  });
  it('unequal ratios r21 = 2, r32 = 3: φ = 1 + h² on h = 1, 2, 6 gives p = 2 by the iteration', () => {
    // φ = 2, 5, 37; ε21 = 3, ε32 = 32; q(2) = ln(3/8), |ln(32/3) + ln(3/8)| = ln 4 ⇒ p = 2
    const a = apparentOrder([2, 5, 37], [1, 2, 6]);
    expect(a.iterations).toBeGreaterThan(1);
    expect(Math.abs(a.order - 2)).toBeLessThanOrEqual(1e-12);
    const r = richardsonExtrapolation([2, 5, 37], [1, 2, 6]);
    expect(r.observed).toBe(true);
    expect(Math.abs(r.value - 1)).toBeLessThanOrEqual(1e-12);
  });
  it('two grids with a given order: φ_ext = φ1 + (φ1 − φ2)/(rᵖ − 1); GCI uses F_s = 3', () => {
    const r = richardsonExtrapolation([1.01, 1.04], [0.1, 0.2], 2);
    expect(Math.abs(r.value - 1)).toBeLessThanOrEqual(8 * eps);
    expect(r.observed).toBe(false);
    const g = gridConvergenceIndex([1.01, 1.04], [0.1, 0.2], { order: 2 });
    expect(g.safetyFactor).toBe(3);
    expect(g.convergence).toBe('assumed');
    expect(Math.abs(g.gciFine - (3 * (0.03 / 1.01)) / 3)).toBeLessThanOrEqual(1e-14);
  });
});

describe('flags and refusals', () => {
  it('oscillatory (s < 0) and divergent (|R| ≥ 1) convergence are flagged', () => {
    expect(gridConvergenceIndex([1, 1.1, 0.8], [1, 2, 4]).oscillatory).toBe(true);
    const d = gridConvergenceIndex([1, 1.3, 1.4], [1, 2, 4]);
    expect(d.divergent).toBe(true);
    expect(d.convergence).toBe('divergent');
  });
  it('oscillatory divergence (R < −1: the changes flip sign and grow) is flagged as both', () => {
    // ε21 = 0.5, ε32 = −0.2: R = ε21/ε32 = −2.5, |R| > 1
    const g = gridConvergenceIndex([1, 1.5, 1.3], [1, 2, 4]);
    expect(g.oscillatory).toBe(true);
    expect(g.divergent).toBe(true);
    expect(g.convergence).toBe('divergent');
    // ε21 = 0.1, ε32 = −0.3: R = −1/3, oscillatory convergence
    const c = gridConvergenceIndex([1, 1.1, 0.8], [1, 2, 4]);
    expect(c.oscillatory).toBe(true);
    expect(c.divergent).toBe(false);
    expect(c.convergence).toBe('oscillatory');
  });
  it('refuses equal values, two grids without an order, spacings out of order, too few values', () => {
    expect(codeOf(() => gridConvergenceIndex([1, 1, 2], [1, 2, 4]))).toBe('APPARENT_ORDER_NOT_FOUND');
    expect(codeOf(() => gridConvergenceIndex([1, 1.1], [1, 2]))).toBe('INVALID_OPTION');
    expect(codeOf(() => gridConvergenceIndex([1, 1.1, 1.2], [1, 1.05, 4]))).toBe('REFINEMENT_RATIO');
    expect(codeOf(() => gridConvergenceIndex([1, 1.1, 1.2], [4, 2, 1]))).toBe('REFINEMENT_RATIO');
    expect(codeOf(() => richardsonExtrapolation([1], [1], 2))).toBe('TOO_FEW_LEVELS');
  });
});
