import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { grid, historyPlot, linePlot, logLogPlot, profilePlot, sampleField, solveTransient, zeros } from '../../../src/index.js';
import { codeOf, errorOf } from '../../support/errors.js';
import { textBoxes } from './labels.js';
import { type XmlElement, byClass, parseXml, textContent } from './xml.js';

function frame(svg: XmlElement): { x: number; y: number; w: number; h: number } {
  const a = byClass(svg, 'frame')[0]!.attrs;
  return { x: Number(a['x']), y: Number(a['y']), w: Number(a['width']), h: Number(a['height']) };
}

function pathPoints(d: string): [number, number][] {
  return [...d.matchAll(/[ML]([-\d.]+),([-\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

/** Tick labels under the frame (x axis) and left of it (y axis). */
function axisTicks(svg: XmlElement): { x: string[]; y: string[] } {
  const f = frame(svg);
  const t = textBoxes(svg).filter((b) => b.kind === 'tick-label');
  return { x: t.filter((b) => b.y0 > f.y + f.h).map((b) => b.text), y: t.filter((b) => b.x1 < f.x).map((b) => b.text) };
}

describe('linePlot', () => {
  const svgText = linePlot(
    [{ label: 'numerical', x: [0, 0.5, 1], y: [20, 30, 80], style: 'points' }, { label: 'exact <ref>', x: [0, 0.25, 0.5, 0.75, 1], y: [20, 22, 30, 50, 80] }],
    { title: 'Profile', xLabel: 'x (m)', yLabel: 'T (°C)' },
  );
  const svg = parseXml(svgText);

  it('draws axes, ticks, a legend with every series, markers and lines', () => {
    expect(byClass(svg, 'axis-label').map(textContent)).toEqual(['x (m)', 'T (°C)']);
    expect(byClass(svg, 'legend-label').map(textContent)).toEqual(['numerical', 'exact <ref>']);
    expect(svgText).toContain('exact &lt;ref&gt;');
    expect(byClass(svg, 'series')).toHaveLength(1); // 'points' draws no line
    expect(byClass(svg, 'markers')).toHaveLength(1);
    const t = axisTicks(svg);
    expect(t.x.length).toBeGreaterThanOrEqual(3);
    expect(t.y.length).toBeGreaterThanOrEqual(3);
  });

  it('maps data to the frame: x spans it exactly, y with a 5 % margin', () => {
    const f = frame(svg);
    const pts = pathPoints(byClass(svg, 'series')[0]!.attrs['d']!);
    // to the 0.01 px the coordinates are written with
    expect(Math.abs(pts[0]![0] - f.x)).toBeLessThanOrEqual(0.006);
    expect(Math.abs(pts[pts.length - 1]![0] - (f.x + f.w))).toBeLessThanOrEqual(0.006);
    const span = 60 * 1.1;
    expect(Math.abs(pts[0]![1] - (f.y + f.h - (3 / span) * f.h))).toBeLessThanOrEqual(0.006);
  });

  it('series beyond the palette repeat its colours dashed', () => {
    const many = parseXml(linePlot(Array.from({ length: 9 }, (_, k) => ({ label: `s${k}`, x: [0, 1], y: [k, k + 1] }))));
    const paths = byClass(many, 'series');
    expect(paths[8]!.attrs['stroke']).toBe(paths[0]!.attrs['stroke']);
    expect(paths[0]!.attrs['stroke-dasharray']).toBeUndefined();
    // the second round of the palette takes the second dash pattern of chart.ts ('7 3')
    expect(paths[8]!.attrs['stroke-dasharray']).toBe('7 3');
  });

  it('negative values get a typographic minus', () => {
    const t = axisTicks(parseXml(linePlot([{ label: '', x: [0, 1], y: [-3, -1] }])));
    expect(t.y.some((s) => s.startsWith('−'))).toBe(true);
    expect(t.y.some((s) => s.startsWith('-'))).toBe(false);
  });

  it('huge and tiny values use ×10ⁿ labels', () => {
    expect(axisTicks(parseXml(linePlot([{ label: '', x: [0, 1], y: [0, 3e9] }]))).y.join(' ')).toMatch(/×10⁹/);
    expect(axisTicks(parseXml(linePlot([{ label: '', x: [0, 1], y: [1e-6, 3e-6] }]))).y.join(' ')).toMatch(/×10⁻⁶/);
  });

  it('refuses empty input, mismatched lengths and non-finite values, with the fix', () => {
    const e = errorOf(() => linePlot([]));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toContain('at least one');
    expect(codeOf(() => linePlot([{ label: 'a', x: [], y: [] }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => linePlot([{ label: 'a', x: [1, 2], y: [1] }]))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => linePlot([{ label: 'a', x: [1, 2], y: [1, NaN] }]))).toBe('NON_FINITE');
    expect(codeOf(() => linePlot([{ label: 'a', x: [1, 2], y: [1, 2], style: 'dots' as never }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => linePlot([{ label: 'a', x: [1, 2], y: [1, 2] }], { width: 50 }))).toBe('INVALID_OPTION');
  });
});

describe('profilePlot', () => {
  const g = grid({ x: { from: 0, to: 0.2, cells: 4 }, y: { nodes: [0, 0.02, 0.1] } });
  const T = sampleField(g, (x, y) => 20 + 100 * x + 1000 * y);

  it('along x at a node line: the values of that line, exactly', () => {
    const svg = parseXml(profilePlot(g, [{ label: 'T', field: T }], { along: 'x', at: 0.02, quantity: 'T', units: '°C' }));
    expect(byClass(svg, 'title').map(textContent)).toEqual(['T along x at y = 0.02 m']);
    expect(byClass(svg, 'axis-label').map(textContent)).toEqual(['x (m)', 'T (°C)']);
    expect(pathPoints(byClass(svg, 'series')[0]!.attrs['d']!)).toHaveLength(5);
  });

  it('between node lines: linear interpolation (exact for a field linear in y)', () => {
    // at y = 0.06 the values are 20 + 100x + 60, 80 … 100 K; mapped back through the frame and
    // the 5 % margins they must come out to the 0.01 px the coordinates are written with
    const svg = parseXml(profilePlot(g, [{ label: 'T', field: T }], { along: 'x', at: 0.06 }));
    const f = frame(svg);
    const pts = pathPoints(byClass(svg, 'series')[0]!.attrs['d']!);
    const lo = 80 - 0.05 * 20;
    const hi = 100 + 0.05 * 20;
    pts.forEach(([, Y], i) => {
      const want = 80 + 100 * 0.05 * i;
      const got = lo + ((f.y + f.h - Y) / f.h) * (hi - lo);
      expect(Math.abs(got - want)).toBeLessThanOrEqual((0.006 / f.h) * (hi - lo));
    });
  });

  it('along y, and on a 1-D grid', () => {
    const s = parseXml(profilePlot(g, [{ label: 'T', field: T }], { along: 'y', at: 0.1 }));
    expect(byClass(s, 'axis-label').map(textContent)[0]).toBe('y (m)');
    expect(pathPoints(byClass(s, 'series')[0]!.attrs['d']!)).toHaveLength(3);
    const line = grid({ x: { from: 0, to: 1, cells: 10 } });
    const one = parseXml(profilePlot(line, [{ label: 'u', field: sampleField(line, (x) => x * x) }, { label: 'v', field: sampleField(line, (x) => x) }]));
    expect(byClass(one, 'series')).toHaveLength(2);
  });

  it('a periodic axis closes the period', () => {
    const ring = grid({ x: { from: 0, to: 1, cells: 8, periodic: true } });
    const pts = pathPoints(byClass(parseXml(profilePlot(ring, [{ label: 'u', field: sampleField(ring, (x) => Math.cos(2 * Math.PI * x)) }])), 'series')[0]!.attrs['d']!);
    expect(pts).toHaveLength(9);
    expect(pts[8]![1]).toBe(pts[0]![1]);
  });

  it('refusals', () => {
    expect(codeOf(() => profilePlot(g, []))).toBe('INVALID_OPTION');
    expect(codeOf(() => profilePlot(g, [{ label: 'T', field: T }], { along: 'x' }))).toBe('INVALID_OPTION'); // no `at`
    expect(codeOf(() => profilePlot(g, [{ label: 'T', field: T }], { along: 'x', at: 0.5 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => profilePlot(g, [{ label: 'T', field: T }], { along: 'z' as never, at: 0 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => profilePlot(g, [{ label: 'T', field: ndarray(new Float64Array(4), [2, 2]) }], { at: 0 }))).toBe('SHAPE_MISMATCH');
    const line = grid({ x: { from: 0, to: 1, cells: 2 } });
    expect(codeOf(() => profilePlot(line, [{ label: 'u', field: zeros(line) }], { at: 0 }))).toBe('INVALID_OPTION');
    const bad = zeros(line);
    bad.set(1, NaN);
    expect(codeOf(() => profilePlot(line, [{ label: 'u', field: bad }]))).toBe('NON_FINITE');
    const cube = grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 1, cells: 1 }, z: { from: 0, to: 1, cells: 1 } });
    expect(codeOf(() => profilePlot(cube, [{ label: 'u', field: zeros(cube) }], { at: 0 }))).toBe('INVALID_OPTION');
  });
});

describe('historyPlot', () => {
  const wall = grid({ x: { from: 0, to: 0.2, cells: 20 } });
  const run = solveTransient(
    { grid: wall, conductivity: 1.4, heatCapacity: 1.9e6, initial: 20, boundary: { xmin: { kind: 'dirichlet', value: 120 }, xmax: { kind: 'dirichlet', value: 20 } } },
    { scheme: 'crank-nicolson', dt: 120, endTime: 7200, probes: [[0.05], [0.1]] },
  );

  it('one line per probe against time in the chosen unit, legend from the probe points', () => {
    const svg = parseXml(historyPlot(run, { quantity: 'temperature', units: '°C', timeUnit: 'h' }));
    expect(byClass(svg, 'series')).toHaveLength(2);
    expect(byClass(svg, 'legend-label').map(textContent)).toEqual(['x = 0.05 m', 'x = 0.1 m']);
    expect(byClass(svg, 'axis-label').map(textContent)).toEqual(['time (h)', 'temperature (°C)']);
    // 2 h of run: the last x tick label is at most 2
    const last = Math.max(...axisTicks(svg).x.map(Number));
    expect(last).toBeLessThanOrEqual(2);
    expect(last).toBeGreaterThanOrEqual(1.5);
  });

  it('labels of our own; refusals', () => {
    expect(historyPlot(run, { labels: ['near <face>', 'middle'] })).toContain('near &lt;face&gt;');
    expect(codeOf(() => historyPlot(run, { labels: ['one'] }))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => historyPlot({ times: run.times, probes: [] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => historyPlot(run, { timeUnit: 'week' as never }))).toBe('INVALID_OPTION');
    expect(codeOf(() => historyPlot({ times: Float64Array.of(0, 1), probes: [{ point: [0], values: Float64Array.of(1) }] }))).toBe('SHAPE_MISMATCH');
  });
});

describe('logLogPlot', () => {
  const h = [0.2, 0.1, 0.05, 0.025];
  const svgText = logLogPlot([{ label: 'L2', x: h, y: h.map((v) => 3 * v * v) }, { label: 'L∞', x: h, y: h.map((v) => 5 * v * v) }], {
    slopes: [1, 2, 4], xLabel: 'spacing h (m)', yLabel: 'error', title: 'Order',
  });
  const svg = parseXml(svgText);

  it('draws each series, dashed reference slopes and their labels', () => {
    expect(byClass(svg, 'series')).toHaveLength(2);
    expect(byClass(svg, 'markers')).toHaveLength(2);
    const refs = byClass(svg, 'reference');
    expect(refs.map((r) => r.attrs['data-slope'])).toEqual(['1', '2', '4']);
    expect(svgText).toContain('stroke-dasharray="6 4"');
    const labels = [...byClass(svg, 'slope-label'), ...byClass(svg, 'legend-label')].map(textContent);
    for (const p of [1, 2, 4]) expect(labels).toContain(`slope ${p}`);
  });

  it('a reference line of slope p has slope p in the plot, through the finest point', () => {
    const f = frame(svg);
    const pts = pathPoints(byClass(svg, 'series')[0]!.attrs['d']!);
    const finest = pts[pts.length - 1]!;
    const coarse = pts[0]!;
    // the data is exactly order 2: its pixel slope equals the slope-2 line's
    const slope = (a: [number, number], b: [number, number]): number => (b[1] - a[1]) / (b[0] - a[0]);
    const ref2 = pathPoints(byClass(svg, 'reference')[1]!.attrs['d']!);
    expect(Math.abs(ref2[0]![0] - finest[0])).toBeLessThanOrEqual(0.006);
    expect(Math.abs(ref2[0]![1] - finest[1])).toBeLessThanOrEqual(0.006);
    // pixel slopes agree to the 0.01-px rounding over a ≥ 100 px run
    expect(Math.abs(slope(ref2[0]!, ref2[1]!) / slope(finest, coarse) - 1)).toBeLessThan(1e-3);
    expect(f.w).toBeGreaterThan(100);
  });

  it('decade ticks with superscript exponents', () => {
    const s = parseXml(logLogPlot([{ label: 'e', x: [1e-3, 1e-1], y: [1e-8, 1e-2] }]));
    const t = axisTicks(s);
    expect(t.y).toContain('10⁻⁶');
    expect(t.x).toContain('10⁻²');
  });

  it('refuses values ≤ 0 with the fix', () => {
    const e = errorOf(() => logLogPlot([{ label: 'L2', x: [0.1, 0.05], y: [1e-3, 0] }]));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toContain('> 0');
    expect(e.message).toContain('drop that point');
    expect(codeOf(() => logLogPlot([{ label: 'L2', x: [-0.1, 0.05], y: [1, 2] }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => logLogPlot([]))).toBe('INVALID_OPTION');
    expect(codeOf(() => logLogPlot([{ label: 'a', x: [1, 2], y: [1, 2] }], { slopes: [NaN] }))).toBe('INVALID_OPTION');
  });
});
