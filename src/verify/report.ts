/**
 * A convergence study as text and pictures: a markdown table, CSV, and a
 * standalone SVG log–log plot of error against spacing (or step) with
 * dashed reference slopes.
 *
 * All three are pure functions of the study's plain data; nothing here
 * touches files (write the strings where you like).
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';
import type { ConvergenceStudy, NormName } from './study.js';

const LABEL: Record<NormName, string> = { l2: 'L2', linf: 'L∞', quantity: 'quantity' };

/** Fixed notation for orders, compact exponent form for errors and measures. */
const num = (v: number): string => v.toExponential(3);
const ord = (v: number): string => v.toFixed(3);

function measureName(s: ConvergenceStudy): string {
  return s.refine === 'time' ? 'dt' : 'h';
}

/**
 * The study as a markdown table: one row per level with its spacing (and
 * step), each norm's error and the observed order from the level before;
 * then one row per norm with the least-squares order ± standard error and
 * the asymptotic-range flag.
 *
 * @param study - the study
 * @returns GitHub-flavoured markdown, lines joined by \n
 * @example studyTable(convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] })).split('\n')[0] // '| level | h | L∞ error | L∞ order |'
 */
export function studyTable(study: ConvergenceStudy): string {
  const both = study.refine === 'both';
  const head = ['level', measureName(study), ...(both ? ['dt'] : [])];
  for (const n of study.norms) head.push(`${LABEL[n]} error`, `${LABEL[n]} order`);
  const lines = [`| ${head.join(' | ')} |`, `|${head.map(() => '---').join('|')}|`];
  study.levels.forEach((l, i) => {
    const row = [String(l.index), num(l.measure), ...(both ? [num(l.timeStep!)] : [])];
    for (const n of study.norms) row.push(num(l.errors[n]!), i === 0 ? '' : ord(study.pairs[i - 1]!.orders[n]!));
    lines.push(`| ${row.join(' | ')} |`);
  });
  lines.push('', '| norm | least-squares order | standard error | asymptotic |', '|---|---|---|---|');
  for (const n of study.norms) {
    const f = study.fits[n]!;
    lines.push(`| ${LABEL[n]} | ${ord(f.order)} | ${f.standardError.toExponential(2)} | ${study.asymptotic[n] ? 'yes' : 'no'} |`);
  }
  return lines.join('\n');
}

/**
 * The study as CSV (RFC 4180, no quoting needed): header
 * `level,h[,dt],<norm>,<norm>_order,…`, one line per level, the order of
 * the first level empty; numbers in full precision.
 *
 * @param study - the study
 * @returns CSV text ending in a newline
 * @example studyCsv(convergenceStudy(({ spacing }) => ({ linf: spacing! }), { refine: 'space', spacings: [0.4, 0.2, 0.1] })).split('\n')[0] // 'level,h,linf,linf_order'
 */
export function studyCsv(study: ConvergenceStudy): string {
  const both = study.refine === 'both';
  const head = ['level', measureName(study), ...(both ? ['dt'] : [])];
  for (const n of study.norms) head.push(n, `${n}_order`);
  const lines = [head.join(',')];
  study.levels.forEach((l, i) => {
    const row = [String(l.index), String(l.measure), ...(both ? [String(l.timeStep)] : [])];
    for (const n of study.norms) row.push(String(l.errors[n]), i === 0 ? '' : String(study.pairs[i - 1]!.orders[n]));
    lines.push(row.join(','));
  });
  return lines.join('\n') + '\n';
}

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

const COLOURS: Record<NormName, string> = { l2: '#1f5f8b', linf: '#b8432f', quantity: '#4a7a2c' };

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** Tick positions (log10) covering [lo, hi]: whole decades, or 1-2-5 within a short range. */
function ticks(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let k = Math.ceil(lo - 1e-9); k <= hi + 1e-9; k++) out.push(k);
  if (out.length >= 2) return out;
  const sub: number[] = [];
  for (let k = Math.floor(lo) - 1; k <= Math.ceil(hi); k++) {
    for (const m of [1, 2, 5]) {
      const v = k + Math.log10(m);
      if (v >= lo - 1e-9 && v <= hi + 1e-9) sub.push(v);
    }
  }
  return sub;
}

function tickLabel(v: number): string {
  const k = Math.round(v);
  if (Math.abs(v - k) < 1e-9) return `10<tspan dy="-6" font-size="9">${k}</tspan>`;
  return (10 ** v).toPrecision(2).replace(/\.?0+e/, 'e');
}

/**
 * The study as a standalone SVG log–log plot: error against spacing (or
 * step), one polyline with markers per norm, dashed reference slopes of
 * whole orders anchored at the finest level of the first norm, decade ticks
 * with labels, and a legend. Fine levels sit at the left.
 *
 * @param study - the study
 * @param options - title, reference slopes, size
 * @returns an SVG document (xmlns set), viewable on its own or inline in HTML
 * @throws InvalidOptionError for a size that is not finite and ≥ 200 px, or a slope that is not finite
 * @example studyPlot(convergenceStudy(({ spacing }) => ({ linf: spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] })).startsWith('<svg') // true
 */
export function studyPlot(study: ConvergenceStudy, options: Readonly<PlotOptions> = {}): string {
  const W = options.width ?? 640;
  const H = options.height ?? 440;
  if (!(Number.isFinite(W) && W >= 200 && Number.isFinite(H) && H >= 200)) {
    throw new InvalidOptionError('width, height', `${W} × ${H} px; give finite sizes ≥ 200`);
  }
  const slopes = options.slopes ?? [...new Set(study.norms.map((n) => Math.max(1, Math.round(study.fits[n]!.order))))];
  for (const p of slopes) if (!Number.isFinite(p)) throw new InvalidOptionError('slopes', `${p} is not a finite order`);
  const left = 72;
  const right = 150;
  const top = 44;
  const bottom = 56;
  const xs = study.levels.map((l) => Math.log10(l.measure));
  const xLo = Math.min(...xs);
  const xHi = Math.max(...xs);
  const padX = 0.06 * (xHi - xLo);
  const x0 = xLo - padX;
  const x1 = xHi + padX;
  const anchorNorm = study.norms[0]!;
  const fine = study.levels[study.levels.length - 1]!;
  const ax = Math.log10(fine.measure);
  const ay = Math.log10(fine.errors[anchorNorm]!);
  const ys: number[] = [];
  for (const n of study.norms) for (const l of study.levels) ys.push(Math.log10(l.errors[n]!));
  // reference lines span the data's x range, so include their ends in the y range
  for (const p of slopes) ys.push(ay + p * (xHi - ax));
  const yLo0 = Math.min(...ys);
  const yHi0 = Math.max(...ys);
  const padY = 0.06 * Math.max(yHi0 - yLo0, 0.5);
  const y0 = yLo0 - padY;
  const y1 = yHi0 + padY;
  const px = (v: number): number => left + ((v - x0) / (x1 - x0)) * (W - left - right);
  const py = (v: number): number => H - bottom - ((v - y0) / (y1 - y0)) * (H - top - bottom);
  const f = (v: number): string => v.toFixed(1);
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="system-ui, sans-serif" font-size="12">`);
  parts.push(`<rect width="${W}" height="${H}" fill="#fbfaf7"/>`);
  parts.push(`<text x="${f(left)}" y="24" font-size="15" font-weight="600" fill="#222">${escapeXml(options.title ?? 'Observed convergence')}</text>`);
  const plotR = W - right;
  const plotB = H - bottom;
  parts.push(`<g stroke="#e3dfd6" stroke-width="1">`);
  const xt = ticks(x0, x1);
  const yt = ticks(y0, y1);
  for (const t of xt) parts.push(`<line x1="${f(px(t))}" y1="${top}" x2="${f(px(t))}" y2="${plotB}"/>`);
  for (const t of yt) parts.push(`<line x1="${left}" y1="${f(py(t))}" x2="${plotR}" y2="${f(py(t))}"/>`);
  parts.push('</g>');
  parts.push(`<rect x="${left}" y="${top}" width="${plotR - left}" height="${plotB - top}" fill="none" stroke="#444"/>`);
  parts.push('<g fill="#333" text-anchor="middle">');
  for (const t of xt) parts.push(`<line x1="${f(px(t))}" y1="${plotB}" x2="${f(px(t))}" y2="${plotB + 5}" stroke="#444"/><text x="${f(px(t))}" y="${plotB + 20}">${tickLabel(t)}</text>`);
  parts.push('</g><g fill="#333" text-anchor="end">');
  for (const t of yt) parts.push(`<line x1="${left - 5}" y1="${f(py(t))}" x2="${left}" y2="${f(py(t))}" stroke="#444"/><text x="${left - 8}" y="${f(py(t) + 4)}">${tickLabel(t)}</text>`);
  parts.push('</g>');
  const xName = study.refine === 'time' ? 'time step dt' : 'spacing h';
  parts.push(`<text x="${f((left + plotR) / 2)}" y="${H - 14}" text-anchor="middle" fill="#222">${xName}</text>`);
  parts.push(`<text transform="translate(18 ${f((top + plotB) / 2)}) rotate(-90)" text-anchor="middle" fill="#222">error</text>`);
  // reference slopes: through the finest point of the first norm
  parts.push('<g stroke="#8a8578" stroke-width="1.2" stroke-dasharray="6 4" fill="none">');
  for (const p of slopes) {
    parts.push(`<path class="reference" d="M${f(px(xLo))},${f(py(ay + p * (xLo - ax)))} L${f(px(xHi))},${f(py(ay + p * (xHi - ax)))}"/>`);
  }
  parts.push('</g><g fill="#6d685c" font-size="11">');
  for (const p of slopes) parts.push(`<text x="${f(px(xHi) + 4)}" y="${f(py(ay + p * (xHi - ax)) + 4)}">slope ${p}</text>`);
  parts.push('</g>');
  for (const n of study.norms) {
    const c = COLOURS[n];
    const d = study.levels.map((l, i) => `${i === 0 ? 'M' : 'L'}${f(px(Math.log10(l.measure)))},${f(py(Math.log10(l.errors[n]!)))}`).join(' ');
    parts.push(`<path class="norm" data-norm="${n}" d="${d}" fill="none" stroke="${c}" stroke-width="2"/>`);
    for (const l of study.levels) {
      parts.push(`<circle cx="${f(px(Math.log10(l.measure)))}" cy="${f(py(Math.log10(l.errors[n]!)))}" r="3.5" fill="${c}"/>`);
    }
  }
  parts.push(`<g transform="translate(${plotR + 16} ${top + 8})">`);
  study.norms.forEach((n, i) => {
    const fit = study.fits[n]!;
    parts.push(`<line x1="0" y1="${i * 20}" x2="22" y2="${i * 20}" stroke="${COLOURS[n]}" stroke-width="2"/><circle cx="11" cy="${i * 20}" r="3.5" fill="${COLOURS[n]}"/>`);
    parts.push(`<text x="28" y="${i * 20 + 4}" fill="#222">${LABEL[n]}  p = ${fit.order.toFixed(2)}</text>`);
  });
  parts.push('</g></svg>');
  return parts.join('\n');
}
