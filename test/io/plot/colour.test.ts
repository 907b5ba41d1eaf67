/**
 * The colour scale, checked from its 8-bit output with a conversion written
 * here from the published definitions: sRGB decoding (IEC 61966-2-1) and
 * Oklab (Ottosson 2020, https://bottosson.github.io/posts/oklab/).
 */
import { describe, expect, it } from 'vitest';
import { scaleColour } from '../../../src/index.js';
import { oklabToLinearSrgb, scaleOklab } from '../../../src/io/plot/colour.js';
import { codeOf } from '../../support/errors.js';
import { hexToOklab } from './oklab.js';

const N = 128;
const ts = Array.from({ length: N + 1 }, (_, k) => k / N);

describe('Oklab conversion', () => {
  it('white is L = 1, a = b = 0; sRGB red is (0.628, 0.225, 0.126)', () => {
    // white: the first row of M₁ sums to 1.00002 (the published constants come from the
    // sRGB→XYZ→LMS product), so l′ = 1 + 6.8e-6 after the cube root; L moves by 0.21× that and
    // a by 1.98× (M₂'s first column), both under 2e-5
    const w = hexToOklab('#ffffff');
    expect(Math.abs(w[0] - 1)).toBeLessThan(2e-5);
    expect(Math.hypot(w[1], w[2])).toBeLessThan(2e-5);
    // red: oklab(62.8 % 0.2249 0.1258), the worked value in CSS Color Module Level 4 (typed from memory)
    const red = hexToOklab('#ff0000');
    expect(Math.abs(red[0] - 0.628)).toBeLessThan(5e-4);
    expect(Math.abs(red[1] - 0.2249)).toBeLessThan(5e-4);
    expect(Math.abs(red[2] - 0.1258)).toBeLessThan(5e-4);
  });
  it('the library inverse undoes the forward map', () => {
    const [L, a, b] = hexToOklab('#3c7ab0');
    const [r, g, bl] = oklabToLinearSrgb(L, a, b);
    const want = hexToOklab('#3c7ab0');
    // round trip through two 3×3 products and cubes/cube roots: ~1e-9 from the 10-digit constants
    const back = hexToOklab(
      '#' + [r, g, bl].map((c) => Math.round(255 * (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055)).toString(16).padStart(2, '0')).join(''),
    );
    expect(Math.hypot(back[0] - want[0], back[1] - want[1], back[2] - want[2])).toBeLessThan(1e-9);
  });
});

describe('the quadrille scale', () => {
  const hex = ts.map(scaleColour);
  const lab = hex.map(hexToOklab);

  it('is 8-bit hex', () => {
    for (const h of hex) expect(h).toMatch(/^#[0-9a-f]{6}$/);
  });

  it('lightness (Oklab L of the 8-bit colour) increases strictly', () => {
    for (let k = 1; k <= N; k++) expect(lab[k]![0]).toBeGreaterThan(lab[k - 1]![0]);
  });

  it('stays inside the sRGB gamut: the designed colours need no clipping', () => {
    for (const t of ts) {
      const [L, a, b] = scaleOklab(t);
      for (const c of oklabToLinearSrgb(L, a, b)) {
        expect(c).toBeGreaterThanOrEqual(0);
        expect(c).toBeLessThanOrEqual(1);
      }
    }
    // and the 8-bit colour is the designed one: rounding moves Oklab by ≲ 0.004, clipping would move it more
    ts.forEach((t, k) => {
      const d = scaleOklab(t);
      const got = lab[k]!;
      expect(Math.hypot(got[0] - d[0], got[1] - d[1], got[2] - d[2])).toBeLessThan(0.006);
    });
  });

  it('has distinct endpoints: dark to light by more than half the lightness range', () => {
    expect(hex[0]).not.toBe(hex[N]);
    expect(lab[N]![0] - lab[0]![0]).toBeGreaterThan(0.6);
    expect(lab[0]![0]).toBeGreaterThan(0.2); // not black: contour lines stay visible on it
    expect(lab[N]![0]).toBeLessThan(0.98); // not white: the map stays distinct from the page
  });

  it('is perceptually uniform: equal steps of t are equal Oklab steps', () => {
    const steps = ts.slice(1).map((t, k) => {
      const a = scaleOklab(ts[k]!);
      const b = scaleOklab(t);
      return Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
    });
    // the arc-length table has 256 chords; at 128 steps each step spans two chords, so the
    // chord-vs-arc error is second order and tiny — 2 % covers it
    expect(Math.max(...steps) / Math.min(...steps)).toBeLessThan(1.02);
  });

  it('clamps outside [0, 1] and refuses NaN', () => {
    expect(scaleColour(-3)).toBe(scaleColour(0));
    expect(scaleColour(7)).toBe(scaleColour(1));
    expect(codeOf(() => scaleColour(NaN))).toBe('NON_FINITE');
  });
});
