import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  NonFiniteOutputError, grid, sampleField, vtkCollection, vtkDocument, zeros, type Field, type Grid,
} from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';
import { child, childrenNamed, decodeBase64, parseXml, type XmlElement } from '../support/xml-tree.js';

/** Values of a DataArray, decoded independently of the writer. */
function arrayValues(el: XmlElement, headerType: string): { values: number[]; headerBytes: number | undefined } {
  expect(el.attributes['type']).toBe('Float64');
  expect(el.attributes['NumberOfComponents']).toBe('1');
  if (el.attributes['format'] === 'ascii') {
    const tokens = el.text.split(' ').flatMap((s) => s.split('\n')).map((s) => s.trim()).filter((s) => s !== '');
    return { values: tokens.map(Number), headerBytes: undefined };
  }
  expect(el.attributes['format']).toBe('binary');
  const bytes = decodeBase64(el.text.trim());
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const h = headerType === 'UInt64' ? 8 : 4;
  const count = h === 8 ? dv.getUint32(0, true) + dv.getUint32(4, true) * 2 ** 32 : dv.getUint32(0, true);
  const values: number[] = [];
  for (let p = h; p < bytes.length; p += 8) values.push(dv.getFloat64(p, true));
  expect(bytes.length).toBe(h + count);
  return { values, headerBytes: count };
}

/** The field value at node (i, j, k), whatever its strides. */
function at(f: Field, i: number, j: number, k: number): number {
  return f.data[f.offset + i * f.stride[0]! + j * (f.stride[1] ?? 0) + k * (f.stride[2] ?? 0)]!;
}

/** Asserts the document's point data is the field in VTK order (x fastest), bit for bit. */
function expectVtkOrder(g: Grid, f: Field, values: number[]): void {
  const [nx, ny, nz] = [g.shape[0], g.shape[1] ?? 1, g.shape[2] ?? 1];
  expect(values.length).toBe(nx * ny * nz);
  for (let k = 0; k < nz; k++) {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const got = values[i + nx * (j + ny * k)]!;
        if (!Object.is(got, at(f, i, j, k))) expect.fail(`point (${i}, ${j}, ${k}): ${got} ≠ ${at(f, i, j, k)}`);
      }
    }
  }
}

// values that are not symmetric under any axis swap and need all 17 digits
const plate = grid({ x: { from: 0.5, to: 2, cells: 3 }, y: { from: -1, to: 0, cells: 2 } });
const T = sampleField(plate, (x, y) => 300 + 10 * x + y / 3 + x * x * y);

describe('vtkDocument: ImageData for uniform grids (Kitware, VTK File Formats, XML)', () => {
  for (const encoding of ['ascii', 'binary'] as const) {
    it(`2-D plate, ${encoding}: extents, origin, spacing, padded z, values in x-fastest order`, () => {
      const doc = vtkDocument(plate, [{ name: 'T', unit: 'K', field: T }], { encoding });
      expect(doc.dataset).toBe('ImageData');
      expect(doc.extension).toBe('.vti');
      const root = parseXml(doc.text);
      expect(root.name).toBe('VTKFile');
      expect(root.attributes).toEqual({ type: 'ImageData', version: '1.0', byte_order: 'LittleEndian', header_type: 'UInt64' });
      const image = child(root, 'ImageData');
      expect(image.attributes['WholeExtent']).toBe('0 3 0 2 0 0');
      expect(image.attributes['Origin']).toBe('0.5 -1 0');
      expect(image.attributes['Spacing']).toBe('0.5 0.5 1');
      const piece = child(image, 'Piece');
      expect(piece.attributes['Extent']).toBe('0 3 0 2 0 0');
      const pd = child(piece, 'PointData');
      expect(pd.attributes['Scalars']).toBe('T');
      const arr = child(pd, 'DataArray');
      expect(arr.attributes['Name']).toBe('T');
      expect(arr.attributes['Units']).toBe('K');
      expect(childrenNamed(piece, 'CellData').length).toBe(1);
      const { values, headerBytes } = arrayValues(arr, 'UInt64');
      if (encoding === 'binary') expect(headerBytes).toBe(8 * plate.size);
      expectVtkOrder(plate, T, values);
      // the transpose is real: VTK point 1 is (x₁, y₀), which is field entry 3 (x slowest)
      expect(values[1]).toBe(T.get(1, 0));
      expect(values[1]).not.toBe(T.data[1]);
    });
  }

  it('binary with a UInt32 header: 4-byte count, exact values', () => {
    const doc = vtkDocument(plate, [{ name: 'T', field: T }], { encoding: 'binary', headerType: 'UInt32' });
    const root = parseXml(doc.text);
    expect(root.attributes['header_type']).toBe('UInt32');
    const arr = child(child(child(child(root, 'ImageData'), 'Piece'), 'PointData'), 'DataArray');
    expect(arr.attributes['Units']).toBeUndefined();
    const { values, headerBytes } = arrayValues(arr, 'UInt32');
    expect(headerBytes).toBe(8 * plate.size);
    expectVtkOrder(plate, T, values);
  });

  it('3-D, nx ≠ ny ≠ nz, a strided view with a negative stride, awkward numbers', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 3, cells: 2 }, z: { from: 1, to: 2, cells: 3 } });
    const big = ndarray(new Float64Array(2 * 3 * 8), [2, 3, 8]);
    const values = [0.1 + 0.2, -0, 5e-324, 1.7976931348623157e308, -1e-300, 1 / 3];
    for (let p = 0; p < big.data.length; p++) big.data[p] = values[p % values.length]! * (p + 1);
    const f = big.step(1, -1, 2); // shape [2, 3, 4]: y reversed, every second z
    expect(f.shape).toEqual([2, 3, 4]);
    for (const encoding of ['ascii', 'binary'] as const) {
      const doc = vtkDocument(g, [{ name: 'u', field: f }], { encoding });
      const image = child(parseXml(doc.text), 'ImageData');
      expect(image.attributes['WholeExtent']).toBe('0 1 0 2 0 3');
      expect(image.attributes['Spacing']).toBe(`1 1.5 ${1 / 3}`);
      expect(image.attributes['Origin']).toBe('0 0 1');
      const arr = child(child(child(image, 'Piece'), 'PointData'), 'DataArray');
      expectVtkOrder(g, f, arrayValues(arr, 'UInt64').values);
    }
  });

  it('1-D: padded to 3-D with extent 0 0, origin 0 and spacing 1 on y and z', () => {
    const g = grid({ x: { from: -2, to: 2, cells: 8 } });
    const u = sampleField(g, (x) => x * x * x);
    const image = child(parseXml(vtkDocument(g, [{ name: 'u', field: u }]).text), 'ImageData');
    expect(image.attributes['WholeExtent']).toBe('0 8 0 0 0 0');
    expect(image.attributes['Origin']).toBe('-2 0 0');
    expect(image.attributes['Spacing']).toBe('0.5 1 1');
    expectVtkOrder(g, u, arrayValues(child(child(child(image, 'Piece'), 'PointData'), 'DataArray'), 'UInt64').values);
  });

  it('periodic axis: the stored nodes only (the node at `to` is not repeated)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4, periodic: true }, y: { from: 0, to: 1, cells: 2 } });
    const image = child(parseXml(vtkDocument(g, [{ name: 'u', field: zeros(g) }]).text), 'ImageData');
    expect(image.attributes['WholeExtent']).toBe('0 3 0 2 0 0');
  });

  it('several fields: one DataArray each, in order; names and units XML-escaped and read back', () => {
    const name = 'q<"flux"> & \'more\'';
    const doc = vtkDocument(plate, [{ name: 'T', field: T }, { name, unit: 'W/m²', field: sampleField(plate, (x, y) => x - y) }], { encoding: 'ascii' });
    const arrays = childrenNamed(child(child(child(parseXml(doc.text), 'ImageData'), 'Piece'), 'PointData'), 'DataArray');
    expect(arrays.map((a) => a.attributes['Name'])).toEqual(['T', name]);
    expect(arrays[1]!.attributes['Units']).toBe('W/m²');
  });
});

describe('vtkDocument: RectilinearGrid for stretched grids', () => {
  const g = grid({ x: { nodes: [0, 0.1, 0.35, 1] }, y: { from: 0, to: 2, cells: 4 } });
  const u = sampleField(g, (x, y) => Math.exp(x) * (1 + y * y));

  for (const encoding of ['ascii', 'binary'] as const) {
    it(`${encoding}: extents, Coordinates x, y and padded z, values in x-fastest order`, () => {
      const doc = vtkDocument(g, [{ name: 'u', field: u }], { encoding });
      expect(doc.dataset).toBe('RectilinearGrid');
      expect(doc.extension).toBe('.vtr');
      const root = parseXml(doc.text);
      expect(root.attributes['type']).toBe('RectilinearGrid');
      const rg = child(root, 'RectilinearGrid');
      expect(rg.attributes['WholeExtent']).toBe('0 3 0 4 0 0');
      const piece = child(rg, 'Piece');
      expect(piece.attributes['Extent']).toBe('0 3 0 4 0 0');
      const coords = childrenNamed(child(piece, 'Coordinates'), 'DataArray');
      expect(coords.map((c) => c.attributes['Name'])).toEqual(['x', 'y', 'z']);
      expect(arrayValues(coords[0]!, 'UInt64').values).toEqual([0, 0.1, 0.35, 1]);
      expect(arrayValues(coords[1]!, 'UInt64').values).toEqual([0, 0.5, 1, 1.5, 2]);
      expect(arrayValues(coords[2]!, 'UInt64').values).toEqual([0]);
      expectVtkOrder(g, u, arrayValues(child(child(piece, 'PointData'), 'DataArray'), 'UInt64').values);
    });
  }

  it('a uniform grid can be written as RectilinearGrid on request; ImageData on a stretched grid is refused', () => {
    expect(vtkDocument(plate, [{ name: 'T', field: T }], { dataset: 'RectilinearGrid' }).extension).toBe('.vtr');
    expect(codeOf(() => vtkDocument(g, [{ name: 'u', field: u }], { dataset: 'ImageData' }))).toBe('INVALID_OPTION');
  });
});

describe('vtkDocument: refusals', () => {
  it('NaN and ±Infinity: NonFiniteOutputError with the count and the first node', () => {
    const f = sampleField(plate, () => 1);
    f.set(2, 1, NaN);
    f.set(3, 0, Infinity);
    const e = errorOf(() => vtkDocument(plate, [{ name: 'T', field: f }]));
    expect(e).toBeInstanceOf(NonFiniteOutputError);
    const n = e as NonFiniteOutputError;
    expect(n.code).toBe('NON_FINITE_OUTPUT');
    expect(n.count).toBe(2);
    expect(n.index).toEqual([2, 1]);
    expect(n.value).toBeNaN();
    expect(n.message).toMatch(/x = 1\.5, y = -0\.5/);
  });

  it('shape mismatch, no fields, repeated names, bad options', () => {
    const other = zeros(grid({ x: { from: 0, to: 1, cells: 3 }, y: { from: 0, to: 1, cells: 3 } }));
    expect(codeOf(() => vtkDocument(plate, [{ name: 'T', field: other }]))).toBe('SHAPE_MISMATCH');
    expect(codeOf(() => vtkDocument(plate, []))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkDocument(plate, [{ name: 'T', field: T }, { name: 'T', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkDocument(plate, [{ name: '', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkDocument(plate, [{ name: 'T', unit: 'K\n', field: T }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkDocument(plate, [{ name: 'T', field: T }], { encoding: 'raw' as 'ascii' }))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkDocument(plate, [{ name: 'T', field: T }], { headerType: 'UInt16' as 'UInt32' }))).toBe('INVALID_OPTION');
  });
});

describe('vtkCollection (.pvd)', () => {
  it('lists each file with its time and part, in order', () => {
    const text = vtkCollection([{ time: 0, file: 'run_0000.vti' }, { time: 0.25, file: 'run_0001.vti' }, { time: 1e-7, file: 'a&b.vti', part: 2 }]);
    const root = parseXml(text);
    expect(root.attributes['type']).toBe('Collection');
    expect(root.attributes['byte_order']).toBe('LittleEndian');
    const sets = childrenNamed(child(root, 'Collection'), 'DataSet');
    expect(sets.map((s) => [s.attributes['timestep'], s.attributes['part'], s.attributes['file']])).toEqual([
      ['0', '0', 'run_0000.vti'], ['0.25', '0', 'run_0001.vti'], ['1e-7', '2', 'a&b.vti'],
    ]);
  });

  it('refuses a non-finite time and an empty file name', () => {
    expect(codeOf(() => vtkCollection([{ time: NaN, file: 'a.vti' }]))).toBe('NON_FINITE_OUTPUT');
    expect(codeOf(() => vtkCollection([{ time: 0, file: '' }]))).toBe('INVALID_OPTION');
    expect(codeOf(() => vtkCollection([{ time: 0, file: 'a.vti', part: -1 }]))).toBe('INVALID_OPTION');
  });
});
