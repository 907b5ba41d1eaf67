/**
 * The quadrille colour scale: a sequential scale designed for this library,
 * perceptually uniform in Oklab and strictly increasing in lightness.
 *
 * **Colour space.** Oklab (Ottosson 2020) from linear sRGB:
 *
 *     [l m s]ᵀ = M₁·[r g b]ᵀ,   (l′, m′, s′) = (∛l, ∛m, ∛s),   [L a b]ᵀ = M₂·[l′ m′ s′]ᵀ
 *
 * with Ottosson's matrices M₁, M₂ (below, with their inverses); Euclidean
 * distance in Oklab approximates perceived colour difference, and L is
 * perceived lightness (0 black, 1 white). Linear sRGB is encoded for the
 * screen by the sRGB transfer function (IEC 61966-2-1):
 * c′ = 12.92·c for c ≤ 0.0031308, else 1.055·c^(1/2.4) − 0.055.
 *
 * **Path.** In Oklch (L, C, h) with a = C cos h, b = C sin h, for u ∈ [0, 1]:
 *
 *     L(u) = 0.29 + 0.665·u                  (dark blue-violet → pale yellow)
 *     h(u) = 268° + 200°·u                   (through violet, magenta, red, orange)
 *     C(u) = min(0.055 + 0.13·sin(πu)^0.9,  0.96·Cmax(L(u), h(u)))
 *
 * where Cmax(L, h) is the largest chroma inside the sRGB gamut at that
 * lightness and hue, found by bisection: the scale never leaves the gamut
 * and keeps a 4 % margin, so rounding to 8 bits does not clip it.
 *
 * **Uniform speed.** The path is re-parametrised by Oklab arc length: the
 * colour at t ∈ [0, 1] is the point u(t) at which the arc length from u = 0
 * is t times the whole length (256-segment polyline estimate, then the
 * exact path at that u). Equal steps in t are therefore equal perceived
 * steps, and since L(u) and u(t) both increase, lightness increases
 * strictly with t — the scale reads correctly in greyscale too.
 *
 * Sources: Ottosson, B. (2020). A perceptual color space for image
 * processing. https://bottosson.github.io/posts/oklab/ — IEC 61966-2-1:1999,
 * the sRGB transfer function. The path and its constants are our own.
 *
 * @module
 */
import { NonFiniteValueError } from '../../errors.js';

/** A colour as three numbers. */
export type Triple = readonly [number, number, number];

/** Linear sRGB (each in [0, 1] inside the gamut) → Oklab (L, a, b). */
export function linearSrgbToOklab(r: number, g: number, b: number): Triple {
  const l = Math.cbrt(0.4122214708 * r + 0.5363529807 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return [
    0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s,
  ];
}

/** Oklab (L, a, b) → linear sRGB, not clipped (components outside [0, 1] mean out of gamut). */
export function oklabToLinearSrgb(L: number, a: number, b: number): Triple {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s,
  ];
}

/** The sRGB transfer function: linear c ∈ [0, 1] → encoded c′ ∈ [0, 1]. */
export function encodeSrgb(c: number): number {
  return c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
}

function inGamut(L: number, a: number, b: number): boolean {
  const [r, g, bl] = oklabToLinearSrgb(L, a, b);
  return r >= 0 && r <= 1 && g >= 0 && g <= 1 && bl >= 0 && bl <= 1;
}

/** The largest chroma at (L, h) inside the sRGB gamut, by bisection (40 halvings: below 1e-12). */
function maxChroma(L: number, h: number): number {
  const ca = Math.cos(h);
  const sa = Math.sin(h);
  let lo = 0;
  let hi = 0.5;
  for (let k = 0; k < 40; k++) {
    const c = 0.5 * (lo + hi);
    if (inGamut(L, c * ca, c * sa)) lo = c;
    else hi = c;
  }
  return lo;
}

const DEG = Math.PI / 180;

/** The designed path at parameter u ∈ [0, 1], in Oklab. */
function pathAt(u: number): Triple {
  const L = 0.29 + 0.665 * u;
  const h = (268 + 200 * u) * DEG;
  const want = 0.055 + 0.13 * Math.sin(Math.PI * u) ** 0.9;
  const C = Math.min(want, 0.96 * maxChroma(L, h));
  return [L, C * Math.cos(h), C * Math.sin(h)];
}

const SEGMENTS = 256;
let arc: Float64Array | undefined;

/** Cumulative Oklab arc length of the path at u = k/256, made on first use (nothing runs at import). */
function arcLength(): Float64Array {
  if (arc !== undefined) return arc;
  const s = new Float64Array(SEGMENTS + 1);
  let p = pathAt(0);
  for (let k = 1; k <= SEGMENTS; k++) {
    const q = pathAt(k / SEGMENTS);
    s[k] = s[k - 1] + Math.hypot(q[0] - p[0], q[1] - p[1], q[2] - p[2]);
    p = q;
  }
  arc = s;
  return s;
}

/** The scale at t ∈ [0, 1] (clamped) in Oklab: the path at equal arc-length fraction t. */
export function scaleOklab(t: number): Triple {
  const s = arcLength();
  const target = Math.min(1, Math.max(0, t)) * s[SEGMENTS];
  let lo = 0;
  let hi = SEGMENTS;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (s[mid] <= target) lo = mid;
    else hi = mid;
  }
  const f = s[hi] > s[lo] ? (target - s[lo]) / (s[hi] - s[lo]) : 0;
  return pathAt((lo + Math.min(1, f)) / SEGMENTS);
}

function hex2(v: number): string {
  const n = Math.min(255, Math.max(0, Math.round(255 * encodeSrgb(v))));
  return n.toString(16).padStart(2, '0');
}

/** Oklab → '#rrggbb' (8-bit sRGB, clipped only against rounding). */
export function oklabToHex(c: Triple): string {
  const [r, g, b] = oklabToLinearSrgb(c[0], c[1], c[2]);
  return `#${hex2(r)}${hex2(g)}${hex2(b)}`;
}

/**
 * The quadrille colour scale at position `t`: '#rrggbb'.
 *
 * t = 0 is the darkest colour (a deep blue-violet, Oklab L = 0.29), t = 1
 * the lightest (a pale yellow, L = 0.955); in between the hue turns through
 * violet, magenta, red and orange. Equal steps of t are equal steps of
 * Oklab distance, and lightness increases strictly with t. Built from an
 * Oklab path of our own (see the module notes for the construction:
 * Ottosson 2020 for the colour space).
 *
 * @param t - position on the scale; values outside [0, 1] are clamped to the ends
 * @returns an sRGB colour as '#rrggbb'
 * @throws NonFiniteValueError if `t` is NaN or infinite
 * @example scaleColour(0) === scaleColour(-1) // true: clamped
 */
export function scaleColour(t: number): string {
  if (!Number.isFinite(t)) throw new NonFiniteValueError('t', t);
  return oklabToHex(scaleOklab(t));
}

/** Number of entries of the lookup table used to colour field cells. */
export const TABLE_SIZE = 1024;
let table: string[] | undefined;

/** The scale at t = k/1023, k = 0 … 1023, as hex; made on first use. Steps are ~0.001 in Oklab, far below visibility. */
export function colourTable(): readonly string[] {
  if (table !== undefined) return table;
  const out: string[] = [];
  for (let k = 0; k < TABLE_SIZE; k++) out.push(oklabToHex(scaleOklab(k / (TABLE_SIZE - 1))));
  table = out;
  return out;
}
