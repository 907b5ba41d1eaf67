/**
 * The log–log picture of a convergence study. It lives with the plots (the
 * output stage consumes the verification stage's plain `ConvergenceStudy`,
 * never the other way round).
 *
 * @module
 */
import { InvalidOptionError } from '../../errors.js';
import type { ConvergenceStudy, NormName } from '../../verify/study.js';
import { checkSeries } from './chart.js';
import { renderLogLog } from './loglog.js';

const LABEL: Record<NormName, string> = { l2: 'L2', linf: 'L∞', quantity: 'quantity' };

/** What {@link studyPlot} draws. */
export interface PlotOptions {
  /** Title above the plot (default: "Observed convergence"). */
  readonly title?: string;
  /** Orders of the dashed reference slopes (default: each norm's least-squares order rounded to a whole number). */
  readonly slopes?: readonly number[];
  /** Width in px (default 640). */
  readonly width?: number;
  /** Height in px (default 440). */
  readonly height?: number;
}

/**
 * The study as a standalone SVG log–log plot: error against spacing (or
 * step), one polyline with markers per norm, dashed reference slopes of
 * whole orders anchored at the finest level of the first norm, decade ticks
 * with labels, and a legend with each norm's least-squares order. Fine
 * levels sit at the left. Drawn by the same log–log layout as `logLogPlot`
 * (the io module's plots), so labels never overlap.
 *
 * @param study - the study
 * @param options - title, reference slopes, size
 * @returns an SVG document (xmlns set), viewable on its own or inline in HTML
 * @throws InvalidOptionError for a size that is not finite and within 200 … 8000 px, or a slope that is not finite
 * @example studyPlot(convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] })).startsWith('<svg') // true
 */
export function studyPlot(study: ConvergenceStudy, options: Readonly<PlotOptions> = {}): string {
  const slopes = options.slopes ?? [...new Set(study.norms.map((n) => Math.max(1, Math.round(study.fits[n]!.order))))];
  for (const p of slopes) if (!Number.isFinite(p)) throw new InvalidOptionError('slopes', `${p} is not a finite order`);
  const x = Float64Array.from(study.levels, (l) => l.measure);
  const input = study.norms.map((n) => ({
    label: `${LABEL[n]}  p = ${study.fits[n]!.order.toFixed(2)}`,
    x,
    y: Float64Array.from(study.levels, (l) => l.errors[n]!),
  }));
  const series = checkSeries(input, 'log', 'log', 'both').map((s, k) => ({ ...s, key: study.norms[k] }));
  return renderLogLog(series, {
    title: options.title ?? 'Observed convergence',
    xLabel: study.refine === 'time' ? 'time step dt' : 'spacing h',
    yLabel: 'error',
    slopes,
    width: options.width ?? 640,
    height: options.height ?? 440,
  }, 'norm', 'data-norm');
}
