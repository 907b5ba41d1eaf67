/**
 * Face and interior views: shapes, which nodes they hold, that they share
 * the field's storage, and their errors.
 */
import fc from 'fast-check';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  type FaceName, boundaryFaces, copyField, faceView, grid, interiorView, sampleField, zeros,
} from '../../src/grid/index.js';
import { SEED, expectCode } from './helpers.js';

const axis = (cells: number, periodic = false) => ({ from: 0, to: cells, cells, periodic });

describe('faceView', () => {
  const g = grid({ x: axis(2), y: axis(3), z: axis(4) }); // shape [3, 4, 5], node (i, j, k) at (i, j, k)
  const code = (x: number, y: number, z: number) => 100 * x + 10 * y + z;

  it('3-D faces drop their axis and keep the others in order', () => {
    const f = sampleField(g, code);
    const cases: Array<[FaceName, number[], (a: number, b: number) => number]> = [
      ['xmin', [4, 5], (j, k) => code(0, j, k)],
      ['xmax', [4, 5], (j, k) => code(2, j, k)],
      ['ymin', [3, 5], (i, k) => code(i, 0, k)],
      ['ymax', [3, 5], (i, k) => code(i, 3, k)],
      ['zmin', [3, 4], (i, j) => code(i, j, 0)],
      ['zmax', [3, 4], (i, j) => code(i, j, 4)],
    ];
    for (const [face, shape, want] of cases) {
      const v = faceView(g, f, face);
      expect(v.shape, face).toEqual(shape);
      expect(v.data).toBe(f.data);
      for (let a = 0; a < shape[0]!; a++) for (let b = 0; b < shape[1]!; b++) expect(v.get(a, b)).toBe(want(a, b));
    }
  });

  it('writes through a face reach the field, and nothing else changes (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom<FaceName>('xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'), fc.double({ min: -1, max: 1, noNaN: true }),
        (face, value) => {
          const f = sampleField(g, code);
          const before = copyField(f);
          const v = faceView(g, f, face);
          for (let a = 0; a < v.shape[0]!; a++) for (let b = 0; b < v.shape[1]!; b++) v.set(a, b, value);
          const d = ['x', 'y', 'z'].indexOf(face[0]!);
          const end = face.endsWith('min') ? 0 : g.shape[d]! - 1;
          for (let i = 0; i < 3; i++) {
            for (let j = 0; j < 4; j++) {
              for (let k = 0; k < 5; k++) {
                const onFace = [i, j, k][d] === end;
                expect(f.get(i, j, k)).toBe(onFace ? value : before.get(i, j, k));
              }
            }
          }
        }),
      { seed: SEED, numRuns: 60 },
    );
  });

  it('2-D faces are lines, 1-D faces are 0-D views', () => {
    const g2 = grid({ x: axis(2), y: axis(5) });
    const f2 = sampleField(g2, (x, y) => 10 * x + y);
    expect(faceView(g2, f2, 'xmin').shape).toEqual([6]);
    expect(faceView(g2, f2, 'ymax').shape).toEqual([3]);
    expect(faceView(g2, f2, 'ymax').get(2)).toBe(25);
    const g1 = grid({ x: axis(3) });
    const f1 = sampleField(g1, (x) => x + 1);
    const right = faceView(g1, f1, 'xmax');
    expect(right.shape).toEqual([]);
    expect(right.get()).toBe(4);
    right.set(-7);
    expect(f1.get(3)).toBe(-7);
  });

  it('works on a strided view of the right shape', () => {
    const g2 = grid({ x: axis(1), y: axis(2) });
    const f = ndarray(new Float64Array(6), [3, 2]).transpose(1, 0); // shape [2, 3], y slowest in memory
    faceView(g2, f, 'ymin').set(1, 9);
    expect(f.get(1, 0)).toBe(9);
    expect(f.data[1]).toBe(9);
  });

  it('errors: unknown face, axis the grid lacks, periodic axis, wrong shape', () => {
    const g2 = grid({ x: axis(2), y: axis(4, true) });
    const f = zeros(g2);
    expectCode(() => faceView(g2, f, 'x-' as FaceName), 'UNKNOWN_FACE');
    expectCode(() => faceView(g2, f, 'zmin'), 'MISSING_AXIS');
    const e = expectCode(() => faceView(g2, f, 'ymax'), 'PERIODIC_FACE');
    expect((e as unknown as { axis: string }).axis).toBe('y');
    expectCode(() => faceView(g2, zeros(grid({ x: axis(2), y: axis(4) })), 'xmin'), 'SHAPE_MISMATCH'); // [3, 5] vs [3, 4]
    expectCode(() => faceView(g2, new Float64Array(12) as never, 'xmin'), 'INVALID_FIELD');
  });
});

describe('boundaryFaces', () => {
  it('two per non-periodic axis, in order', () => {
    expect(boundaryFaces(grid({ x: axis(2) }))).toEqual(['xmin', 'xmax']);
    expect(boundaryFaces(grid({ x: axis(2), y: axis(2), z: axis(2) })))
      .toEqual(['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax']);
    expect(boundaryFaces(grid({ x: axis(2, true), y: axis(2) }))).toEqual(['ymin', 'ymax']);
  });
});

describe('interiorView', () => {
  it('strips the boundary nodes of non-periodic axes only, sharing data', () => {
    const g = grid({ x: axis(4), y: axis(5, true), z: axis(2) }); // shape [5, 5, 3]
    const f = sampleField(g, (x, y, z) => 100 * x + 10 * y + z);
    const v = interiorView(g, f);
    expect(v.shape).toEqual([3, 5, 1]);
    expect(v.data).toBe(f.data);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 5; j++) expect(v.get(i, j, 0)).toBe(100 * (i + 1) + 10 * j + 1);
    v.set(0, 0, 0, -1);
    expect(f.get(1, 0, 1)).toBe(-1);
  });

  it('is empty for a single cell and refuses a wrong shape', () => {
    const g = grid({ x: axis(1) });
    expect(interiorView(g, zeros(g)).shape).toEqual([0]);
    expectCode(() => interiorView(g, zeros(grid({ x: axis(2) }))), 'SHAPE_MISMATCH');
  });
});
