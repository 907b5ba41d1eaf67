/**
 * Hyper-dual numbers: exact first and second derivatives by evaluating a
 * function once on numbers with two nilpotent parts.
 *
 * A hyper-dual number is a = a₀ + a₁ε₁ + a₂ε₂ + a₁₂ε₁ε₂ with ε₁² = ε₂² = 0,
 * ε₁ε₂ ≠ 0. For a smooth f,
 *
 *   f(a) = f(a₀) + a₁f′ε₁ + a₂f′ε₂ + (a₁₂f′ + a₁a₂f″)ε₁ε₂,  f′, f″ at a₀,
 *
 * so seeding x = x₀ + ε₁ + ε₂ gives f(x₀), f′(x₀) (in both ε parts) and
 * f″(x₀) (in the ε₁ε₂ part), each to round-off: there is no step size and
 * no subtractive cancellation, unlike a difference quotient.
 *
 * Source: Fike, J. A. & Alonso, J. J. (2011). The development of hyper-dual
 * numbers for exact second-derivative calculations. AIAA paper 2011-886,
 * 49th AIAA Aerospace Sciences Meeting.
 *
 * @module
 */
import { HyperDualDomainError } from '../errors.js';

/** A hyper-dual number or a plain number (promoted to a constant). */
export type HyperDualLike = HyperDual | number;

/**
 * An immutable hyper-dual number a₀ + a₁ε₁ + a₂ε₂ + a₁₂ε₁ε₂ (module formula).
 *
 * @example new HyperDual(2, 1, 1, 0).mul(new HyperDual(2, 1, 1, 0)).e12 // 2 (= d²(x²)/dx²)
 */
export class HyperDual {
  /**
   * @param re - real part a₀
   * @param e1 - ε₁ part a₁
   * @param e2 - ε₂ part a₂
   * @param e12 - ε₁ε₂ part a₁₂
   */
  constructor(readonly re: number, readonly e1 = 0, readonly e2 = 0, readonly e12 = 0) {}

  /**
   * A constant c (all nilpotent parts zero).
   *
   * @param c - the value
   * @returns c + 0ε₁ + 0ε₂ + 0ε₁ε₂
   * @example HyperDual.constant(3).e1 // 0
   */
  static constant(c: number): HyperDual {
    return new HyperDual(c);
  }

  /**
   * The variable x₀ seeded for d/dx and d²/dx²: x₀ + ε₁ + ε₂.
   *
   * @param x - the point x₀
   * @returns x₀ + ε₁ + ε₂
   * @example HyperDual.variable(3).sin().e12 // −sin 3
   */
  static variable(x: number): HyperDual {
    return new HyperDual(x, 1, 1, 0);
  }

  /**
   * Promotes a number to a constant; hyper-dual numbers pass through.
   *
   * @param a - number or hyper-dual
   * @returns the hyper-dual number
   * @example HyperDual.from(2).re // 2
   */
  static from(a: HyperDualLike): HyperDual {
    return typeof a === 'number' ? new HyperDual(a) : a;
  }

  /** f(a) from f(a₀), f′(a₀), f″(a₀) (module formula). */
  private chain(f0: number, f1: number, f2: number): HyperDual {
    return new HyperDual(f0, f1 * this.e1, f1 * this.e2, f1 * this.e12 + f2 * this.e1 * this.e2);
  }

  /**
   * a + b, part by part. Exact up to one rounding per part.
   *
   * @param b - the other term
   * @returns the sum
   * @example HyperDual.variable(1).add(2).re // 3
   */
  add(b: HyperDualLike): HyperDual {
    if (typeof b === 'number') return new HyperDual(this.re + b, this.e1, this.e2, this.e12);
    return new HyperDual(this.re + b.re, this.e1 + b.e1, this.e2 + b.e2, this.e12 + b.e12);
  }

  /**
   * a − b, part by part.
   *
   * @param b - the subtrahend
   * @returns the difference
   * @example HyperDual.variable(1).sub(2).re // −1
   */
  sub(b: HyperDualLike): HyperDual {
    if (typeof b === 'number') return new HyperDual(this.re - b, this.e1, this.e2, this.e12);
    return new HyperDual(this.re - b.re, this.e1 - b.e1, this.e2 - b.e2, this.e12 - b.e12);
  }

  /**
   * −a.
   *
   * @returns the negation
   * @example HyperDual.variable(1).neg().e1 // −1
   */
  neg(): HyperDual {
    return new HyperDual(-this.re, -this.e1, -this.e2, -this.e12);
  }

  /**
   * a·b = a₀b₀ + (a₀b₁ + a₁b₀)ε₁ + (a₀b₂ + a₂b₀)ε₂ + (a₀b₁₂ + a₁b₂ + a₂b₁ + a₁₂b₀)ε₁ε₂.
   *
   * @param b - the other factor
   * @returns the product
   * @example HyperDual.variable(3).mul(HyperDual.variable(3)).e1 // 6
   */
  mul(b: HyperDualLike): HyperDual {
    if (typeof b === 'number') return new HyperDual(this.re * b, this.e1 * b, this.e2 * b, this.e12 * b);
    return new HyperDual(
      this.re * b.re,
      this.re * b.e1 + this.e1 * b.re,
      this.re * b.e2 + this.e2 * b.re,
      this.re * b.e12 + this.e1 * b.e2 + this.e2 * b.e1 + this.e12 * b.re,
    );
  }

  /**
   * a / b = a · (1/b), with 1/b by the chain rule (f′ = −1/b₀², f″ = 2/b₀³).
   *
   * @param b - the divisor, real part ≠ 0
   * @returns the quotient
   * @throws HyperDualDomainError if b₀ = 0
   * @example HyperDual.constant(1).div(HyperDual.variable(2)).e12 // 0.25 (= 2/x³ at x = 2)
   */
  div(b: HyperDualLike): HyperDual {
    if (typeof b === 'number') {
      if (b === 0) throw new HyperDualDomainError('div', b);
      return this.mul(1 / b);
    }
    if (b.re === 0) throw new HyperDualDomainError('div', b.re);
    const inv = 1 / b.re;
    return this.mul(b.chain(inv, -inv * inv, 2 * inv * inv * inv));
  }

  /**
   * sin a (f′ = cos a₀, f″ = −sin a₀).
   *
   * @returns sin a
   * @example HyperDual.variable(0).sin().e1 // 1
   */
  sin(): HyperDual {
    const s = Math.sin(this.re);
    return this.chain(s, Math.cos(this.re), -s);
  }

  /**
   * cos a (f′ = −sin a₀, f″ = −cos a₀).
   *
   * @returns cos a
   * @example HyperDual.variable(0).cos().e12 // −1
   */
  cos(): HyperDual {
    const c = Math.cos(this.re);
    return this.chain(c, -Math.sin(this.re), -c);
  }

  /**
   * exp a (f′ = f″ = e^{a₀}).
   *
   * @returns e^a
   * @example HyperDual.variable(0).exp().e12 // 1
   */
  exp(): HyperDual {
    const e = Math.exp(this.re);
    return this.chain(e, e, e);
  }

  /**
   * Natural logarithm (f′ = 1/a₀, f″ = −1/a₀²), for a₀ > 0.
   *
   * @returns ln a
   * @throws HyperDualDomainError if a₀ ≤ 0
   * @example HyperDual.variable(2).log().e1 // 0.5
   */
  log(): HyperDual {
    if (!(this.re > 0)) throw new HyperDualDomainError('log', this.re);
    const inv = 1 / this.re;
    return this.chain(Math.log(this.re), inv, -inv * inv);
  }

  /**
   * Square root (f′ = 1/(2√a₀), f″ = −1/(4a₀^{3/2})), for a₀ > 0.
   *
   * @returns √a
   * @throws HyperDualDomainError if a₀ ≤ 0 (the derivative is infinite at 0)
   * @example HyperDual.variable(4).sqrt().e1 // 0.25
   */
  sqrt(): HyperDual {
    if (!(this.re > 0)) throw new HyperDualDomainError('sqrt', this.re);
    const s = Math.sqrt(this.re);
    return this.chain(s, 0.5 / s, -0.25 / (s * this.re));
  }

  /**
   * aᵇ. For a number b: f′ = b·a₀^{b−1}, f″ = b(b−1)·a₀^{b−2} (a₀ may be ≤ 0
   * when b is a whole number ≥ 2, or any b with a₀ > 0). For a hyper-dual b:
   * exp(b·ln a), which needs a₀ > 0.
   *
   * @param b - the exponent
   * @returns aᵇ
   * @throws HyperDualDomainError where the result or its derivatives are not finite
   * @example HyperDual.variable(3).pow(2).e12 // 2
   */
  pow(b: HyperDualLike): HyperDual {
    if (typeof b === 'number') {
      const a = this.re;
      if (Number.isInteger(b) && b >= 0) {
        if (b === 0) return new HyperDual(1);
        if (b === 1) return this;
        return this.chain(a ** b, b * a ** (b - 1), b * (b - 1) * a ** (b - 2));
      }
      if (!(a > 0)) throw new HyperDualDomainError('pow', a);
      return this.chain(a ** b, b * a ** (b - 1), b * (b - 1) * a ** (b - 2));
    }
    if (!(this.re > 0)) throw new HyperDualDomainError('pow', this.re);
    return b.mul(this.log()).exp();
  }

  /**
   * tanh a (f′ = 1 − tanh²a₀, f″ = −2 tanh a₀ (1 − tanh²a₀)).
   *
   * @returns tanh a
   * @example HyperDual.variable(0).tanh().e1 // 1
   */
  tanh(): HyperDual {
    const t = Math.tanh(this.re);
    const d = 1 - t * t;
    return this.chain(t, d, -2 * t * d);
  }
}
