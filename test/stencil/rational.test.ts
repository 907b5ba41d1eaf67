import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { QuadrilleError, Rational } from '../../src/index.js';

describe('Rational', () => {
  it('reads integers, decimals as printed, exponents and fractions exactly', () => {
    expect(Rational.from(0.1).toString()).toBe('1/10');
    expect(Rational.from(-2.5).toString()).toBe('-5/2');
    expect(Rational.from(1e-7).toString()).toBe('1/10000000');
    expect(Rational.from(1e21).toString()).toBe('1000000000000000000000');
    expect(Rational.from('1/3').toString()).toBe('1/3');
    expect(Rational.from(' -2 ').toString()).toBe('-2');
    expect(Rational.from('6/-4').toString()).toBe('-3/2');
    expect(Rational.from('0.25/1.5').toString()).toBe('1/6');
    expect(Rational.from('.5e1').toString()).toBe('5');
    expect(Rational.from(7n).toString()).toBe('7');
  });

  it('keeps the reduced form with a positive denominator', () => {
    const r = Rational.of(-12n, -18n);
    expect(r.num).toBe(2n);
    expect(r.den).toBe(3n);
    expect(Rational.of(0n, -5n).toString()).toBe('0');
  });

  it('does field arithmetic exactly', () => {
    const a = Rational.from('1/6');
    const b = Rational.from('-3/4');
    expect(a.add(b).toString()).toBe('-7/12');
    expect(a.sub(b).toString()).toBe('11/12');
    expect(a.mul(b).toString()).toBe('-1/8');
    expect(a.div(b).toString()).toBe('-2/9');
    expect(b.neg().compare(a)).toBe(1);
    expect(a.equals(Rational.from('2/12'))).toBe(true);
  });

  it('toNumber is correctly rounded, also beyond the float64 range of num and den', () => {
    // 1/3 and 2/3 round to the doubles nearest them (IEEE 754 division is correctly rounded).
    expect(Rational.from('1/3').toNumber()).toBe(1 / 3);
    const big = 10n ** 400n;
    expect(Rational.of(big + 1n, 3n * big).toNumber()).toBe(1 / 3);
    expect(Rational.of(-(2n ** 1100n), 2n ** 1099n).toNumber()).toBe(-2);
    // Property: for num, den below 2⁵³ the value equals the single IEEE division.
    fc.assert(
      fc.property(fc.bigInt({ min: -(2n ** 80n), max: 2n ** 80n }), fc.bigInt({ min: 1n, max: 2n ** 80n }), (n, d) => {
        const r = Rational.of(n, d);
        // reference: exact comparison of the candidate with its neighbours, via bigint scaling
        const x = r.toNumber();
        if (r.num === 0n) return expect(x).toBe(0);
        const up = nextUp(Math.abs(x));
        const dn = nextDown(Math.abs(x));
        const a = r.num < 0n ? -r.num : r.num;
        // |x − v| ≤ |neighbour − v| for both neighbours
        expect(distLe(x, dn, a, r.den) && distLe(x, up, a, r.den)).toBe(true);
      }),
      { seed: 7, numRuns: 300 },
    );
  });

  it('rejects what cannot be read, with a stable code', () => {
    for (const bad of ['abc', '1/0', '', '1//2', '0x10', 'NaN']) {
      expect(() => Rational.from(bad)).toThrow(QuadrilleError);
    }
    expect(() => Rational.from(NaN)).toThrow(/finite/);
    try {
      Rational.from('1/0');
    } catch (e) {
      expect((e as QuadrilleError).code).toBe('INVALID_RATIONAL');
    }
    expect(() => Rational.from('1/3').div(Rational.ZERO)).toThrow(QuadrilleError);
  });
});

/** Exact rational of a finite double: m·2^e. */
function exactOf(x: number): [bigint, bigint] {
  const buf = new DataView(new ArrayBuffer(8));
  buf.setFloat64(0, x);
  const bits = buf.getBigUint64(0);
  const exp = Number((bits >> 52n) & 0x7ffn);
  let mant = bits & ((1n << 52n) - 1n);
  let e = exp - 1075;
  if (exp === 0) e = -1074;
  else mant |= 1n << 52n;
  return e >= 0 ? [mant << BigInt(e), 1n] : [mant, 1n << BigInt(-e)];
}
function nextUp(x: number): number {
  const b = new DataView(new ArrayBuffer(8));
  b.setFloat64(0, x);
  b.setBigUint64(0, b.getBigUint64(0) + 1n);
  return b.getFloat64(0);
}
function nextDown(x: number): number {
  const b = new DataView(new ArrayBuffer(8));
  b.setFloat64(0, x);
  b.setBigUint64(0, b.getBigUint64(0) - 1n);
  return b.getFloat64(0);
}
/** |x − a/d| ≤ |y − a/d|, exactly. */
function distLe(x: number, y: number, a: bigint, d: bigint): boolean {
  const [xn, xd] = exactOf(Math.abs(x));
  const [yn, yd] = exactOf(y);
  const abs = (v: bigint) => (v < 0n ? -v : v);
  const dx = abs(xn * d - a * xd) * yd;
  const dy = abs(yn * d - a * yd) * xd;
  return dx <= dy;
}
