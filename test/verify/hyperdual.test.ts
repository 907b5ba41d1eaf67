/**
 * Hyper-dual numbers (Fike & Alonso 2011, AIAA 2011-886): value, first and
 * second derivatives of each operation against closed-form derivatives.
 */
import { describe, expect, it } from 'vitest';
import { HyperDual, type HyperDualLike } from '../../src/verify/index.js';
import { codeOf } from '../support/errors.js';

const eps = Number.EPSILON;

/** [f, f′, f″] at x by one hyper-dual evaluation. */
function derivs(f: (x: HyperDual) => HyperDualLike, x: number): [number, number, number] {
  const v = HyperDual.from(f(HyperDual.variable(x)));
  expect(v.e1).toBe(v.e2); // both ε parts carry f′
  return [v.re, v.e1, v.e12];
}

/** |got − want| ≤ k·ε·scale per component; k = 16 covers the few roundings of each chain rule. */
function close(got: readonly number[], want: readonly number[], k = 16): void {
  for (let i = 0; i < want.length; i++) {
    expect(Math.abs(got[i]! - want[i]!)).toBeLessThanOrEqual(k * eps * Math.max(1, Math.abs(want[i]!)));
  }
}

describe('elementary functions: value, f′, f″ exact to round-off', () => {
  const x = 0.7;
  const cases: Array<[string, (h: HyperDual) => HyperDualLike, [number, number, number]]> = [
    ['add', (h) => h.add(2).add(h), [2 * x + 2, 2, 0]],
    ['sub', (h) => h.sub(3).sub(h.mul(2)), [-x - 3, -1, 0]],
    ['mul', (h) => h.mul(h).mul(h), [x ** 3, 3 * x * x, 6 * x]],
    ['div', (h) => HyperDual.constant(1).div(h), [1 / x, -1 / x ** 2, 2 / x ** 3]],
    ['div by number', (h) => h.mul(h).div(4), [x * x / 4, x / 2, 0.5]],
    ['sin', (h) => h.sin(), [Math.sin(x), Math.cos(x), -Math.sin(x)]],
    ['cos', (h) => h.cos(), [Math.cos(x), -Math.sin(x), -Math.cos(x)]],
    ['exp', (h) => h.mul(2).exp(), [Math.exp(2 * x), 2 * Math.exp(2 * x), 4 * Math.exp(2 * x)]],
    ['log', (h) => h.log(), [Math.log(x), 1 / x, -1 / x ** 2]],
    ['sqrt', (h) => h.sqrt(), [Math.sqrt(x), 0.5 / Math.sqrt(x), -0.25 * x ** -1.5]],
    ['pow number', (h) => h.pow(2.5), [x ** 2.5, 2.5 * x ** 1.5, 3.75 * x ** 0.5]],
    ['pow integer', (h) => h.neg().pow(3), [-(x ** 3), -3 * x * x, -6 * x]],
    ['pow hyper-dual', (h) => h.pow(h), [x ** x, x ** x * (Math.log(x) + 1), x ** x * ((Math.log(x) + 1) ** 2 + 1 / x)]],
    ['tanh', (h) => h.tanh(), [Math.tanh(x), 1 - Math.tanh(x) ** 2, -2 * Math.tanh(x) * (1 - Math.tanh(x) ** 2)]],
    ['composite sin(x²)·e^x', (h) => h.mul(h).sin().mul(h.exp()), [
      Math.sin(x * x) * Math.exp(x),
      (2 * x * Math.cos(x * x) + Math.sin(x * x)) * Math.exp(x),
      (2 * Math.cos(x * x) - 4 * x * x * Math.sin(x * x) + 4 * x * Math.cos(x * x) + Math.sin(x * x)) * Math.exp(x),
    ]],
  ];
  for (const [name, f, want] of cases) it(name, () => close(derivs(f, x), want));
  it('mixed partial ∂²(xy)/∂x∂y = 1 with ε₁ on x and ε₂ on y', () => {
    const v = new HyperDual(2, 1, 0, 0).mul(new HyperDual(3, 0, 1, 0));
    expect([v.re, v.e1, v.e2, v.e12]).toEqual([6, 3, 2, 1]);
  });
});

describe('domain errors', () => {
  it('log, sqrt, div and fractional pow outside their domain throw HYPERDUAL_DOMAIN', () => {
    expect(codeOf(() => HyperDual.variable(0).log())).toBe('HYPERDUAL_DOMAIN');
    expect(codeOf(() => HyperDual.variable(-1).sqrt())).toBe('HYPERDUAL_DOMAIN');
    expect(codeOf(() => HyperDual.variable(1).div(0))).toBe('HYPERDUAL_DOMAIN');
    expect(codeOf(() => HyperDual.variable(1).div(HyperDual.variable(0)))).toBe('HYPERDUAL_DOMAIN');
    expect(codeOf(() => HyperDual.variable(-2).pow(0.5))).toBe('HYPERDUAL_DOMAIN');
  });
});
