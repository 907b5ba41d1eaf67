/**
 * Nothing overlaps: on awkward inputs, every plot's text labels — boxes
 * estimated again here from the SVG alone (test/io/plot/labels.ts) — are
 * pairwise disjoint, inside the sheet and at least 11 px, and the SVG is
 * well-formed.
 */
import { describe, expect, it } from 'vitest';
import { fieldMap, grid, historyPlot, linePlot, logLogPlot, sampleField, tanhAxis } from '../../../src/index.js';
import { mulberry32 } from '../../support/prng.js';
import { outside, overlapping, textBoxes } from './labels.js';
import { parseXml } from './xml.js';

function check(svgText: string, minTicks = 2): void {
  const svg = parseXml(svgText);
  const W = Number(svg.attrs['width']);
  const H = Number(svg.attrs['height']);
  const boxes = textBoxes(svg);
  const pairs = overlapping(boxes);
  expect(pairs.map(([a, b]) => `${a.kind} "${a.text}" × ${b.kind} "${b.text}"`)).toEqual([]);
  expect(outside(boxes, W, H).map((b) => `${b.kind} "${b.text}"`)).toEqual([]);
  for (const b of boxes) expect(b.size).toBeGreaterThanOrEqual(11);
  expect(boxes.filter((b) => b.kind === 'tick-label').length).toBeGreaterThanOrEqual(2 * minTicks);
  expect(svgText).not.toMatch(/NaN|Infinity|undefined/);
}

const square = grid({ x: { from: -1, to: 1, cells: 30 }, y: { from: -1, to: 1, cells: 30 } });
const stretched = grid({ x: tanhAxis({ from: 0, to: 3, cells: 40, beta: 3, cluster: 'from' }), y: { nodes: [0, 0.01, 0.05, 0.2, 0.6, 1] } });

describe('field maps with contours', () => {
  const cases: [string, () => string][] = [
    ['tiny range (1e-9 of 300 K)', () => fieldMap(square, sampleField(square, (x, y) => 300 + 1e-9 * (x * x + y * y)), { levels: 6, units: 'K' })],
    ['huge range (1e12)', () => fieldMap(square, sampleField(square, (x, y) => 1e12 * (x + 2 * y)), { levels: 9, units: 'Pa' })],
    ['tiny magnitudes (1e-7)', () => fieldMap(square, sampleField(square, (x, y) => 1e-7 * Math.sin(3 * x) * y), { levels: 8 })],
    ['negative values', () => fieldMap(square, sampleField(square, (x, y) => -5000 + 800 * x * y), { levels: [-5600, -5300, -5000, -4700, -4400] })],
    ['many levels (60)', () => fieldMap(square, sampleField(square, (x, y) => Math.sin(4 * x) * Math.cos(3 * y)), { levels: 60 })],
    ['200 levels on a saddle', () => fieldMap(square, sampleField(square, (x, y) => x * y), { levels: 200 })],
    ['stretched with NaN', () => {
      const f = sampleField(stretched, (x, y) => Math.exp(-x) * (1 - y));
      f.set(3, 2, NaN);
      f.set(10, 4, NaN);
      return fieldMap(stretched, f, { levels: 12, quantity: 'concentration', units: 'mol/m³', mesh: true });
    }],
    ['narrow domain, small sheet', () => {
      const g = grid({ x: { from: 0, to: 10, cells: 50 }, y: { from: 0, to: 0.5, cells: 5 } });
      return fieldMap(g, sampleField(g, (x, y) => x * (1 + y)), { levels: 10, width: 320 });
    }],
    ['tall domain, fixed height', () => {
      const g = grid({ x: { from: 0, to: 0.1, cells: 6 }, y: { from: 0, to: 2, cells: 60 } });
      return fieldMap(g, sampleField(g, (x, y) => y * y - x), { levels: 15, height: 300 });
    }],
    ['long title and label', () => fieldMap(square, sampleField(square, (x) => x), {
      title: 'A very long title that would not fit into the width of the sheet at all, no matter what, really', quantity: 'temperature rise above the initial value', units: 'K', levels: 4, width: 360,
    })],
  ];
  for (const [name, make] of cases) it(name, () => check(make()));
});

describe('line plots', () => {
  const x = Array.from({ length: 50 }, (_, i) => i / 49);
  const cases: [string, () => string][] = [
    ['tiny range', () => linePlot([{ label: 'T', x, y: x.map((v) => 1 + 1e-12 * v) }], { xLabel: 'x (m)', yLabel: 'T (K)' })],
    ['huge range', () => linePlot([{ label: 'p', x: x.map((v) => 1e9 * v), y: x.map((v) => 1e15 * v * v) }], { xLabel: 'x', yLabel: 'p' })],
    ['negative values', () => linePlot([{ label: 'a', x: x.map((v) => -v), y: x.map((v) => -1e4 - v) }, { label: 'b', x, y: x.map((v) => -3e4 * v) }])],
    ['constant and single point', () => linePlot([{ label: 'c', x: [2], y: [5] }], { title: 'one point' })],
    ['twenty series with long labels, small sheet', () => linePlot(
      Array.from({ length: 20 }, (_, k) => ({ label: `series number ${k} with a rather long label`, x, y: x.map((v) => v * k) })),
      { width: 300, height: 220, title: 'crowded', xLabel: 'x (m)', yLabel: 'y (m)' },
    )],
  ];
  for (const [name, make] of cases) it(name, () => check(make()));
});

describe('probe histories', () => {
  it('10⁵ records, three probes, hours', () => {
    const n = 100_000;
    const times = Float64Array.from({ length: n }, (_, i) => i * 0.36);
    const rnd = mulberry32(7);
    const probes = [[0.1], [0.2], [0.3]].map((point, k) => ({
      point, values: Float64Array.from(times, (t) => 20 + 80 * (1 - Math.exp(-t / (3000 * (k + 1)))) + rnd()),
    }));
    const svg = historyPlot({ times, probes }, { quantity: 'temperature', units: '°C', timeUnit: 'h' });
    check(svg);
    // thinned to a few points per pixel column, extremes kept
    expect(svg.length).toBeLessThan(400_000);
  });
  it('2-D probes with tiny variations', () => {
    const times = Float64Array.of(0, 1, 2, 3);
    check(historyPlot({ times, probes: [{ point: [1e-4, 2.5e-4], values: Float64Array.of(1e-9, 2e-9, 2.5e-9, 2.6e-9) }] }));
  });
});

describe('log–log plots', () => {
  const h = [1, 0.5, 0.25, 0.125, 0.0625, 0.03125];
  const cases: [string, () => string][] = [
    ['12 decades', () => logLogPlot([{ label: 'e', x: h.map((v) => v * 1e-3), y: h.map((v) => 1e-2 * v ** 4) }, { label: 'f', x: h.map((v) => v * 1e-3), y: h.map((v) => v * 1e-14) }], { slopes: [1, 2, 4], xLabel: 'h (m)', yLabel: 'error' })],
    ['under one decade', () => logLogPlot([{ label: 'e', x: [1, 1.2, 1.5], y: [2, 2.2, 2.5] }], { slopes: [1] })],
    ['many slopes', () => logLogPlot([{ label: 'e', x: h, y: h.map((v) => v * v) }], { slopes: [0.5, 1, 2, 3, 4, 6, 8] })],
    ['small sheet', () => logLogPlot([{ label: 'L2 error of the temperature', x: h, y: h.map((v) => v * v) }], { slopes: [2], width: 200, height: 200, title: 'convergence' })],
  ];
  for (const [name, make] of cases) it(name, () => check(make()));
});
