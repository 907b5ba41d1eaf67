import { describe, expect, it } from 'vitest';
import {
  QuadrilleError, backwardStencil, centralStencil, exactWeights, fornbergWeights, forwardStencil, stencil,
} from '../../src/index.js';

function caught(f: () => unknown): QuadrilleError {
  try {
    f();
  } catch (e) {
    if (e instanceof QuadrilleError) return e;
    throw e;
  }
  throw new Error('expected a QuadrilleError');
}

describe('bad input to the stencil engine', () => {
  it('negative, fractional or NaN derivative', () => {
    for (const m of [-1, 1.5, NaN]) {
      expect(caught(() => fornbergWeights(m, [0, 1, 2])).code).toBe('INVALID_DERIVATIVE');
      expect(caught(() => exactWeights(m, [0, 1, 2])).code).toBe('INVALID_DERIVATIVE');
      expect(caught(() => centralStencil(m, 2)).code).toBe('INVALID_DERIVATIVE');
    }
  });
  it('derivative 0 is refused by the named builders, which point to stencil(0, offsets)', () => {
    for (const f of [centralStencil, forwardStencil, backwardStencil]) {
      const e = caught(() => f(0, 2));
      expect(e.code).toBe('INVALID_DERIVATIVE');
      expect(e.message).toMatch(/stencil\(0, offsets\)/);
    }
    // interpolation to a point off the nodes is a legitimate derivative-0 stencil
    expect(stencil(0, [-1, 1]).exact.map(String)).toEqual(['1/2', '1/2']);
    expect(stencil(0, [-1, 1]).accuracy).toBe(2);
  });
  it('accuracy not a positive whole number, or odd for a centred stencil (message offers the fix)', () => {
    expect(caught(() => forwardStencil(1, 0)).code).toBe('INVALID_ACCURACY');
    expect(caught(() => backwardStencil(1, 2.5)).code).toBe('INVALID_ACCURACY');
    const e = caught(() => centralStencil(2, 3));
    expect(e.code).toBe('INVALID_ACCURACY');
    expect(e.message).toMatch(/2 or 4/);
  });
  it('too few nodes for the derivative', () => {
    const e = caught(() => fornbergWeights(2, [0, 1]));
    expect(e.code).toBe('TOO_FEW_NODES');
    expect(e.message).toMatch(/at least 3/);
    expect(caught(() => exactWeights(1, [0])).code).toBe('TOO_FEW_NODES');
    expect(caught(() => stencil(3, [0, 1, 2])).code).toBe('INVALID_OFFSETS');
  });
  it('duplicate or non-finite nodes, non-finite at', () => {
    const e = caught(() => fornbergWeights(1, [0, 1, 0.5, 1]));
    expect(e.code).toBe('DUPLICATE_NODES');
    expect(e.message).toMatch(/nodes\[1\] and nodes\[3\]/);
    expect(caught(() => exactWeights(1, ['1/2', 0.5, 2])).code).toBe('DUPLICATE_NODES');
    expect(caught(() => fornbergWeights(1, [0, NaN, 2])).code).toBe('NON_FINITE');
    expect(caught(() => fornbergWeights(1, [0, 1, 2], Infinity)).code).toBe('NON_FINITE');
    expect(caught(() => stencil(1, [0, 1, 1])).code).toBe('DUPLICATE_NODES');
    expect(caught(() => stencil(1, [0, 0.5, 1])).code).toBe('INVALID_OFFSETS');
  });
  it('weights that overflow float64 are refused, not returned as Infinity', () => {
    // 40 nodes 1e-20 apart: 8th-derivative weights scale like (1e-20)⁻⁸ = 1e160 times the
    // unit-spacing ones (~1e200 on 40 nodes), beyond float64's 1.8e308
    const nodes = Array.from({ length: 40 }, (_, i) => i * 1e-20);
    expect(caught(() => fornbergWeights(8, nodes)).code).toBe('WEIGHT_OVERFLOW');
  });
  it('every error is an Error with its class name', () => {
    const e = caught(() => centralStencil(-1, 2));
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('InvalidDerivativeError');
  });
});
