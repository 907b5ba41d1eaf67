/**
 * Checkpoints and run results as JSON (RFC 8259: Bray, T. (2017). The
 * JavaScript Object Notation (JSON) Data Interchange Format. IETF RFC 8259).
 *
 * Numbers are written as the shortest decimal that reads back as the same
 * float64 (ECMAScript `String(x)`; −0 as `-0`, which JSON's grammar allows
 * and `JSON.parse` reads as −0), so every value round-trips exactly. JSON has
 * no NaN or Infinity: such values are refused with NonFiniteOutputError.
 *
 * Checkpoint form, version 1 (keys in this order, no others):
 * ```json
 * {
 *   "format": "quadrille-checkpoint",
 *   "version": 1,
 *   "scheme": "crank-nicolson",
 *   "startTime": 0,
 *   "endTime": 28800,
 *   "dt": 60,
 *   "step": 480,
 *   "time": 28800,
 *   "state": [[20, 20.4, …]]
 * }
 * ```
 * `state` holds the stepper's state vectors in node order (x slowest): one
 * for one-level schemes, two (current, previous) for leapfrog.
 *
 * Run form, version 1 (written only; metadata and probes, not the fields):
 * ```json
 * {
 *   "format": "quadrille-run",
 *   "version": 1,
 *   "scheme": "crank-nicolson",
 *   "time": 28800, "steps": 480, "dt": 60, "aborted": false,
 *   "iterations": 0, "seconds": 0.012,
 *   "shape": [41],
 *   "times": [0, 60, …],
 *   "probes": [{ "point": [0.1], "values": [20, …] }],
 *   "outputs": [{ "time": 3600, "shape": [41], "file": "wall_0000.vtr" }]
 * }
 * ```
 * `file` appears only when output file names are passed.
 *
 * @module
 */
import { InvalidOptionError, MalformedJsonError } from '../errors.js';
import type { Checkpoint, RunResult } from '../time/index.js';
import { checkArrayFinite, checkNumberFinite, numberText } from './format.js';

function num(what: string, v: number): string {
  checkNumberFinite(what, v);
  return numberText(v);
}

function numbers(what: string, a: ArrayLike<number>): string {
  checkArrayFinite(a, what);
  const parts = new Array<string>(a.length);
  for (let p = 0; p < a.length; p++) parts[p] = numberText(a[p]!);
  return `[${parts.join(', ')}]`;
}

/**
 * A checkpoint as JSON, in the documented version-1 form (module doc);
 * {@link checkpointFromJson} reads it back bit for bit.
 *
 * @param c - the checkpoint, e.g. `result.checkpoint`
 * @returns JSON text ending in a newline
 * @throws NonFiniteOutputError for a NaN or infinite time, step or state value
 * @example JSON.parse(checkpointToJson(result.checkpoint)).format // 'quadrille-checkpoint'
 */
export function checkpointToJson(c: Checkpoint): string {
  const lines = [
    '{',
    `  "format": "quadrille-checkpoint",`,
    `  "version": 1,`,
    `  "scheme": ${JSON.stringify(c.scheme)},`,
    `  "startTime": ${num('startTime', c.startTime)},`,
    `  "endTime": ${num('endTime', c.endTime)},`,
    `  "dt": ${num('dt', c.dt)},`,
    `  "step": ${num('step', c.step)},`,
    `  "time": ${num('time', c.time)},`,
    `  "state": [`,
    c.state.map((v, k) => `    ${numbers(`state[${k}]`, v)}`).join(',\n'),
    '  ]',
    '}',
  ];
  return lines.join('\n') + '\n';
}

const CHECKPOINT_KEYS = ['format', 'version', 'scheme', 'startTime', 'endTime', 'dt', 'step', 'time', 'state'] as const;

/**
 * Reads a checkpoint from the JSON form written by {@link checkpointToJson}
 * (module doc). Every key is required and no other is accepted; numbers must
 * be finite, `step` a whole number ≥ 0.
 *
 * @param text - the JSON
 * @returns the checkpoint, its state as new Float64Arrays
 * @throws MalformedJsonError naming the path of the fault (`$` for text that is not JSON)
 * @example checkpointFromJson(checkpointToJson(result.checkpoint)).state[0][3] === result.checkpoint.state[0][3] // true
 */
export function checkpointFromJson(text: string): Checkpoint {
  const bad = (path: string, why: string): never => {
    throw new MalformedJsonError('checkpoint', path, why);
  };
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    bad('$', `not JSON (${(e as Error).message}); give text written by checkpointToJson`);
  }
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) bad('$', 'not a JSON object');
  const o = doc as Record<string, unknown>;
  for (const k of Object.keys(o)) {
    if (!(CHECKPOINT_KEYS as readonly string[]).includes(k)) bad(k, `unknown key; a version-1 checkpoint has ${CHECKPOINT_KEYS.join(', ')}`);
  }
  for (const k of CHECKPOINT_KEYS) if (!(k in o)) bad(k, 'missing');
  if (o['format'] !== 'quadrille-checkpoint') bad('format', `is ${JSON.stringify(o['format'])}; expected "quadrille-checkpoint"`);
  if (o['version'] !== 1) bad('version', `${JSON.stringify(o['version'])} is not supported; this reader reads version 1`);
  if (typeof o['scheme'] !== 'string') bad('scheme', 'must be a string');
  const finite = (k: string): number => {
    const v = o[k];
    if (typeof v !== 'number' || !Number.isFinite(v)) bad(k, `is ${JSON.stringify(v)}; a finite number is required`);
    return v as number;
  };
  const startTime = finite('startTime');
  const endTime = finite('endTime');
  const dt = finite('dt');
  const step = finite('step');
  const time = finite('time');
  if (!(Number.isSafeInteger(step) && step >= 0)) bad('step', `is ${step}; a whole number ≥ 0 is required`);
  const raw = o['state'];
  if (!Array.isArray(raw) || raw.length === 0) bad('state', 'must be a non-empty array of arrays of numbers');
  const state = (raw as unknown[]).map((v, k) => {
    if (!Array.isArray(v)) bad(`state[${k}]`, 'must be an array of numbers');
    const a = v as unknown[];
    const out = new Float64Array(a.length);
    for (let i = 0; i < a.length; i++) {
      const x = a[i];
      if (typeof x !== 'number' || !Number.isFinite(x)) bad(`state[${k}][${i}]`, `is ${JSON.stringify(x)}; a finite number is required`);
      out[i] = x as number;
    }
    return out;
  });
  return { format: 'quadrille-checkpoint', version: 1, scheme: o['scheme'] as string, startTime, endTime, dt, step, time, state };
}

/** Options of {@link runResultJson}. */
export interface RunJsonOptions {
  /** One file name per output snapshot (e.g. from {@link writeVtkSeries}), written as each output's `file`. */
  readonly outputFiles?: readonly string[];
}

/**
 * A run result as JSON, in the documented version-1 run form (module doc):
 * the run's metadata, the probe record times and series, and the time and
 * shape of each output snapshot (not the field values: write those with
 * {@link vtkDocument} or {@link fieldCsv}).
 *
 * @param r - the run result
 * @param options - output file names to record
 * @returns JSON text ending in a newline
 * @throws NonFiniteOutputError for a NaN or infinite time or probe value;
 *   InvalidOptionError for a file list whose length differs from the outputs
 * @example JSON.parse(runResultJson(result)).times.length === result.times.length // true
 */
export function runResultJson(r: RunResult, options: Readonly<RunJsonOptions> = {}): string {
  const files = options.outputFiles;
  if (files !== undefined && files.length !== r.outputs.length) {
    throw new InvalidOptionError('outputFiles', `${files.length} name(s) for ${r.outputs.length} output(s); give one per output`);
  }
  const probes = r.probes.map(
    (p, k) => `    { "point": ${numbers(`probes[${k}].point`, p.point)}, "values": ${numbers(`probes[${k}].values`, p.values)} }`,
  );
  const outputs = r.outputs.map((s, k) => {
    const file = files === undefined ? '' : `, "file": ${JSON.stringify(files[k])}`;
    return `    { "time": ${num(`outputs[${k}].time`, s.time)}, "shape": [${s.field.shape.join(', ')}]${file} }`;
  });
  const list = (items: string[]): string => (items.length === 0 ? '[]' : `[\n${items.join(',\n')}\n  ]`);
  const lines = [
    '{',
    `  "format": "quadrille-run",`,
    `  "version": 1,`,
    `  "scheme": ${JSON.stringify(r.scheme)},`,
    `  "time": ${num('time', r.time)},`,
    `  "steps": ${num('steps', r.steps)},`,
    `  "dt": ${num('dt', r.dt)},`,
    `  "aborted": ${r.aborted ? 'true' : 'false'},`,
    `  "iterations": ${num('iterations', r.iterations)},`,
    `  "seconds": ${num('seconds', r.seconds)},`,
    `  "shape": [${r.field.shape.join(', ')}],`,
    `  "times": ${numbers('times', r.times)},`,
    `  "probes": ${list(probes)},`,
    `  "outputs": ${list(outputs)}`,
    '}',
  ];
  return lines.join('\n') + '\n';
}
