/**
 * quadrille/testing: assertions that throw plain Errors with the table.
 */
import { describe, expect, it } from 'vitest';
import { convergenceStudy } from '../../src/verify/index.js';
import { expectOrder } from '../../src/testing.js';
import { errorOf } from '../support/errors.js';

const s = convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2, l2: spacing! }), { refine: 'space', spacings: [0.1, 0.05, 0.025] });

describe('expectOrder', () => {
  it('returns quietly when the order is within tolerance', () => {
    expect(() => expectOrder(s, 2)).not.toThrow();
    expect(() => expectOrder(s, 1, { norm: 'l2' })).not.toThrow();
  });
  it('throws an Error whose message holds the numbers and the whole table', () => {
    const e = errorOf(() => expectOrder(s, 4, { tolerance: 0.1, norm: 'linf' }));
    expect(e).toBeInstanceOf(Error);
    expect(e.code).toBe('ORDER_NOT_REACHED');
    expect(e.message).toContain('observed order 2.000 in the linf norm differs from the expected 4 by more than 0.1');
    expect(e.message).toContain('| level | h | L2 error | L2 order | L∞ error | L∞ order |');
    expect(e.message).toContain('| L∞ | 2.000 |');
  });
  it('refuses a norm the study lacks', () => {
    const t = convergenceStudy(({ spacing }) => ({ linf: spacing! }), { refine: 'space', spacings: [0.4, 0.2, 0.1] });
    expect(errorOf(() => expectOrder(t, 1, { norm: 'l2' })).code).toBe('INVALID_OPTION');
  });
});
