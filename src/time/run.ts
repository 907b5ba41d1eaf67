/**
 * The run driver: fixed steps from a start time to an end time, outputs at
 * requested times, probes, a per-step hook, progress, cancellation, blow-up
 * detection and checkpoints.
 *
 * Steps. The run takes N = ⌈(end − start)/dt⌉ equal steps of
 * dt' = (end − start)/N ≤ dt, so it ends exactly at `end` and never exceeds
 * the requested (or the stable) step; step n ends at start + n·dt', computed
 * from n, not summed, so a resumed run reproduces the times bit for bit.
 *
 * Outputs at requested times between two steps are linear interpolations of
 * the two levels (second-order accurate in time, like the schemes); probes
 * record the field at given points (multilinear interpolation in the cell)
 * after every step.
 *
 * @module
 */
import ndarray from 'ndarray';
import { BlowUpError, InvalidOptionError } from '../errors.js';
import type { Field, Grid } from '../grid/index.js';
import type { Stepper } from './stepper.js';

/** Progress of a run, passed to `onProgress`. */
export interface Progress {
  /** Fraction of the steps done, 0 … 1. */
  readonly fraction: number;
  /** Time reached (s). */
  readonly time: number;
  /** Steps done. */
  readonly step: number;
  /** Steps in the whole run. */
  readonly steps: number;
}

/** What a per-step hook sees; it may change `u` in place (custom models). */
export interface StepView {
  /** Time reached (s). */
  readonly time: number;
  /** Steps done. */
  readonly step: number;
  /** The current solution, one value per node (x slowest); writable. */
  readonly u: Float64Array;
}

/** Options of the run driver shared by every transient solve. */
export interface RunOptions {
  /** Start time (s), default 0. */
  readonly startTime?: number;
  /** End time (s), > start. */
  readonly endTime: number;
  /** Times (s) at which to keep a copy of the field (interpolated between steps). */
  readonly outputTimes?: readonly number[];
  /** Points (coordinates, as many as the grid has axes) at which to record a time series. */
  readonly probes?: readonly (readonly number[])[];
  /** Called after every step; may change the solution in place. */
  readonly onStep?: (view: StepView) => void;
  /** Called about every 1 % of the run and at its end. */
  readonly onProgress?: (p: Progress) => void;
  /** Stops the run within one step; the result is marked `aborted`. */
  readonly signal?: AbortSignal;
}

/** A snapshot of a run from which it can be resumed bit for bit. */
export interface Checkpoint {
  /** Format tag. */
  readonly format: 'quadrille-checkpoint';
  /** Format version. */
  readonly version: 1;
  /** The scheme that made it. */
  readonly scheme: string;
  /** Start time of the run (s). */
  readonly startTime: number;
  /** End time of the run (s). */
  readonly endTime: number;
  /** Step size actually used, dt' (s). */
  readonly dt: number;
  /** Steps done. */
  readonly step: number;
  /** Time reached (s). */
  readonly time: number;
  /** The stepper's state vectors (u, and the previous level for leapfrog). */
  readonly state: readonly Float64Array[];
}

/** The field at one output time. */
export interface Snapshot {
  /** The output time (s). */
  readonly time: number;
  /** The field then, shape `grid.shape`. */
  readonly field: Field;
}

/** A probe's recorded time series. */
export interface ProbeSeries {
  /** Where. */
  readonly point: readonly number[];
  /** Values after each recorded step, aligned with {@link RunResult.times}. */
  readonly values: Float64Array;
}

/** What a transient run returns. */
export interface RunResult {
  /** The solution at the last time reached, shape `grid.shape`. */
  readonly field: Field;
  /** The last time reached (s). */
  readonly time: number;
  /** Steps done in all (including steps before a resume). */
  readonly steps: number;
  /** Step size used (s). */
  readonly dt: number;
  /** True when stopped by the AbortSignal before the end time. */
  readonly aborted: boolean;
  /** The scheme. */
  readonly scheme: string;
  /** Fields at the requested output times reached. */
  readonly outputs: readonly Snapshot[];
  /** Times of the probe records: the start (or resume) time, then each step. */
  readonly times: Float64Array;
  /** One series per probe. */
  readonly probes: readonly ProbeSeries[];
  /** Linear-solver iterations summed over the run (0 for explicit and direct steps). */
  readonly iterations: number;
  /** Wall-clock seconds of the stepping loop. */
  readonly seconds: number;
  /** A checkpoint of the final state, to resume or to continue a run. */
  readonly checkpoint: Checkpoint;
}

/** Nodes and weights of a point for multilinear interpolation. @internal */
export function probeWeights(g: Grid, point: readonly number[]): { nodes: Int32Array; weights: Float64Array } {
  if (point.length !== g.dimension) {
    throw new InvalidOptionError('probes', `a probe needs ${g.dimension} coordinate(s), got [${point.join(', ')}]`);
  }
  let nodes = [0];
  let weights = [1];
  let stride = 1;
  const strides: number[] = [];
  for (let d = g.dimension - 1; d >= 0; d--) {
    strides[d] = stride;
    stride *= g.shape[d]!;
  }
  for (let d = 0; d < g.dimension; d++) {
    const ax = g.axes[d]!;
    const x = ax.coordinates;
    const p = point[d]!;
    const last = ax.periodic ? ax.to : x[x.length - 1]!;
    if (!(p >= ax.from && p <= last)) {
      throw new InvalidOptionError('probes', `coordinate ${p} is outside axis ${ax.name} [${ax.from}, ${last}]`);
    }
    let lo = 0;
    let hi = x.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (x[mid]! <= p) lo = mid;
      else hi = mid;
    }
    let i0 = lo;
    let i1 = Math.min(lo + 1, x.length - 1);
    let x0 = x[i0]!;
    let x1 = x[i1]!;
    if (ax.periodic && p >= x[x.length - 1]!) {
      i0 = x.length - 1;
      i1 = 0;
      x0 = x[i0]!;
      x1 = ax.to;
    }
    const s = x1 > x0 ? (p - x0) / (x1 - x0) : 0;
    const nn: number[] = [];
    const ww: number[] = [];
    for (let k = 0; k < nodes.length; k++) {
      nn.push(nodes[k]! + i0 * strides[d]!, nodes[k]! + i1 * strides[d]!);
      ww.push(weights[k]! * (1 - s), weights[k]! * s);
    }
    nodes = nn;
    weights = ww;
  }
  return { nodes: Int32Array.from(nodes), weights: Float64Array.from(weights) };
}

/** Step count and size of a run (module doc). @internal */
export function stepPlan(startTime: number, endTime: number, dt: number): { steps: number; dt: number } {
  if (!(Number.isFinite(startTime) && Number.isFinite(endTime) && endTime > startTime)) {
    throw new InvalidOptionError('endTime', `the run needs finite times with endTime > startTime, got ${startTime} → ${endTime}`);
  }
  if (!(Number.isFinite(dt) && dt > 0)) throw new InvalidOptionError('dt', `${dt} is not a step; give a finite dt > 0 (s)`);
  const span = endTime - startTime;
  // a ratio within rounding of a whole number is taken as that number
  const steps = Math.max(1, Math.ceil(span / dt - 1e-9));
  return { steps, dt: span / steps };
}

/**
 * Σ 0·uᵢ: NaN when any value is NaN or ±Infinity, else 0 however large the
 * values (no overflow to a false alarm). Four partial sums, so the loop is
 * not held up by one chain of additions.
 */
function nonFinite(u: Float64Array): number {
  const n = u.length;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    s0 += 0 * u[i]!;
    s1 += 0 * u[i + 1]!;
    s2 += 0 * u[i + 2]!;
    s3 += 0 * u[i + 3]!;
  }
  for (; i < n; i++) s0 += 0 * u[i]!;
  return s0 + s1 + s2 + s3;
}

/**
 * Runs a stepper (module doc). Internal: the transient solvers call it.
 *
 * @internal
 */
export function runStepper(g: Grid, stepper: Stepper, plan: { steps: number; dt: number }, o: RunOptions, firstStep: number): RunResult {
  const start = o.startTime ?? 0;
  const { steps, dt } = plan;
  let u = stepper.state[0]!;
  const n = u.length;
  const probes = (o.probes ?? []).map((pt) => ({ point: [...pt], ...probeWeights(g, pt) }));
  const records = steps - firstStep + 1;
  const times = new Float64Array(records);
  const series = probes.map(() => new Float64Array(records));
  const sample = (slot: number, t: number): void => {
    times[slot] = t;
    for (let k = 0; k < probes.length; k++) {
      const pr = probes[k]!;
      let v = 0;
      for (let q = 0; q < pr.nodes.length; q++) v += pr.weights[q]! * u[pr.nodes[q]!]!;
      series[k]![slot] = v;
    }
  };
  const outTimes = [...(o.outputTimes ?? [])].sort((a, b) => a - b);
  for (const t of outTimes) {
    if (!(Number.isFinite(t) && t >= start && t <= o.endTime)) {
      throw new InvalidOptionError('outputTimes', `${t} is outside the run [${start}, ${o.endTime}]`);
    }
  }
  const timeAt = (step: number): number => (step === steps ? o.endTime : start + step * dt);
  const outputs: Snapshot[] = [];
  let nextOut = 0;
  while (nextOut < outTimes.length && outTimes[nextOut]! < timeAt(firstStep)) nextOut++;
  const keep = (t: number, a: Float64Array, b: Float64Array | undefined, s: number): void => {
    const copy = new Float64Array(n);
    for (let i = 0; i < n; i++) copy[i] = b === undefined ? a[i]! : (1 - s) * a[i]! + s * b[i]!;
    outputs.push({ time: t, field: ndarray(copy, [...g.shape]) });
  };
  while (nextOut < outTimes.length && outTimes[nextOut] === timeAt(firstStep)) keep(outTimes[nextOut++]!, u, undefined, 0);
  const before = new Float64Array(outTimes.length > 0 ? n : 0);
  sample(0, timeAt(firstStep));
  const every = Math.max(1, Math.floor((steps - firstStep) / 100));
  let iterations = 0;
  let step = firstStep;
  let aborted = false;
  const t0 = performance.now();
  while (step < steps) {
    if (o.signal?.aborted) {
      aborted = true;
      break;
    }
    const t = timeAt(step);
    const t1 = timeAt(step + 1);
    const wantOut = nextOut < outTimes.length && outTimes[nextOut]! <= t1;
    if (wantOut) before.set(u);
    const reported = stepper.advance(t, step);
    u = stepper.state[0]!;
    iterations += stepper.lastIterations;
    step++;
    // blow-up: NaN or ±Infinity anywhere makes the sum non-finite (the fused 1-D and leapfrog kernels
    // report Σu, which can also overflow when finite values approach 1e308: an alarm only at such sizes)
    const sum = typeof reported === 'number' ? reported : nonFinite(u);
    if (!Number.isFinite(sum)) throw new BlowUpError(step, t1);
    if (o.onStep) o.onStep({ time: t1, step, u });
    while (nextOut < outTimes.length && outTimes[nextOut]! <= t1) {
      const to = outTimes[nextOut++]!;
      keep(to, before, u, (to - t) / (t1 - t));
    }
    sample(step - firstStep, t1);
    if (o.onProgress && (step % every === 0 || step === steps)) {
      o.onProgress({ fraction: step / steps, time: t1, step, steps });
    }
  }
  const seconds = (performance.now() - t0) / 1000;
  const used = step - firstStep + 1;
  const time = timeAt(step);
  return {
    field: ndarray(Float64Array.from(u), [...g.shape]),
    time,
    steps: step,
    dt,
    aborted,
    scheme: stepper.scheme,
    outputs,
    times: times.slice(0, used),
    probes: probes.map((p, k) => ({ point: p.point, values: series[k]!.slice(0, used) })),
    iterations,
    seconds,
    checkpoint: {
      format: 'quadrille-checkpoint',
      version: 1,
      scheme: stepper.scheme,
      startTime: start,
      endTime: o.endTime,
      dt,
      step,
      time,
      state: stepper.state.map((v) => Float64Array.from(v)),
    },
  };
}

const MAGIC = 0x51445243; // "QDRC"

/**
 * A checkpoint as bytes: a small header (magic, version, step, counts, the
 * scheme name) and the float64 values, little-endian, exactly as in memory.
 *
 * @param c - the checkpoint
 * @returns the bytes
 * @example checkpointFromBytes(checkpointToBytes(result.checkpoint)).step === result.checkpoint.step // true
 */
export function checkpointToBytes(c: Checkpoint): Uint8Array {
  const name = new TextEncoder().encode(c.scheme);
  const values = c.state.reduce((s, v) => s + v.length, 0);
  const header = 4 * 4 + 8 * 4 + 4 * c.state.length + name.length;
  const pad = (8 - (header % 8)) % 8;
  const buf = new ArrayBuffer(header + pad + 8 * values);
  const dv = new DataView(buf);
  let o = 0;
  dv.setUint32(o, MAGIC, true); o += 4;
  dv.setUint32(o, c.version, true); o += 4;
  dv.setUint32(o, c.state.length, true); o += 4;
  dv.setUint32(o, name.length, true); o += 4;
  dv.setFloat64(o, c.startTime, true); o += 8;
  dv.setFloat64(o, c.endTime, true); o += 8;
  dv.setFloat64(o, c.dt, true); o += 8;
  dv.setFloat64(o, c.step, true); o += 8;
  for (const v of c.state) {
    dv.setUint32(o, v.length, true);
    o += 4;
  }
  new Uint8Array(buf, o, name.length).set(name);
  o += name.length + pad;
  for (const v of c.state) {
    for (let i = 0; i < v.length; i++) {
      dv.setFloat64(o, v[i]!, true);
      o += 8;
    }
  }
  return new Uint8Array(buf);
}

/**
 * Reads bytes written by {@link checkpointToBytes}.
 *
 * @param bytes - the bytes
 * @returns the checkpoint
 */
export function checkpointFromBytes(bytes: Uint8Array): Checkpoint {
  const bad = (why: string): never => {
    throw new InvalidOptionError('checkpoint', `${why}; give bytes made by checkpointToBytes`);
  };
  if (bytes.byteLength < 48) bad(`${bytes.byteLength} bytes are too few for a checkpoint`);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let o = 0;
  if (dv.getUint32(o, true) !== MAGIC) bad('the bytes do not start with the checkpoint tag');
  o += 4;
  const version = dv.getUint32(o, true); o += 4;
  if (version !== 1) bad(`version ${version} is not supported`);
  const count = dv.getUint32(o, true); o += 4;
  const nameLen = dv.getUint32(o, true); o += 4;
  const startTime = dv.getFloat64(o, true); o += 8;
  const endTime = dv.getFloat64(o, true); o += 8;
  const dt = dv.getFloat64(o, true); o += 8;
  const step = dv.getFloat64(o, true); o += 8;
  const lengths: number[] = [];
  for (let k = 0; k < count; k++) {
    lengths.push(dv.getUint32(o, true));
    o += 4;
  }
  const scheme = new TextDecoder().decode(bytes.subarray(o, o + nameLen));
  o += nameLen;
  o += (8 - (o % 8)) % 8;
  const total = lengths.reduce((s, v) => s + v, 0);
  if (bytes.byteLength !== o + 8 * total) bad(`expected ${o + 8 * total} bytes, got ${bytes.byteLength} (truncated?)`);
  const state = lengths.map((len) => {
    const v = new Float64Array(len);
    for (let i = 0; i < len; i++) {
      v[i] = dv.getFloat64(o, true);
      o += 8;
    }
    return v;
  });
  const time = step === Math.round((endTime - startTime) / dt) ? endTime : startTime + step * dt;
  return { format: 'quadrille-checkpoint', version: 1, scheme, startTime, endTime, dt, step, time, state };
}
