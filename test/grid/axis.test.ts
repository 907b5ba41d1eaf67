/**
 * Axes: coordinates, spacing and cell widths of uniform, stretched and
 * periodic axes, and the errors for bad descriptions.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { grid } from '../../src/grid/index.js';
import { SEED, eps, expectCode } from './helpers.js';

describe('uniform axis', () => {
  it('has cells + 1 nodes from + i·dx, both ends exact', () => {
    const g = grid({ x: { from: -1, to: 2, cells: 6 } });
    const x = g.x;
    expect(x.uniform).toBe(true);
    expect(x.periodic).toBe(false);
    expect(x.count).toBe(7);
    expect(x.cells).toBe(6);
    expect(x.spacing).toBe(0.5);
    expect(g.dx).toBe(0.5);
    expect(Array.from(x.coordinates)).toEqual([-1, -0.5, 0, 0.5, 1, 1.5, 2]);
    expect(Array.from(x.widths)).toEqual([0.5, 0.5, 0.5, 0.5, 0.5, 0.5]);
    expect([x.from, x.to]).toEqual([-1, 2]);
  });

  it('coordinates are from + i·dx to a few ulps and the last node is `to` exactly (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e3, noNaN: true }),
        fc.integer({ min: 1, max: 300 }),
        (from, length, cells) => {
          const to = from + length;
          fc.pre(to > from);
          const a = grid({ x: { from, to, cells } }).x;
          const h = (to - from) / cells;
          expect(a.count).toBe(cells + 1);
          expect(a.coordinates[0]).toBe(from);
          expect(a.coordinates[cells]).toBe(to);
          for (let i = 1; i < a.count; i++) expect(a.coordinates[i]).toBeGreaterThan(a.coordinates[i - 1]!);
          // Nodes i < cells are the formula itself. The last node is `to`, which the formula
          // misses by the rounding of h (ε/2·h, times cells: ε/2·L), of i·h (ε/2·L) and of the
          // sum (ε/2·max(|from|, |to|)); with L ≤ 2·max(|from|, |to|) that is ≤ 2.5·ε·scale.
          const scale = Math.max(Math.abs(from), Math.abs(to));
          for (let i = 1; i < cells; i++) expect(a.coordinates[i]).toBe(from + i * h);
          expect(Math.abs(a.coordinates[cells]! - (from + cells * h))).toBeLessThanOrEqual(3 * eps * scale);
        }),
      { seed: SEED, numRuns: 200 },
    );
  });

  it('periodic: n cells give n stored nodes, the node at `to` is the node at `from`', () => {
    const g = grid({ x: { from: 0, to: 2 * Math.PI, cells: 8, periodic: true } });
    const x = g.x;
    expect(x.periodic).toBe(true);
    expect(x.count).toBe(8);
    expect(g.nx).toBe(8);
    expect(x.cells).toBe(8);
    expect(x.spacing).toBe((2 * Math.PI) / 8);
    expect(x.coordinates.length).toBe(8);
    expect(x.coordinates[0]).toBe(0);
    expect(x.coordinates[7]).toBe(7 * ((2 * Math.PI) / 8));
    expect(x.widths.length).toBe(8); // the eighth is the wrap-around cell
    expect(x.to).toBe(2 * Math.PI);
  });
});

describe('stretched axis', () => {
  it('keeps the given nodes (copied), widths are their differences', () => {
    const nodes = [0, 0.1, 0.3, 0.7, 1.5];
    const g = grid({ x: { nodes } });
    const x = g.x;
    expect(x.uniform).toBe(false);
    expect(x.spacing).toBeUndefined();
    expect(g.dx).toBeUndefined();
    expect(x.count).toBe(5);
    expect(x.cells).toBe(4);
    expect(Array.from(x.coordinates)).toEqual(nodes);
    expect(Array.from(x.widths)).toEqual([0.1 - 0, 0.3 - 0.1, 0.7 - 0.3, 1.5 - 0.7]);
    expect([x.from, x.to]).toEqual([0, 1.5]);
    nodes[1] = 42; // the grid owns a copy
    expect(x.coordinates[1]).toBe(0.1);
  });

  it('accepts a Float64Array and does not share it', () => {
    const nodes = Float64Array.of(1, 2, 4);
    const x = grid({ x: { nodes } }).x;
    expect(x.coordinates).not.toBe(nodes);
    nodes[0] = -5;
    expect(x.coordinates[0]).toBe(1);
  });

  it('periodic: the closed list x₀ … xₙ stores x₀ … xₙ₋₁, the last width wraps round', () => {
    const x = grid({ x: { nodes: [0, 1, 3, 6], periodic: true } }).x;
    expect(x.count).toBe(3);
    expect(x.cells).toBe(3);
    expect(Array.from(x.coordinates)).toEqual([0, 1, 3]);
    expect(Array.from(x.widths)).toEqual([1, 2, 3]);
    expect([x.from, x.to]).toEqual([0, 6]);
  });
});

describe('axis errors', () => {
  it('cells not a whole number ≥ 1 → INVALID_CELLS', () => {
    for (const cells of [0, -3, 1.5, NaN, Infinity]) {
      const e = expectCode(() => grid({ x: { from: 0, to: 1, cells } }), 'INVALID_CELLS');
      expect((e as unknown as { cells: number }).cells).toBe(cells);
    }
  });

  it('to ≤ from → INVALID_INTERVAL; non-finite ends → NON_FINITE', () => {
    expectCode(() => grid({ x: { from: 1, to: 1, cells: 4 } }), 'INVALID_INTERVAL');
    expectCode(() => grid({ x: { from: 2, to: 1, cells: 4 } }), 'INVALID_INTERVAL');
    expectCode(() => grid({ x: { from: NaN, to: 1, cells: 4 } }), 'NON_FINITE');
    expectCode(() => grid({ x: { from: 0, to: Infinity, cells: 4 } }), 'NON_FINITE');
  });

  it('a span that overflows or nodes that round together are refused', () => {
    expectCode(() => grid({ x: { from: -1e308, to: 1e308, cells: 4 } }), 'INVALID_SPACING');
    // spacing 0.25 is below half an ulp of 1e16 (2), so from + i·dx stalls
    expectCode(() => grid({ x: { from: 1e16, to: 1e16 + 2, cells: 8 } }), 'NON_INCREASING_NODES');
  });

  it('stretched nodes: too few, non-finite, not increasing', () => {
    expectCode(() => grid({ x: { nodes: [1] } }), 'TOO_FEW_NODES');
    expectCode(() => grid({ x: { nodes: [] } }), 'TOO_FEW_NODES');
    expectCode(() => grid({ x: { nodes: [0, NaN, 1] } }), 'NON_FINITE');
    const e = expectCode(() => grid({ x: { nodes: [0, 0.5, 0.5, 1] } }), 'NON_INCREASING_NODES');
    expect((e as unknown as { index: number }).index).toBe(2);
    expectCode(() => grid({ x: { nodes: [0, 2, 1] } }), 'NON_INCREASING_NODES');
    expectCode(() => grid({ x: { nodes: [-1e308, 1e308] } }), 'INVALID_SPACING');
  });

  it('mixed, incomplete or unknown options → INVALID_AXIS_SPEC', () => {
    const bad = (spec: unknown) => () => grid({ x: spec as { nodes: number[] } });
    expectCode(bad({ from: 0, to: 1, cells: 2, nodes: [0, 1] }), 'INVALID_AXIS_SPEC');
    expectCode(bad({ from: 0, cells: 2 }), 'INVALID_AXIS_SPEC');
    expectCode(bad({ from: 0, to: 1, cells: 2, periodic: 'yes' }), 'INVALID_AXIS_SPEC');
    expectCode(bad({ from: 0, to: 1, cells: '2' }), 'INVALID_AXIS_SPEC');
    expectCode(bad({ from: 0, to: 1, cells: 2, spacing: 0.5 }), 'INVALID_AXIS_SPEC');
    expectCode(bad({ nodes: 'abc' }), 'INVALID_AXIS_SPEC');
    expectCode(bad(null), 'INVALID_AXIS_SPEC');
    expectCode(bad({}), 'INVALID_AXIS_SPEC');
  });
});
