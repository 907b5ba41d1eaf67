/**
 * Line plots on linear axes: any x–y series, profiles of a field along a
 * grid line, and probe time histories of a transient run. Pure: data in,
 * SVG text out.
 *
 * Axes carry nice 1-2-5 ticks (Heckbert 1990) thinned until their labels
 * clear each other by the label-box estimate (0.6·size per character,
 * height = size); series take the house palette in order, then repeat it
 * dashed; the legend sits right of the plot.
 *
 * @module
 */
import { InvalidOptionError, NonFiniteValueError, ShapeMismatchError } from '../../errors.js';
import type { Field } from '../../grid/field.js';
import { checkField } from '../../grid/field.js';
import type { Axis } from '../../grid/axis.js';
import type { Grid } from '../../grid/grid.js';
import type { RunResult } from '../../time/run.js';
import { type SeriesStyle, checkSeries, drawChart } from './chart.js';
import { formatCompact } from './ticks.js';

/**
 * One series of a line plot: points (x[i], y[i]) joined in the order given.
 *
 * @example linePlot([{ label: 'measured', x: [0, 1, 2], y: [20, 24, 31], style: 'points' }]).includes('measured') // true
 */
export interface LineSeries {
  /** Legend text; '' leaves the series out of the legend. */
  readonly label: string;
  /** Abscissae, finite. */
  readonly x: ArrayLike<number>;
  /** Ordinates, finite, one per abscissa. */
  readonly y: ArrayLike<number>;
  /** Line, markers or both (default 'line'; 'both' on log–log plots). */
  readonly style?: SeriesStyle;
}

/**
 * Text and size of a line plot.
 *
 * @example linePlot([{ label: '', x: [0, 1], y: [0, 1] }], { title: 'ramp', xLabel: 'x (m)', yLabel: 'T (K)' }).includes('ramp') // true
 */
export interface LinePlotOptions {
  /** Title above the plot (default none). */
  readonly title?: string;
  /** x axis label, units included, e.g. "time (h)" (default none). */
  readonly xLabel?: string;
  /** y axis label, units included (default none). */
  readonly yLabel?: string;
  /** Width in px, 200 … 8000 (default 720). */
  readonly width?: number;
  /** Height in px, 200 … 8000 (default 440). */
  readonly height?: number;
}

/** "name (units)", or the name alone. */
export function withUnits(name: string, units: string | undefined): string {
  return units !== undefined && units !== '' ? `${name} (${units})` : name;
}

function text(name: string, v: unknown, fallback: string): string {
  if (v === undefined) return fallback;
  if (typeof v !== 'string') throw new InvalidOptionError(name, `${String(v)} is not text; give a string`);
  return v;
}

/**
 * A line plot of one or more x–y series on linear axes, as a standalone SVG.
 *
 * The x axis spans the data exactly; the y axis spans it with 5 % margins
 * (a constant series is widened by 1 % of its magnitude, or ±1 at zero).
 * Series longer than four points per pixel column are thinned to the
 * first, lowest, highest and last point of each column, which keeps every
 * extreme visible.
 *
 * @param series - one or more series, drawn in order over each other
 * @param options - title, axis labels, size
 * @returns an SVG document (xmlns set), standalone or inline in HTML
 * @throws InvalidOptionError for no series, an empty series, a bad style or size;
 *   ShapeMismatchError when x and y lengths differ; NonFiniteValueError for NaN or ±∞
 * @example linePlot([{ label: 'T', x: [0, 0.5, 1], y: [20, 35, 80] }], { xLabel: 'x (m)', yLabel: 'T (°C)' }).startsWith('<svg') // true
 */
export function linePlot(series: readonly LineSeries[], options: Readonly<LinePlotOptions> = {}): string {
  return drawChart({
    width: options.width ?? 720,
    height: options.height ?? 440,
    title: text('title', options.title, ''),
    xLabel: text('xLabel', options.xLabel, ''),
    yLabel: text('yLabel', options.yLabel, ''),
    xKind: 'linear',
    yKind: 'linear',
    series: checkSeries(series, 'linear', 'linear', 'line'),
  });
}

/**
 * One field to draw along a profile line.
 *
 * @example profilePlot(grid({ x: { from: 0, to: 1, cells: 2 } }), [{ label: 'T', field: zeros(grid({ x: { from: 0, to: 1, cells: 2 } })) }]).includes('T') // true
 */
export interface ProfileLine {
  /** Legend text. */
  readonly label: string;
  /** Values at the grid's nodes, shape `grid.shape`, x slowest. */
  readonly field: Field;
  /** Line, markers at the nodes, or both (default 'line'). */
  readonly style?: SeriesStyle;
}

/**
 * Where a profile runs and how it is labelled.
 *
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 0.1, cells: 2 } });
 * const T = sampleField(g, (x, y) => 20 + 100 * x * y);
 * profilePlot(g, [{ label: 'T', field: T }], { along: 'x', at: 0.05, quantity: 'temperature', units: '°C' }).includes('temperature along x at y = 0.05 m') // true
 * ```
 */
export interface ProfileOptions {
  /** The axis the profile runs along: 'x' (default) or 'y'. */
  readonly along?: 'x' | 'y';
  /**
   * On a 2-D grid, the coordinate of the other axis where the profile runs
   * (y for a profile along x), inside that axis; between nodes the values
   * are interpolated linearly. Not allowed on a 1-D grid.
   */
  readonly at?: number;
  /** Name of the plotted quantity (default 'value'). */
  readonly quantity?: string;
  /** Units of the quantity, e.g. '°C' (default none). */
  readonly units?: string;
  /** Units of the coordinates (default 'm'). */
  readonly lengthUnits?: string;
  /** Title (default "⟨quantity⟩ along x at y = …"). */
  readonly title?: string;
  /** Width in px (default 720). */
  readonly width?: number;
  /** Height in px (default 440). */
  readonly height?: number;
}

/** Node coordinates of an axis, with the periodic image node at `to` appended so the period closes. */
function closedCoordinates(a: Axis): Float64Array {
  if (!a.periodic) return Float64Array.from(a.coordinates);
  const out = new Float64Array(a.count + 1);
  out.set(a.coordinates);
  out[a.count] = a.to;
  return out;
}

/**
 * Profiles of one or more fields along a grid line, as a standalone SVG
 * line plot: u(x) on a 1-D grid; u(x, y = at) or u(x = at, y) on a 2-D grid,
 * linear in the off-axis coordinate between the two nearest node lines
 * (exact on a node line). On a periodic axis the profile closes the period
 * at `to` with the value of the first node.
 *
 * @param g - the grid, 1-D or 2-D
 * @param lines - the fields to draw, each of shape `g.shape`
 * @param options - axis, position, quantity and units, title, size
 * @returns an SVG document
 * @throws InvalidOptionError for no lines, a 3-D grid, a missing or misplaced `at`, bad text or size;
 *   ShapeMismatchError / InvalidFieldError for a field of the wrong shape or kind;
 *   NonFiniteValueError for NaN or ±∞ on the profile (profiles have no "no data" drawing)
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 8 } });
 * const computed = sampleField(g, (x) => 300 + 10 * x);
 * const exact = sampleField(g, (x) => 300 + 10 * x + 0.01 * Math.sin(Math.PI * x));
 * profilePlot(g, [{ label: 'computed', field: computed, style: 'points' }, { label: 'exact', field: exact }], { quantity: 'T', units: 'K' }).includes('T (K)') // true
 * ```
 */
export function profilePlot(g: Grid, lines: readonly ProfileLine[], options: Readonly<ProfileOptions> = {}): string {
  if (!Array.isArray(lines) || lines.length === 0) {
    throw new InvalidOptionError('lines', 'no fields given; pass at least one { label, field }');
  }
  const along = options.along ?? 'x';
  if (along !== 'x' && along !== 'y') throw new InvalidOptionError('along', `${String(along)}; use 'x' or 'y'`);
  const quantity = text('quantity', options.quantity, 'value');
  const lengthUnits = text('lengthUnits', options.lengthUnits, 'm');
  let coords: Float64Array;
  let where = '';
  let sample: (f: Field, k: number) => number;
  if (g.dimension === 1) {
    if (along !== 'x') throw new InvalidOptionError('along', "a 1-D grid has only axis x; use along: 'x'");
    if (options.at !== undefined) throw new InvalidOptionError('at', 'a 1-D profile runs along the whole grid; leave at out');
    coords = closedCoordinates(g.x);
    const n = g.x.count;
    sample = (f, k) => f.data[f.offset + (k % n) * f.stride[0]];
  } else if (g.dimension === 2) {
    const d = along === 'x' ? 0 : 1;
    const run = g.axes[d] as Axis;
    const across = g.axes[1 - d] as Axis;
    const at = options.at;
    if (typeof at !== 'number' || !Number.isFinite(at)) {
      throw new InvalidOptionError('at', `give the ${across.name} coordinate of the profile line, a finite number in [${across.from}, ${across.to}]`);
    }
    const c = closedCoordinates(across);
    if (at < c[0] || at > c[c.length - 1]) {
      throw new InvalidOptionError('at', `${across.name} = ${at} is outside the grid's [${c[0]}, ${c[c.length - 1]}]; give a coordinate inside it`);
    }
    let j = 0;
    while (j < c.length - 2 && c[j + 1] <= at) j++;
    const w = (at - c[j]) / (c[j + 1] - c[j]);
    coords = closedCoordinates(run);
    const nRun = run.count;
    const nAcross = across.count;
    const j0 = j % nAcross;
    const j1 = (j + 1) % nAcross;
    sample = (f, k) => {
      const i = k % nRun;
      const s0 = f.stride[0];
      const s1 = f.stride[1];
      const a = d === 0 ? f.data[f.offset + i * s0 + j0 * s1] : f.data[f.offset + j0 * s0 + i * s1];
      const b = d === 0 ? f.data[f.offset + i * s0 + j1 * s1] : f.data[f.offset + j1 * s0 + i * s1];
      return w === 0 ? a : (1 - w) * a + w * b;
    };
    where = ` at ${across.name} = ${formatCompact(at)} ${lengthUnits}`.trimEnd();
  } else {
    throw new InvalidOptionError('grid', 'profiles are drawn on 1-D and 2-D grids; for a 3-D field take a 2-D slice first (field.pick(null, null, k) on a grid of x and y)');
  }
  const series = lines.map((l, k) => {
    if (l === null || typeof l !== 'object') throw new InvalidOptionError(`lines[${k}]`, 'give { label, field }');
    checkField(g, l.field, `lines[${k}].field`);
    const y = new Float64Array(coords.length);
    for (let i = 0; i < coords.length; i++) {
      y[i] = sample(l.field, i);
      if (!Number.isFinite(y[i])) {
        throw new NonFiniteValueError(`lines[${k}].field at ${along} = ${coords[i]}${where}`, y[i]);
      }
    }
    return { label: l.label, x: coords, y, style: l.style };
  });
  return drawChart({
    width: options.width ?? 720,
    height: options.height ?? 440,
    title: text('title', options.title, `${quantity} along ${along}${where}`),
    xLabel: withUnits(along, lengthUnits),
    yLabel: withUnits(quantity, options.units),
    xKind: 'linear',
    yKind: 'linear',
    series: checkSeries(series, 'linear', 'linear', 'line'),
  });
}

/** Seconds per unit of the time axis of a history plot. */
const SECONDS = { s: 1, min: 60, h: 3600, d: 86400 } as const;

/**
 * How a probe history is labelled.
 *
 * @example
 * ```ts
 * const run = { times: Float64Array.of(0, 3600, 7200), probes: [{ point: [0.1], values: Float64Array.of(20, 31, 38) }] };
 * historyPlot(run, { quantity: 'temperature', units: '°C', timeUnit: 'h' }).includes('time (h)') // true
 * ```
 */
export interface HistoryOptions {
  /** Name of the probed quantity (default 'value'). */
  readonly quantity?: string;
  /** Units of the quantity (default none). */
  readonly units?: string;
  /** Unit of the time axis: seconds (default), minutes, hours or days; run times are in s. */
  readonly timeUnit?: 's' | 'min' | 'h' | 'd';
  /** Legend text per probe, in the run's probe order (default: the probe's coordinates). */
  readonly labels?: readonly string[];
  /** Units of probe coordinates in the default labels (default 'm'). */
  readonly lengthUnits?: string;
  /** Title (default "⟨quantity⟩ at the probes"). */
  readonly title?: string;
  /** Width in px (default 720). */
  readonly width?: number;
  /** Height in px (default 440). */
  readonly height?: number;
}

/**
 * The probe time histories of a transient run, one line per probe, as a
 * standalone SVG: value against time (in `timeUnit`), legend by probe.
 *
 * @param run - a run result, or anything with its `times` (s) and `probes`
 * @param options - quantity and units, time unit, labels, title, size
 * @returns an SVG document
 * @throws InvalidOptionError if the run has no probes (pass `probes: [[x], …]` to the run), a bad time unit, text or size;
 *   ShapeMismatchError when `labels` or a probe's values do not match the probes or times;
 *   NonFiniteValueError for NaN or ±∞ in the records
 * @example
 * ```ts
 * const run = { times: Float64Array.of(0, 60, 120), probes: [{ point: [0.1, 0.05], values: Float64Array.of(20, 21, 23) }] };
 * historyPlot(run, { units: '°C', timeUnit: 'min' }).includes('(x, y) = (0.1, 0.05) m') // true
 * ```
 */
export function historyPlot(run: Pick<RunResult, 'times' | 'probes'>, options: Readonly<HistoryOptions> = {}): string {
  if (run === null || typeof run !== 'object' || !Array.isArray(run.probes) || run.times === undefined) {
    throw new InvalidOptionError('run', 'give a run result, or { times, probes } as a run returns them');
  }
  if (run.probes.length === 0) {
    throw new InvalidOptionError('run.probes', 'the run recorded no probes; pass probes: [[x], …] (one point per probe) in the run options');
  }
  const unit = options.timeUnit ?? 's';
  if (!Object.hasOwn(SECONDS, unit)) throw new InvalidOptionError('timeUnit', `${String(unit)}; use 's', 'min', 'h' or 'd'`);
  const labels = options.labels;
  if (labels !== undefined && (!Array.isArray(labels) || labels.length !== run.probes.length)) {
    throw new ShapeMismatchError(`labels has ${Array.isArray(labels) ? labels.length : 'no'} entries but the run has ${run.probes.length} probe(s); give one label per probe`);
  }
  const lengthUnits = text('lengthUnits', options.lengthUnits, 'm');
  const quantity = text('quantity', options.quantity, 'value');
  const scale = SECONDS[unit];
  const t = Float64Array.from(run.times, (v) => v / scale);
  const series = run.probes.map((p, k) => {
    const point = p.point.map(formatCompact);
    const names = ['x', 'y', 'z'].slice(0, point.length);
    const fallback = point.length === 1
      ? `${names[0]} = ${point[0]} ${lengthUnits}`
      : `(${names.join(', ')}) = (${point.join(', ')}) ${lengthUnits}`;
    if (p.values.length !== t.length) {
      throw new ShapeMismatchError(`probes[${k}] has ${p.values.length} value(s) but there are ${t.length} time(s); give one value per record time`);
    }
    return { label: labels !== undefined ? text(`labels[${k}]`, labels[k], '') : fallback.trimEnd(), x: t, y: p.values };
  });
  return drawChart({
    width: options.width ?? 720,
    height: options.height ?? 440,
    title: text('title', options.title, `${quantity} at the probes`),
    xLabel: withUnits('time', unit),
    yLabel: withUnits(quantity, options.units),
    xKind: 'linear',
    yKind: 'linear',
    series: checkSeries(series, 'linear', 'linear', 'line'),
  });
}
