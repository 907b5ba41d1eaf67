/**
 * One self-contained HTML page from text, tables and SVG plots: inline CSS,
 * inline SVG, no scripts, no fonts or images fetched from anywhere, so the
 * file can be mailed, archived or attached to a CI run and still open
 * unchanged. Pure: a description in, the page as text out.
 *
 * Every piece of user text is escaped (& < > " ' become entities), so text
 * is shown as written and cannot inject markup. Figures are inserted as
 * given: pass SVG made by this module's plot functions, or SVG you trust.
 * The page is written as polyglot markup (void elements self-closed), so it
 * is also well-formed XML.
 *
 * @module
 */
import { InvalidOptionError, ShapeMismatchError } from '../../errors.js';

/**
 * One block of a report section.
 *
 * - `paragraph`: plain text; blank lines start new paragraphs.
 * - `table`: rows of cells (strings, or numbers shown with up to 6 significant
 *   digits), an optional header row and caption; all rows as long as the header
 *   (or the first row).
 * - `markdown`: markdown-like text — pipe tables (`| a | b |`, a `|---|` rule
 *   after the header row), `- ` bullet lists and paragraphs — such as
 *   `studyTable` returns.
 * - `figure`: an SVG document (`<svg …>…</svg>`) with an optional caption.
 *
 * @example htmlReport({ title: 'r', sections: [{ heading: 's', blocks: [{ kind: 'paragraph', text: 'T < 80 °C' }] }] }).includes('T &lt; 80 °C') // true
 */
export type ReportBlock =
  | {
      /** A paragraph of plain text. */
      readonly kind: 'paragraph';
      /** The text; blank lines start new paragraphs. */
      readonly text: string;
    }
  | {
      /** A table from rows. */
      readonly kind: 'table';
      /** Rows of cells: strings, or numbers (shown with up to 6 significant digits). */
      readonly rows: readonly (readonly (string | number)[])[];
      /** Column headings (default none). */
      readonly header?: readonly string[];
      /** Caption above the table (default none). */
      readonly caption?: string;
    }
  | {
      /** Markdown-like text: pipe tables, `- ` lists, paragraphs. */
      readonly kind: 'markdown';
      /** The text, e.g. what `studyTable` returns. */
      readonly text: string;
    }
  | {
      /** An inline SVG figure. */
      readonly kind: 'figure';
      /** The SVG document, as a plot function returns it (an XML prolog is dropped). */
      readonly svg: string;
      /** Caption under the figure (default none). */
      readonly caption?: string;
    };

/**
 * A titled section of a report.
 *
 * @example htmlReport({ title: 'r', sections: [{ heading: 'Mesh', blocks: [] }] }).includes('<h2>Mesh</h2>') // true
 */
export interface ReportSection {
  /** Section heading. */
  readonly heading: string;
  /** Its contents, in order. */
  readonly blocks: readonly ReportBlock[];
}

/**
 * What a report holds.
 *
 * @example htmlReport({ title: 'Wall', caution: 'Illustrative numbers.', sections: [] }).includes('class="caution"') // true
 */
export interface ReportContent {
  /** Page title and top heading. */
  readonly title: string;
  /** A line under the title (default none). */
  readonly summary?: string;
  /**
   * A caution paragraph shown prominently under the title, e.g. the limits of
   * the model or that results need independent checking (default none).
   */
  readonly caution?: string;
  /** The sections, in order. */
  readonly sections: readonly ReportSection[];
}

/** `s` with & < > " ' escaped: safe in HTML text and in quoted attributes. */
function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

function textOf(name: string, v: unknown): string {
  if (typeof v !== 'string') throw new InvalidOptionError(name, `${String(v)} is not text; give a string`);
  return v;
}

function cell(v: string | number, name: string): string {
  if (typeof v === 'number') {
    if (Number.isInteger(v) && Math.abs(v) < 1e15) return String(v);
    return Number.isFinite(v) ? String(Number(v.toPrecision(6))) : String(v);
  }
  return textOf(name, v);
}

const NUMERIC = /^[-+−]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

function table(header: readonly string[] | undefined, rows: readonly (readonly string[])[], caption: string | undefined): string {
  const td = (c: string, tag: 'td' | 'th'): string => `<${tag}${tag === 'td' && NUMERIC.test(c.trim()) ? ' class="num"' : ''}>${esc(c)}</${tag}>`;
  const out = ['<div class="table"><table>'];
  if (caption !== undefined) out.push(`<caption>${esc(caption)}</caption>`);
  if (header !== undefined) out.push(`<thead><tr>${header.map((c) => td(c, 'th')).join('')}</tr></thead>`);
  out.push('<tbody>');
  for (const r of rows) out.push(`<tr>${r.map((c) => td(c, 'td')).join('')}</tr>`);
  out.push('</tbody></table></div>');
  return out.join('');
}

function paragraphs(text: string): string {
  return text
    .split(/\n\s*\n/)
    .map((p) => p.trim())
    .filter((p) => p !== '')
    .map((p) => `<p>${esc(p.replace(/\s*\n\s*/g, ' '))}</p>`)
    .join('\n');
}

/** Cells of a pipe-table line: outer pipes dropped, `\|` kept as a literal bar. */
function pipeCells(line: string): string[] {
  const body = line.trim().replace(/^\|/, '').replace(/(?<!\\)\|$/, '');
  return body.split(/(?<!\\)\|/).map((c) => c.trim().replace(/\\\|/g, '|'));
}

function markdown(text: string, where: string): string {
  const lines = text.split(/\r?\n/);
  const out: string[] = [];
  let para: string[] = [];
  const flush = (): void => {
    if (para.length > 0) out.push(`<p>${esc(para.join(' '))}</p>`);
    para = [];
  };
  for (let i = 0; i < lines.length; ) {
    const line = lines[i].trim();
    if (line.startsWith('|')) {
      flush();
      const block: string[] = [];
      while (i < lines.length && lines[i].trim().startsWith('|')) block.push(lines[i++].trim());
      const rule = (l: string): boolean => /^\|?(\s*:?-{3,}:?\s*\|)*\s*:?-{3,}:?\s*\|?$/.test(l);
      const hasHeader = block.length >= 2 && rule(block[1]);
      const rows = block.filter((_, k) => !(hasHeader && k === 1)).map(pipeCells);
      const header = hasHeader ? rows.shift() : undefined;
      const width = header?.length ?? rows[0]?.length ?? 0;
      rows.forEach((r, k) => {
        if (r.length !== width) {
          throw new ShapeMismatchError(`${where}: table row ${k + 1} has ${r.length} cell(s) but the table has ${width} column(s); give every row ${width} cells`);
        }
      });
      out.push(table(header, rows, undefined));
      continue;
    }
    if (/^[-*] /.test(line)) {
      flush();
      const items: string[] = [];
      while (i < lines.length && /^[-*] /.test(lines[i].trim())) items.push(lines[i++].trim().slice(2));
      out.push(`<ul>${items.map((t) => `<li>${esc(t)}</li>`).join('')}</ul>`);
      continue;
    }
    if (line === '') flush();
    else para.push(line);
    i++;
  }
  flush();
  return out.join('\n');
}

function figure(svg: string, caption: string | undefined, where: string): string {
  const s = svg.trim().replace(/^<\?xml[^>]*\?>\s*/, '');
  if (!s.startsWith('<svg') || !s.endsWith('</svg>')) {
    throw new InvalidOptionError(`${where}.svg`, 'is not an SVG document; pass the string a plot function returns (it starts with <svg and ends with </svg>)');
  }
  const cap = caption !== undefined ? `<figcaption>${esc(caption)}</figcaption>` : '';
  return `<figure>${s}${cap}</figure>`;
}

function block(b: ReportBlock, where: string): string {
  if (b === null || typeof b !== 'object') throw new InvalidOptionError(where, "give { kind: 'paragraph' | 'table' | 'markdown' | 'figure', … }");
  switch (b.kind) {
    case 'paragraph':
      return paragraphs(textOf(`${where}.text`, b.text));
    case 'markdown':
      return markdown(textOf(`${where}.text`, b.text), where);
    case 'figure':
      return figure(textOf(`${where}.svg`, b.svg), b.caption === undefined ? undefined : textOf(`${where}.caption`, b.caption), where);
    case 'table': {
      if (!Array.isArray(b.rows)) throw new InvalidOptionError(`${where}.rows`, 'give an array of rows, each an array of cells');
      const header = b.header?.map((c, k) => textOf(`${where}.header[${k}]`, c));
      const rows = b.rows.map((r, k) => {
        if (!Array.isArray(r)) throw new InvalidOptionError(`${where}.rows[${k}]`, 'give each row as an array of cells');
        return r.map((c, m) => cell(c, `${where}.rows[${k}][${m}]`));
      });
      const width = header?.length ?? rows[0]?.length ?? 0;
      rows.forEach((r, k) => {
        if (r.length !== width) {
          throw new ShapeMismatchError(`${where}.rows[${k}] has ${r.length} cell(s) but the table has ${width} column(s); give every row ${width} cells`);
        }
      });
      return table(header, rows, b.caption === undefined ? undefined : textOf(`${where}.caption`, b.caption));
    }
    default: {
      const unknown: never = b;
      throw new InvalidOptionError(`${where}.kind`, `${String((unknown as { kind: unknown }).kind)}; use 'paragraph', 'table', 'markdown' or 'figure'`);
    }
  }
}

// our own page style: warm paper, serif text, sans captions and tables; no external fonts
const STYLE = `
:root { color-scheme: light; }
body { margin: 0; background: #f4f2ec; color: #22252b; font: 16px/1.55 'Iowan Old Style', 'Palatino Linotype', Palatino, Georgia, serif; }
main { max-width: 60rem; margin: 0 auto; padding: 2.5rem 1.5rem 4rem; background: #fdfcf9; min-height: 100vh; box-sizing: border-box; }
h1 { font: 600 1.9rem/1.2 'Source Sans 3', 'Segoe UI', 'Noto Sans', 'Helvetica Neue', Arial, sans-serif; margin: 0 0 0.4rem; letter-spacing: -0.01em; }
h2 { font: 600 1.3rem/1.3 'Source Sans 3', 'Segoe UI', 'Noto Sans', 'Helvetica Neue', Arial, sans-serif; margin: 2.4rem 0 0.8rem; padding-bottom: 0.25rem; border-bottom: 2px solid #d9d5ca; }
.summary { color: #5d6068; margin: 0 0 1.2rem; }
.caution { margin: 1.2rem 0 1.6rem; padding: 0.8rem 1rem; border-left: 5px solid #c45a1c; background: #fbf0e6; }
.caution strong { display: block; font-family: 'Source Sans 3', 'Segoe UI', 'Noto Sans', Arial, sans-serif; letter-spacing: 0.06em; text-transform: uppercase; font-size: 0.8rem; color: #8f3e10; }
.caution p { margin: 0.2rem 0 0; }
.table { overflow-x: auto; margin: 1rem 0; }
table { border-collapse: collapse; font: 14px/1.4 'Source Sans 3', 'Segoe UI', 'Noto Sans', 'Helvetica Neue', Arial, sans-serif; font-variant-numeric: tabular-nums; }
caption { caption-side: top; text-align: left; color: #5d6068; padding-bottom: 0.3rem; }
th, td { padding: 0.3rem 0.75rem; border-bottom: 1px solid #e4e2dc; text-align: left; vertical-align: top; }
th { border-bottom: 2px solid #b9b4a8; font-weight: 600; }
td.num { text-align: right; }
figure { margin: 1.4rem 0; }
figure svg { max-width: 100%; height: auto; display: block; }
figcaption { font: 14px/1.4 'Source Sans 3', 'Segoe UI', 'Noto Sans', Arial, sans-serif; color: #5d6068; margin-top: 0.4rem; }
footer { margin-top: 3rem; color: #8a8d94; font-size: 0.85rem; }
@media print { body { background: none; } main { padding: 0; } figure, table { break-inside: avoid; } }
`;

/**
 * One self-contained HTML page: a title, an optional summary line, an
 * optional caution paragraph, then sections of paragraphs, tables
 * (from rows, or from markdown-like pipe tables) and inline SVG figures.
 * All CSS is inline and nothing is fetched, so the page stands alone; all
 * user text is escaped. Deterministic: the same content gives the same page.
 *
 * @param content - title, summary, caution and sections
 * @returns the page, starting with `<!DOCTYPE html>`
 * @throws InvalidOptionError for text that is not a string, an unknown block kind or a figure that is not SVG;
 *   ShapeMismatchError for a table row whose length differs from the header's (or the first row's)
 * @example htmlReport({ title: 'Plate & fin', sections: [] }).includes('<title>Plate &amp; fin</title>') // true
 */
export function htmlReport(content: Readonly<ReportContent>): string {
  if (content === null || typeof content !== 'object') throw new InvalidOptionError('content', 'give { title, sections }');
  const title = textOf('title', content.title);
  if (!Array.isArray(content.sections)) throw new InvalidOptionError('sections', 'give an array of { heading, blocks }');
  const out = [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8"/>',
    '<meta name="viewport" content="width=device-width, initial-scale=1"/>',
    '<meta name="generator" content="quadrille"/>',
    `<title>${esc(title)}</title>`,
    `<style>${STYLE}</style>`,
    '</head>',
    '<body>',
    '<main>',
    `<header><h1>${esc(title)}</h1>`,
  ];
  if (content.summary !== undefined) out.push(`<p class="summary">${esc(textOf('summary', content.summary))}</p>`);
  out.push('</header>');
  if (content.caution !== undefined) {
    out.push(`<aside class="caution" role="note"><strong>Caution</strong>${paragraphs(textOf('caution', content.caution))}</aside>`);
  }
  content.sections.forEach((s, k) => {
    const where = `sections[${k}]`;
    if (s === null || typeof s !== 'object' || !Array.isArray(s.blocks)) throw new InvalidOptionError(where, 'give { heading, blocks: [...] }');
    out.push('<section>', `<h2>${esc(textOf(`${where}.heading`, s.heading))}</h2>`);
    (s.blocks as readonly ReportBlock[]).forEach((b: ReportBlock, m: number) => out.push(block(b, `${where}.blocks[${m}]`)));
    out.push('</section>');
  });
  out.push('<footer>Made with quadrille.</footer>', '</main>', '</body>', '</html>');
  return out.join('\n') + '\n';
}
