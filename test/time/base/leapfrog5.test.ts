import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../support/prng.js';
import { leapfrog5 } from '../../../src/time/base/leapfrog5.js';

const EPS = Number.EPSILON;

/**
 * Sizes (nodes, boundary included) that reach every branch of the kernel:
 * odd and even interior row counts (the odd row goes first), odd and even
 * interior column counts (the odd column of each row pair goes first), a
 * single interior row or column, and a few full row pairs.
 */
const SIZES: readonly (readonly [number, number])[] = [
  [3, 3], [3, 4], [4, 3], [4, 7], [5, 5], [6, 9], [7, 4], [8, 8], [9, 13], [3, 10], [12, 17],
];

interface Coefficients {
  readonly name: string;
  readonly cx: number;
  readonly cy: number;
  readonly dt2: number;
  readonly cm: number;
  readonly inv: number;
  readonly f: number;
}

/** γdt = 0.2 gives cm = 0.9, inv = 1/1.1; dx ≠ dy so that cx ≠ cy. */
const CASES: readonly Coefficients[] = [
  { name: 'no damping, no source', cx: 3.1, cy: 1.7, dt2: 0.04, cm: 1, inv: 1, f: 0 },
  { name: 'damping', cx: 3.1, cy: 1.7, dt2: 0.04, cm: 0.9, inv: 1 / 1.1, f: 0 },
  { name: 'source', cx: 3.1, cy: 1.7, dt2: 0.04, cm: 1, inv: 1, f: 0.7 },
  { name: 'damping and source', cx: 2.3, cy: 5.9, dt2: 0.02, cm: 0.9, inv: 1 / 1.1, f: -1.3 },
];

function random(n: number, seed: number): Float64Array {
  const r = mulberry32(seed);
  const a = new Float64Array(n);
  for (let k = 0; k < n; k++) a[k] = 2 * r() - 1;
  return a;
}

/**
 * The documented formula, literally and node by node, into a copy of `old`:
 * (2u − cm·old + dt²·(cx(u[k−sx] + u[k+sx]) + cy(u[k−1] + u[k+1]) + c0·u + f))·inv.
 * Also returns, per node, the sum of the magnitudes of its terms (the scale
 * of its round-off).
 */
function reference(nx: number, ny: number, p: Coefficients, u: Float64Array, old: Float64Array): { next: Float64Array; scale: Float64Array } {
  const { cx, cy, dt2, cm, inv, f } = p;
  const c0 = -2 * (cx + cy);
  const next = Float64Array.from(old);
  const scale = new Float64Array(old.length);
  for (let i = 1; i < nx - 1; i++) {
    for (let j = 1; j < ny - 1; j++) {
      const k = i * ny + j;
      const lap = cx * (u[k - ny]! + u[k + ny]!) + cy * (u[k - 1]! + u[k + 1]!) + c0 * u[k]!;
      next[k] = (2 * u[k]! - cm * old[k]! + dt2 * (lap + f)) * inv;
      scale[k] = inv * (2 * Math.abs(u[k]!) + Math.abs(cm * old[k]!) +
        dt2 * (Math.abs(cx) * (Math.abs(u[k - ny]!) + Math.abs(u[k + ny]!)) + Math.abs(cy) * (Math.abs(u[k - 1]!) + Math.abs(u[k + 1]!)) +
          Math.abs(c0 * u[k]!) + Math.abs(f)));
    }
  }
  return { next, scale };
}

function interior(nx: number, ny: number): number[] {
  const ks: number[] = [];
  for (let i = 1; i < nx - 1; i++) for (let j = 1; j < ny - 1; j++) ks.push(i * ny + j);
  return ks;
}

describe('leapfrog5', () => {
  for (const p of CASES) {
    it(`agrees with the documented formula to round-off (${p.name})`, () => {
      const c0 = -2 * (p.cx + p.cy);
      let seed = 11;
      for (const [nx, ny] of SIZES) {
        const u = random(nx * ny, seed++);
        const old = random(nx * ny, seed++);
        const u0 = Float64Array.from(u);
        const { next, scale } = reference(nx, ny, p, u, old);
        const got = Float64Array.from(old);
        const sum = leapfrog5(nx, ny, p.cx, p.cy, c0, p.dt2, p.cm, p.inv, p.f, u, got);
        const inside = new Set(interior(nx, ny));
        let want = 0;
        let size = 0;
        for (let k = 0; k < nx * ny; k++) {
          if (!inside.has(k)) {
            // boundary nodes are not touched
            expect(got[k]).toBe(old[k]);
            continue;
          }
          // Each side has at most 12 roundings on the path of any term (the
          // kernel's count includes folding its coefficients from dt², cx, cy,
          // c0, cm, inv, f), so the two differ by ≤ 24ε·scale to first order;
          // k = 32 leaves a margin of 4/3 (observed: under 2 on random data).
          expect(Math.abs(got[k]! - next[k]!)).toBeLessThanOrEqual(32 * EPS * scale[k]!);
          want += got[k]!;
          size += Math.abs(got[k]!);
        }
        // u is read only
        expect(u).toEqual(u0);
        // the sum of the new interior values, in any association: (m − 1)ε·Σ|v|
        expect(Math.abs(sum - want)).toBeLessThanOrEqual(inside.size * EPS * size);
      }
    });
  }

  it('does not depend on the blocking: a node gets the same value whichever row pair or column it falls in', () => {
    // The same 5 × 5 data, embedded at every position of a 12 × 17 grid whose
    // other nodes are random: the interior node's new value depends only on
    // its own 5-point neighbourhood, so it must come out bit for bit the same.
    const p = CASES[3]!;
    const c0 = -2 * (p.cx + p.cy);
    const [nx, ny] = [12, 17];
    const patchU = random(5, 101);
    const patchOld = random(1, 102)[0]!;
    let first: number | undefined;
    for (let i = 1; i < nx - 1; i++) {
      for (let j = 1; j < ny - 1; j++) {
        const u = random(nx * ny, 200 + i * ny + j);
        const old = random(nx * ny, 900 + i * ny + j);
        const k = i * ny + j;
        [u[k - ny], u[k + ny], u[k - 1], u[k + 1], u[k]] = patchU;
        old[k] = patchOld;
        leapfrog5(nx, ny, p.cx, p.cy, c0, p.dt2, p.cm, p.inv, p.f, u, old);
        first ??= old[k]!;
        expect(old[k]).toBe(first);
      }
    }
  });

  for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
    it(`detects ${bad} planted at any interior node of u or of the old level`, () => {
      // Also with the centre weights folded to 0 (2 + dt²c0 = 0 for cx = cy = 1,
      // dt² = 1/2, and cm = 0 for γdt = 2): 0·NaN and 0·∞ are NaN, so a bad value
      // cannot cancel out of its own node.
      const cases = [...CASES, { name: 'zero centre weights', cx: 1, cy: 1, dt2: 0.5, cm: 0, inv: 0.5, f: 0 }];
      for (const p of cases) {
        const c0 = -2 * (p.cx + p.cy);
        for (const [nx, ny] of SIZES) {
          for (const k of interior(nx, ny)) {
            for (const target of ['u', 'old'] as const) {
              const u = random(nx * ny, 7 * k + 1);
              const old = random(nx * ny, 7 * k + 2);
              (target === 'u' ? u : old)[k] = bad;
              const sum = leapfrog5(nx, ny, p.cx, p.cy, c0, p.dt2, p.cm, p.inv, p.f, u, old);
              expect(Number.isFinite(sum), `${p.name}, ${nx}×${ny}, node ${k} of ${target}`).toBe(false);
            }
          }
        }
      }
    });
  }

  it('returns a finite sum without a bad value, and 0 with no interior', () => {
    const p = CASES[1]!;
    const c0 = -2 * (p.cx + p.cy);
    for (const [nx, ny] of SIZES) {
      expect(Number.isFinite(leapfrog5(nx, ny, p.cx, p.cy, c0, p.dt2, p.cm, p.inv, p.f, random(nx * ny, 3), random(nx * ny, 4)))).toBe(true);
    }
    for (const [nx, ny] of [[0, 0], [2, 5], [5, 2], [1, 1]] as const) {
      const u = random(nx * ny, 5);
      const old = random(nx * ny, 6);
      const before = Float64Array.from(old);
      expect(leapfrog5(nx, ny, p.cx, p.cy, c0, p.dt2, p.cm, p.inv, p.f, u, old)).toBe(0);
      expect(old).toEqual(before);
    }
  });
});
