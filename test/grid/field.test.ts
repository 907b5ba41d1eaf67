/**
 * Fields: C-order layout with x slowest (checked through ndarray strides),
 * sampling, copying, and the shape / type / finiteness checks.
 */
import fc from 'fast-check';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { copyField, grid, sampleField, zeros } from '../../src/grid/index.js';
import { SEED, expectCode } from './helpers.js';

const axis = (cells: number) => ({ from: 0, to: 1, cells });

describe('field layout: x slowest, last axis fastest', () => {
  it('zeros has the grid shape and C-order strides (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 1, maxLength: 3 }), (cells) => {
        const spec = cells.length === 1 ? { x: axis(cells[0]!) }
          : cells.length === 2 ? { x: axis(cells[0]!), y: axis(cells[1]!) }
            : { x: axis(cells[0]!), y: axis(cells[1]!), z: axis(cells[2]!) };
        const g = grid(spec);
        const f = zeros(g);
        expect(f.shape).toEqual([...g.shape]);
        expect(f.data.length).toBe(g.size);
        expect(f.offset).toBe(0);
        const n = cells.map((c) => c + 1);
        const want = n.length === 1 ? [1] : n.length === 2 ? [n[1], 1] : [n[1]! * n[2]!, n[2], 1];
        expect(f.stride).toEqual(want);
        expect(Array.from(f.data).every((v) => v === 0)).toBe(true);
      }),
      { seed: SEED, numRuns: 100 },
    );
  });

  it('element (i, j, k) is data[(i·ny + j)·nz + k] and holds f(xᵢ, yⱼ, z_k)', () => {
    const g = grid({ x: axis(2), y: { nodes: [0, 0.25, 1] }, z: { from: 0, to: 4, cells: 4, periodic: true } });
    const f = sampleField(g, (x, y, z) => 100 * x + 10 * y + z);
    const [nx, ny, nz] = g.shape;
    expect([nx, ny, nz]).toEqual([3, 3, 4]);
    for (let i = 0; i < nx; i++) {
      for (let j = 0; j < ny; j++) {
        for (let k = 0; k < nz; k++) {
          const want = 100 * g.x.coordinates[i]! + 10 * g.y.coordinates[j]! + g.z.coordinates[k]!;
          expect(f.data[(i * ny + j) * nz + k]).toBe(want);
          expect(f.get(i, j, k)).toBe(want);
        }
      }
    }
  });

  it('1-D and 2-D sampling pass exactly the coordinates of the axes present', () => {
    const g1 = grid({ x: axis(4) });
    const args: number[][] = [];
    sampleField(g1, (...a: number[]) => { args.push(a); return 0; });
    expect(args).toEqual([[0], [0.25], [0.5], [0.75], [1]]);
    const g2 = grid({ x: axis(1), y: axis(2) });
    const f = sampleField(g2, (x, y) => x - y);
    expect(Array.from(f.data)).toEqual([0, -0.5, -1, 1, 0.5, 0]);
  });

  it('sampleField writes into `out` of any strides and returns it', () => {
    const g = grid({ x: axis(2), y: axis(3) });
    // a transposed view: shape [3, 4], strides [1, 3]
    const out = ndarray(new Float64Array(12), [4, 3]).transpose(1, 0);
    const r = sampleField(g, (x, y) => x + 2 * y, out);
    expect(r).toBe(out);
    expect(out.get(2, 3)).toBe(1 + 2);
    expect(out.data[3 * 3 + 2]).toBe(3); // element (i = 2, j = 3) lives at j·3 + i
  });

  it('sampleField refuses non-finite values and a wrong `out`', () => {
    const g = grid({ x: axis(2), y: axis(2) });
    const e = expectCode(() => sampleField(g, (x, y) => (x === 0.5 && y === 1 ? NaN : 1)), 'NON_FINITE');
    expect(e.message).toContain('fn(0.5, 1)');
    expectCode(() => sampleField(g, () => Infinity), 'NON_FINITE');
    expectCode(() => sampleField(g, () => 0, ndarray(new Float64Array(9), [3, 3]).hi(3, 2)), 'SHAPE_MISMATCH');
    expectCode(() => sampleField(g, () => 0, ndarray(new Float64Array(9), [9])), 'SHAPE_MISMATCH');
    expectCode(() => sampleField(g, () => 0, ndarray(new Float32Array(9), [3, 3]) as never), 'INVALID_FIELD');
  });
});

describe('copyField', () => {
  it('copies a strided view into new contiguous storage, source untouched', () => {
    const g = grid({ x: axis(3), y: axis(4) });
    const f = sampleField(g, (x, y) => 10 * x + y);
    const view = f.step(2, -1); // every other x, y reversed
    const c = copyField(view);
    expect(c.shape).toEqual([2, 5]);
    expect(c.stride).toEqual([5, 1]);
    for (let i = 0; i < 2; i++) for (let j = 0; j < 5; j++) expect(c.get(i, j)).toBe(view.get(i, j));
    c.set(0, 0, -1);
    expect(f.get(0, 4)).toBe(1);
  });

  it('copies 0-D, 1-D and 3-D views and into `out`', () => {
    const g = grid({ x: axis(1), y: axis(1), z: axis(2) });
    const f = sampleField(g, (x, y, z) => x + 2 * y + 4 * z);
    const c3 = copyField(f);
    expect(Array.from(c3.data)).toEqual(Array.from(f.data));
    expect(c3.data).not.toBe(f.data);
    const c1 = copyField(f.pick(1, 1, null));
    expect(Array.from(c1.data)).toEqual([3, 5, 7]);
    const c0 = copyField(f.pick(1, 0, 2));
    expect(c0.shape).toEqual([]);
    expect(c0.get()).toBe(5);
    const out = zeros(g);
    expect(copyField(f, out)).toBe(out);
    expect(Array.from(out.data)).toEqual(Array.from(f.data));
  });

  it('refuses mismatched shapes, non-fields and more than 3 axes', () => {
    const g = grid({ x: axis(2) });
    expectCode(() => copyField(zeros(g), ndarray(new Float64Array(2), [2])), 'SHAPE_MISMATCH');
    expectCode(() => copyField(Float64Array.of(1, 2) as never), 'INVALID_FIELD');
    expectCode(() => copyField({ data: new Float64Array(2) } as never), 'INVALID_FIELD');
    expectCode(() => copyField(null as never), 'INVALID_FIELD');
    expectCode(() => copyField(ndarray(new Float64Array(16), [2, 2, 2, 2])), 'SHAPE_MISMATCH');
  });
});
