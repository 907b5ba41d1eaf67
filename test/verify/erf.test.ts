/**
 * erf, erfc, erfcx (Cody 1969) against published values and against two
 * independent evaluations: an exact Taylor series over BigInt rationals
 * (small x) and a continued fraction (large x).
 */
import { describe, expect, it } from 'vitest';
import { erf, erfc, erfcx } from '../../src/verify/index.js';
import table from '../reference/abramowitz-stegun-1964-table7.1.json';

const eps = Number.EPSILON;
const TWO_OVER_SQRT_PI = 1.1283791670955126; // correctly rounded 2/√π
const INV_SQRT_PI = 0.5641895835477563; // correctly rounded 1/√π

/** Σ (−1)ⁿ x^{2n+1}/(n!(2n+1)) for x = a/b, exactly over BigInt, rounded to float64 once. */
function taylorSum(a: bigint, b: bigint): number {
  // term t_n = x^{2n+1}/n! kept as tn/td; the sum as sn/sd
  let tn = a;
  let td = b;
  let sn = 0n;
  let sd = 1n;
  for (let n = 0n; n < 200n; n++) {
    const num = (n % 2n === 0n ? 1n : -1n) * tn;
    const den = td * (2n * n + 1n);
    sn = sn * den + num * sd;
    sd = sd * den;
    // stop when the next term is below 2^-120 of the sum
    if (tn * (1n << 120n) < td) break;
    tn = tn * a * a;
    td = td * b * b * (n + 1n);
  }
  // float64 of sn/sd: scale by 2^100, integer-divide, convert (the quotient has > 100 bits, so one rounding)
  return Number((sn << 100n) / sd) / 2 ** 100;
}

/** erfc(x)·e^{x²}·√π by the continued fraction 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + …)))), evaluated backwards. */
function continuedFraction(x: number, depth = 400): number {
  let t = x;
  for (let k = depth; k >= 1; k--) t = x + k / 2 / t;
  return 1 / t;
}

describe('erf against Abramowitz & Stegun (1964), Table 7.1 (typed from memory, 10 decimals)', () => {
  for (const e of table.entries) {
    it(`erf(${e.x}) = ${e.erf}`, () => {
      // the table rounds to 10 decimals: half a unit of the last digit
      expect(Math.abs(erf(e.x) - e.erf)).toBeLessThanOrEqual(0.5e-10 + 4 * eps);
    });
  }
});

describe('erf against an exact rational Taylor series, x = k/16, k = 1 … 48', () => {
  it('agrees to 3 ulps (one rounding of the sum, one of 2/√π, one of the product, plus Cody\'s < 1 ulp)', () => {
    let worst = 0;
    for (let k = 1; k <= 48; k++) {
      const want = TWO_OVER_SQRT_PI * taylorSum(BigInt(k), 16n);
      const x = k / 16;
      const rel = Math.abs(erf(x) - want) / want;
      worst = Math.max(worst, rel);
      expect(rel).toBeLessThanOrEqual(3 * eps);
      // erf(−x) = −erf(x) exactly
      expect(erf(-x)).toBe(-erf(x));
    }
    expect(worst).toBeGreaterThan(0); // the check did compare something non-trivial
  });
  it('erfc = 1 − erf for small x, where no cancellation occurs (|x| ≤ 0.5)', () => {
    for (let k = -8; k <= 8; k++) {
      const x = k / 16;
      const want = 1 - TWO_OVER_SQRT_PI * (k === 0 ? 0 : Math.sign(k) * taylorSum(BigInt(Math.abs(k)), 16n));
      // erfc ≥ 0.47 here, so 1 − erf loses at most a factor 2 of relative accuracy
      expect(Math.abs(erfc(x) - want)).toBeLessThanOrEqual(4 * eps * want);
    }
  });
});

describe('erfcx and erfc against the continued fraction, x = 2 … 26.5', () => {
  it('erfcx to 6 ulps (the fraction has ~400 roundings that damp out; Cody < 1 ulp)', () => {
    for (let x = 2; x <= 26.5; x += 0.25) {
      const want = INV_SQRT_PI * continuedFraction(x);
      expect(Math.abs(erfcx(x) - want)).toBeLessThanOrEqual(6 * eps * want);
    }
  });
  it('erfc keeps full relative accuracy in the tail (tolerance adds the x²·ε error of e^{−x²} in the reference)', () => {
    for (let x = 2; x <= 26.5; x += 0.5) {
      const want = INV_SQRT_PI * continuedFraction(x) * Math.exp(-x * x);
      expect(Math.abs(erfc(x) - want)).toBeLessThanOrEqual((8 + 2 * x * x) * eps * want);
    }
  });
  it('erfcx for large x approaches 1/(x√π)(1 − 1/(2x²)), and for negative x is 2e^{x²} − erfcx(−x)', () => {
    const x = 1e4;
    expect(Math.abs(erfcx(x) - (INV_SQRT_PI / x) * (1 - 1 / (2 * x * x)))).toBeLessThanOrEqual(4 * eps * erfcx(x));
    expect(Math.abs(erfcx(-1) - (2 * Math.E - erfcx(1)))).toBeLessThanOrEqual(8 * eps * erfcx(-1));
  });
});

describe('edge values', () => {
  it('limits and NaN', () => {
    expect(erf(0)).toBe(0);
    expect(erf(Infinity)).toBe(1);
    expect(erf(-Infinity)).toBe(-1);
    expect(erfc(Infinity)).toBe(0);
    expect(erfc(-Infinity)).toBe(2);
    expect(erfc(30)).toBe(0);
    expect(Number.isNaN(erf(NaN))).toBe(true);
    expect(Number.isNaN(erfc(NaN))).toBe(true);
    expect(Number.isNaN(erfcx(NaN))).toBe(true);
    // the three ranges meet without a visible step: across a seam erfc changes by its
    // slope (2/√π)e^{−s²} times the 2sε step, plus at most 6 ulps of approximation error
    for (const s of [0.46875, 4]) {
      const slope = TWO_OVER_SQRT_PI * Math.exp(-s * s);
      expect(Math.abs(erfc(s * (1 + eps)) - erfc(s * (1 - eps)))).toBeLessThanOrEqual(slope * 2 * s * eps + 6 * eps * erfc(s));
    }
  });
});
