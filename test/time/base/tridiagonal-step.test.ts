import { describe, expect, it } from 'vitest';
import { factorTridiagonal } from '../../../src/linalg/thomas.js';
import { fusedTridiagonalStep, planTwistedStep, twistedTridiagonalStep } from '../../../src/time/base/tridiagonal-step.js';
import { mulberry32 } from '../../support/prng.js';

const EPS = Number.EPSILON;

interface System {
  n: number;
  es: Float64Array; ed: Float64Array; eu: Float64Array;
  ks: Float64Array; kd: Float64Array; ku: Float64Array;
  b: Float64Array; u: Float64Array;
}

/** A random strictly diagonally dominant K (margin ≥ 1, so ‖K⁻¹‖∞ ≤ 1) and a random E, b, u. */
function randomSystem(n: number, seed: number, zeroB = false): System {
  const rnd = mulberry32(seed);
  const s = (): number => 2 * rnd() - 1;
  const sys: System = {
    n, es: new Float64Array(n), ed: new Float64Array(n), eu: new Float64Array(n),
    ks: new Float64Array(n), kd: new Float64Array(n), ku: new Float64Array(n), b: new Float64Array(n), u: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    sys.es[i] = s();
    sys.ed[i] = 4 * s();
    sys.eu[i] = s();
    sys.ks[i] = i > 0 ? 3 * s() : 0;
    sys.ku[i] = i < n - 1 ? 3 * s() : 0;
    sys.kd[i] = (rnd() < 0.5 ? -1 : 1) * (Math.abs(sys.ks[i]!) + Math.abs(sys.ku[i]!) + 1 + rnd());
    sys.b[i] = zeroB ? 0 : s();
    sys.u[i] = s();
  }
  return sys;
}

/** r = E·u + b, and the magnitudes |E|·|u| + |b| behind it (the round-off scale). */
function rhs(sys: System): { r: number[]; mag: number } {
  const { n, es, ed, eu, b, u } = sys;
  const r: number[] = [];
  let mag = 0;
  for (let i = 0; i < n; i++) {
    const l = i > 0 ? es[i]! * u[i - 1]! : 0;
    const h = i < n - 1 ? eu[i]! * u[i + 1]! : 0;
    r.push(l + ed[i]! * u[i]! + h + b[i]!);
    mag = Math.max(mag, Math.abs(l) + Math.abs(ed[i]! * u[i]!) + Math.abs(h) + Math.abs(b[i]!));
  }
  return { r, mag };
}

/** Dense Gaussian elimination with partial pivoting: the reference solve. */
function denseSolve(sys: System, r: number[]): number[] {
  const n = sys.n;
  const A = Array.from({ length: n }, (_, i) => {
    const row = new Array<number>(n + 1).fill(0);
    if (i > 0) row[i - 1] = sys.ks[i]!;
    row[i] = sys.kd[i]!;
    if (i < n - 1) row[i + 1] = sys.ku[i]!;
    row[n] = r[i]!;
    return row;
  });
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let i = c + 1; i < n; i++) if (Math.abs(A[i]![c]!) > Math.abs(A[p]![c]!)) p = i;
    [A[c], A[p]] = [A[p]!, A[c]!];
    for (let i = c + 1; i < n; i++) {
      const f = A[i]![c]! / A[c]![c]!;
      for (let q = c; q <= n; q++) A[i]![q]! -= f * A[c]![q]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let v = A[i]![n]!;
    for (let q = i + 1; q < n; q++) v -= A[i]![q]! * x[q]!;
    x[i] = v / A[i]![i]!;
  }
  return x;
}

function twisted(sys: System, bZero = false): { x: Float64Array; sum: number } {
  const p = planTwistedStep(sys.es, sys.ed, sys.eu, sys.ks, sys.kd, sys.ku);
  expect(p).toBeDefined();
  const x = Float64Array.from(sys.u);
  const sum = twistedTridiagonalStep(p!, sys.b, bZero, x);
  return { x, sum };
}

function plain(sys: System): Float64Array {
  const f = factorTridiagonal(sys.ks, sys.kd, sys.ku);
  const x = Float64Array.from(sys.u);
  fusedTridiagonalStep(sys.n, sys.es, sys.ed, sys.eu, sys.b, f.sub as Float64Array, f.inversePivots as Float64Array, f.ratios as Float64Array, x);
  return x;
}

function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i]! - b[i]!));
  return d;
}

// Round-off bound: r = E·u + b costs 3 adds (error ≤ 4ε·mag); with margin ≥ 1,
// ‖K⁻¹‖∞ ≤ 1 and the eliminations (growth ≤ 2 for diagonal dominance, about 6
// operations per row each way) add a few ε·mag more; k = 64 leaves room, and
// a wrong middle row or a wrong end row misses it by orders of magnitude.
const K_ROUND = 64;

describe('twistedTridiagonalStep', () => {
  it('matches a dense pivoted solve on random diagonally dominant systems, n = 1 … 40', () => {
    for (let n = 1; n <= 40; n++) {
      for (const zeroB of [false, true]) {
        const sys = randomSystem(n, 1000 + n, zeroB);
        const { r, mag } = rhs(sys);
        const want = denseSolve(sys, r);
        const { x } = twisted(sys, zeroB);
        expect(maxDiff(x, want), `n = ${n}, zero b ${zeroB}`).toBeLessThanOrEqual(K_ROUND * EPS * mag);
      }
    }
  });

  it('matches the plain Thomas step on large random systems (odd and even n)', () => {
    for (const n of [999, 1000, 4096, 4097]) {
      const sys = randomSystem(n, n);
      const { mag } = rhs(sys);
      const { x } = twisted(sys);
      // both sides carry the bound above
      expect(maxDiff(x, plain(sys))).toBeLessThanOrEqual(2 * K_ROUND * EPS * mag);
    }
  });

  it('handles a Crank–Nicolson Toeplitz interior with a variable layer and prescribed end rows', () => {
    // K = I/dt − ½A, E = I/dt + ½A on interior rows, A = κ·D2/h²; κ = 50 on a layer; rows 0, n−1 prescribed
    for (const n of [2, 3, 4, 5, 1001, 1002]) {
      const h = 1 / (n - 1);
      const dt = 1e-3;
      const sys: System = {
        n, es: new Float64Array(n), ed: new Float64Array(n), eu: new Float64Array(n),
        ks: new Float64Array(n), kd: new Float64Array(n), ku: new Float64Array(n), b: new Float64Array(n), u: new Float64Array(n),
      };
      const kappa = (i: number): number => (i > 0.3 * n && i < 0.45 * n ? 50 : 1);
      sys.kd[0] = 1;
      sys.kd[n - 1] = 1;
      sys.b[0] = 0.25;
      sys.b[n - 1] = -0.5;
      for (let i = 1; i < n - 1; i++) {
        const w = kappa(i) / (h * h);
        sys.es[i] = 0.5 * w;
        sys.eu[i] = 0.5 * w;
        sys.ed[i] = 1 / dt - w;
        sys.kd[i] = 1 / dt + w;
        sys.ks[i] = i > 1 ? -0.5 * w : 0;
        sys.ku[i] = i < n - 2 ? -0.5 * w : 0;
        // the eliminated prescribed neighbours, ½w·(value at tⁿ⁺¹), on the right-hand side
        sys.b[i] = (i === 1 ? 0.5 * w * sys.b[0]! : 0) + (i === n - 2 ? 0.5 * w * sys.b[n - 1]! : 0);
        sys.u[i] = Math.sin(Math.PI * i * h) + 0.1 * Math.cos(7 * i);
      }
      sys.u[0] = sys.b[0]!;
      sys.u[n - 1] = sys.b[n - 1]!;
      // garbage outside the matrix must be ignored
      sys.es[0] = 1e300;
      sys.eu[n - 1] = -1e300;
      sys.ks[0] = 1e300;
      sys.ku[n - 1] = 1e300;
      const { r, mag } = rhs({ ...sys, es: Float64Array.from(sys.es, (v, i) => (i === 0 ? 0 : v)), eu: Float64Array.from(sys.eu, (v, i) => (i === n - 1 ? 0 : v)) });
      const ref = { ...sys, ks: Float64Array.from(sys.ks, (v, i) => (i === 0 ? 0 : v)), ku: Float64Array.from(sys.ku, (v, i) => (i === n - 1 ? 0 : v)) };
      const { x } = twisted(sys);
      // K has margin 1/dt on the interior (‖K⁻¹‖∞ ≤ dt), and 1 on the end rows
      const scale = mag * Math.max(dt, 1);
      if (n <= 5) {
        expect(maxDiff(x, denseSolve(ref, r)), `n = ${n}`).toBeLessThanOrEqual(K_ROUND * EPS * scale);
      } else {
        const f = factorTridiagonal(ref.ks, ref.kd, ref.ku);
        const y = Float64Array.from(sys.u);
        const es0 = Float64Array.from(ref.es);
        es0[0] = 0;
        const eu0 = Float64Array.from(sys.eu);
        eu0[n - 1] = 0;
        fusedTridiagonalStep(n, es0, sys.ed, eu0, sys.b, f.sub as Float64Array, f.inversePivots as Float64Array, f.ratios as Float64Array, y);
        expect(maxDiff(x, y), `n = ${n}`).toBeLessThanOrEqual(2 * K_ROUND * EPS * scale);
      }
      // the prescribed end rows come out exactly
      expect(x[0]).toBe(sys.b[0]);
      expect(x[n - 1]).toBe(sys.b[n - 1]);
    }
  });

  it('gives the same bits with and without b when b is zero, and on a second run', () => {
    const sys = randomSystem(1001, 7, true);
    const a = twisted(sys, true).x;
    const b = twisted(sys, false).x;
    const c = twisted(sys, true).x;
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(Array.from(a)).toEqual(Array.from(c));
  });

  it('returns Σu, and a non-finite sum for NaN in', () => {
    const sys = randomSystem(501, 11);
    const { x, sum } = twisted(sys);
    let want = 0;
    let abs = 0;
    for (const v of x) {
      want += v;
      abs += Math.abs(v);
    }
    // two summation orders of 501 terms: ≤ 2·501·ε·Σ|x|
    expect(Math.abs(sum - want)).toBeLessThanOrEqual(2 * 501 * EPS * abs);
    sys.u[250] = Number.NaN;
    expect(Number.isFinite(twisted(sys).sum)).toBe(false);
  });

  it('n = 0 does nothing', () => {
    const p = planTwistedStep(new Float64Array(0), new Float64Array(0), new Float64Array(0), new Float64Array(0), new Float64Array(0), new Float64Array(0));
    expect(p).toBeDefined();
    expect(twistedTridiagonalStep(p!, new Float64Array(0), false, new Float64Array(0))).toBe(0);
  });

  it('refuses a plan when a pivot vanishes (the middle row of a singular K)', () => {
    const one = Float64Array.of(1, 1);
    const z = new Float64Array(2);
    // K = [[1, 1], [1, 1]]: δ₁ = 1, γ₀ = 1 − 1·1/1 = 0
    expect(planTwistedStep(z, z, z, one, one, one)).toBeUndefined();
    // and a vanishing top pivot: K = [[0, 1, 0], [1, 2, 1], [0, 1, 2]]
    expect(planTwistedStep(new Float64Array(3), new Float64Array(3), new Float64Array(3), Float64Array.of(0, 1, 1), Float64Array.of(0, 2, 2), Float64Array.of(1, 1, 0))).toBeUndefined();
  });
});
