/**
 * Marching squares (Lorensen & Cline 1987, 2-D form) against level sets
 * known in closed form, the saddle rule as documented in
 * src/io/plot/contour.ts, and the contour paths of field maps.
 */
import { describe, expect, it } from 'vitest';
import { fieldMap, grid, sampleField, tanhAxis } from '../../../src/index.js';
import { contourLines } from '../../../src/io/plot/contour.js';
import { byClass, parseXml } from './xml.js';

const eps = Number.EPSILON;

/** Nodal values v[i·ny + j] = f(xs[i], ys[j]). */
function sample(xs: Float64Array, ys: Float64Array, f: (x: number, y: number) => number): Float64Array {
  const v = new Float64Array(xs.length * ys.length);
  for (let i = 0; i < xs.length; i++) for (let j = 0; j < ys.length; j++) v[i * ys.length + j] = f(xs[i]!, ys[j]!);
  return v;
}

const uniform = (a: number, b: number, n: number): Float64Array => Float64Array.from({ length: n + 1 }, (_, i) => (i === n ? b : a + ((b - a) * i) / n));

function points(p: Float64Array): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k < p.length; k += 2) out.push([p[k]!, p[k + 1]!]);
  return out;
}

describe('level sets known in closed form', () => {
  const circle = (x: number, y: number): number => x * x + y * y;

  it('u = x² + y²: each level c is one closed loop on the circle r = √c, within the interpolation error', () => {
    for (const [name, xs, ys] of [
      ['uniform', uniform(-1, 1, 20), uniform(-1, 1, 20)],
      ['stretched', Float64Array.from(tanhAxis({ from: -1, to: 1, cells: 24, beta: 2, cluster: 'both' }).nodes), uniform(-1, 1, 16)],
    ] as const) {
      const v = sample(xs, ys, circle);
      let h = 0;
      for (const a of [xs, ys]) for (let i = 1; i < a.length; i++) h = Math.max(h, a[i]! - a[i - 1]!);
      for (const c of [0.09, 0.25, 0.5, 0.81]) {
        const lines = contourLines(xs, ys, v, c);
        expect(lines, `${name} c = ${c}`).toHaveLength(1);
        expect(lines[0]!.closed).toBe(true);
        // along an edge u is quadratic with u'' = 2, so linear interpolation misses by ≤ (h/2)²·2/2 = h²/4;
        // round-off of x² + y² and of the interpolation: a few ε at scale 1
        for (const [x, y] of points(lines[0]!.points)) expect(Math.abs(circle(x, y) - c)).toBeLessThanOrEqual(h * h / 4 + 16 * eps);
        // the loop goes all the way round: its points cover every quadrant
        const q = new Set(points(lines[0]!.points).map(([x, y]) => `${Math.sign(x)}${Math.sign(y)}`));
        expect(q.size).toBeGreaterThanOrEqual(4);
      }
    }
  });

  it('a plane u = 3x − 2y + 1: contours are exact to round-off and straight', () => {
    const xs = Float64Array.from([0, 0.1, 0.35, 0.5, 0.9, 1]);
    const ys = uniform(0, 1, 7);
    const u = (x: number, y: number): number => 3 * x - 2 * y + 1;
    const v = sample(xs, ys, u);
    for (const c of [-0.5, 0.3, 1, 2.7]) {
      const lines = contourLines(xs, ys, v, c);
      expect(lines).toHaveLength(1);
      expect(lines[0]!.closed).toBe(false);
      const pts = points(lines[0]!.points);
      // linear interpolation is exact for a linear field: only round-off, ~10 operations at scale |u| ≤ 4
      for (const [x, y] of pts) expect(Math.abs(u(x, y) - c)).toBeLessThanOrEqual(64 * eps * 4);
      // the line starts and ends on the boundary
      for (const [x, y] of [pts[0]!, pts[pts.length - 1]!]) {
        expect(Math.min(Math.abs(x), Math.abs(x - 1), Math.abs(y), Math.abs(y - 1))).toBeLessThanOrEqual(4 * eps);
      }
    }
  });

  it('a level outside the values gives no line; NaN cells give none', () => {
    const xs = uniform(0, 1, 4);
    const v = sample(xs, xs, (x, y) => x + y);
    expect(contourLines(xs, xs, v, 5)).toHaveLength(0);
    expect(contourLines(xs, xs, v, -1)).toHaveLength(0);
    v.fill(NaN);
    expect(contourLines(xs, xs, v, 1)).toHaveLength(0);
  });
});

describe('saddle cells: resolved by the cell-centre mean', () => {
  // corners (0,0) = 1, (0,1) = 0, (1,0) = 0, (1,1) = 1 (x slowest); centre mean 0.5
  const xs = Float64Array.of(0, 1);
  const v = Float64Array.of(1, 0, 0, 1);
  const segments = (level: number): string[] =>
    contourLines(xs, xs, v, level)
      .map((l) => points(l.points).map(([x, y]) => `(${x.toFixed(2)},${y.toFixed(2)})`).sort().join(' '))
      .sort();

  it('mean ≥ level: the above corners are joined, the segments cut off the below corners (1,0) and (0,1)', () => {
    expect(segments(0.5)).toEqual(['(0.00,0.50) (0.50,1.00)', '(0.50,0.00) (1.00,0.50)']);
    expect(segments(0.4)).toEqual(['(0.00,0.60) (0.40,1.00)', '(0.60,0.00) (1.00,0.40)']);
  });

  it('mean < level: the below corners are joined, the segments cut off the above corners (0,0) and (1,1)', () => {
    expect(segments(0.6)).toEqual(['(0.00,0.40) (0.40,0.00)', '(0.60,1.00) (1.00,0.60)']);
  });

  it('the mirrored saddle follows the same rule', () => {
    const w = Float64Array.of(0, 1, 1, 0); // (0,0) = 0, (0,1) = 1, (1,0) = 1, (1,1) = 0
    const s = contourLines(xs, xs, w, 0.5).map((l) => points(l.points).map(([x, y]) => `(${x},${y})`).sort().join(' ')).sort();
    // mean 0.5 ≥ 0.5: cut off the below corners (0,0) and (1,1)
    expect(s).toEqual(['(0,0.5) (0.5,0)', '(0.5,1) (1,0.5)']);
  });
});

/** Points of an SVG path made of M, L and Z commands. */
function pathPoints(d: string): [number, number][] {
  const out: [number, number][] = [];
  for (const m of d.matchAll(/[ML]([-\d.]+),([-\d.]+)/g)) out.push([Number(m[1]), Number(m[2])]);
  return out;
}

describe('contours in a field map', () => {
  const g = grid({ x: { from: -1, to: 1, cells: 20 }, y: { from: -1, to: 1, cells: 20 } });
  const u = sampleField(g, (x, y) => x * x + y * y);

  it('one path per level present, each on its circle (mapped back from pixels through the frame)', () => {
    const svg = parseXml(fieldMap(g, u, { levels: [-1, 0.25, 0.5, 1, 1.5, 3] }));
    const paths = byClass(svg, 'contour');
    // −1 and 3 lie outside [0, 2]: no line, no path
    expect(paths.map((p) => Number(p.attrs['data-level']))).toEqual([0.25, 0.5, 1, 1.5]);
    const frame = byClass(svg, 'frame')[0]!.attrs;
    const fx = Number(frame['x']);
    const fy = Number(frame['y']);
    const fw = Number(frame['width']);
    const fh = Number(frame['height']);
    for (const p of paths) {
      const c = Number(p.attrs['data-level']);
      const pts = pathPoints(p.attrs['d']!);
      expect(pts.length).toBeGreaterThan(8);
      for (const [X, Y] of pts) {
        const x = -1 + ((X - fx) / fw) * 2;
        const y = 1 - ((Y - fy) / fh) * 2;
        // h²/4 from the interpolation (h = 0.1); coordinates are written to 0.01 px, i.e. ≤ 0.005·2/fw
        // in x and y, and |∇u| ≤ 2√2 turns that into ≤ 6e-5 here
        expect(Math.abs(x * x + y * y - c)).toBeLessThanOrEqual(0.01 / 4 + (2 * Math.SQRT2 * 0.01) / Math.min(fw, fh));
      }
    }
  });

  it('a level count gives that many equally spaced levels inside the range', () => {
    const svg = parseXml(fieldMap(g, u, { levels: 7 }));
    const levels = byClass(svg, 'contour').map((p) => Number(p.attrs['data-level']));
    expect(levels).toHaveLength(7);
    // lo + k(hi − lo)/8 with [lo, hi] = [0, 2]: 0.25, 0.5, …, 1.75 to round-off
    levels.forEach((l, k) => expect(Math.abs(l - 0.25 * (k + 1))).toBeLessThanOrEqual(4 * eps));
    // the colour bar marks each level
    expect(byClass(svg, 'level-mark')[0]!.attrs['d']!.match(/M/g)).toHaveLength(7);
  });

  it('no contours unless asked', () => {
    expect(byClass(parseXml(fieldMap(g, u)), 'contour')).toHaveLength(0);
  });
});
