/**
 * A convergence study as text: a markdown table and CSV. The log–log
 * picture, `studyPlot`, is drawn by the output stage (src/io/plot).
 *
 * Both are pure functions of the study's plain data; nothing here
 * touches files (write the strings where you like).
 *
 * @module
 */
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
