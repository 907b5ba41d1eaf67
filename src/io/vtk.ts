/**
 * Fields as VTK XML datasets (ImageData `.vti`, RectilinearGrid `.vtr`) and
 * transient series as a Collection (`.pvd`), readable by ParaView, VisIt and
 * VTK itself.
 *
 * Source: Kitware, "VTK File Formats", section "XML File Formats" (VTK
 * User's Guide, 11th ed., ch. 19; https://docs.vtk.org/en/latest/vtk_file_formats/vtkxml_file_format.html).
 *
 * - `VTKFile` carries `type`, `version="1.0"`, `byte_order="LittleEndian"`
 *   and `header_type` (`UInt64` by default, or `UInt32`).
 * - Uniform grids become ImageData with `WholeExtent` and `Piece Extent`
 *   `"0 nx−1 0 ny−1 0 nz−1"`, `Origin` (the first node) and `Spacing`
 *   (dx dy dz). Grids with a stretched axis become RectilinearGrid with the
 *   same extents and a `Coordinates` element of three Float64 DataArrays
 *   named x, y, z. A 1-D or 2-D grid is padded to 3-D: a missing axis has
 *   extent `0 0`, origin 0, spacing 1 and the single coordinate 0.
 * - `PointData` holds one Float64 DataArray per field, `Name` = the field's
 *   name and, when a unit is given, an extra attribute `Units` (ignored by
 *   VTK readers; put the unit in the name, `T [K]`, to see it in ParaView's
 *   array list). The first field is named as the active `Scalars`.
 * - Point order is VTK's: x fastest, then y, then z — point id
 *   i + nx·(j + ny·k). quadrille fields store x slowest; the writer
 *   transposes, so a value written at id i + nx·(j + ny·k) is field (i, j, k).
 * - `format="ascii"`: the shortest decimals that read back as the same
 *   float64, six to a line. `format="binary"`: RFC 4648 base64 (standard
 *   alphabet, padded) of one byte stream: the byte count of the data as a
 *   little-endian UInt32 or UInt64 (per `header_type`), then the data as
 *   little-endian float64 — uncompressed, header and data encoded together,
 *   as VTK's own writer does. Both are exact.
 * - Periodic axes: the stored nodes only, so the node at `to` (the image of
 *   the node at `from`) is not written and the dataset ends one cell short
 *   of the period.
 * - NaN and ±Infinity are refused (NonFiniteOutputError).
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';
import type { Grid } from '../grid/index.js';
import type { NamedField } from './csv.js';
import { base64, checkFieldFinite, checkNames, checkNumberFinite, counts3, escapeXml, numberText, type View3, view3 } from './format.js';

/** How DataArray values are stored: decimal text, or base64 of the little-endian bytes. */
export type VtkEncoding = 'ascii' | 'binary';

/** Integer type of the byte-count header in front of binary data. */
export type VtkHeaderType = 'UInt32' | 'UInt64';

/** The VTK dataset type: ImageData needs every axis uniform; RectilinearGrid takes any grid. */
export type VtkDataset = 'ImageData' | 'RectilinearGrid';

/** Options of {@link vtkDocument}. */
export interface VtkOptions {
  /** `'binary'` (default) or `'ascii'`; both exact. */
  readonly encoding?: VtkEncoding;
  /** Byte-count header of binary data, `'UInt64'` (default) or `'UInt32'` (limits an array to 4 GiB). */
  readonly headerType?: VtkHeaderType;
  /** Dataset type; default ImageData when every axis is uniform, else RectilinearGrid. */
  readonly dataset?: VtkDataset;
}

/** A VTK XML document and how to name its file. */
export interface VtkDocument {
  /** The dataset type written. */
  readonly dataset: VtkDataset;
  /** The file extension VTK readers expect: `.vti` for ImageData, `.vtr` for RectilinearGrid. */
  readonly extension: '.vti' | '.vtr';
  /** The XML text, ending in a newline. */
  readonly text: string;
}

/** One time step of a {@link vtkCollection}. */
export interface CollectionEntry {
  /** Time of the step (s), finite. */
  readonly time: number;
  /** Path of the dataset file, relative to the `.pvd` file's directory. */
  readonly file: string;
  /** Piece number when one time step has several files (default 0). */
  readonly part?: number;
}

const VALUES_PER_LINE = 6;

function checkOptions(o: Readonly<VtkOptions>): { encoding: VtkEncoding; header: VtkHeaderType } {
  const encoding = o.encoding ?? 'binary';
  if (encoding !== 'ascii' && encoding !== 'binary') {
    throw new InvalidOptionError('encoding', `${JSON.stringify(encoding)}; use 'ascii' or 'binary'`);
  }
  const header = o.headerType ?? 'UInt64';
  if (header !== 'UInt32' && header !== 'UInt64') {
    throw new InvalidOptionError('headerType', `${JSON.stringify(header)}; use 'UInt32' or 'UInt64'`);
  }
  return { encoding, header };
}

/** The body of one DataArray (values already in VTK order). */
function arrayBody(values: Float64Array, encoding: VtkEncoding, header: VtkHeaderType, indent: string): string {
  if (encoding === 'ascii') {
    const lines: string[] = [];
    for (let p = 0; p < values.length; p += VALUES_PER_LINE) {
      const end = Math.min(values.length, p + VALUES_PER_LINE);
      const parts: string[] = [];
      for (let q = p; q < end; q++) parts.push(numberText(values[q]!));
      lines.push(indent + parts.join(' '));
    }
    return lines.join('\n');
  }
  const h = header === 'UInt64' ? 8 : 4;
  const n = values.length * 8;
  if (header === 'UInt32' && n > 0xffffffff) {
    throw new InvalidOptionError('headerType', `an array of ${n} bytes does not fit a UInt32 byte count; use 'UInt64'`);
  }
  const bytes = new Uint8Array(h + n);
  const dv = new DataView(bytes.buffer);
  dv.setUint32(0, n % 0x100000000, true);
  if (h === 8) dv.setUint32(4, Math.floor(n / 0x100000000), true);
  // DataView keeps the byte order little-endian on any machine
  for (let p = 0; p < values.length; p++) dv.setFloat64(h + 8 * p, values[p]!, true);
  return indent + base64(bytes);
}

function dataArray(name: string, unit: string | undefined, values: Float64Array, encoding: VtkEncoding, header: VtkHeaderType, indent: string): string {
  const units = unit === undefined ? '' : ` Units="${escapeXml(unit)}"`;
  return (
    `${indent}<DataArray type="Float64" Name="${escapeXml(name)}"${units} NumberOfComponents="1" format="${encoding}">\n` +
    `${arrayBody(values, encoding, header, indent + '  ')}\n` +
    `${indent}</DataArray>`
  );
}

/** Values of one field in VTK point order: x fastest. */
function vtkOrder(g: Grid, v: View3): Float64Array {
  const [nx, ny, nz] = counts3(g);
  const out = new Float64Array(nx * ny * nz);
  const { data, offset, s0, s1, s2 } = v;
  let q = 0;
  for (let k = 0; k < nz; k++) {
    for (let j = 0; j < ny; j++) {
      let p = offset + j * s1 + k * s2;
      for (let i = 0; i < nx; i++) {
        out[q++] = data[p]!;
        p += s0;
      }
    }
  }
  return out;
}

/**
 * Fields on a grid as one VTK XML document: ImageData for a uniform grid,
 * RectilinearGrid otherwise (module doc for the exact layout).
 *
 * @param g - the grid (1-D and 2-D grids are padded to 3-D)
 * @param fields - the fields, each of shape `g.shape` (any strides), written as PointData
 * @param options - encoding, header type, dataset type
 * @returns the document, its dataset type and file extension
 * @throws ShapeMismatchError / InvalidFieldError for a field that does not fit the grid;
 *   NonFiniteOutputError for NaN or ±Infinity; InvalidOptionError for an empty or repeated
 *   name, a bad option, or ImageData asked for on a grid with a stretched axis
 * @example vtkDocument(grid({ x: { from: 0, to: 1, cells: 4 } }), [{ name: 'u', field: zeros(grid({ x: { from: 0, to: 1, cells: 4 } })) }]).extension // '.vti'
 */
export function vtkDocument(g: Grid, fields: readonly NamedField[], options: Readonly<VtkOptions> = {}): VtkDocument {
  const { encoding, header } = checkOptions(options);
  if (!Array.isArray(fields) || fields.length === 0) {
    throw new InvalidOptionError('fields', 'give at least one { name, field, unit? } to write');
  }
  checkNames('fields', fields.map((f) => f.name));
  for (const f of fields) {
    if (f.unit !== undefined && (typeof f.unit !== 'string' || f.unit.length === 0 || /[\u0000-\u001f\u007f]/.test(f.unit))) {
      throw new InvalidOptionError('fields', `unit of ${f.name} is ${JSON.stringify(f.unit)}; give non-empty printable text or leave it out`);
    }
  }
  const uniform = g.axes.every((a) => a.uniform);
  const dataset = options.dataset ?? (uniform ? 'ImageData' : 'RectilinearGrid');
  if (dataset !== 'ImageData' && dataset !== 'RectilinearGrid') {
    throw new InvalidOptionError('dataset', `${JSON.stringify(dataset)}; use 'ImageData' or 'RectilinearGrid'`);
  }
  if (dataset === 'ImageData' && !uniform) {
    const a = g.axes.find((x) => !x.uniform)!;
    throw new InvalidOptionError('dataset', `ImageData needs uniform axes but axis ${a.name} is stretched; use 'RectilinearGrid' (the default here)`);
  }
  const views = fields.map((f) => view3(g, f.field, `field ${JSON.stringify(f.name)}`));
  views.forEach((v, c) => checkFieldFinite(g, v, `field ${JSON.stringify(fields[c]!.name)}`));
  const [nx, ny, nz] = counts3(g);
  const extent = `0 ${nx - 1} 0 ${ny - 1} 0 ${nz - 1}`;
  const lines: string[] = [
    '<?xml version="1.0"?>',
    `<VTKFile type="${dataset}" version="1.0" byte_order="LittleEndian" header_type="${header}">`,
  ];
  if (dataset === 'ImageData') {
    const origin = [0, 1, 2].map((d) => numberText(g.axes[d]?.from ?? 0)).join(' ');
    const spacing = [0, 1, 2].map((d) => numberText(g.axes[d]?.spacing ?? 1)).join(' ');
    lines.push(`  <ImageData WholeExtent="${extent}" Origin="${origin}" Spacing="${spacing}">`);
  } else {
    lines.push(`  <RectilinearGrid WholeExtent="${extent}">`);
  }
  lines.push(`    <Piece Extent="${extent}">`);
  lines.push(`      <PointData Scalars="${escapeXml(fields[0]!.name)}">`);
  fields.forEach((f, c) => lines.push(dataArray(f.name, f.unit, vtkOrder(g, views[c]!), encoding, header, '        ')));
  lines.push('      </PointData>', '      <CellData>', '      </CellData>');
  if (dataset === 'RectilinearGrid') {
    lines.push('      <Coordinates>');
    for (const [d, name] of ['x', 'y', 'z'].entries()) {
      const a = g.axes[d];
      const c = a === undefined ? Float64Array.of(0) : Float64Array.from(a.coordinates);
      lines.push(dataArray(name, undefined, c, encoding, header, '        '));
    }
    lines.push('      </Coordinates>');
  }
  lines.push('    </Piece>', `  </${dataset}>`, '</VTKFile>');
  return { dataset, extension: dataset === 'ImageData' ? '.vti' : '.vtr', text: lines.join('\n') + '\n' };
}

/**
 * A VTK Collection (`.pvd`) listing one dataset file per time step, which
 * ParaView opens as a time series: `<DataSet timestep="t" group="" part="p"
 * file="…"/>` per entry, in the order given.
 *
 * @param entries - time (s) and file of each step; file paths relative to the `.pvd` file
 * @returns the XML text, ending in a newline
 * @throws NonFiniteOutputError for a time that is not finite; InvalidOptionError for an
 *   empty file name or a part that is not a whole number ≥ 0
 * @example vtkCollection([{ time: 0, file: 'u_0000.vti' }]).includes('<DataSet timestep="0" group="" part="0" file="u_0000.vti"/>') // true
 */
export function vtkCollection(entries: readonly CollectionEntry[]): string {
  const lines = [
    '<?xml version="1.0"?>',
    '<VTKFile type="Collection" version="0.1" byte_order="LittleEndian">',
    '  <Collection>',
  ];
  entries.forEach((e, k) => {
    checkNumberFinite(`entries[${k}].time`, e.time);
    if (typeof e.file !== 'string' || e.file.length === 0) {
      throw new InvalidOptionError('entries', `entry ${k} has file ${JSON.stringify(e.file)}; give a path relative to the .pvd file`);
    }
    const part = e.part ?? 0;
    if (!(Number.isSafeInteger(part) && part >= 0)) throw new InvalidOptionError('entries', `entry ${k} has part ${part}; give a whole number ≥ 0`);
    lines.push(`    <DataSet timestep="${numberText(e.time)}" group="" part="${part}" file="${escapeXml(e.file)}"/>`);
  });
  lines.push('  </Collection>', '</VTKFile>');
  return lines.join('\n') + '\n';
}
