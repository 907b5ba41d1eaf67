/**
 * The benchmark harness: timing (warm-up, then timed runs; median, min, max
 * by `process.hrtime.bigint()`), peak RSS, a seeded PRNG, and the printer of
 * WORKLOADS.md's line format:
 *
 * `W1 impl=quadrille variant=matrix-free path=ts n=2048 median_s=0.0051 min_s=… max_s=… runs=… mpts_per_s=… max_err=… peak_rss_mb=…`
 *
 * A result line holds `key=value` pairs after the workload id and nothing
 * else; every other line the harness prints starts with `#`.
 *
 * @module
 */

/** Timings of one benchmark body, in seconds. */
export interface Timing {
  /** Number of timed runs. */
  readonly runs: number;
  /** Median of the timed runs (mean of the middle two for an even count). */
  readonly median: number;
  /** Fastest timed run. */
  readonly min: number;
  /** Slowest timed run. */
  readonly max: number;
  /** Every timed run, in the order run. */
  readonly times: readonly number[];
}

/** How {@link measure} repeats a body. */
export interface MeasureOptions {
  /** Untimed runs first (JIT warm-up, page faults); default 2. */
  readonly warmup?: number;
  /** Timed runs, at least 5; default {@link defaultRuns}. */
  readonly runs?: number;
  /** Called untimed before every run (reset state). */
  readonly setup?: () => void;
  /** Body calls per timed run; the times are divided by it. Default 1. */
  readonly repeat?: number;
}

let runsOverride: number | undefined;

/** Timed runs used when a case does not ask for a number; `--runs=N` sets it. */
export function defaultRuns(fallback = 11): number {
  return runsOverride ?? fallback;
}

/** Sets the number of timed runs for every case (at least 5). */
export function setDefaultRuns(runs: number | undefined): void {
  runsOverride = runs === undefined ? undefined : Math.max(5, Math.floor(runs));
}

/** Median of a non-empty list. */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length;
  return m % 2 === 1 ? s[(m - 1) / 2] : 0.5 * (s[m / 2 - 1] + s[m / 2]);
}

/**
 * Throws when a benchmark result is, or starts, middles or ends with, NaN:
 * it keeps the body's work observable and catches a broken kernel.
 */
export function consume(result: unknown): void {
  if (typeof result === 'number') {
    if (Number.isNaN(result)) throw new Error('benchmark body returned NaN');
  } else if (result instanceof Float64Array) {
    const n = result.length;
    if (n > 0 && (Number.isNaN(result[0]) || Number.isNaN(result[n >> 1]) || Number.isNaN(result[n - 1]))) {
      throw new Error('benchmark body produced NaN');
    }
  }
}

/**
 * Runs `body` `warmup` times untimed, then `runs` times timed; each result
 * is passed to {@link consume} outside the timed region.
 */
export function measure<T>(body: () => T, options: Readonly<MeasureOptions> = {}): { timing: Timing; result: T } {
  const warmup = options.warmup ?? 2;
  const runs = Math.max(5, options.runs ?? defaultRuns());
  const repeat = Math.max(1, options.repeat ?? 1);
  const setup = options.setup;
  let result = undefined as T;
  for (let r = 0; r < warmup; r++) {
    setup?.();
    for (let k = 0; k < repeat; k++) result = body();
    consume(result);
  }
  const times: number[] = [];
  for (let r = 0; r < runs; r++) {
    setup?.();
    const t0 = process.hrtime.bigint();
    for (let k = 0; k < repeat; k++) result = body();
    const t1 = process.hrtime.bigint();
    times.push(Number(t1 - t0) / 1e9 / repeat);
    consume(result);
  }
  return {
    timing: { runs, median: median(times), min: Math.min(...times), max: Math.max(...times), times },
    result,
  };
}

/**
 * Body calls per timed run so that one run lasts about `targetS` seconds,
 * from one untimed trial call.
 */
export function calibrate(body: () => unknown, targetS = 0.02): number {
  const t0 = process.hrtime.bigint();
  consume(body());
  const dt = Number(process.hrtime.bigint() - t0) / 1e9;
  return Math.max(1, Math.ceil(targetS / Math.max(dt, 1e-7)));
}

/** Peak resident set size of this process so far, in MB (maxRSS is in KiB). */
export function peakRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}

/** The seeded PRNG the tests use (mulberry32), shared so benchmarks draw the same streams. */
export { mulberry32 } from '../test/support/prng.js';

/** A figure: integers as they are, others to 4 significant digits. */
export function formatValue(v: number | string): string {
  if (typeof v === 'string') return v;
  if (!Number.isFinite(v)) return String(v);
  if (Number.isInteger(v) && Math.abs(v) < 1e15) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) {
    // 3.870e-6 → 3.87e-6
    const [m, e] = v.toExponential(3).split('e');
    return `${String(Number(m))}e${e}`;
  }
  return String(Number(v.toPrecision(4)));
}

/** One result of a workload, as printed on one line. */
export interface ResultLine {
  /** Workload id, the first word: W1, W1b, S1, … */
  readonly id: string;
  /** Implementation: quadrille, c, numpy, scipy. */
  readonly impl: string;
  /** Variant, where a workload has more than one. */
  readonly variant?: string;
  /** ts or wasm, once the kernel engine offers both. */
  readonly path?: string;
  /** Size keys of the workload (n, count, …), in order. */
  readonly size?: Readonly<Record<string, number | string>>;
  /** Timings; omitted for lines that report sizes only. */
  readonly timing?: Timing;
  /** The workload's own figures, in order. */
  readonly figures?: Readonly<Record<string, number | string>>;
  /** Append peak_rss_mb (default true). */
  readonly rss?: boolean;
}

/** The line of {@link ResultLine}, without a newline. */
export function formatLine(line: Readonly<ResultLine>): string {
  const parts = [line.id, `impl=${line.impl}`];
  if (line.variant !== undefined) parts.push(`variant=${line.variant}`);
  if (line.path !== undefined) parts.push(`path=${line.path}`);
  for (const [k, v] of Object.entries(line.size ?? {})) parts.push(`${k}=${formatValue(v)}`);
  const t = line.timing;
  if (t) {
    parts.push(`median_s=${formatValue(t.median)}`, `min_s=${formatValue(t.min)}`,
      `max_s=${formatValue(t.max)}`, `runs=${t.runs}`);
  }
  for (const [k, v] of Object.entries(line.figures ?? {})) parts.push(`${k}=${formatValue(v)}`);
  if (line.rss ?? true) parts.push(`peak_rss_mb=${formatValue(Math.round(peakRssMb()))}`);
  for (const p of parts) {
    if (/\s/.test(p)) throw new Error(`result field ${JSON.stringify(p)} contains white space`);
  }
  return parts.join(' ');
}

/** Prints a result line on stdout. */
export function printLine(line: Readonly<ResultLine>): void {
  process.stdout.write(`${formatLine(line)}\n`);
}

/** The unique name of a case: its `name`, else its id. */
export function caseName(c: Readonly<BenchCase>): string {
  return c.name ?? c.id;
}

/** Prints a comment line (`# …`) on stdout. */
export function note(text: string): void {
  for (const l of text.split('\n')) process.stdout.write(`# ${l}\n`);
}

/** What a benchmark case receives from the runner. */
export interface BenchContext {
  /** Timed runs to use unless the case needs its own count. */
  readonly runs: number;
}

/** One benchmark the runner can select by id or group. */
export interface BenchCase {
  /** Workload id printed first on its lines (W1, W1b, S1, …); several cases may share one. */
  readonly id: string;
  /**
   * Unique name of the case (default: the id); needed when two cases share
   * an id, e.g. `W2-assembly` beside a solver's `W2`.
   */
  readonly name?: string;
  /** Group name (stencil, operator, …). */
  readonly group: string;
  /** Short description for `--list`. */
  readonly title: string;
  /** Runs the case and prints its lines. */
  readonly run: (ctx: Readonly<BenchContext>) => void;
}
