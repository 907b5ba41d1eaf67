/**
 * Log–log plots, the picture of a convergence study: error against
 * spacing (or step) on logarithmic axes, with dashed reference slopes.
 * Pure: data in, SVG text out.
 *
 * On log–log axes a power law e = C·hᵖ is a straight line of slope p, so a
 * reference line of slope p through a measured point shows at a glance
 * whether the measurements follow order p. Ticks are whole decades when the
 * range holds two or more, else 1-2-5 multiples of the decade (Heckbert
 * 1990); both axes are padded by 6 % of their log range.
 *
 * @module
 */
import { InvalidOptionError } from '../../errors.js';
import { type ChartSeries, checkSeries, drawChart } from './chart.js';
import type { LineSeries } from './line.js';

/**
 * Text, slopes and size of a log–log plot.
 *
 * @example logLogPlot([{ label: 'L2', x: [0.1, 0.05, 0.025], y: [1e-2, 2.5e-3, 6.25e-4] }], { slopes: [2] }).includes('slope 2') // true
 */
export interface LogLogOptions {
  /** Title above the plot (default none). */
  readonly title?: string;
  /** x axis label, e.g. "spacing h (m)" (default none). */
  readonly xLabel?: string;
  /** y axis label (default none). */
  readonly yLabel?: string;
  /**
   * Orders p of dashed reference lines y ∝ xᵖ, each through the first
   * series' point of smallest x (the finest level of a study), across the
   * data's x range; labelled "slope p" on the line where there is room, else
   * in the legend. Default none.
   */
  readonly slopes?: readonly number[];
  /** Width in px, 200 … 8000 (default 640). */
  readonly width?: number;
  /** Height in px, 200 … 8000 (default 440). */
  readonly height?: number;
}

/** The log–log renderer shared with `studyPlot`: checked series in, SVG out. */
export function renderLogLog(
  series: readonly ChartSeries[], options: Readonly<LogLogOptions>, seriesClass = 'series', keyAttribute = 'data-key',
): string {
  for (const [name, v] of [['title', options.title], ['xLabel', options.xLabel], ['yLabel', options.yLabel]] as const) {
    if (v !== undefined && typeof v !== 'string') throw new InvalidOptionError(name, `${String(v)} is not text; give a string`);
  }
  if (options.slopes !== undefined && !Array.isArray(options.slopes)) {
    throw new InvalidOptionError('slopes', 'give an array of orders, e.g. [1, 2, 4]');
  }
  return drawChart({
    width: options.width ?? 640,
    height: options.height ?? 440,
    title: options.title ?? '',
    xLabel: options.xLabel ?? '',
    yLabel: options.yLabel ?? '',
    xKind: 'log',
    yKind: 'log',
    series,
    slopes: options.slopes ?? [],
    seriesClass,
    keyAttribute,
    padX: true,
  });
}

/**
 * A log–log plot of one or more series with dashed reference slopes, as a
 * standalone SVG. Series are drawn with markers and lines by default.
 *
 * @param series - one or more series; every x and y must be > 0
 * @param options - title, axis labels, reference slopes, size
 * @returns an SVG document (xmlns set)
 * @throws InvalidOptionError for no series, an empty series, a value ≤ 0 (the message names it and the fix),
 *   a non-finite slope, bad text or size; ShapeMismatchError when x and y lengths differ;
 *   NonFiniteValueError for NaN or ±∞
 * @example logLogPlot([{ label: 'error', x: [0.2, 0.1, 0.05], y: [0.04, 0.01, 0.0025] }], { xLabel: 'h', yLabel: 'error', slopes: [1, 2] }).match(/class="reference"/g).length // 2
 */
export function logLogPlot(series: readonly LineSeries[], options: Readonly<LogLogOptions> = {}): string {
  return renderLogLog(checkSeries(series, 'log', 'log', 'both'), options);
}
