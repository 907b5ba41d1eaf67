/**
 * Fields and probe time series as CSV, and a reader for field CSV.
 *
 * Format: RFC 4180 (Shafranovich, Y. (2005). Common Format and MIME Type
 * for Comma-Separated Values (CSV) Files. IETF RFC 4180), with one header
 * line, commas between cells, and a cell quoted in double quotes (a quote
 * inside doubled) only when it holds a comma or a quote. Lines end in LF, as
 * in {@link studyCsv}; the reader accepts LF and CRLF. Every line has the
 * same number of cells.
 *
 * Header cells are `name` or `name [unit]`; names and units may not contain
 * `[`, `]` or control characters, so the header reads back unambiguously.
 *
 * Numbers are written as the shortest decimal that reads back as the same
 * float64 (ECMAScript `String(x)`, −0 as `-0`), so a write → read round trip
 * is exact to the bit.
 *
 * Non-finite values: refused by default (NonFiniteOutputError with the count
 * and the first node); `nonFinite: 'empty'` writes an empty cell instead for
 * NaN and ±Infinity alike, and the reader gives NaN for an empty cell.
 *
 * Convergence tables: {@link studyCsv} already writes a study as CSV in this
 * style; use it directly.
 *
 * @module
 */
import ndarray from 'ndarray';
import { InvalidOptionError, MalformedCsvError, ShapeMismatchError } from '../errors.js';
import type { AxisName, Field, Grid } from '../grid/index.js';
import type { RunResult } from '../time/index.js';
import { checkArrayFinite, checkFieldFinite, checkNames, counts3, numberText, view3 } from './format.js';

/** A field to be written, with the name and unit of its column or array. */
export interface NamedField {
  /** Column (CSV) or array (VTK) name, e.g. `T`; non-empty, unique among the fields written together. */
  readonly name: string;
  /** Values at the stored nodes, shape `grid.shape`, any strides. */
  readonly field: Field;
  /** Unit, e.g. `K`; written as `T [K]` in CSV and as a `Units` attribute in VTK. Default: none. */
  readonly unit?: string;
}

/** What to do with NaN and ±Infinity in CSV output. */
export type NonFinitePolicy =
  | 'refuse' // throw NonFiniteOutputError with the count and the first position
  | 'empty'; // write an empty cell (read back as NaN)

/** Options of {@link fieldCsv}. */
export interface FieldCsvOptions {
  /** Unit of the coordinate columns, default `'m'`; `''` writes bare `x`, `y`, `z`. */
  readonly lengthUnit?: string;
  /** NaN and ±Infinity: `'refuse'` (default) or `'empty'` cells. */
  readonly nonFinite?: NonFinitePolicy;
}

/** Options of {@link probeCsv}. */
export interface ProbeCsvOptions {
  /** One column name per probe; default `u(x)`, `u(x;y)` or `u(x;y;z)` from the probe's point. */
  readonly names?: readonly string[];
  /** Unit of the probed quantity, e.g. `'K'`; default none. */
  readonly unit?: string;
  /** Unit of the time column, default `'s'`; `''` writes a bare `t`. */
  readonly timeUnit?: string;
  /** NaN and ±Infinity: `'refuse'` (default) or `'empty'` cells. */
  readonly nonFinite?: NonFinitePolicy;
}

/** One axis of a field table read back: its name, unit and distinct node coordinates in order. */
export interface TableAxis {
  /** `x`, `y` or `z`. */
  readonly name: AxisName;
  /** The unit in the header, or undefined if none. */
  readonly unit: string | undefined;
  /** Node coordinates along the axis, strictly increasing, exactly as written. */
  readonly coordinates: Float64Array;
}

/** One value column of a field table read back. */
export interface TableField {
  /** The column name. */
  readonly name: string;
  /** The unit in the header, or undefined if none. */
  readonly unit: string | undefined;
  /** The values, shape `[nx]`, `[nx, ny]` or `[nx, ny, nz]`, contiguous, x slowest; NaN where a cell was empty. */
  readonly field: Field;
}

/** A field CSV read back by {@link readFieldCsv}. */
export interface FieldTable {
  /** The coordinate axes, x first. */
  readonly axes: readonly TableAxis[];
  /** Node counts per axis, x first. */
  readonly shape: readonly number[];
  /** The value columns in header order. */
  readonly fields: readonly TableField[];
}

const NON_FINITE_HINT = "find where they come from, or pass nonFinite: 'empty' to write empty cells";

function checkUnit(option: string, unit: string | undefined): void {
  if (unit === undefined) return;
  if (typeof unit !== 'string' || /[[\]\u0000-\u001f\u007f]/.test(unit)) {
    throw new InvalidOptionError(option, `unit ${JSON.stringify(unit)} must be text without [, ] or control characters`);
  }
}

function checkPolicy(p: unknown): NonFinitePolicy {
  if (p === undefined) return 'refuse';
  if (p !== 'refuse' && p !== 'empty') throw new InvalidOptionError('nonFinite', `${JSON.stringify(p)}; use 'refuse' or 'empty'`);
  return p;
}

/** One header or data cell, quoted per RFC 4180 §2.6–2.7 when it needs it. */
function cell(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function heading(name: string, unit: string | undefined): string {
  return cell(unit === undefined || unit === '' ? name : `${name} [${unit}]`);
}

function valueText(v: number): string {
  return Number.isFinite(v) ? numberText(v) : '';
}

function checkFieldNames(fields: readonly NamedField[], reserved: readonly string[]): void {
  if (!Array.isArray(fields) || fields.length === 0) {
    throw new InvalidOptionError('fields', 'give at least one { name, field, unit? } to write');
  }
  checkNames('fields', fields.map((f) => f.name), reserved);
  for (const f of fields) {
    if (/[[\]]/.test(f.name)) throw new InvalidOptionError('fields', `name ${JSON.stringify(f.name)} holds [ or ]; the header keeps them for the unit`);
    checkUnit(`unit of ${f.name}`, f.unit);
  }
}

/**
 * Fields on a grid as CSV: one line per stored node, the coordinate columns
 * `x[, y[, z]]` first, then one column per field.
 *
 * Row order is the field's memory order: x slowest, the last axis fastest,
 * so row r + 1 (after the header) is node (i, j, k) with r = (i·ny + j)·nz + k.
 * A periodic axis lists its stored nodes only (the node at `to` is the node
 * at `from` and is not repeated).
 *
 * @param g - the grid
 * @param fields - the fields, each of shape `g.shape` (any strides); names not `x`, `y`, `z`
 * @param options - coordinate unit, non-finite policy
 * @returns CSV text (module doc), ending in a newline
 * @throws ShapeMismatchError / InvalidFieldError for a field that does not fit the grid;
 *   NonFiniteOutputError for NaN or ±Infinity unless `nonFinite: 'empty'`;
 *   InvalidOptionError for an empty, repeated or reserved name or a bad unit
 * @example fieldCsv(grid({ x: { from: 0, to: 1, cells: 2 } }), [{ name: 'T', unit: 'K', field: sampleField(grid({ x: { from: 0, to: 1, cells: 2 } }), (x) => 300 + x) }]) // 'x [m],T [K]\n0,300\n0.5,300.5\n1,301\n'
 */
export function fieldCsv(g: Grid, fields: readonly NamedField[], options: Readonly<FieldCsvOptions> = {}): string {
  checkFieldNames(fields, ['x', 'y', 'z']);
  const lengthUnit = options.lengthUnit ?? 'm';
  checkUnit('lengthUnit', lengthUnit);
  const policy = checkPolicy(options.nonFinite);
  const views = fields.map((f) => view3(g, f.field, `field ${JSON.stringify(f.name)}`));
  if (policy === 'refuse') {
    views.forEach((v, c) => checkFieldFinite(g, v, `field ${JSON.stringify(fields[c]!.name)}`, NON_FINITE_HINT));
  }
  const head = [...g.axes.map((a) => heading(a.name, lengthUnit)), ...fields.map((f) => heading(f.name, f.unit))];
  const lines: string[] = [head.join(',')];
  const [nx, ny, nz] = counts3(g);
  const xs = g.x.coordinates;
  const ys = g.y?.coordinates;
  const zs = g.z?.coordinates;
  const dim = g.dimension;
  const row: string[] = new Array<string>(dim + fields.length);
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++) {
        row[0] = numberText(xs[i]!);
        if (dim > 1) row[1] = numberText(ys![j]!);
        if (dim > 2) row[2] = numberText(zs![k]!);
        for (let c = 0; c < views.length; c++) {
          const v = views[c]!;
          row[dim + c] = valueText(v.data[v.offset + i * v.s0 + j * v.s1 + k * v.s2]!);
        }
        lines.push(row.join(','));
      }
    }
  }
  return lines.join('\n') + '\n';
}

/**
 * Probe time series of a run as CSV: a time column `t`, then one column per
 * probe, one line per record (the start or resume time, then every step),
 * aligned with `run.times`.
 *
 * @param run - a run result, or anything with its `times` and `probes`
 * @param options - column names, units, non-finite policy
 * @returns CSV text (module doc), ending in a newline
 * @throws InvalidOptionError for names of the wrong count, empty, repeated or `t`, or a bad unit;
 *   ShapeMismatchError for a series whose length differs from `times`;
 *   NonFiniteOutputError for NaN or ±Infinity unless `nonFinite: 'empty'`
 * @example probeCsv({ times: Float64Array.of(0, 60), probes: [{ point: [0.1], values: Float64Array.of(20, 21.5) }] }, { unit: 'K' }) // 't [s],u(0.1) [K]\n0,20\n60,21.5\n'
 */
export function probeCsv(run: Pick<RunResult, 'times' | 'probes'>, options: Readonly<ProbeCsvOptions> = {}): string {
  const { times, probes } = run;
  const names = options.names ?? probes.map((p) => `u(${p.point.map(numberText).join(';')})`);
  if (names.length !== probes.length) {
    throw new InvalidOptionError('names', `${names.length} name(s) for ${probes.length} probe(s); give one name per probe`);
  }
  checkNames('names', names, ['t']);
  for (const n of names) if (/[[\]]/.test(n)) throw new InvalidOptionError('names', `name ${JSON.stringify(n)} holds [ or ]; the header keeps them for the unit`);
  checkUnit('unit', options.unit);
  const timeUnit = options.timeUnit ?? 's';
  checkUnit('timeUnit', timeUnit);
  const policy = checkPolicy(options.nonFinite);
  checkArrayFinite(times, 'probe times');
  probes.forEach((p, c) => {
    if (p.values.length !== times.length) {
      throw new ShapeMismatchError(`probe ${c} has ${p.values.length} values but there are ${times.length} times; give aligned series`);
    }
    if (policy === 'refuse') checkArrayFinite(p.values, `probe ${JSON.stringify(names[c])}`);
  });
  const lines = [[heading('t', timeUnit), ...names.map((n) => heading(n, options.unit))].join(',')];
  for (let r = 0; r < times.length; r++) {
    let line = numberText(times[r]!);
    for (const p of probes) line += ',' + valueText(p.values[r]!);
    lines.push(line);
  }
  return lines.join('\n') + '\n';
}

/** Splits one CSV line into cells (RFC 4180 §2.5–2.7); a quoted cell may not span lines. */
function splitLine(line: string, lineNo: number): string[] {
  const cells: string[] = [];
  let p = 0;
  const n = line.length;
  for (;;) {
    if (line[p] === '"') {
      let s = '';
      p++;
      for (;;) {
        const q = line.indexOf('"', p);
        if (q < 0) throw new MalformedCsvError(lineNo, 'a quoted cell is not closed on its line; close it with "');
        s += line.slice(p, q);
        if (line[q + 1] === '"') {
          s += '"';
          p = q + 2;
        } else {
          p = q + 1;
          break;
        }
      }
      cells.push(s);
      if (p === n) return cells;
      if (line[p] !== ',') throw new MalformedCsvError(lineNo, `text after a closing quote at column ${p + 1}; quote the whole cell`);
      p++;
    } else {
      const q = line.indexOf(',', p);
      const s = q < 0 ? line.slice(p) : line.slice(p, q);
      if (s.includes('"')) throw new MalformedCsvError(lineNo, `a quote inside the unquoted cell ${JSON.stringify(s)}; quote the cell and double the quote`);
      cells.push(s);
      if (q < 0) return cells;
      p = q + 1;
    }
  }
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function readNumber(s: string, lineNo: number, column: string): number {
  const t = s.trim();
  if (!DECIMAL.test(t)) throw new MalformedCsvError(lineNo, `${column} is ${JSON.stringify(s)}, not a decimal number`);
  const v = Number(t);
  if (!Number.isFinite(v)) throw new MalformedCsvError(lineNo, `${column} is ${s}, which overflows float64`);
  return v;
}

function parseHeading(s: string): { name: string; unit: string | undefined } {
  const m = /^(.*) \[([^[\]]*)\]$/.exec(s);
  return m ? { name: m[1]!, unit: m[2]! } : { name: s, unit: undefined };
}

/**
 * Reads a field CSV as written by {@link fieldCsv}: coordinate columns named
 * `x`, then optionally `y` and `z` (units optional), then value columns;
 * rows in x-slowest order over a full tensor grid of strictly increasing
 * coordinates. Values round-trip exactly; an empty value cell reads as NaN.
 *
 * @param text - the CSV (LF or CRLF line ends; a final newline optional)
 * @returns the axes with their coordinates, the shape, and one field per value column
 * @throws MalformedCsvError with the 1-based line number for a missing or bad header,
 *   a row with the wrong number of cells, a cell that is not a decimal number,
 *   or rows that are not the nodes of a grid in x-slowest order
 * @example readFieldCsv('x [m],T [K]\n0,300\n0.5,300.5\n').fields[0].field.get(1) // 300.5
 */
export function readFieldCsv(text: string): FieldTable {
  if (typeof text !== 'string') throw new MalformedCsvError(1, 'the input is not text');
  const lines = text.split(/\r?\n/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length === 0) throw new MalformedCsvError(1, 'the text is empty; a header line x[,y[,z]],<values> is needed');
  const head = splitLine(lines[0]!, 1).map(parseHeading);
  let dim = 0;
  while (dim < 3 && dim < head.length && head[dim]!.name === ['x', 'y', 'z'][dim]) dim++;
  if (dim === 0) throw new MalformedCsvError(1, `the first column is ${JSON.stringify(head[0]!.name)}; the coordinate columns x[, y[, z]] come first`);
  if (head.length === dim) throw new MalformedCsvError(1, 'there are coordinate columns only; at least one value column is needed');
  const width = head.length;
  const rows = lines.length - 1;
  if (rows === 0) throw new MalformedCsvError(2, 'there are no data lines after the header');
  const coords = Array.from({ length: dim }, () => new Float64Array(rows));
  const values = Array.from({ length: width - dim }, () => new Float64Array(rows));
  for (let r = 0; r < rows; r++) {
    const lineNo = r + 2;
    const cells = splitLine(lines[r + 1]!, lineNo);
    if (cells.length !== width) throw new MalformedCsvError(lineNo, `${cells.length} cell(s), but the header has ${width}`);
    for (let d = 0; d < dim; d++) coords[d]![r] = readNumber(cells[d]!, lineNo, head[d]!.name);
    for (let c = dim; c < width; c++) {
      const s = cells[c]!;
      values[c - dim]![r] = s.trim() === '' ? NaN : readNumber(s, lineNo, `column ${JSON.stringify(head[c]!.name)}`);
    }
  }
  // counts from the fastest axis outwards: along axis d the coordinate rises
  // every `stride` rows until it falls back
  const shape = new Array<number>(dim).fill(0);
  let stride = 1;
  for (let d = dim - 1; d >= 0; d--) {
    const c = coords[d]!;
    let n = 1;
    while (n * stride < rows && c[n * stride]! > c[(n - 1) * stride]!) n++;
    shape[d] = n;
    stride *= n;
  }
  if (stride > rows) {
    throw new MalformedCsvError(
      rows + 2,
      `the text ends after ${rows} data lines, but the coordinates make a grid of ${shape.join(' × ')} = ${stride} nodes; write one line per node, x slowest`,
    );
  }
  if (stride < rows) {
    throw new MalformedCsvError(
      stride + 2,
      `the first ${stride} data lines make a grid of ${shape.join(' × ')} nodes, but more follow; write one line per node, x slowest`,
    );
  }
  const axes: TableAxis[] = [];
  let inner = rows;
  for (let d = 0; d < dim; d++) {
    inner /= shape[d]!;
    axes.push({
      name: (['x', 'y', 'z'] as const)[d]!,
      unit: head[d]!.unit,
      coordinates: Float64Array.from({ length: shape[d]! }, (_, i) => coords[d]![i * inner]!),
    });
  }
  // every row must sit at the node its position implies
  for (let r = 0; r < rows; r++) {
    let rest = r;
    for (let d = dim - 1; d >= 0; d--) {
      const i = rest % shape[d]!;
      rest = (rest - i) / shape[d]!;
      const want = axes[d]!.coordinates[i]!;
      if (!Object.is(coords[d]![r], want)) {
        throw new MalformedCsvError(
          r + 2,
          `${axes[d]!.name} = ${coords[d]![r]} but node ${i} of axis ${axes[d]!.name} is at ${want}; the rows are not a grid in x-slowest order`,
        );
      }
    }
  }
  return {
    axes,
    shape,
    fields: values.map((v, c) => ({ name: head[dim + c]!.name, unit: head[dim + c]!.unit, field: ndarray(v, [...shape]) })),
  };
}
