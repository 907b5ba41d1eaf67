/**
 * The shared x–y chart behind line profiles, probe histories and log–log
 * plots: ranges, nice ticks on linear or logarithmic axes, grid, frame,
 * series, dashed reference slopes, legend, all laid out with the label-box
 * estimate of ./text.ts so that no two labels overlap. Internal.
 *
 * Layout, outside in: a title line on top; the legend in a column right of
 * the plot; y tick labels right-aligned left of the frame, the y axis label
 * rotated at the left edge; x tick labels under the frame and the x axis
 * label at the bottom. Tick labels that would collide are thinned by the
 * tick search (a coarser nice step); a lone label that still does not fit
 * (at a sheet edge) is dropped, its tick mark kept.
 *
 * @module
 */
import { InvalidOptionError, NonFiniteValueError, ShapeMismatchError } from '../../errors.js';
import { MUTED, PAPER, RULE, Sheet, checkSize } from './sheet.js';
import { SIZE, escapeXml, fitText, labelBox, overlaps, px, textWidth, type Box } from './text.js';
import { type Tick, linearTicks, logTicks } from './ticks.js';

/** Series colours in drawing order: our own, distinct in hue and in lightness. */
export const PALETTE = ['#1d5b8f', '#c45a1c', '#2d8251', '#8b3f91', '#a8830f', '#2a9bb3', '#a8354b', '#55585e'] as const;
/** Dash patterns, one per pass through the palette, so series 9 on differ from 1 … 8. */
const DASHES = ['', '7 3', '2 3', '10 3 2 3'] as const;

/**
 * How a series is drawn: a line through its points, markers at its points, or both.
 *
 * @example linePlot([{ label: 'nodes', x: [0, 1], y: [2, 3], style: 'points' }]).includes('class="markers"') // true
 */
export type SeriesStyle = 'line' | 'points' | 'both';

/** A checked series ready to draw. */
export interface ChartSeries {
  /** Legend text ('' for none). */
  readonly label: string;
  /** Abscissae. */
  readonly x: Float64Array;
  /** Ordinates. */
  readonly y: Float64Array;
  /** Line, markers or both. */
  readonly style: SeriesStyle;
  /** Optional key written as a data attribute. */
  readonly key?: string;
}

/** Axis scale kind. */
export type AxisKind = 'linear' | 'log';

/** Everything a chart needs. */
export interface ChartSpec {
  readonly width: number;
  readonly height: number;
  readonly title: string;
  readonly xLabel: string;
  readonly yLabel: string;
  readonly xKind: AxisKind;
  readonly yKind: AxisKind;
  readonly series: readonly ChartSeries[];
  /** Orders of dashed reference slopes (log–log only), through the first series' point of smallest x. */
  readonly slopes?: readonly number[];
  /** Class of each series path (default 'series'). */
  readonly seriesClass?: string;
  /** Name of the data attribute carrying a series key (default 'data-key'). */
  readonly keyAttribute?: string;
  /** Pad the x range by 6 % each side (log–log) instead of spanning the data exactly. */
  readonly padX?: boolean;
}

/** What a caller passes for one series. */
export interface SeriesInput {
  readonly label: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  readonly style?: SeriesStyle;
}

/**
 * Checks and copies user series: at least one, each with equal non-zero
 * lengths, finite values, and values > 0 on a log axis.
 */
export function checkSeries(
  list: readonly SeriesInput[], xKind: AxisKind, yKind: AxisKind, defaultStyle: SeriesStyle,
): ChartSeries[] {
  if (!Array.isArray(list) || list.length === 0) {
    throw new InvalidOptionError('series', 'no series given; pass at least one { label, x, y } with one point or more');
  }
  return list.map((s, k) => {
    const name = `series[${k}]${typeof s?.label === 'string' && s.label !== '' ? ` (${JSON.stringify(s.label)})` : ''}`;
    if (s === null || typeof s !== 'object' || typeof s.label !== 'string') {
      throw new InvalidOptionError(`series[${k}]`, 'give { label: string, x: number[], y: number[] }');
    }
    if (s.x === undefined || s.y === undefined || typeof s.x.length !== 'number' || typeof s.y.length !== 'number') {
      throw new InvalidOptionError(name, 'x and y must be arrays (or typed arrays) of numbers');
    }
    if (s.x.length !== s.y.length) {
      throw new ShapeMismatchError(`${name} has ${s.x.length} x value(s) but ${s.y.length} y value(s); give one y per x`);
    }
    if (s.x.length === 0) throw new InvalidOptionError(name, 'the series is empty; give at least one point, or leave the series out');
    const style = s.style ?? defaultStyle;
    if (style !== 'line' && style !== 'points' && style !== 'both') {
      throw new InvalidOptionError(`${name}.style`, `${String(style)} is not a style; use 'line', 'points' or 'both'`);
    }
    const x = Float64Array.from(s.x);
    const y = Float64Array.from(s.y);
    for (const [axis, v, kind] of [['x', x, xKind], ['y', y, yKind]] as const) {
      for (let i = 0; i < v.length; i++) {
        if (!Number.isFinite(v[i])) throw new NonFiniteValueError(`${name}.${axis}[${i}]`, v[i]);
        if (kind === 'log' && !(v[i] > 0)) {
          throw new InvalidOptionError(
            `${name}.${axis}[${i}]`,
            `${v[i]} on a logarithmic axis; a log axis needs values > 0 — drop that point (an error of exactly 0 has no logarithm) or plot on linear axes with linePlot`,
          );
        }
      }
    }
    return { label: s.label, x, y, style };
  });
}

/** Data range of an axis, widened when degenerate and padded; in transformed units (log10 on a log axis). */
function range(values: readonly number[], pad: number, log: boolean): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    const t = log ? Math.log10(v) : v;
    if (t < lo) lo = t;
    if (t > hi) hi = t;
  }
  const mag = Math.max(Math.abs(lo), Math.abs(hi));
  // a span under ~1e-13 of the magnitude cannot carry distinct tick labels in float64
  if (!(hi - lo > 1e-13 * mag)) {
    const d = log ? 0.5 : mag > 0 ? 0.01 * mag : 1;
    lo -= d;
    hi += d;
  }
  if (!Number.isFinite(hi - lo)) {
    throw new InvalidOptionError('series', `values span [${lo}, ${hi}], wider than float64 can subtract; rescale the data`);
  }
  const p = pad * (hi - lo);
  return [lo - p, hi + p];
}

/** Horizontal tick-label test: boxes at least 0.6·size apart. */
export function fitsAcross(at: (v: number) => number, baseline: number, size: number): (t: readonly Tick[]) => boolean {
  return (ticks) => {
    let prev: Box | undefined;
    for (const t of ticks) {
      const b = labelBox(t.label, at(t.value), baseline, size, 'middle');
      if (prev !== undefined && b.x0 - prev.x1 < 0.6 * size) return false;
      prev = b;
    }
    return true;
  };
}

/** Vertical tick-label test: boxes (centred on their ticks) at least 0.4·size apart. */
export function fitsUp(at: (v: number) => number, size: number): (t: readonly Tick[]) => boolean {
  return (ticks) => {
    let prevTop = Infinity;
    for (const t of ticks) {
      const y = at(t.value);
      if (prevTop - (y + 0.5 * size) < 0.4 * size) return false;
      prevTop = y - 0.5 * size;
    }
    return true;
  };
}

/** Ticks of one axis in data units: linear nice steps, or the log search. */
export function axisTicks(kind: AxisKind, lo: number, hi: number, fits: (t: readonly Tick[]) => boolean): Tick[] {
  return kind === 'log' ? logTicks(lo, hi, fits) : linearTicks(lo, hi, fits);
}

/** A legend entry. */
interface Entry {
  readonly label: string;
  readonly colour: string;
  readonly dash: string;
  readonly marker: boolean;
  readonly line: boolean;
}

function seriesLook(k: number): { colour: string; dash: string } {
  return { colour: PALETTE[k % PALETTE.length], dash: DASHES[Math.floor(k / PALETTE.length) % DASHES.length] };
}

/** Keeps at most ~4 points per pixel column: first, min, max, last of each column, in order. */
function thin(xs: readonly number[], ys: readonly number[], columns: number): [number[], number[]] {
  if (xs.length <= 4 * columns) return [[...xs], [...ys]];
  const ox: number[] = [];
  const oy: number[] = [];
  let i = 0;
  while (i < xs.length) {
    const c = Math.floor(xs[i]);
    let j = i;
    let lo = i;
    let hi = i;
    while (j + 1 < xs.length && Math.floor(xs[j + 1]) === c) {
      j++;
      if (ys[j] < ys[lo]) lo = j;
      if (ys[j] > ys[hi]) hi = j;
    }
    for (const k of [...new Set([i, lo, hi, j])].sort((a, b) => a - b)) {
      ox.push(xs[k]);
      oy.push(ys[k]);
    }
    i = j + 1;
  }
  return [ox, oy];
}

/** Draws the chart; returns the SVG document. */
export function drawChart(spec: ChartSpec): string {
  const W = spec.width;
  const H = spec.height;
  checkSize(W, H);
  const xLog = spec.xKind === 'log';
  const yLog = spec.yKind === 'log';
  const slopes = spec.slopes ?? [];
  for (const p of slopes) {
    if (!Number.isFinite(p)) throw new InvalidOptionError('slopes', `${p} is not a finite order; give numbers such as [1, 2, 4]`);
  }
  const allX: number[] = [];
  const allY: number[] = [];
  for (const s of spec.series) {
    for (let i = 0; i < s.x.length; i++) {
      allX.push(s.x[i]);
      allY.push(s.y[i]);
    }
  }
  const [x0, x1] = range(allX, spec.padX === true ? 0.06 : 0, xLog);
  // reference slopes through the first series' point of smallest x, across the data's x range
  const first = spec.series[0];
  let ai = 0;
  for (let i = 1; i < first.x.length; i++) if (first.x[i] < first.x[ai]) ai = i;
  const tx = (v: number): number => (xLog ? Math.log10(v) : v);
  const ty = (v: number): number => (yLog ? Math.log10(v) : v);
  let dataLo = Infinity;
  let dataHi = -Infinity;
  for (const v of allX) {
    dataLo = Math.min(dataLo, tx(v));
    dataHi = Math.max(dataHi, tx(v));
  }
  const ax = tx(first.x[ai]);
  const ay = ty(first.y[ai]);
  const refs = slopes.map((p) => ({ p, yLo: ay + p * (dataLo - ax), yHi: ay + p * (dataHi - ax) }));
  const yValues = [...allY];
  for (const r of refs) yValues.push(10 ** r.yLo, 10 ** r.yHi);
  const [y0, y1] = range(yLog ? yValues : allY, yLog ? 0.06 : 0.05, yLog);

  const sheet = new Sheet(W, H);
  const title = spec.title;
  const top = title !== '' ? 48 : 18;
  const bottom = spec.xLabel !== '' ? 58 : 36;
  const plotT = top;
  const plotB = H - bottom;
  const plotH = plotB - plotT;
  const my = (t: number): number => plotB - ((t - y0) / (y1 - y0)) * plotH;
  const yAt = (v: number): number => my(ty(v));
  const yTicks = axisTicks(spec.yKind, y0, y1, fitsUp(yAt, SIZE.tick));
  const yTickW = Math.max(0, ...yTicks.map((t) => textWidth(t.label, SIZE.tick)));
  const left = Math.ceil((spec.yLabel !== '' ? 12 + SIZE.axis + 8 : 10) + yTickW + 9);

  // legend: series with a label, and room for a "slope p" fallback entry
  const entries: Entry[] = [];
  spec.series.forEach((s, k) => {
    const { colour, dash } = seriesLook(k);
    if (s.label !== '') entries.push({ label: s.label, colour, dash, marker: s.style !== 'line', line: s.style !== 'points' });
  });
  const slopeText = (p: number): string => `slope ${p}`;
  const wanted = Math.max(0, ...entries.map((e) => textWidth(e.label, SIZE.legend)), ...slopes.map((p) => textWidth(slopeText(p), SIZE.legend)));
  const hasLegend = entries.length > 0 || slopes.length > 0;
  const roomForText = Math.max(36, W - left - 0.5 * (W - left) - 62);
  const legendText = Math.min(wanted, roomForText);
  const right = hasLegend ? Math.ceil(20 + 30 + legendText + 10) : 24;
  const plotL = left;
  const plotR = W - right;
  const plotW = plotR - plotL;
  const mx = (t: number): number => plotL + ((t - x0) / (x1 - x0)) * plotW;
  const xAt = (v: number): number => mx(tx(v));
  const xBase = plotB + 8 + 0.8 * SIZE.tick;
  const xTicks = axisTicks(spec.xKind, x0, x1, fitsAcross(xAt, xBase, SIZE.tick));

  // grid, frame, ticks
  const grid: string[] = [];
  for (const t of xTicks) grid.push(`M${px(xAt(t.value))},${px(plotT)}V${px(plotB)}`);
  for (const t of yTicks) grid.push(`M${px(plotL)},${px(yAt(t.value))}H${px(plotR)}`);
  sheet.raw(`<path class="grid" d="${grid.join('')}" stroke="${RULE}" stroke-width="1" fill="none"/>`);
  sheet.raw(`<rect class="frame" x="${px(plotL)}" y="${px(plotT)}" width="${px(plotW)}" height="${px(plotH)}" fill="none" stroke="${MUTED}" stroke-width="1"/>`);
  const marks: string[] = [];
  for (const t of xTicks) marks.push(`M${px(xAt(t.value))},${px(plotB)}v5`);
  for (const t of yTicks) marks.push(`M${px(plotL)},${px(yAt(t.value))}h-5`);
  sheet.raw(`<path class="tick" d="${marks.join('')}" stroke="${MUTED}" stroke-width="1"/>`);

  // mandatory texts first, so that optional ones give way to them
  if (title !== '') {
    sheet.text({ text: fitText(title, SIZE.title, W - 32), x: 16, y: 28, size: SIZE.title, anchor: 'start', kind: 'title', weight: 600 }, true);
  }
  if (spec.xLabel !== '') {
    sheet.text({ text: fitText(spec.xLabel, SIZE.axis, plotW), x: plotL + plotW / 2, y: H - 14, size: SIZE.axis, anchor: 'middle', kind: 'axis-label' }, true);
  }
  if (spec.yLabel !== '') {
    sheet.text({
      text: fitText(spec.yLabel, SIZE.axis, plotH), x: 12 + 0.8 * SIZE.axis, y: plotT + plotH / 2,
      size: SIZE.axis, anchor: 'middle', rotated: true, kind: 'axis-label',
    }, true);
  }
  for (const t of xTicks) sheet.text({ text: t.label, x: xAt(t.value), y: xBase, size: SIZE.tick, anchor: 'middle', kind: 'tick-label', fill: MUTED });
  for (const t of yTicks) {
    sheet.text({ text: t.label, x: plotL - 9, y: yAt(t.value) + 0.3 * SIZE.tick, size: SIZE.tick, anchor: 'end', kind: 'tick-label', fill: MUTED });
  }

  // reference slopes
  const refLines = refs.map((r) => ({ ...r, xa: mx(dataLo), ya: my(r.yLo), xb: mx(dataHi), yb: my(r.yHi) }));
  if (refLines.length > 0) {
    const d = refLines.map((r) => `<path class="reference" data-slope="${r.p}" d="M${px(r.xa)},${px(r.ya)}L${px(r.xb)},${px(r.yb)}"/>`);
    sheet.raw(`<g stroke="#8c8f96" stroke-width="1.2" stroke-dasharray="6 4" fill="none">${d.join('')}</g>`);
  }

  // series; their markers and lines are obstacles for the slope labels
  const obstacles: Box[] = [];
  const linePoints: number[] = []; // x, y, owner (series index, or −1 − r for reference line r)
  const densify = (xa: number, ya: number, xb: number, yb: number, owner: number): void => {
    const n = Math.max(1, Math.ceil(Math.hypot(xb - xa, yb - ya) / 3));
    for (let m = 0; m <= n; m++) linePoints.push(xa + (m / n) * (xb - xa), ya + (m / n) * (yb - ya), owner);
  };
  refLines.forEach((r, k) => densify(r.xa, r.ya, r.xb, r.yb, -1 - k));
  const cls = spec.seriesClass ?? 'series';
  const keyAttr = spec.keyAttribute ?? 'data-key';
  spec.series.forEach((s, k) => {
    const { colour, dash } = seriesLook(k);
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i < s.x.length; i++) {
      xs.push(xAt(s.x[i]));
      ys.push(yAt(s.y[i]));
    }
    const key = s.key !== undefined ? ` ${keyAttr}="${escapeXml(s.key)}"` : '';
    const label = s.label !== '' ? ` data-label="${escapeXml(s.label)}"` : '';
    if (s.style !== 'points') {
      const [tx2, ty2] = thin(xs, ys, plotW);
      const d = tx2.map((v, i) => `${i === 0 ? 'M' : 'L'}${px(v)},${px(ty2[i])}`).join('');
      const dashAttr = dash !== '' ? ` stroke-dasharray="${dash}"` : '';
      sheet.raw(`<path class="${cls}"${key}${label} d="${d}" fill="none" stroke="${colour}" stroke-width="2" stroke-linejoin="round"${dashAttr}/>`);
    }
    if (s.style !== 'points') {
      for (let i = 0; i + 1 < xs.length; i++) densify(xs[i], ys[i], xs[i + 1], ys[i + 1], k);
    }
    if (s.style !== 'line') {
      const dots = xs.map((v, i) => `<circle cx="${px(v)}" cy="${px(ys[i])}" r="3.5"/>`);
      sheet.raw(`<g class="markers" fill="${colour}" stroke="${PAPER}" stroke-width="0.8">${dots.join('')}</g>`);
      for (let i = 0; i < xs.length; i++) obstacles.push({ x0: xs[i] - 4, y0: ys[i] - 4, x1: xs[i] + 4, y1: ys[i] + 4 });
    }
  });

  // slope labels on their lines where they fit, else in the legend
  const inside = (b: Box): boolean => b.x0 >= plotL + 2 && b.x1 <= plotR - 2 && b.y0 >= plotT + 2 && b.y1 <= plotB - 2;
  const crossed = (b: Box, own: number): boolean => {
    for (let m = 0; m < linePoints.length; m += 3) {
      if (linePoints[m + 2] !== own && linePoints[m] >= b.x0 && linePoints[m] <= b.x1 && linePoints[m + 1] >= b.y0 && linePoints[m + 1] <= b.y1) return true;
    }
    return false;
  };
  for (const [rk, r] of refLines.entries()) {
    let placed = false;
    for (const f of [0.9, 0.75, 0.6, 0.45, 0.3, 0.15]) {
      const x = r.xa + f * (r.xb - r.xa);
      const y = r.ya + f * (r.yb - r.ya);
      for (const [dx, dy, anchor] of [[-4, -5, 'end'], [4, 14, 'start']] as const) {
        const l = { text: slopeText(r.p), x: x + dx, y: y + dy, size: SIZE.small, anchor, kind: 'slope-label', fill: '#6b6e75', halo: PAPER };
        const b = labelBox(l.text, l.x, l.y, l.size, l.anchor);
        if (!inside(b) || obstacles.some((o) => overlaps(b, o)) || crossed(b, -1 - rk)) continue;
        if (sheet.text(l)) {
          placed = true;
          break;
        }
      }
      if (placed) break;
    }
    if (!placed) entries.push({ label: slopeText(r.p), colour: '#8c8f96', dash: '6 4', marker: false, line: true });
  }

  // legend column
  if (entries.length > 0) {
    const lx = plotR + 20;
    const step = 20;
    const fitCount = Math.max(1, Math.floor((plotH - 6) / step));
    const shown = entries.length > fitCount ? entries.slice(0, fitCount - 1) : entries;
    const rows: string[] = [];
    shown.forEach((e, i) => {
      const y = plotT + 10 + i * step;
      if (e.line) {
        const dashAttr = e.dash !== '' ? ` stroke-dasharray="${e.dash}"` : '';
        rows.push(`<path d="M${px(lx)},${px(y)}h24" stroke="${e.colour}" stroke-width="2"${dashAttr}/>`);
      }
      if (e.marker) rows.push(`<circle cx="${px(lx + 12)}" cy="${px(y)}" r="3.5" fill="${e.colour}"/>`);
    });
    sheet.raw(`<g class="legend" fill="none">${rows.join('')}</g>`);
    shown.forEach((e, i) => {
      const y = plotT + 10 + i * step;
      sheet.text({ text: fitText(e.label, SIZE.legend, legendText), x: lx + 30, y: y + 0.35 * SIZE.legend, size: SIZE.legend, anchor: 'start', kind: 'legend-label' });
    });
    if (shown.length < entries.length) {
      const y = plotT + 10 + shown.length * step;
      sheet.text({ text: fitText(`+${entries.length - shown.length} more`, SIZE.legend, legendText), x: lx + 30, y: y + 0.35 * SIZE.legend, size: SIZE.legend, anchor: 'start', kind: 'legend-label', fill: MUTED });
    }
  }
  return sheet.finish();
}
