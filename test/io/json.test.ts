import { describe, expect, it } from 'vitest';
import {
  MalformedJsonError, checkpointFromJson, checkpointToJson, grid, runResultJson, solveTransient, solveWave,
  type Checkpoint,
} from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';

const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 0.5, cells: 4 } });
const plate = {
  grid: g,
  initial: (x: number, y: number) => Math.sin(Math.PI * x) * (1 + y) + 1 / 3,
  boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }],
} as const;
const opts = { scheme: 'crank-nicolson', dt: 0.005, endTime: 0.1, probes: [[0.5, 0.25], [0.1, 0.4]], outputTimes: [0.05, 0.1] } as const;

function expectSameCheckpoint(got: Checkpoint, want: Checkpoint): void {
  const { state: gs, ...gm } = got;
  const { state: ws, ...wm } = want;
  expect(gm).toEqual(wm);
  expect(gs.length).toBe(ws.length);
  ws.forEach((w, k) => {
    expect(gs[k]!.length).toBe(w.length);
    for (let i = 0; i < w.length; i++) if (!Object.is(gs[k]![i], w[i])) expect.fail(`state[${k}][${i}]: ${gs[k]![i]} ≠ ${w[i]}`);
  });
}

describe('checkpointToJson / checkpointFromJson', () => {
  it('documented form: keys in order, valid JSON, values exact; resume from it continues bit for bit', () => {
    const full = solveTransient(plate, opts);
    const ac = new AbortController();
    const half = solveTransient(plate, { ...opts, signal: ac.signal, onStep: (v) => { if (v.step === 9) ac.abort(); } });
    const text = checkpointToJson(half.checkpoint);
    expect(Object.keys(JSON.parse(text))).toEqual(['format', 'version', 'scheme', 'startTime', 'endTime', 'dt', 'step', 'time', 'state']);
    const cp = checkpointFromJson(text);
    expectSameCheckpoint(cp, half.checkpoint);
    const rest = solveTransient(plate, { ...opts, resume: cp });
    expect(Array.from(rest.field.data)).toEqual(Array.from(full.field.data));
  });

  it('leapfrog: both levels round-trip', () => {
    const r = solveWave({ grid: g, initial: (x: number, y: number) => Math.sin(Math.PI * x) * y, boundary: plate.boundary }, { dt: 0.01, endTime: 0.05 });
    expect(r.checkpoint.state.length).toBe(2);
    expectSameCheckpoint(checkpointFromJson(checkpointToJson(r.checkpoint)), r.checkpoint);
  });

  it('extreme values, −0 included, survive exactly', () => {
    const c: Checkpoint = {
      format: 'quadrille-checkpoint', version: 1, scheme: 'θ = 0.6 "custom"', startTime: -1e-300, endTime: 1e21, dt: 0.1 + 0.2,
      step: 3, time: 5e-324, state: [Float64Array.of(-0, 0, 5e-324, -1.7976931348623157e308, 1 / 3), new Float64Array(0)],
    };
    expectSameCheckpoint(checkpointFromJson(checkpointToJson(c)), c);
  });

  it('NaN and ±Infinity are refused on writing', () => {
    const c: Checkpoint = {
      format: 'quadrille-checkpoint', version: 1, scheme: 'x', startTime: 0, endTime: 1, dt: 0.1, step: 1, time: 0.1,
      state: [Float64Array.of(1, NaN, Infinity)],
    };
    const e = errorOf(() => checkpointToJson(c));
    expect(e.code).toBe('NON_FINITE_OUTPUT');
    expect(e.message).toMatch(/state\[0\] holds 2 non-finite value\(s\); the first is NaN at index 1/);
    expect(codeOf(() => checkpointToJson({ ...c, state: [Float64Array.of(1)], time: Infinity }))).toBe('NON_FINITE_OUTPUT');
  });

  const good = JSON.parse(checkpointToJson({
    format: 'quadrille-checkpoint', version: 1, scheme: 'backward-euler', startTime: 0, endTime: 1, dt: 0.5, step: 1, time: 0.5,
    state: [Float64Array.of(1, 2)],
  })) as Record<string, unknown>;
  const malformed: [string, string, string][] = [
    ['not JSON', '{"format": ', '$'],
    ['an array', '[]', '$'],
    ['a wrong format tag', JSON.stringify({ ...good, format: 'other' }), 'format'],
    ['an unknown version', JSON.stringify({ ...good, version: 2 }), 'version'],
    ['a missing key', JSON.stringify({ ...good, dt: undefined }), 'dt'],
    ['an unknown key', JSON.stringify({ ...good, extra: 1 }), 'extra'],
    ['a string number', JSON.stringify({ ...good, endTime: '1' }), 'endTime'],
    ['an overflowing number', JSON.stringify(good).replace('"endTime":1', '"endTime":1e400'), 'endTime'],
    ['a fractional step', JSON.stringify({ ...good, step: 1.5 }), 'step'],
    ['an empty state', JSON.stringify({ ...good, state: [] }), 'state'],
    ['a bad state value', JSON.stringify({ ...good, state: [[1, 2], [3, null]] }), 'state[1][1]'],
  ];
  for (const [what, text, path] of malformed) {
    it(`checkpointFromJson rejects ${what} at ${path}`, () => {
      const e = errorOf(() => checkpointFromJson(text));
      expect(e).toBeInstanceOf(MalformedJsonError);
      expect((e as MalformedJsonError).path).toBe(path);
    });
  }
});

describe('runResultJson', () => {
  it('run metadata, times, probes and output metadata, exact', () => {
    const r = solveTransient(plate, opts);
    const doc = JSON.parse(runResultJson(r, { outputFiles: ['a_0000.vti', 'a_0001.vti'] })) as {
      format: string; version: number; scheme: string; time: number; steps: number; dt: number; aborted: boolean;
      iterations: number; seconds: number; shape: number[]; times: number[];
      probes: { point: number[]; values: number[] }[]; outputs: { time: number; shape: number[]; file?: string }[];
    };
    expect(Object.keys(doc)).toEqual(['format', 'version', 'scheme', 'time', 'steps', 'dt', 'aborted', 'iterations', 'seconds', 'shape', 'times', 'probes', 'outputs']);
    expect([doc.format, doc.version, doc.scheme, doc.time, doc.steps, doc.dt, doc.aborted]).toEqual(['quadrille-run', 1, r.scheme, r.time, r.steps, r.dt, false]);
    expect(doc.shape).toEqual([9, 5]);
    expect(doc.times).toEqual(Array.from(r.times));
    expect(doc.probes.map((p) => p.point)).toEqual([[0.5, 0.25], [0.1, 0.4]]);
    expect(doc.probes[1]!.values).toEqual(Array.from(r.probes[1]!.values));
    expect(doc.outputs).toEqual([{ time: 0.05, shape: [9, 5], file: 'a_0000.vti' }, { time: 0.1, shape: [9, 5], file: 'a_0001.vti' }]);
    expect(JSON.parse(runResultJson(r)).outputs[0]).toEqual({ time: 0.05, shape: [9, 5] });
    expect(codeOf(() => runResultJson(r, { outputFiles: ['one'] }))).toBe('INVALID_OPTION');
  });
});
