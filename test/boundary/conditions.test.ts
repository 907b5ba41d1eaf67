import { describe, expect, it } from 'vitest';
import { boundaryConditions, grid } from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';

const g2 = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4 } });
const zero = { kind: 'dirichlet', value: 0 } as const;

describe('boundaryConditions: validation', () => {
  it('accepts an object keyed by face and a list of entries naming several faces', () => {
    const a = boundaryConditions(g2, { xmin: zero, xmax: zero, ymin: zero, ymax: { kind: 'neumann', flux: 5 } });
    const b = boundaryConditions(g2, [{ faces: ['xmin', 'xmax', 'ymin'], ...zero }, { faces: 'ymax', kind: 'neumann', flux: 5 }]);
    expect(a.faces.map((f) => f.face)).toEqual(['xmin', 'xmax', 'ymin', 'ymax']);
    expect(b.faces.map((f) => [f.face, f.condition.kind])).toEqual(a.faces.map((f) => [f.face, f.condition.kind]));
  });
  it('refuses a face that does not exist, on this grid or at all', () => {
    expect(codeOf(() => boundaryConditions(g2, { xmin: zero, xmax: zero, ymin: zero, ymax: zero, zmin: zero }))).toBe('INVALID_OPTION');
    expect(codeOf(() => boundaryConditions(g2, { left: zero } as never))).toBe('UNKNOWN_FACE');
    const gp = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4, periodic: true } });
    expect(codeOf(() => boundaryConditions(gp, { xmin: zero, xmax: zero, ymin: zero }))).toBe('PERIODIC_FACE');
    expect(boundaryConditions(gp, { xmin: zero, xmax: zero }).faces.length).toBe(2);
  });
  it('refuses two conditions on one face and names the missing ones', () => {
    expect(codeOf(() => boundaryConditions(g2, [{ faces: ['xmin', 'xmax'], ...zero }, { faces: ['xmax', 'ymin', 'ymax'], ...zero }]))).toBe('DUPLICATE_CONDITION');
    const e = errorOf(() => boundaryConditions(g2, { xmin: zero, ymax: zero }));
    expect(e.code).toBe('MISSING_CONDITION');
    expect(e.message).toMatch(/xmax, ymin/);
    expect(e.message).toMatch(/flux: 0/);
  });
  it('refuses h ≤ 0, non-finite data and unknown kinds', () => {
    const rest = { xmax: zero, ymin: zero, ymax: zero };
    expect(codeOf(() => boundaryConditions(g2, { xmin: { kind: 'robin', h: 0, ambient: 20 }, ...rest }))).toBe('INVALID_COEFFICIENT');
    expect(codeOf(() => boundaryConditions(g2, { xmin: { kind: 'robin', h: -3, ambient: 20 }, ...rest }))).toBe('INVALID_COEFFICIENT');
    expect(codeOf(() => boundaryConditions(g2, { xmin: { kind: 'dirichlet', value: NaN }, ...rest }))).toBe('NON_FINITE');
    expect(codeOf(() => boundaryConditions(g2, { xmin: { kind: 'neumann', flux: Infinity }, ...rest }))).toBe('NON_FINITE');
    expect(codeOf(() => boundaryConditions(g2, { xmin: { kind: 'heat' } as never, ...rest }))).toBe('INVALID_OPTION');
  });
});
