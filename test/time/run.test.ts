import { describe, expect, it } from 'vitest';
import { checkpointFromBytes, checkpointToBytes, grid, solveTransient, solveWave } from '../../src/index.js';
import { codeOf } from '../support/errors.js';

const g2 = grid({ x: { from: 0, to: 1, cells: 16 }, y: { from: 0, to: 1, cells: 16 } });
const plate = {
  grid: g2,
  initial: (x: number, y: number) => 20 + 10 * x * y,
  boundary: [
    { faces: 'xmin', kind: 'dirichlet', value: (x: number, y: number, t: number) => 20 + 30 * Math.min(t / 0.05, 1) },
    { faces: ['xmax', 'ymin', 'ymax'], kind: 'robin', h: 4, ambient: 20 },
  ],
  source: (x: number, y: number, t: number) => 100 * Math.exp(-t),
} as const;

describe('run driver', () => {
  it('ends exactly at the end time with equal steps no larger than asked', () => {
    const r = solveTransient(plate, { scheme: 'crank-nicolson', dt: 0.03, endTime: 0.1 });
    expect(r.steps).toBe(4);
    expect(r.dt).toBe(0.025);
    expect(r.time).toBe(0.1);
  });
  it('checkpoint and resume continue bit for bit (as bytes too)', () => {
    const opts = { scheme: 'crank-nicolson', dt: 0.005, endTime: 0.2, probes: [[0.5, 0.5]], rannacherSteps: 2 } as const;
    const full = solveTransient(plate, opts);
    const controller = new AbortController();
    const half = solveTransient(plate, { ...opts, onStep: (v) => { if (v.step === 17) controller.abort(); }, signal: controller.signal });
    expect(half.aborted).toBe(true);
    expect(half.steps).toBe(17);
    const cp = checkpointFromBytes(checkpointToBytes(half.checkpoint));
    const rest = solveTransient(plate, { ...opts, resume: cp });
    expect(rest.steps).toBe(full.steps);
    expect(rest.aborted).toBe(false);
    expect(Array.from(rest.field.data)).toEqual(Array.from(full.field.data));
    expect(rest.probes[0]!.values[rest.probes[0]!.values.length - 1]).toBe(full.probes[0]!.values[full.probes[0]!.values.length - 1]);
  });
  it('leapfrog resumes bit for bit from its two levels', () => {
    const wave = { grid: g2, initial: (x: number, y: number) => Math.sin(Math.PI * x) * Math.sin(2 * Math.PI * y), boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] } as const;
    const opts = { dt: 0.01, endTime: 0.5 };
    const full = solveWave(wave, opts);
    const ac = new AbortController();
    const part = solveWave(wave, { ...opts, signal: ac.signal, onStep: (v) => { if (v.step === 21) ac.abort(); } });
    const rest = solveWave(wave, { ...opts, resume: part.checkpoint });
    expect(Array.from(rest.field.data)).toEqual(Array.from(full.field.data));
  });
  it('abort stops within one step and returns what was computed', () => {
    const ac = new AbortController();
    ac.abort();
    const r = solveTransient(plate, { scheme: 'backward-euler', dt: 0.01, endTime: 1, signal: ac.signal });
    expect(r.aborted).toBe(true);
    expect(r.steps).toBe(0);
    expect(r.time).toBe(0);
  });
  it('outputs at requested times are interpolated between steps; probes record every step; progress reaches 1', () => {
    const seen: number[] = [];
    const r = solveTransient(plate, {
      scheme: 'crank-nicolson', dt: 0.01, endTime: 0.1, outputTimes: [0, 0.025, 0.1], probes: [[0.25, 0.75], [1, 0]],
      onProgress: (p) => seen.push(p.fraction),
    });
    expect(r.outputs.map((o) => o.time)).toEqual([0, 0.025, 0.1]);
    expect(r.outputs[0]!.field.get(8, 8)).toBe(20 + 10 * 0.25);
    expect(Array.from(r.outputs[2]!.field.data)).toEqual(Array.from(r.field.data));
    expect(r.times.length).toBe(11);
    expect(r.probes[0]!.values[0]).toBe(20 + 10 * 0.25 * 0.75);
    expect(seen[seen.length - 1]).toBe(1);
    // the value at the midpoint output lies between the two steps around it
    const p = r.outputs[1]!.field.get(0, 8);
    expect(p).toBeGreaterThan(20);
  });
  it('detects a blow-up at the step where it appears', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 10 } });
    const e = codeOf(() => solveTransient(
      { grid: g, initial: (x) => Math.sin(7 * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] },
      { scheme: 'forward-euler', dt: 0.02, endTime: 100, stabilityGuard: false },
    ));
    expect(e).toBe('BLOW_UP');
  });
  it('does not mistake large finite values for a blow-up (the driver checks Σ0·u, not Σu, which overflows here)', () => {
    // sixteen nodes at 8e307: their sum overflows, every value stays finite (k and ρcV/dt keep every row below
    // overflow); K is banded, not tridiagonal, so the steps go through banded LU and the driver's own check
    // (the fused tridiagonal and leapfrog kernels report Σu, documented to overflow only at such sizes)
    const g = grid({ x: { from: 0, to: 1, cells: 3 }, y: { from: 0, to: 1, cells: 3 } });
    const r = solveTransient(
      { grid: g, conductivity: 0.1, initial: 8e307, boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 8e307 }] },
      { scheme: 'backward-euler', dt: 1, endTime: 2, solver: 'direct' },
    );
    expect(r.solver).toBe('banded-lu');
    expect(r.steps).toBe(2);
    expect(r.field.get(1, 1) / 8e307).toBeCloseTo(1, 12);
  });
  it('refuses bad options', () => {
    expect(codeOf(() => solveTransient(plate, { scheme: 'crank-nicolson', dt: 0, endTime: 1 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => solveTransient(plate, { scheme: { theta: 1.5 }, dt: 0.1, endTime: 1 }))).toBe('INVALID_OPTION');
    expect(codeOf(() => solveTransient(plate, { scheme: 'crank-nicolson', dt: 0.1, endTime: 1, outputTimes: [2] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => solveTransient(plate, { scheme: 'crank-nicolson', dt: 0.1, endTime: 1, probes: [[2, 0]] }))).toBe('INVALID_OPTION');
    expect(codeOf(() => checkpointFromBytes(new Uint8Array(10)))).toBe('INVALID_OPTION');
  });
});
