/**
 * Published stencil weights, checked three ways: against the library's exact
 * recursion and named builders, and against an exact solve of the Taylor
 * conditions written here from scratch (own BigInt fractions, own Gaussian
 * elimination, nothing imported from src/), which is the arbiter for typos
 * in the JSON tables.
 *
 * Reference: Fornberg, B. (1988). Generation of finite difference formulas on
 * arbitrarily spaced grids. Math. Comp. 51(184), 699–706, Tables 1 and 3
 * (typed from memory; see the `note` field of each JSON file).
 */
import { describe, expect, it } from 'vitest';
import {
  backwardStencil, centralStencil, exactWeights, fornbergWeights, forwardStencil, type Stencil,
} from '../../src/index.js';
import table1 from '../reference/fornberg-1988-table1.json';
import table3 from '../reference/fornberg-1988-table3.json';

interface Entry {
  derivative: number;
  accuracy: number;
  offsets: number[];
  weights: string[];
}

interface Table {
  source: string;
  note: string;
  entries: Entry[];
}

const TABLE1 = table1 as Table;
const TABLE3 = table3 as Table;

// ---------------------------------------------------------------------------
// Independent exact arithmetic: a fraction is [num, den], den > 0, reduced.
// Deliberately not the library's Rational, so a shared bug cannot hide.
// ---------------------------------------------------------------------------

type Frac = readonly [bigint, bigint];

function gcd(a: bigint, b: bigint): bigint {
  a = a < 0n ? -a : a;
  b = b < 0n ? -b : b;
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}

function frac(num: bigint, den = 1n): Frac {
  if (den === 0n) throw new Error(`zero denominator in ${num}/0`);
  if (den < 0n) [num, den] = [-num, -den];
  const g = gcd(num, den);
  return g > 1n ? [num / g, den / g] : [num, den];
}

const ZERO: Frac = [0n, 1n];
const add = (a: Frac, b: Frac): Frac => frac(a[0] * b[1] + b[0] * a[1], a[1] * b[1]);
const sub = (a: Frac, b: Frac): Frac => frac(a[0] * b[1] - b[0] * a[1], a[1] * b[1]);
const mul = (a: Frac, b: Frac): Frac => frac(a[0] * b[0], a[1] * b[1]);
const div = (a: Frac, b: Frac): Frac => frac(a[0] * b[1], a[1] * b[0]);
const neg = (a: Frac): Frac => [-a[0], a[1]];
const isZero = (a: Frac): boolean => a[0] === 0n;
/** Same text form the library promises: "-1/12", "2", "0". */
const show = (a: Frac): string => (a[1] === 1n ? `${a[0]}` : `${a[0]}/${a[1]}`);

/** Reads "p/q" or "p" (integers only, as the tables hold). */
function parse(text: string): Frac {
  const m = /^(-?\d+)(?:\/(\d+))?$/.exec(text);
  if (m === null) throw new Error(`not a fraction: ${text}`);
  return frac(BigInt(m[1]!), BigInt(m[2] ?? '1'));
}

function factorial(k: number): bigint {
  let f = 1n;
  for (let i = 2; i <= k; i++) f *= BigInt(i);
  return f;
}

/** oᵏ for an integer offset o, exactly. */
const ipow = (o: number, k: number): Frac => frac(BigInt(o) ** BigInt(k));

/**
 * Solves Σⱼ wⱼ oⱼᵏ / k! = δₖₘ, k = 0 … N − 1, by exact Gaussian elimination
 * (pivot: first non-zero entry in the column; exact arithmetic needs no more).
 */
function solveTaylor(m: number, offsets: readonly number[]): Frac[] {
  const n = offsets.length;
  const a: Frac[][] = [];
  for (let k = 0; k < n; k++) {
    const row: Frac[] = [];
    for (let j = 0; j < n; j++) row.push(div(ipow(offsets[j]!, k), frac(factorial(k))));
    row.push(k === m ? frac(1n) : ZERO); // augmented right-hand side δₖₘ
    a.push(row);
  }
  for (let col = 0; col < n; col++) {
    let piv = col;
    while (piv < n && isZero(a[piv]![col]!)) piv++;
    if (piv === n) throw new Error(`singular Taylor system for offsets ${offsets.join(', ')}`);
    [a[col], a[piv]] = [a[piv]!, a[col]!];
    const p = a[col]!;
    for (let r = col + 1; r < n; r++) {
      const f = div(a[r]![col]!, p[col]!);
      if (isZero(f)) continue;
      for (let c = col; c <= n; c++) a[r]![c] = sub(a[r]![c]!, mul(f, p[c]!));
    }
  }
  const w: Frac[] = new Array<Frac>(n).fill(ZERO);
  for (let r = n - 1; r >= 0; r--) {
    let s = a[r]![n]!;
    for (let c = r + 1; c < n; c++) s = sub(s, mul(a[r]![c]!, w[c]!));
    w[r] = div(s, a[r]![r]!);
  }
  return w;
}

/** Mₖ = Σⱼ wⱼ oⱼᵏ. */
function moment(w: readonly Frac[], offsets: readonly number[], k: number): Frac {
  let s = ZERO;
  for (let j = 0; j < w.length; j++) s = add(s, mul(w[j]!, ipow(offsets[j]!, k)));
  return s;
}

/**
 * Accuracy and leading error from the moments, independently of the library:
 * Mₖ/k! must be δₖₘ for k < m + p and non-zero at k = m + p, and then
 * C = Mₘ₊ₚ / (m + p)! (approximation − exact = C hᵖ u⁽ᵐ⁺ᵖ⁾ + …).
 */
function leadingError(m: number, p: number, w: readonly Frac[], offsets: readonly number[]): Frac {
  for (let k = 0; k < m + p; k++) {
    const want = k === m ? frac(factorial(m)) : ZERO;
    expect(show(moment(w, offsets, k)), `moment ${k}`).toBe(show(want));
  }
  const c = div(moment(w, offsets, m + p), frac(factorial(m + p)));
  expect(isZero(c), `moment ${m + p} must not vanish for accuracy exactly ${p}`).toBe(false);
  return c;
}

/** The backward image of a forward entry: offsets −oⱼ, weights reversed times (−1)ᵐ. */
function mirror(e: Entry): Entry {
  const sign = e.derivative % 2 === 0 ? 1n : -1n;
  return {
    derivative: e.derivative,
    accuracy: e.accuracy,
    offsets: e.offsets.map((o) => (o === 0 ? 0 : -o)).reverse(),
    weights: e.weights.map((s) => { const f = parse(s); return show(frac(sign * f[0], f[1])); }).reverse(),
  };
}

/**
 * float64 round-off of the recursion: each weight passes through at most
 * N − 1 updates of ≤ 4 roundings each (two products, a difference, a
 * quotient), and an allowance of 2 for cancellation against intermediate
 * values larger than the result gives k = 8N. Measured worst case over both
 * tables: 4.9 ε·max|w| (derivative 3, accuracy 6, N = 9).
 */
function expectFloatWeights(got: Float64Array, want: readonly Frac[]): void {
  const wantNum = want.map((f) => Number(f[0]) / Number(f[1]));
  const scale = Math.max(...wantNum.map(Math.abs));
  const tol = 8 * want.length * Number.EPSILON * scale;
  for (let j = 0; j < want.length; j++) {
    expect(Math.abs(got[j]! - wantNum[j]!), `weight ${j}`).toBeLessThanOrEqual(tol);
  }
}

/** Everything a named builder must reproduce for one table entry. */
function expectStencilMatches(st: Stencil, e: Entry, want: readonly Frac[]): void {
  expect(st.derivative).toBe(e.derivative);
  expect(st.offsets).toEqual(e.offsets);
  expect(st.exact.map(String)).toEqual(e.weights);
  expect(st.accuracy).toBe(e.accuracy);
  // Numerators and denominators here are < 2⁵³, so one IEEE division is the
  // correctly rounded value the library promises in `weights`.
  expect(Array.from(st.weights)).toEqual(want.map((f) => Number(f[0]) / Number(f[1])));
  const c = leadingError(e.derivative, e.accuracy, want, e.offsets);
  expect(st.leadingError.toString()).toBe(show(c));
}

function label(e: Entry): string {
  return `derivative ${e.derivative}, accuracy ${e.accuracy}, offsets ${e.offsets[0]}…${e.offsets[e.offsets.length - 1]}`;
}

/** Common checks of one entry: canonical text, independent solve, exactWeights, fornbergWeights. */
function expectEntry(e: Entry): Frac[] {
  expect(e.offsets.length).toBe(e.weights.length);
  const want = e.weights.map(parse);
  // Canonical text (reduced, positive denominator) makes toString() comparison fair.
  expect(want.map(show)).toEqual(e.weights);
  // (b) the independent exact solve, the arbiter for typos
  expect(solveTaylor(e.derivative, e.offsets).map(show)).toEqual(e.weights);
  // (a) the library's exact recursion
  expect(exactWeights(e.derivative, e.offsets).map(String)).toEqual(e.weights);
  expectFloatWeights(fornbergWeights(e.derivative, e.offsets), want);
  return want;
}

describe('Fornberg (1988), Math. Comp. 51(184), 699–706, Table 1: centred weights', () => {
  it('cites its source', () => {
    expect(TABLE1.source).toMatch(/Fornberg.*1988.*Math\. Comp\. 51\(184\), 699–706.*Table 1/);
    expect(TABLE1.note).toMatch(/memory/);
    expect(TABLE1.entries.length).toBe(14);
  });

  for (const e of TABLE1.entries) {
    it(label(e), () => {
      const want = expectEntry(e);
      const k = Math.floor((e.derivative + 1) / 2) - 1 + e.accuracy / 2;
      expect(e.offsets).toEqual(Array.from({ length: 2 * k + 1 }, (_, i) => i - k));
      expectStencilMatches(centralStencil(e.derivative, e.accuracy), e, want);
    });
  }
});

describe('Fornberg (1988), Math. Comp. 51(184), 699–706, Table 3: one-sided weights', () => {
  it('cites its source', () => {
    expect(TABLE3.source).toMatch(/Fornberg.*1988.*Math\. Comp\. 51\(184\), 699–706.*Table 3/);
    expect(TABLE3.note).toMatch(/memory/);
    expect(TABLE3.entries.length).toBe(12);
  });

  for (const e of TABLE3.entries) {
    it(`forward, ${label(e)}`, () => {
      const want = expectEntry(e);
      expect(e.offsets).toEqual(Array.from({ length: e.derivative + e.accuracy }, (_, i) => i));
      expectStencilMatches(forwardStencil(e.derivative, e.accuracy), e, want);
    });

    const b = mirror(e);
    it(`backward (mirrored Table 3 entry), ${label(b)}`, () => {
      const want = expectEntry(b);
      expectStencilMatches(backwardStencil(b.derivative, b.accuracy), b, want);
      // Mirrored moments are M'ₖ = (−1)ᵐ⁺ᵏ Mₖ; at k = m + p that is (−1)ᵖ, so the
      // leading error flips sign exactly when p is odd.
      const f = leadingError(e.derivative, e.accuracy, e.weights.map(parse), e.offsets);
      const s = e.accuracy % 2 === 0 ? f : neg(f);
      expect(backwardStencil(b.derivative, b.accuracy).leadingError.toString()).toBe(show(s));
    });
  }
});

describe('leading error constants: textbook values of common practice, spot-checked', () => {
  // These three constants are standard facts of finite-difference practice
  // (Taylor expansion of the named formula), not taken from the 1988 tables.
  const cases: [string, () => Stencil, Entry, string][] = [
    ['central 2nd derivative, accuracy 2: (u₋₁ − 2u₀ + u₁)/h² has error h²u⁗/12',
      () => centralStencil(2, 2), TABLE1.entries.find((e) => e.derivative === 2 && e.accuracy === 2)!, '1/12'],
    ['central 1st derivative, accuracy 2: (u₁ − u₋₁)/2h has error h²u‴/6',
      () => centralStencil(1, 2), TABLE1.entries.find((e) => e.derivative === 1 && e.accuracy === 2)!, '1/6'],
    ['forward 1st derivative, accuracy 1: (u₁ − u₀)/h has error h u″/2',
      () => forwardStencil(1, 1), TABLE3.entries.find((e) => e.derivative === 1 && e.accuracy === 1)!, '1/2'],
  ];
  for (const [name, build, e, c] of cases) {
    it(name, () => {
      expect(show(leadingError(e.derivative, e.accuracy, e.weights.map(parse), e.offsets))).toBe(c);
      expect(build().leadingError.toString()).toBe(c);
    });
  }
});

describe('the independent solver itself', () => {
  it('reproduces the three-point second difference and rejects a singular system', () => {
    expect(solveTaylor(2, [-1, 0, 1]).map(show)).toEqual(['1', '-2', '1']);
    expect(() => solveTaylor(1, [0, 0])).toThrow(/singular/);
  });
});
