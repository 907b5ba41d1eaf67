/**
 * Colour maps of 2-D fields with a colour bar and optional contour lines.
 * Pure: grid and field in, SVG text out.
 *
 * **Cells at their true positions.** A field holds values at nodes, so each
 * node is drawn as its own cell — the rectangle from the midpoints to its
 * neighbours (clipped at the domain's ends) — filled with the colour of
 * its value. On a stretched axis the cells are as uneven as the nodes; a
 * periodic axis is closed at `to` by the image of its first node.
 *
 * **Colour.** The quadrille scale ({@link scaleColour}: Oklab, lightness
 * strictly increasing), value v ↦ t = (v − lo)/(hi − lo) clamped to [0, 1],
 * with [lo, hi] the finite data range unless `range` is given.
 *
 * **NaN means "no data".** NaN nodes are drawn hatched grey, the colour bar
 * gains a hatched "no data" swatch, they are left out of the range, and
 * contours skip every cell with a NaN corner. ±Infinity is refused
 * (NonFiniteValueError): it is an overflow, not a gap.
 *
 * **Contours** by marching squares with saddles resolved by the cell-centre
 * mean (see the contour module notes; Lorensen & Cline 1987): one `<path>`
 * per level that crosses the field, labelled with its value where the label
 * clears every other label and every other level's line.
 *
 * @module
 */
import { InvalidOptionError, NonFiniteValueError } from '../../errors.js';
import type { Field } from '../../grid/field.js';
import { checkField } from '../../grid/field.js';
import type { Axis } from '../../grid/axis.js';
import type { Grid } from '../../grid/grid.js';
import { fitsAcross, fitsUp } from './chart.js';
import { TABLE_SIZE, colourTable } from './colour.js';
import { type ContourLine, contourLines } from './contour.js';
import { withUnits } from './line.js';
import { INK, MUTED, PAPER, Sheet, checkSize } from './sheet.js';
import { SIZE, type Box, fitText, labelBox, px, textWidth } from './text.js';
import { type Tick, formatStep, linearTicks } from './ticks.js';

/**
 * What a field map shows and how.
 *
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 8 } });
 * const T = sampleField(g, (x, y) => 100 * x * y);
 * fieldMap(g, T, { quantity: 'temperature', units: '°C', levels: [25, 50, 75] }).match(/class="contour"/g).length // 3
 * ```
 */
export interface FieldMapOptions {
  /** Title above the map (default "⟨quantity⟩ on nx × ny nodes"). */
  readonly title?: string;
  /** Name of the mapped quantity, for the colour bar (default 'value'). */
  readonly quantity?: string;
  /** Units of the quantity, e.g. '°C' (default none). */
  readonly units?: string;
  /** Units of the coordinates (default 'm'). */
  readonly lengthUnits?: string;
  /**
   * Values at the two ends of the colour scale, lo < hi, both finite
   * (default: the finite data range; a constant field is widened by 1 % of
   * its magnitude, or ±1 at zero). Values outside are drawn in the end colours.
   */
  readonly range?: readonly [number, number];
  /**
   * Contour levels: a count n (0 … 200) for n equally spaced levels strictly
   * inside the colour range, lo + k·(hi − lo)/(n + 1), k = 1 … n; or the
   * levels themselves (finite; sorted and deduplicated). Default none.
   */
  readonly levels?: number | readonly number[];
  /** Width in px, 200 … 8000 (default 720). */
  readonly width?: number;
  /**
   * Height in px, 200 … 8000 (default: from the domain's aspect ratio with
   * `equalScale`, else 0.72·width).
   */
  readonly height?: number;
  /**
   * One metre (one length unit) is as long across as up, so the map has the
   * domain's shape (default: true when the domain's aspect ratio is between
   * 1:5 and 5:1).
   */
  readonly equalScale?: boolean;
  /** Draw the grid's node lines over the map (default false). */
  readonly mesh?: boolean;
}

/** Node coordinates with the periodic image at `to` appended, and the node cells' edges. */
function axisCells(a: Axis): { nodes: Float64Array; edges: Float64Array } {
  const n = a.periodic ? a.count + 1 : a.count;
  const nodes = new Float64Array(n);
  nodes.set(a.coordinates);
  if (a.periodic) nodes[n - 1] = a.to;
  const edges = new Float64Array(n + 1);
  edges[0] = nodes[0];
  for (let i = 1; i < n; i++) edges[i] = 0.5 * (nodes[i - 1] + nodes[i]);
  edges[n] = nodes[n - 1];
  return { nodes, edges };
}

/** FNV-1a hash of a string, as 8 hex digits: a stable id suffix, so that maps inlined in one page keep distinct ids. */
function hash(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, '0');
}

function levelList(spec: FieldMapOptions['levels'], lo: number, hi: number): number[] {
  if (spec === undefined) return [];
  if (typeof spec === 'number') {
    if (!Number.isSafeInteger(spec) || spec < 0 || spec > 200) {
      throw new InvalidOptionError('levels', `${spec}; give a whole number of levels from 0 to 200, or the levels themselves`);
    }
    return Array.from({ length: spec }, (_, k) => lo + ((k + 1) * (hi - lo)) / (spec + 1));
  }
  if (!Array.isArray(spec)) throw new InvalidOptionError('levels', 'give a count or an array of level values');
  spec.forEach((v, k) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new NonFiniteValueError(`levels[${k}]`, Number(v));
  });
  return [...new Set(spec as readonly number[])].sort((a, b) => a - b);
}

/** Labels for the levels: enough decimals to tell neighbouring levels apart. */
function levelLabels(levels: readonly number[], lo: number, hi: number): string[] {
  let step = hi - lo;
  for (let k = 1; k < levels.length; k++) step = Math.min(step, levels[k] - levels[k - 1]);
  let e = Math.floor(Math.log10(step));
  const unit = 10 ** e;
  if (levels.some((v) => Math.abs(v / unit - Math.round(v / unit)) > 1e-6)) e -= 1;
  const magnitude = Math.max(...levels.map(Math.abs));
  return levels.map((v) => formatStep(v, e, magnitude));
}

/** Arc-length positions of a polyline in px, and the point at a fraction of its length. */
function pointAlong(p: Float64Array, f: number): [number, number] {
  let total = 0;
  for (let k = 2; k < p.length; k += 2) total += Math.hypot(p[k] - p[k - 2], p[k + 1] - p[k - 1]);
  let goal = f * total;
  for (let k = 2; k < p.length; k += 2) {
    const d = Math.hypot(p[k] - p[k - 2], p[k + 1] - p[k - 1]);
    if (d >= goal && d > 0) {
      const s = goal / d;
      return [p[k - 2] + s * (p[k] - p[k - 2]), p[k - 1] + s * (p[k + 1] - p[k - 1])];
    }
    goal -= d;
  }
  return [p[p.length - 2], p[p.length - 1]];
}

function lengthOf(p: Float64Array): number {
  let total = 0;
  for (let k = 2; k < p.length; k += 2) total += Math.hypot(p[k] - p[k - 2], p[k + 1] - p[k - 1]);
  return total;
}

/**
 * A colour map of a 2-D field, as a standalone SVG: node cells at their
 * true positions in the quadrille colour scale, axes with units and nice
 * 1-2-5 ticks, a colour bar with ticks and the quantity's name and units,
 * a title, and optional contour lines labelled with their values.
 *
 * Layout: every label's box is estimated (0.6·size per character, height
 * = size) and none may overlap another — tick labels thin out to a
 * coarser nice step when crowded, and a contour label moves along its line
 * (or is left out) until it clears the others and the other levels' lines.
 *
 * @param g - a 2-D grid, uniform or stretched axes, periodic or not
 * @param field - values at the grid's nodes, shape [nx, ny], x slowest; NaN means no data
 * @param options - quantity and units, range, contour levels, size, title
 * @returns an SVG document (xmlns set), standalone or inline in HTML
 * @throws InvalidOptionError for a grid that is not 2-D, a bad range, level count, text or size;
 *   ShapeMismatchError / InvalidFieldError for a field of the wrong shape or kind;
 *   NonFiniteValueError for ±Infinity in the field, a field with no finite value (and no `range`), or a non-finite level
 * @example
 * ```ts
 * const g = grid({ x: { nodes: [0, 0.1, 0.3, 0.7, 1.5] }, y: { from: 0, to: 1, cells: 4 } });
 * fieldMap(g, sampleField(g, (x, y) => x + y), { units: 'K' }).includes('value (K)') // true
 * ```
 */
export function fieldMap(g: Grid, field: Field, options: Readonly<FieldMapOptions> = {}): string {
  if (g === null || typeof g !== 'object' || g.dimension !== 2) {
    throw new InvalidOptionError('grid', `a field map needs a 2-D grid, this one is ${String(g?.dimension)}-D; use profilePlot for 1-D fields, or a 2-D slice of a 3-D one`);
  }
  checkField(g, field, 'field');
  const gy = g.axes[1] as Axis;
  for (const key of ['title', 'quantity', 'units', 'lengthUnits'] as const) {
    const v = options[key];
    if (v !== undefined && typeof v !== 'string') throw new InvalidOptionError(key, `${String(v)} is not text; give a string`);
  }
  const X = axisCells(g.x);
  const Y = axisCells(gy);
  const nx = X.nodes.length;
  const ny = Y.nodes.length;
  const sx = g.x.count;
  const sy = gy.count;
  const v = new Float64Array(nx * ny);
  let nan = 0;
  let dLo = Infinity;
  let dHi = -Infinity;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      const w = field.data[field.offset + (i % sx) * field.stride[0] + (j % sy) * field.stride[1]];
      if (Number.isNaN(w)) nan++;
      else if (!Number.isFinite(w)) throw new NonFiniteValueError(`field[${i % sx}, ${j % sy}]`, w);
      else {
        if (w < dLo) dLo = w;
        if (w > dHi) dHi = w;
      }
      v[i * ny + j] = w;
    }
  }
  let lo: number;
  let hi: number;
  if (options.range !== undefined) {
    const r = options.range;
    if (!Array.isArray(r) || r.length !== 2 || !Number.isFinite(r[0]) || !Number.isFinite(r[1]) || !(r[0] < r[1])) {
      throw new InvalidOptionError('range', `${JSON.stringify(r)}; give [lo, hi], finite, lo < hi`);
    }
    [lo, hi] = r;
  } else {
    if (dLo === Infinity) throw new NonFiniteValueError('every entry of field', NaN);
    lo = dLo;
    hi = dHi;
    const mag = Math.max(Math.abs(lo), Math.abs(hi));
    if (!(hi - lo > 1e-13 * mag)) {
      const d = mag > 0 ? 0.01 * mag : 1;
      lo -= d;
      hi += d;
    }
    if (!Number.isFinite(hi - lo)) throw new InvalidOptionError('range', `the data span [${lo}, ${hi}] overflows float64; give a range or rescale`);
  }
  const levels = levelList(options.levels, lo, hi);
  const quantity = options.quantity ?? 'value';
  const lengthUnits = options.lengthUnits ?? 'm';
  const title = options.title ?? `${quantity} on ${sx} × ${sy} nodes`;

  // layout
  const W = options.width ?? 720;
  const givenH = options.height;
  checkSize(W, givenH ?? 200);
  const Lx = g.x.to - g.x.from;
  const Ly = gy.to - gy.from;
  const equal = options.equalScale ?? (Ly / Lx >= 0.2 && Ly / Lx <= 5);
  if (typeof equal !== 'boolean') throw new InvalidOptionError('equalScale', `${String(equal)}; use true or false`);
  const top = 48;
  const bottom = 58;
  const noDataW = nan > 0 ? textWidth('no data', SIZE.small) + 22 : 0;
  let plotH = (givenH ?? 0.72 * W) - top - bottom;
  let plotW = 0;
  let left = 0;
  let right = 0;
  let yTicks: Tick[] = [];
  let cTicks: Tick[] = [];
  const noDataH = nan > 0 ? 30 : 0;
  const verticalTicks = (): void => {
    const yAt = (y: number): number => top + plotH - ((y - gy.from) / Ly) * plotH;
    yTicks = linearTicks(gy.from, gy.to, fitsUp(yAt, SIZE.tick));
    const barH = plotH - noDataH;
    cTicks = linearTicks(lo, hi, fitsUp((c) => top + barH - ((c - lo) / (hi - lo)) * barH, SIZE.tick));
  };
  // the margins depend on the tick labels, which depend on the height, which (equal scale) depends on the margins
  for (let pass = 0; pass < 3; pass++) {
    verticalTicks();
    left = Math.ceil(12 + SIZE.axis + 8 + Math.max(0, ...yTicks.map((t) => textWidth(t.label, SIZE.tick))) + 9);
    const cbW = Math.max(noDataW - 8, ...cTicks.map((t) => textWidth(t.label, SIZE.tick)));
    right = Math.ceil(22 + 16 + 8 + cbW + 8 + SIZE.axis + 12);
    plotW = W - left - right;
    if (plotW < 60) throw new InvalidOptionError('width', `${W} px leaves ${Math.round(plotW)} px for the map; give a larger width`);
    if (equal) {
      plotH = (plotW * Ly) / Lx;
      const maxH = givenH !== undefined ? givenH - top - bottom : 1.5 * W;
      if (plotH > maxH) {
        plotH = maxH;
        plotW = (plotH * Lx) / Ly;
      }
    }
  }
  verticalTicks();
  const H = givenH ?? Math.max(200, Math.ceil(top + plotH + bottom));
  checkSize(W, H);
  const plotL = left;
  const plotT = top;
  const plotR = plotL + plotW;
  const plotB = plotT + plotH;
  const mx = (x: number): number => plotL + ((x - g.x.from) / Lx) * plotW;
  const my = (y: number): number => plotB - ((y - gy.from) / Ly) * plotH;
  const sheet = new Sheet(W, H);

  // cells: one rect per run of equal colour along y, at the nodes' true cell edges
  const table = colourTable();
  const colourOf = (w: number): number => {
    if (Number.isNaN(w)) return -1;
    const t = Math.min(1, Math.max(0, (w - lo) / (hi - lo)));
    return Math.round(t * (TABLE_SIZE - 1));
  };
  const rects: string[] = [];
  for (let i = 0; i < nx; i++) {
    const xa = mx(X.edges[i]);
    const xb = mx(X.edges[i + 1]);
    let j = 0;
    while (j < ny) {
      const c = colourOf(v[i * ny + j]);
      let k = j;
      while (k + 1 < ny && colourOf(v[i * ny + k + 1]) === c) k++;
      const ya = my(Y.edges[k + 1]);
      const yb = my(Y.edges[j]);
      const fill = c < 0 ? 'NODATA' : table[c];
      rects.push(`<rect x="${px(xa)}" y="${px(ya)}" width="${px(xb - xa)}" height="${px(yb - ya)}" fill="${fill}"/>`);
      j = k + 1;
    }
  }
  const id = `quadrille-nodata-${hash(rects.join('') + title)}`;
  const hatch = `url(#${id})`;
  if (nan > 0) {
    sheet.raw(
      `<defs><pattern id="${id}" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">` +
        `<rect width="6" height="6" fill="#d7d7d4"/><path d="M0,0V6" stroke="#8f8f8b" stroke-width="2"/></pattern></defs>`,
    );
  }
  sheet.raw(`<g class="cells" shape-rendering="crispEdges">${rects.join('').replace(/NODATA/g, hatch)}</g>`);
  if (options.mesh === true) {
    const d: string[] = [];
    for (const x of X.nodes) d.push(`M${px(mx(x))},${px(plotT)}V${px(plotB)}`);
    for (const y of Y.nodes) d.push(`M${px(plotL)},${px(my(y))}H${px(plotR)}`);
    sheet.raw(`<path class="mesh" d="${d.join('')}" stroke="#ffffff" stroke-opacity="0.45" stroke-width="0.6" fill="none"/>`);
  }

  // contours: one path per level that crosses the field
  const drawn: { level: number; label: string; lines: Float64Array[] }[] = [];
  const labels = levelLabels(levels.length > 0 ? levels : [0], lo, hi);
  levels.forEach((level, k) => {
    const lines: ContourLine[] = contourLines(X.nodes, Y.nodes, v, level);
    if (lines.length === 0) return;
    const pix: Float64Array[] = [];
    const d: string[] = [];
    for (const l of lines) {
      const p = new Float64Array(l.points.length);
      for (let m = 0; m < p.length; m += 2) {
        p[m] = mx(l.points[m]);
        p[m + 1] = my(l.points[m + 1]);
        d.push(`${m === 0 ? 'M' : 'L'}${px(p[m])},${px(p[m + 1])}`);
      }
      if (l.closed) {
        d.push('Z');
        const q = new Float64Array(p.length + 2);
        q.set(p);
        q[p.length] = p[0];
        q[p.length + 1] = p[1];
        pix.push(q);
      } else {
        pix.push(p);
      }
    }
    sheet.raw(`<path class="contour" data-level="${level}" d="${d.join('')}" fill="none" stroke="#16181d" stroke-opacity="0.85" stroke-width="1" stroke-linejoin="round"/>`);
    drawn.push({ level, label: labels[k], lines: pix });
  });
  sheet.raw(`<rect class="frame" x="${px(plotL)}" y="${px(plotT)}" width="${px(plotW)}" height="${px(plotH)}" fill="none" stroke="${MUTED}" stroke-width="1"/>`);

  // axes: mandatory texts first
  sheet.text({ text: fitText(title, SIZE.title, W - 32), x: 16, y: 28, size: SIZE.title, anchor: 'start', kind: 'title', weight: 600 }, true);
  sheet.text({ text: fitText(withUnits('x', lengthUnits), SIZE.axis, plotW), x: plotL + plotW / 2, y: H - 14, size: SIZE.axis, anchor: 'middle', kind: 'axis-label' }, true);
  sheet.text({
    text: fitText(withUnits(gy.name, lengthUnits), SIZE.axis, plotH), x: 12 + 0.8 * SIZE.axis, y: plotT + plotH / 2,
    size: SIZE.axis, anchor: 'middle', rotated: true, kind: 'axis-label',
  }, true);
  const xBase = plotB + 8 + 0.8 * SIZE.tick;
  const xTicks = linearTicks(g.x.from, g.x.to, fitsAcross(mx, xBase, SIZE.tick));
  const marks: string[] = [];
  for (const t of xTicks) marks.push(`M${px(mx(t.value))},${px(plotB)}v5`);
  for (const t of yTicks) marks.push(`M${px(plotL)},${px(my(t.value))}h-5`);
  for (const t of xTicks) sheet.text({ text: t.label, x: mx(t.value), y: xBase, size: SIZE.tick, anchor: 'middle', kind: 'tick-label', fill: MUTED });
  for (const t of yTicks) {
    sheet.text({ text: t.label, x: plotL - 9, y: my(t.value) + 0.3 * SIZE.tick, size: SIZE.tick, anchor: 'end', kind: 'tick-label', fill: MUTED });
  }

  // colour bar
  const barX = plotR + 22;
  const barH = plotH - noDataH;
  const barB = plotT + barH;
  const cy = (c: number): number => barB - ((c - lo) / (hi - lo)) * barH;
  const steps = Math.max(16, Math.min(128, Math.round(barH / 2)));
  const bar: string[] = [];
  for (let k = 0; k < steps; k++) {
    const y1 = barB - (k * barH) / steps;
    const y0 = barB - ((k + 1) * barH) / steps;
    bar.push(`<rect x="${px(barX)}" y="${px(y0)}" width="16" height="${px(y1 - y0)}" fill="${table[Math.round(((k + 0.5) / steps) * (TABLE_SIZE - 1))]}"/>`);
  }
  sheet.raw(`<g class="colour-bar" shape-rendering="crispEdges">${bar.join('')}</g>`);
  sheet.raw(`<rect class="colour-bar-frame" x="${px(barX)}" y="${px(plotT)}" width="16" height="${px(barH)}" fill="none" stroke="${MUTED}" stroke-width="1"/>`);
  const inBar = drawn.filter((l) => l.level >= lo && l.level <= hi);
  if (inBar.length > 0) {
    const d = inBar.map((l) => `M${px(barX)},${px(cy(l.level))}h16`).join('');
    sheet.raw(`<path class="level-mark" d="${d}" stroke="${INK}" stroke-width="1"/>`);
  }
  for (const t of cTicks) marks.push(`M${px(barX + 16)},${px(cy(t.value))}h4`);
  sheet.raw(`<path class="tick" d="${marks.join('')}" stroke="${MUTED}" stroke-width="1"/>`);
  for (const t of cTicks) {
    sheet.text({ text: t.label, x: barX + 16 + 8, y: cy(t.value) + 0.3 * SIZE.tick, size: SIZE.tick, anchor: 'start', kind: 'tick-label', fill: MUTED });
  }
  const cbW = Math.max(noDataW - 8, ...cTicks.map((t) => textWidth(t.label, SIZE.tick)));
  sheet.text({
    text: fitText(withUnits(quantity, options.units), SIZE.axis, barH), x: barX + 16 + 8 + cbW + 8 + 0.8 * SIZE.axis, y: plotT + barH / 2,
    size: SIZE.axis, anchor: 'middle', rotated: true, kind: 'colour-bar-label',
  }, true);
  if (nan > 0) {
    sheet.raw(`<rect class="no-data-swatch" x="${px(barX)}" y="${px(plotB - 14)}" width="16" height="14" fill="${hatch}" stroke="${MUTED}" stroke-width="1"/>`);
    sheet.text({ text: 'no data', x: barX + 22, y: plotB - 3, size: SIZE.small, anchor: 'start', kind: 'no-data' }, true);
  }

  // contour labels: round-robin over levels so each level is labelled before any gets a second label
  if (drawn.length > 0) placeContourLabels(sheet, drawn, { x0: plotL, y0: plotT, x1: plotR, y1: plotB });
  return sheet.finish();
}

/** Buckets of contour points (16 px squares) to test label boxes against other levels' lines quickly. */
class PointIndex {
  private readonly cells = new Map<number, number[]>();

  add(x: number, y: number, level: number): void {
    const key = Math.floor(x / 16) * 65536 + Math.floor(y / 16);
    const list = this.cells.get(key);
    if (list === undefined) this.cells.set(key, [x, y, level]);
    else list.push(x, y, level);
  }

  /** Whether a point of a level other than `level` lies in `b`. */
  hits(b: Box, level: number): boolean {
    for (let cx = Math.floor(b.x0 / 16); cx <= Math.floor(b.x1 / 16); cx++) {
      for (let cy = Math.floor(b.y0 / 16); cy <= Math.floor(b.y1 / 16); cy++) {
        const list = this.cells.get(cx * 65536 + cy);
        if (list === undefined) continue;
        for (let k = 0; k < list.length; k += 3) {
          if (list[k + 2] !== level && list[k] >= b.x0 && list[k] <= b.x1 && list[k + 1] >= b.y0 && list[k + 1] <= b.y1) return true;
        }
      }
    }
    return false;
  }
}

function placeContourLabels(sheet: Sheet, drawn: readonly { level: number; label: string; lines: Float64Array[] }[], plot: Box): void {
  const index = new PointIndex();
  drawn.forEach((d, k) => {
    for (const p of d.lines) {
      // densify long segments so that a box between two far points still sees the line
      for (let m = 0; m < p.length; m += 2) {
        index.add(p[m], p[m + 1], k);
        if (m + 2 < p.length) {
          const len = Math.hypot(p[m + 2] - p[m], p[m + 3] - p[m + 1]);
          for (let s = 4; s < len; s += 4) index.add(p[m] + (s / len) * (p[m + 2] - p[m]), p[m + 1] + (s / len) * (p[m + 3] - p[m + 1]), k);
        }
      }
    }
  });
  const size = SIZE.small;
  const queues = drawn.map((d) => [...d.lines].map((p) => ({ p, len: lengthOf(p) })).sort((a, b) => b.len - a.len).slice(0, 3));
  const fractions = [0.5, 0.3, 0.7, 0.15, 0.85, 0.4, 0.6, 0.05, 0.95, 0.22, 0.78];
  const placed: [number, number][] = [];
  for (let round = 0; round < 3; round++) {
    drawn.forEach((d, k) => {
      const line = queues[k][round];
      if (line === undefined) return;
      const w = textWidth(d.label, size);
      if (line.len < w) return;
      // of the free spots along the line, take the one farthest from the labels already placed
      let best: [number, number] | undefined;
      let bestDistance = -1;
      for (const f of fractions) {
        const [x, y] = pointAlong(line.p, f);
        const b = labelBox(d.label, x, y + 0.3 * size, size, 'middle');
        if (b.x0 < plot.x0 + 2 || b.x1 > plot.x1 - 2 || b.y0 < plot.y0 + 2 || b.y1 > plot.y1 - 2) continue;
        if (index.hits(b, k) || !sheet.free(b)) continue;
        let near = Infinity;
        for (const [px0, py0] of placed) near = Math.min(near, Math.hypot(x - px0, y - py0));
        if (near > bestDistance) {
          best = [x, y];
          bestDistance = near;
        }
      }
      if (best === undefined) return;
      sheet.text({ text: d.label, x: best[0], y: best[1] + 0.3 * size, size, anchor: 'middle', kind: 'contour-label', halo: PAPER, fill: '#16181d' });
      placed.push(best);
    });
  }
}

