import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  MalformedCsvError, NonFiniteOutputError, convergenceStudy, fieldCsv, grid, probeCsv, readFieldCsv, sampleField,
  studyCsv, zeros,
} from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';

const plate = grid({ x: { from: 0, to: 1, cells: 2 }, y: { nodes: [0, 0.1, 0.4, 1] } });
// not symmetric in x and y, and with values that need 17 digits
const T = sampleField(plate, (x, y) => 300 + 10 * x + y / 3);
const q = sampleField(plate, (x, y) => -x * y * 0.1);

describe('fieldCsv (RFC 4180)', () => {
  it('header with names and units, one row per node, x slowest (y fastest)', () => {
    const text = fieldCsv(plate, [{ name: 'T', unit: 'K', field: T }, { name: 'q', unit: 'W/m²', field: q }]);
    const lines = text.split('\n');
    expect(lines[0]).toBe('x [m],y [m],T [K],q [W/m²]');
    expect(text.endsWith('\n')).toBe(true);
    expect(lines.length - 2).toBe(plate.size);
    const rows = lines.slice(1, -1).map((l) => l.split(',').map(Number));
    // row (i·ny + j) + 1 is node (i, j)
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 4; j++) {
        const r = rows[i * 4 + j]!;
        expect(r[0]).toBe(plate.x.coordinates[i]);
        expect(r[1]).toBe(plate.y!.coordinates[j]);
        expect(r[2]).toBe(T.get(i, j));
        expect(Object.is(r[3], q.get(i, j))).toBe(true);
      }
    }
    expect(lines[2]).toBe(`0,0.1,${300 + 0.1 / 3},-0`);
  });

  it('1-D and 3-D coordinate columns; lengthUnit; a strided view is read in node order', () => {
    const g1 = grid({ x: { from: 0, to: 1, cells: 2 } });
    expect(fieldCsv(g1, [{ name: 'u', field: sampleField(g1, (x) => 2 * x) }], { lengthUnit: '' })).toBe('x,u\n0,0\n0.5,1\n1,2\n');
    const g3 = grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 1, cells: 1 }, z: { from: 0, to: 2, cells: 2 } });
    const u = ndarray(Float64Array.from({ length: 12 }, (_, p) => p), [2, 2, 3]).step(-1, 1, 1);
    const lines = fieldCsv(g3, [{ name: 'u', field: u }], { lengthUnit: 'mm' }).trimEnd().split('\n');
    expect(lines[0]).toBe('x [mm],y [mm],z [mm],u');
    expect(lines.slice(1)).toEqual([
      '0,0,0,6', '0,0,1,7', '0,0,2,8', '0,1,0,9', '0,1,1,10', '0,1,2,11',
      '1,0,0,0', '1,0,1,1', '1,0,2,2', '1,1,0,3', '1,1,1,4', '1,1,2,5',
    ]);
  });

  it('periodic axes list the stored nodes only', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4, periodic: true } });
    expect(fieldCsv(g, [{ name: 'u', field: zeros(g) }]).trimEnd().split('\n').slice(1).map((l) => l.split(',')[0])).toEqual(['0', '0.25', '0.5', '0.75']);
  });

  it('names with commas and quotes are quoted (RFC 4180 §2.6–2.7) and read back', () => {
    const text = fieldCsv(plate, [{ name: 'T, "mean"', unit: '°C', field: T }]);
    expect(text.split('\n')[0]).toBe('x [m],y [m],"T, ""mean"" [°C]"');
    expect(readFieldCsv(text).fields[0]!.name).toBe('T, "mean"');
  });

  it('NaN refused by default with the count and the first node; empty cells on request', () => {
    const f = sampleField(plate, () => 1);
    f.set(1, 2, NaN);
    f.set(2, 0, -Infinity);
    const e = errorOf(() => fieldCsv(plate, [{ name: 'T', field: f }]));
    expect(e).toBeInstanceOf(NonFiniteOutputError);
    const n = e as NonFiniteOutputError;
    expect([n.count, n.index]).toEqual([2, [1, 2]]);
    expect(n.message).toMatch(/x = 0\.5, y = 0\.4/);
    expect(n.message).toMatch(/nonFinite: 'empty'/);
    const text = fieldCsv(plate, [{ name: 'T', field: f }], { nonFinite: 'empty' });
    expect(text.split('\n')[1 + 1 * 4 + 2]).toBe('0.5,0.4,');
    expect(text.split('\n')[1 + 2 * 4]).toBe('1,0,');
    const back = readFieldCsv(text).fields[0]!.field;
    expect(back.get(1, 2)).toBeNaN();
    expect(back.get(2, 0)).toBeNaN();
    expect(back.get(0, 0)).toBe(1);
  });

  it('refuses bad input: shape, names, units, policy', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 3 } });
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T', field: zeros(g) }]))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => fieldCsv(plate, []))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'y', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T', field: T }, { name: 'T', field: q }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T\n', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T[1]', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T', unit: 'K]', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => fieldCsv(plate, [{ name: 'T', field: T }], { nonFinite: 'zero' as 'empty' }))).toBe('INVALID_OPTION');
  });
});

describe('readFieldCsv', () => {
  it('round-trips axes, units and values exactly (2-D stretched, 3-D, CRLF)', () => {
    const text = fieldCsv(plate, [{ name: 'T', unit: 'K', field: T }, { name: 'q', field: q }]);
    const t = readFieldCsv(text);
    expect(t.shape).toEqual([3, 4]);
    expect(t.axes.map((a) => [a.name, a.unit])).toEqual([['x', 'm'], ['y', 'm']]);
    expect(Array.from(t.axes[1]!.coordinates)).toEqual(Array.from(plate.y!.coordinates));
    expect(t.fields.map((f) => [f.name, f.unit])).toEqual([['T', 'K'], ['q', undefined]]);
    for (let p = 0; p < plate.size; p++) {
      expect(Object.is(t.fields[0]!.field.data[p], T.data[p])).toBe(true);
      expect(Object.is(t.fields[1]!.field.data[p], q.data[p])).toBe(true);
    }
    const g3 = grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 3, cells: 3 }, z: { nodes: [0, 1e-9, 1] } });
    const u = sampleField(g3, (x, y, z) => Math.exp(x) * Math.sin(y) + z);
    const t3 = readFieldCsv(fieldCsv(g3, [{ name: 'u', field: u }]).replace(/\n/g, '\r\n'));
    expect(t3.shape).toEqual([3, 4, 3]);
    expect(Array.from(t3.fields[0]!.field.data)).toEqual(Array.from(u.data));
  });

  const malformed: [string, string, number][] = [
    ['empty text', '', 1],
    ['no coordinate column', 'T,x\n1,0\n', 1],
    ['coordinates only', 'x,y\n0,0\n', 1],
    ['no data', 'x,T\n', 2],
    ['a short row', 'x,T\n0,1\n1\n', 3],
    ['a long row', 'x,T\n0,1\n1,2,3\n', 3],
    ['a non-number', 'x,T\n0,1\n1,abc\n', 3],
    ['an empty coordinate', 'x,T\n0,1\n,2\n', 3],
    ['an unclosed quote', 'x,"T\n0,1\n', 1],
    ['a stray quote', 'x,T\n0,1\n1,2"\n', 3],
    ['rows out of order', 'x,y,T\n0,0,1\n0,1,1\n1,1,1\n1,0,1\n', 4],
    ['a ragged grid (one past the end)', 'x,y,T\n0,0,1\n0,1,1\n1,0,1\n', 5],
    ['rows beyond the grid', 'x,T\n0,1\n1,1\n0.5,1\n', 4],
  ];
  for (const [what, text, line] of malformed) {
    it(`rejects ${what} at line ${line}`, () => {
      const e = errorOf(() => readFieldCsv(text));
      expect(e).toBeInstanceOf(MalformedCsvError);
      expect((e as MalformedCsvError).line).toBe(line);
    });
  }
});

describe('probeCsv', () => {
  const run = {
    times: Float64Array.of(0, 60, 120),
    probes: [
      { point: [0.1, 0.25], values: Float64Array.of(20, 20.5, 21.125) },
      { point: [0.5, 0], values: Float64Array.of(20, 19.75, 1 / 3) },
    ],
  };

  it('a time column then one column per probe, one row per record', () => {
    expect(probeCsv(run, { unit: 'K' })).toBe(
      `t [s],u(0.1;0.25) [K],u(0.5;0) [K]\n0,20,20\n60,20.5,19.75\n120,21.125,${1 / 3}\n`,
    );
    expect(probeCsv(run, { names: ['mid', 'edge'], timeUnit: 'h' }).split('\n')[0]).toBe('t [h],mid,edge');
  });

  it('refuses NaN (or writes empty cells on request), misaligned series, bad names', () => {
    const bad = { times: run.times, probes: [{ point: [0], values: Float64Array.of(1, NaN, 2) }] };
    expect(codeOf(() => probeCsv(bad))).toBe('NON_FINITE_OUTPUT');
    expect(probeCsv(bad, { nonFinite: 'empty' }).split('\n')[2]).toBe('60,');
    expect(codeOf(() => probeCsv({ times: run.times, probes: [{ point: [0], values: Float64Array.of(1) }] }))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => probeCsv(run, { names: ['a'] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => probeCsv(run, { names: ['t', 'b'] }))).toBe('INVALID_OPTION');
  });
});

describe('convergence tables', () => {
  it('studyCsv already writes them; the io layer adds no second writer', () => {
    const s = convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.4, 0.2, 0.1] });
    expect(studyCsv(s).split('\n')[0]).toBe('level,h,linf,linf_order');
  });
});
