import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { fieldMap, grid, sampleField, zeros } from '../../../src/index.js';
import { codeOf } from '../../support/errors.js';
import { textBoxes } from './labels.js';
import { hexToOklab } from './oklab.js';
import { type XmlElement, byClass, elements, parseXml, textContent } from './xml.js';

const plate = grid({ x: { from: 0, to: 0.2, cells: 10 }, y: { from: 0, to: 0.1, cells: 5 } });
const T = sampleField(plate, (x, y) => 20 + 400 * x + 300 * y);

function frameOf(svg: XmlElement): { x: number; y: number; w: number; h: number } {
  const a = byClass(svg, 'frame')[0]!.attrs;
  return { x: Number(a['x']), y: Number(a['y']), w: Number(a['width']), h: Number(a['height']) };
}

/** Cell rects (not the colour bar), with their numbers. */
function cells(svg: XmlElement): { x: number; y: number; w: number; h: number; fill: string }[] {
  return elements(byClass(svg, 'cells')[0]!, 'rect').map((r) => ({
    x: Number(r.attrs['x']), y: Number(r.attrs['y']), w: Number(r.attrs['width']), h: Number(r.attrs['height']), fill: r.attrs['fill']!,
  }));
}

describe('field map: a well-formed SVG with every part', () => {
  const text = fieldMap(plate, T, { quantity: 'temperature', units: '°C', title: 'Plate <A> & B', levels: [40, 60, 80] });
  const svg = parseXml(text);

  it('is a standalone SVG document', () => {
    expect(svg.name).toBe('svg');
    expect(svg.attrs['xmlns']).toBe('http://www.w3.org/2000/svg');
    expect(Number(svg.attrs['width'])).toBe(720);
    expect(svg.attrs['viewBox']).toBe(`0 0 ${svg.attrs['width']} ${svg.attrs['height']}`);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('has a title (escaped), axes with units, tick labels on both axes', () => {
    expect(byClass(svg, 'title').map(textContent)).toEqual(['Plate <A> & B']);
    expect(text).toContain('Plate &lt;A&gt; &amp; B');
    expect(byClass(svg, 'axis-label').map(textContent)).toEqual(['x (m)', 'y (m)']);
    const f = frameOf(svg);
    const ticks = textBoxes(svg).filter((b) => b.kind === 'tick-label');
    const below = ticks.filter((b) => b.y0 > f.y + f.h);
    const leftOf = ticks.filter((b) => b.x1 < f.x);
    expect(below.length).toBeGreaterThanOrEqual(3);
    expect(leftOf.length).toBeGreaterThanOrEqual(3);
    // nice 1-2-5 steps: the x labels are equally spaced values 0, 0.02, … or 0, 0.05, …
    const xs = below.map((b) => Number(b.text));
    const steps = new Set(xs.slice(1).map((v, k) => (v - xs[k]!).toFixed(6)));
    expect(steps.size).toBe(1);
    const step = Number([...steps][0]);
    const m = step / 10 ** Math.floor(Math.log10(step));
    expect([1, 2, 5].some((n) => Math.abs(m - n) < 1e-6)).toBe(true);
  });

  it('has a colour bar with ticks and its label with units', () => {
    const bar = byClass(svg, 'colour-bar')[0]!;
    expect(elements(bar, 'rect').length).toBeGreaterThanOrEqual(16);
    expect(byClass(svg, 'colour-bar-label').map(textContent)).toEqual(['temperature (°C)']);
    const barX = Number(elements(bar, 'rect')[0]!.attrs['x']);
    const barTicks = textBoxes(svg).filter((b) => b.kind === 'tick-label' && b.x0 > barX);
    expect(barTicks.length).toBeGreaterThanOrEqual(3);
    // values 20 … 150 °C: the bar's labels stay inside that range and increase upwards
    const vals = barTicks.map((b) => Number(b.text));
    for (const v of vals) expect(v >= 20 && v <= 150).toBe(true);
    const byHeight = [...barTicks].sort((a, b) => b.y0 - a.y0).map((b) => Number(b.text));
    expect(byHeight).toEqual([...byHeight].sort((a, b) => a - b));
  });

  it('has one path per contour level, and every font at least 11 px', () => {
    expect(byClass(svg, 'contour')).toHaveLength(3);
    for (const b of textBoxes(svg)) expect(b.size).toBeGreaterThanOrEqual(11);
  });

  it('keeps the domain shape with equal scale (0.2 m × 0.1 m → 2:1)', () => {
    const f = frameOf(svg);
    expect(Math.abs(f.w / f.h - 2)).toBeLessThan(0.01);
  });

  it('is deterministic', () => {
    expect(fieldMap(plate, T, { quantity: 'temperature', units: '°C', title: 'Plate <A> & B', levels: [40, 60, 80] })).toBe(text);
  });
});

describe('cells at their true positions', () => {
  it('a stretched axis is drawn stretched: cell widths follow the node cells', () => {
    const nodes = [0, 0.1, 0.3, 0.7, 1.5];
    const g = grid({ x: { nodes }, y: { from: 0, to: 1, cells: 3 } });
    const svg = parseXml(fieldMap(g, sampleField(g, (x) => x), { equalScale: false }));
    const f = frameOf(svg);
    // node cells: midpoints between nodes, clipped at the ends
    const edges = [0, 0.05, 0.2, 0.5, 1.1, 1.5];
    const cols = [...new Map(cells(svg).map((c) => [c.x, c])).values()].sort((a, b) => a.x - b.x);
    expect(cols).toHaveLength(5);
    cols.forEach((c, i) => {
      // coordinates are written to 0.01 px: left and width each off by ≤ 0.005
      expect(Math.abs(c.x - (f.x + (edges[i]! / 1.5) * f.w))).toBeLessThanOrEqual(0.011);
      expect(Math.abs(c.w - ((edges[i + 1]! - edges[i]!) / 1.5) * f.w)).toBeLessThanOrEqual(0.011);
    });
    // the widest cell is 12× the narrowest, as the node spacing says
    const w = cols.map((c) => c.w);
    expect(Math.max(...w) / Math.min(...w)).toBeGreaterThan(11.9);
  });

  it('cells tile the frame exactly, y up', () => {
    const svg = parseXml(fieldMap(plate, T));
    const f = frameOf(svg);
    const area = cells(svg).reduce((s, c) => s + c.w * c.h, 0);
    expect(Math.abs(area / (f.w * f.h) - 1)).toBeLessThan(1e-3);
    // the hottest corner (x = 0.2, y = 0.1) is top right: its cell is the lightest
    const light = [...cells(svg)].sort((a, b) => hexToOklab(b.fill)[0] - hexToOklab(a.fill)[0])[0]!;
    // coordinates are written to 0.01 px, so a sum of two is within 0.01
    expect(Math.abs(light.x + light.w - (f.x + f.w))).toBeLessThanOrEqual(0.011);
    expect(Math.abs(light.y - f.y)).toBeLessThanOrEqual(0.011);
  });

  it('a periodic axis closes at `to` with the first node', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4, periodic: true }, y: { from: 0, to: 1, cells: 2 } });
    const svg = parseXml(fieldMap(g, sampleField(g, (x) => Math.sin(2 * Math.PI * x))));
    const cols = [...new Map(cells(svg).map((c) => [c.x, c])).values()].sort((a, b) => a.x - b.x);
    expect(cols).toHaveLength(5); // 4 stored nodes and the image of node 0 at x = 1
    expect(cols[0]!.fill).toBe(cols[4]!.fill);
  });
});

describe('value → colour', () => {
  it('is monotone: lightness of the cell colour increases with the value', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 60 }, y: { from: 0, to: 1, cells: 1 } });
    const svg = parseXml(fieldMap(g, sampleField(g, (x) => Math.exp(3 * x)), { equalScale: false }));
    const cols = [...new Map(cells(svg).map((c) => [c.x, c])).values()].sort((a, b) => a.x - b.x);
    const L = cols.map((c) => hexToOklab(c.fill)[0]);
    for (let i = 1; i < L.length; i++) expect(L[i]!).toBeGreaterThanOrEqual(L[i - 1]!);
    expect(L[L.length - 1]! - L[0]!).toBeGreaterThan(0.6);
  });

  it('a range clamps: values beyond it take the end colours', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 1 } });
    const f = sampleField(g, (x) => 10 * x); // 0 … 10
    const svg = parseXml(fieldMap(g, f, { range: [2.5, 7.5] }));
    const cols = [...new Map(cells(svg).map((c) => [c.x, c])).values()].sort((a, b) => a.x - b.x);
    expect(cols[0]!.fill).toBe(cols[1]!.fill); // 0 and 2.5 → lo
    expect(cols[3]!.fill).toBe(cols[4]!.fill); // 7.5 and 10 → hi
    expect(cols[2]!.fill).not.toBe(cols[1]!.fill);
  });

  it('a constant field is drawn in one colour with a widened bar', () => {
    const svg = parseXml(fieldMap(plate, sampleField(plate, () => 300)));
    expect(new Set(cells(svg).map((c) => c.fill)).size).toBe(1);
    expect(byClass(svg, 'tick-label').length).toBeGreaterThan(4);
  });
});

describe('NaN policy: NaN is "no data"', () => {
  it('NaN nodes are hatched, the bar says "no data", the range ignores them', () => {
    const f = sampleField(plate, (x, y) => x + y);
    f.set(4, 2, NaN);
    const text = fieldMap(plate, f);
    const svg = parseXml(text);
    const id = elements(svg, 'pattern')[0]!.attrs['id']!;
    const hatched = cells(svg).filter((c) => c.fill === `url(#${id})`);
    expect(hatched).toHaveLength(1);
    expect(byClass(svg, 'no-data').map(textContent)).toEqual(['no data']);
    expect(byClass(svg, 'no-data-swatch')).toHaveLength(1);
    expect(text).not.toMatch(/NaN/);
  });

  it('without NaN there is no swatch and no pattern', () => {
    const svg = parseXml(fieldMap(plate, T));
    expect(byClass(svg, 'no-data')).toHaveLength(0);
    expect(elements(svg, 'pattern')).toHaveLength(0);
  });

  it('pattern ids differ between different maps (several maps can share one page)', () => {
    const a = sampleField(plate, (x) => x);
    const b = sampleField(plate, (x, y) => y);
    a.set(0, 0, NaN);
    b.set(0, 0, NaN);
    const ida = elements(parseXml(fieldMap(plate, a)), 'pattern')[0]!.attrs['id'];
    const idb = elements(parseXml(fieldMap(plate, b)), 'pattern')[0]!.attrs['id'];
    expect(ida).not.toBe(idb);
  });

  it('an all-NaN field needs a range; ±Infinity is refused', () => {
    const f = zeros(plate);
    f.data.fill(NaN);
    expect(codeOf(() => fieldMap(plate, f))).toBe('NON_FINITE');
    expect(byClass(parseXml(fieldMap(plate, f, { range: [0, 1] })), 'no-data')).toHaveLength(1);
    const g = sampleField(plate, () => 1);
    g.set(2, 3, Infinity);
    expect(codeOf(() => fieldMap(plate, g))).toBe('NON_FINITE');
  });
});

describe('refusals', () => {
  it('wrong grids, shapes and options', () => {
    const line = grid({ x: { from: 0, to: 1, cells: 4 } });
    expect(codeOf(() => fieldMap(line, zeros(line)))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, ndarray(new Float64Array(12), [3, 4])))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => fieldMap(plate, [1, 2, 3] as never))).toBe('INVALID_FIELD');
    expect(codeOf(() => fieldMap(plate, T, { range: [5, 5] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { range: [0, NaN] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { levels: 2.5 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { levels: -1 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { levels: [1, NaN] }))).toBe('NON_FINITE');
    expect(codeOf(() => fieldMap(plate, T, { width: 100 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { height: Infinity }))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldMap(plate, T, { units: 3 as never }))).toBe('INVALID_OPTION');
  });
});
