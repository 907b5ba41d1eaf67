/**
 * Grids: dimension from the axes given, shape and size, per-axis names
 * (nx, dx, …), immutability, and errors for unknown or missing axes.
 */
import { describe, expect, it } from 'vitest';
import { axisOf, grid } from '../../src/grid/index.js';
import { expectCode } from './helpers.js';

const ux = { from: 0, to: 1, cells: 4 } as const;

describe('grid', () => {
  it('1-D: shape [nx], no y or z', () => {
    const g = grid({ x: ux });
    expect(g.dimension).toBe(1);
    expect(g.shape).toEqual([5]);
    expect(g.size).toBe(5);
    expect(g.axes.length).toBe(1);
    expect(g.y).toBeUndefined();
    expect(g.z).toBeUndefined();
    expect(g.ny).toBeUndefined();
    expect(g.dy).toBeUndefined();
  });

  it('2-D: shape [nx, ny], axes x then y', () => {
    const g = grid({ x: ux, y: { nodes: [0, 0.2, 1] } });
    expect(g.dimension).toBe(2);
    expect(g.shape).toEqual([5, 3]);
    expect(g.size).toBe(15);
    expect([g.nx, g.ny]).toEqual([5, 3]);
    expect(g.dx).toBe(0.25);
    expect(g.dy).toBeUndefined(); // stretched
    expect(g.y.name).toBe('y');
    expect(g.axes[1]).toBe(g.y);
  });

  it('3-D: shape [nx, ny, nz], periodic axes store cells nodes', () => {
    const g = grid({ x: ux, y: { from: 0, to: 2, cells: 2 }, z: { from: 0, to: 3, cells: 6, periodic: true } });
    expect(g.dimension).toBe(3);
    expect(g.shape).toEqual([5, 3, 6]);
    expect(g.size).toBe(90);
    expect([g.nx, g.ny, g.nz]).toEqual([5, 3, 6]);
    expect([g.dx, g.dy, g.dz]).toEqual([0.25, 1, 0.5]);
    expect(g.z.periodic).toBe(true);
  });

  it('is frozen: grid, axes list, shape and axes', () => {
    const g = grid({ x: ux, y: ux });
    expect(Object.isFrozen(g)).toBe(true);
    expect(Object.isFrozen(g.axes)).toBe(true);
    expect(Object.isFrozen(g.shape)).toBe(true);
    expect(Object.isFrozen(g.x)).toBe(true);
    expect(() => { (g as { nx: number }).nx = 3; }).toThrow(TypeError);
  });

  it('axisOf finds an axis by name', () => {
    const g = grid({ x: ux, y: { from: 0, to: 1, cells: 2 } });
    expect(axisOf(g, 'y')).toBe(g.y);
    expect(axisOf(g, 'x')).toBe(g.x);
    expectCode(() => axisOf(g, 'z'), 'MISSING_AXIS');
    expectCode(() => axisOf(g, 'w' as 'x'), 'UNKNOWN_AXIS');
  });

  it('unknown axis names → UNKNOWN_AXIS, gaps → MISSING_AXIS', () => {
    const e = expectCode(() => grid({ x: ux, w: ux } as unknown as { x: typeof ux }), 'UNKNOWN_AXIS');
    expect((e as unknown as { axis: string }).axis).toBe('w');
    expectCode(() => grid({ X: ux } as unknown as { x: typeof ux }), 'UNKNOWN_AXIS');
    const m = expectCode(() => grid({ y: ux } as unknown as { x: typeof ux }), 'MISSING_AXIS');
    expect((m as unknown as { axis: string }).axis).toBe('x');
    const m2 = expectCode(() => grid({ x: ux, z: ux } as unknown as { x: typeof ux }), 'MISSING_AXIS');
    expect((m2 as unknown as { axis: string }).axis).toBe('y');
    expectCode(() => grid({} as unknown as { x: typeof ux }), 'MISSING_AXIS');
    expectCode(() => grid(null as unknown as { x: typeof ux }), 'MISSING_AXIS');
  });

  it('reports errors of an axis with its name', () => {
    const e = expectCode(() => grid({ x: ux, y: { from: 0, to: 1, cells: 0 } }), 'INVALID_CELLS');
    expect(e.message).toContain('axis y');
  });
});
