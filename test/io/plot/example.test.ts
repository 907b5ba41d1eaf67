import { describe, expect, it } from 'vitest';
import { plotsExample } from '../../../docs/examples/plots.js';
import { erfc } from '../../../src/index.js';
import { outside, overlapping, textBoxes } from './labels.js';
import { byClass, elements, parseXml } from './xml.js';

describe('docs/examples/plots.ts runs and its numbers are true', () => {
  const r = plotsExample();

  it('the map has the seven isotherms asked for; the plate matches the Fourier series (Carslaw & Jaeger 1959, §5.2)', () => {
    expect(r.isotherms).toBe(7);
    // second order with dx = 6.25 mm and dy ≤ 6 mm: 0.035 K at the time of writing; the order itself
    // is proven in test/verify — this guards the example's statement "a few hundredths of a kelvin"
    expect(r.plateError).toBeLessThan(0.1);
  });

  it('the wall mid-point follows the semi-infinite solid early on (Carslaw & Jaeger 1959, §2.4)', () => {
    // after 2 h the heat has gone 2√(αt) ≈ 0.15 m of the 0.2 m wall: the far face is barely felt, so
    // 20 + 100·erfc(0.1/(2√(αt))) holds to within 1 K
    const alpha = 1.4 / 1.9e6;
    const want = 20 + 100 * erfc(0.1 / (2 * Math.sqrt(alpha * 7200)));
    expect(Math.abs(r.wallMidAfter2h - want)).toBeLessThanOrEqual(1);
  });

  it('the study shows order 2', () => {
    expect(Math.abs(r.order - 2)).toBeLessThanOrEqual(0.1);
  });

  it('every plot is well-formed with no overlapping labels; the report holds them all with its caution', () => {
    for (const svg of [r.map, r.profile, r.history, r.convergence]) {
      const root = parseXml(svg);
      const boxes = textBoxes(root);
      expect(overlapping(boxes)).toEqual([]);
      expect(outside(boxes, Number(root.attrs['width']), Number(root.attrs['height']))).toEqual([]);
    }
    const page = parseXml(r.html);
    expect(elements(page, 'svg')).toHaveLength(4);
    expect(byClass(page, 'caution')).toHaveLength(1);
    expect(r.html).toContain('licensed engineering practice');
  });
});
