import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  MalformedMatrixMarketError, NonFiniteOutputError, UnsupportedMatrixMarketError,
  advection, discretize, grid, matrixFromMatrixMarket, matrixToMatrixMarket, vectorFromMatrixMarket,
  vectorToMatrixMarket, type CsrMatrix,
} from '../../src/index.js';
import { codeOf, errorOf } from '../support/errors.js';
import { mulberry32 } from '../support/prng.js';

/** Same structure and bitwise-equal values. */
function expectSameCsr(got: CsrMatrix, want: CsrMatrix): void {
  expect(got.rows).toBe(want.rows);
  expect(got.cols).toBe(want.cols);
  expect(Array.from(got.rowPtr)).toEqual(Array.from(want.rowPtr));
  expect(Array.from(got.colIdx)).toEqual(Array.from(want.colIdx));
  expect(got.values.length).toBe(want.values.length);
  for (let p = 0; p < want.values.length; p++) {
    if (!Object.is(got.values[p], want.values[p])) expect.fail(`values[${p}]: ${got.values[p]} ≠ ${want.values[p]}`);
  }
}

/** A random sparse m × n CSR matrix with values that need all 17 digits, plus extremes. */
function randomCsr(rows: number, cols: number, seed: number): CsrMatrix {
  const rnd = mulberry32(seed);
  const special = [-0, 5e-324, -1.7976931348623157e308, 0.1 + 0.2, 1e21, -1e-7, 0];
  const rowPtr = new Int32Array(rows + 1);
  const colIdx: number[] = [];
  const values: number[] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      if (rnd() < 0.3) {
        colIdx.push(c);
        const s = rnd();
        values.push(s < 0.2 ? special[Math.floor(rnd() * special.length)]! : (rnd() - 0.5) * 10 ** Math.floor(rnd() * 40 - 20));
      }
    }
    rowPtr[r + 1] = colIdx.length;
  }
  return { rows, cols, rowPtr, colIdx: Int32Array.from(colIdx), values: Float64Array.from(values) };
}

const plate = grid({ x: { from: 0, to: 1, cells: 5 }, y: { from: 0, to: 2, cells: 3 } });
const steady = discretize(plate, {
  conductivity: (x: number, y: number) => 1 + x + 3 * y * y,
  boundary: [
    { faces: ['xmin', 'ymin'], kind: 'dirichlet', value: 0 },
    { faces: 'xmax', kind: 'neumann', flux: -2 },
    { faces: 'ymax', kind: 'robin', h: 10, ambient: 20 },
  ],
}).system({ source: (x: number, y: number) => Math.sin(3 * x) * y });

describe('matrixToMatrixMarket / matrixFromMatrixMarket (NIST Matrix Market, Boisvert, Pozo & Remington 1996)', () => {
  it('a nonsymmetric operator: general coordinate form, 1-based, round trip exact', () => {
    const op = advection(plate, { velocity: [1.5, -0.25], scheme: 'upwind' });
    expect(op.symmetric).toBe(false);
    const text = matrixToMatrixMarket(op);
    const lines = text.split('\n');
    expect(lines[0]).toBe('%%MatrixMarket matrix coordinate real general');
    const m = op.matrix;
    expect(lines[1]).toBe(`${m.rows} ${m.cols} ${m.values.length}`);
    expect(lines.length).toBe(2 + m.values.length + 1);
    // first entry of row 0 written as 1-based indices
    expect(lines[2]!.split(' ').slice(0, 2)).toEqual(['1', String(m.colIdx[0]! + 1)]);
    expectSameCsr(matrixFromMatrixMarket(text), m);
  });

  it('the symmetric steady system: symmetric form, lower triangle only, reader expands exactly', () => {
    const m = steady.matrix.matrix;
    const text = matrixToMatrixMarket(steady.matrix);
    const lines = text.trimEnd().split('\n');
    expect(lines[0]).toBe('%%MatrixMarket matrix coordinate real symmetric');
    let lower = 0;
    for (let r = 0; r < m.rows; r++) for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (m.colIdx[p]! <= r) lower++;
    expect(lines[1]).toBe(`${m.rows} ${m.cols} ${lower}`);
    expect(lower).toBeLessThan(m.values.length);
    for (const l of lines.slice(2)) {
      const [i, j] = l.split(' ').map(Number);
      expect(i!).toBeGreaterThanOrEqual(j!);
    }
    expectSameCsr(matrixFromMatrixMarket(text), m);
    // forced general writes every entry and reads back the same
    const general = matrixToMatrixMarket(steady.matrix, { symmetry: 'general' });
    expect(general.split('\n')[0]).toBe('%%MatrixMarket matrix coordinate real general');
    expectSameCsr(matrixFromMatrixMarket(general), m);
  });

  it('random matrices with extreme values (−0, subnormals, ±max, 17 digits) round-trip to the bit', () => {
    for (const [rows, cols, seed] of [[7, 11, 1], [12, 5, 2], [1, 1, 3], [20, 20, 4]] as const) {
      const m = randomCsr(rows, cols, seed);
      expectSameCsr(matrixFromMatrixMarket(matrixToMatrixMarket(m)), m);
    }
    const empty: CsrMatrix = { rows: 3, cols: 2, rowPtr: new Int32Array(4), colIdx: new Int32Array(0), values: new Float64Array(0) };
    expectSameCsr(matrixFromMatrixMarket(matrixToMatrixMarket(empty)), empty);
  });

  it("'symmetric' on a nonsymmetric matrix is refused; comments are written as % lines", () => {
    expect(codeOf(() => matrixToMatrixMarket(randomCsr(4, 4, 9), { symmetry: 'symmetric' }))).toBe('NOT_SYMMETRIC');
    const text = matrixToMatrixMarket(steady.matrix, { comments: ['steady plate system', 'unknowns x slowest\nrows 1-based'] });
    expect(text.split('\n').slice(1, 4)).toEqual(['% steady plate system', '% unknowns x slowest', '% rows 1-based']);
    expectSameCsr(matrixFromMatrixMarket(text), steady.matrix.matrix);
  });

  it('NaN or ±Infinity in the values: NonFiniteOutputError with count and (row, column)', () => {
    const m = randomCsr(6, 6, 5);
    const values = Float64Array.from(m.values);
    values[3] = NaN;
    values[7] = -Infinity;
    const e = errorOf(() => matrixToMatrixMarket({ ...m, values }));
    expect(e).toBeInstanceOf(NonFiniteOutputError);
    const n = e as NonFiniteOutputError;
    expect(n.count).toBe(2);
    let r = 0;
    while (m.rowPtr[r + 1]! <= 3) r++;
    expect(n.index).toEqual([r, m.colIdx[3]]);
  });

  it('reading: unsorted entries sorted, duplicates summed in file order, explicit zeros kept, comments, blank lines, CRLF', () => {
    const text = [
      '%%MatrixMarket MATRIX Coordinate REAL General',
      '% a comment',
      '',
      '  3 4 6  ',
      '3 4 1.5',
      '% a comment between entries',
      '1 2 0.1',
      '1 1 0',
      '',
      '3 4 0.2',
      '1 2 0.2',
      '2 3 -7e-3',
    ].join('\r\n');
    const m = matrixFromMatrixMarket(text);
    expect(m.rows).toBe(3);
    expect(m.cols).toBe(4);
    expect(Array.from(m.rowPtr)).toEqual([0, 2, 3, 4]);
    expect(Array.from(m.colIdx)).toEqual([0, 1, 2, 3]);
    expect(Array.from(m.values)).toEqual([0, 0.1 + 0.2, -7e-3, 1.5 + 0.2]);
  });

  it('reading: integer field as real, skew-symmetric expanded with the sign flipped', () => {
    const m = matrixFromMatrixMarket('%%MatrixMarket matrix coordinate integer general\n2 2 2\n1 1 -3\n2 1 +4\n');
    expect(Array.from(m.values)).toEqual([-3, 4]);
    const s = matrixFromMatrixMarket('%%MatrixMarket matrix coordinate real skew-symmetric\n3 3 2\n2 1 1.5\n3 2 -2\n');
    expect(Array.from(s.rowPtr)).toEqual([0, 1, 3, 4]);
    expect(Array.from(s.colIdx)).toEqual([1, 0, 2, 1]);
    expect(Array.from(s.values)).toEqual([-1.5, 1.5, 2, -2]);
  });

  // each case: the text, the line the error must name, and the error class
  const MM = '%%MatrixMarket matrix coordinate real general';
  const malformed: [string, string, number][] = [
    ['empty text', '', 1],
    ['bad banner token', '%%MatrixMarkets matrix coordinate real general\n1 1 1\n1 1 1\n', 1],
    ['banner missing a qualifier', '%%MatrixMarket matrix coordinate real\n1 1 1\n1 1 1\n', 1],
    ['unknown format', '%%MatrixMarket matrix sparse real general\n1 1 1\n1 1 1\n', 1],
    ['unknown field', '%%MatrixMarket matrix coordinate double general\n1 1 1\n1 1 1\n', 1],
    ['unknown symmetry', '%%MatrixMarket matrix coordinate real upper\n1 1 1\n1 1 1\n', 1],
    ['no size line', `${MM}\n% only comments\n`, 3],
    ['size line with two numbers', `${MM}\n% c\n2 2\n1 1 1\n`, 3],
    ['size line not numeric', `${MM}\n2 two 1\n1 1 1\n`, 2],
    ['negative size', `${MM}\n-2 2 1\n1 1 1\n`, 2],
    ['non-square symmetric', '%%MatrixMarket matrix coordinate real symmetric\n2 3 1\n1 1 1\n', 2],
    ['truncated: too few entries', `${MM}\n3 3 3\n1 1 1\n2 2 2\n`, 5],
    ['truncated mid-way, trailing comment', `${MM}\n3 3 3\n1 1 1\n% end\n`, 5],
    ['too many entries', `${MM}\n3 3 1\n1 1 1\n2 2 2\n`, 4],
    ['entry with two fields', `${MM}\n3 3 2\n1 1 1\n2 2\n`, 4],
    ['entry with four fields', `${MM}\n3 3 2\n1 1 1\n2 2 2 0\n`, 4],
    ['row index 0', `${MM}\n3 3 1\n0 1 1\n`, 3],
    ['row index beyond rows', `${MM}\n3 3 2\n1 1 1\n4 1 1\n`, 4],
    ['column index beyond columns', `${MM}\n3 2 1\n1 3 1\n`, 3],
    ['fractional index', `${MM}\n3 3 1\n1.5 1 1\n`, 3],
    ['non-numeric value', `${MM}\n3 3 1\n1 1 abc\n`, 3],
    ['NaN value', `${MM}\n3 3 1\n1 1 nan\n`, 3],
    ['Infinity value', `${MM}\n3 3 1\n1 1 Infinity\n`, 3],
    ['overflowing value', `${MM}\n3 3 1\n1 1 1e400\n`, 3],
    ['hexadecimal value', `${MM}\n3 3 1\n1 1 0x10\n`, 3],
    ['decimal in an integer file', '%%MatrixMarket matrix coordinate integer general\n2 2 1\n1 1 1.5\n', 3],
    ['upper entry in a symmetric file', '%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 1\n1 2 1\n', 4],
    ['diagonal entry in a skew-symmetric file', '%%MatrixMarket matrix coordinate real skew-symmetric\n3 3 1\n2 2 1\n', 3],
  ];
  for (const [what, text, line] of malformed) {
    it(`rejects ${what} at line ${line}`, () => {
      const e = errorOf(() => matrixFromMatrixMarket(text));
      expect(e).toBeInstanceOf(MalformedMatrixMarketError);
      expect(e.code).toBe('MALFORMED_MATRIX_MARKET');
      expect((e as MalformedMatrixMarketError).line).toBe(line);
      expect(e.message).toMatch(new RegExp(`^Matrix Market line ${line}: `));
    });
  }

  const unsupported: [string, string][] = [
    ['complex', '%%MatrixMarket matrix coordinate complex general\n1 1 1\n1 1 1 0\n'],
    ['pattern', '%%MatrixMarket matrix coordinate pattern general\n1 1 1\n1 1\n'],
    ['hermitian', '%%MatrixMarket matrix coordinate real hermitian\n1 1 1\n1 1 1\n'],
    ['a dense array', '%%MatrixMarket matrix array real general\n1 1\n1\n'],
    ['the vector object', '%%MatrixMarket vector coordinate real general\n1 1\n1 1\n'],
  ];
  for (const [what, text] of unsupported) {
    it(`refuses ${what} clearly (UNSUPPORTED_MATRIX_MARKET, line 1)`, () => {
      const e = errorOf(() => matrixFromMatrixMarket(text));
      expect(e).toBeInstanceOf(UnsupportedMatrixMarketError);
      expect((e as UnsupportedMatrixMarketError).line).toBe(1);
    });
  }
});

describe('vectorToMatrixMarket / vectorFromMatrixMarket (array format)', () => {
  it('the right-hand side of the steady system round-trips exactly', () => {
    const text = vectorToMatrixMarket(steady.rhs);
    const lines = text.split('\n');
    expect(lines[0]).toBe('%%MatrixMarket matrix array real general');
    expect(lines[1]).toBe(`${steady.rhs.length} 1`);
    const back = vectorFromMatrixMarket(text);
    expect(back.length).toBe(steady.rhs.length);
    for (let i = 0; i < back.length; i++) expect(Object.is(back[i], steady.rhs[i])).toBe(true);
  });

  it('extreme values, and an ndarray view written in x-slowest order whatever its strides', () => {
    const v = Float64Array.of(-0, 5e-324, 1.7976931348623157e308, 0.1 + 0.2, -1e-300, 123456789.123456789);
    const back = vectorFromMatrixMarket(vectorToMatrixMarket(v));
    for (let i = 0; i < v.length; i++) expect(Object.is(back[i], v[i])).toBe(true);
    const f = ndarray(Float64Array.of(1, 2, 3, 4, 5, 6), [2, 3]).transpose(1, 0); // shape [3, 2], strides [1, 3]
    expect(Array.from(vectorFromMatrixMarket(vectorToMatrixMarket(f)))).toEqual([1, 4, 2, 5, 3, 6]);
    expect(Array.from(vectorFromMatrixMarket('%%MatrixMarket matrix array integer general\n1 3\n1\n-2\n3\n'))).toEqual([1, -2, 3]);
  });

  it('refuses NaN on writing; malformed and unsupported arrays on reading, with line numbers', () => {
    expect(codeOf(() => vectorToMatrixMarket(Float64Array.of(1, NaN)))).toBe('NON_FINITE_OUTPUT');
    const A = '%%MatrixMarket matrix array real general';
    const cases: [string, number][] = [[`${A}\n3 1\n1\n2\n`, 5], [`${A}\n2 1\n1\n2\n3\n`, 5], [`${A}\n2 1\n1 2\n2\n`, 3], [`${A}\n2 1\n1\nx\n`, 4], [`${A}\n2\n`, 2]];
    for (const [text, line] of cases) {
      const e = errorOf(() => vectorFromMatrixMarket(text));
      expect(e.code).toBe('MALFORMED_MATRIX_MARKET');
      expect((e as MalformedMatrixMarketError).line).toBe(line);
    }
    expect(codeOf(() => vectorFromMatrixMarket(`${A}\n2 2\n1\n2\n3\n4\n`))).toBe('UNSUPPORTED_MATRIX_MARKET');
    expect(codeOf(() => vectorFromMatrixMarket('%%MatrixMarket matrix array real symmetric\n1 1\n1\n'))).toBe('UNSUPPORTED_MATRIX_MARKET');
    expect(codeOf(() => vectorFromMatrixMarket('%%MatrixMarket matrix coordinate real general\n1 1 1\n1 1 1\n'))).toBe('UNSUPPORTED_MATRIX_MARKET');
  });
});

// scipy is optional: the check runs only where python3 can import scipy.io
const scipy = spawnSync('python3', ['-c', 'import scipy.io'], { encoding: 'utf8' });
const noScipy = scipy.error !== undefined || scipy.status !== 0;

describe('cross-check with scipy.io.mmread', () => {
  it.skipIf(noScipy)(
    `scipy reads our general and symmetric files entry by entry, exactly${noScipy ? ' (skipped: python3 with scipy is not available here)' : ''}`,
    () => {
      const dir = mkdtempSync(join(tmpdir(), 'quadrille-mm-'));
      try {
        const cases: [string, CsrMatrix, string][] = [
          ['general.mtx', randomCsr(9, 7, 11), matrixToMatrixMarket(randomCsr(9, 7, 11))],
          ['symmetric.mtx', steady.matrix.matrix, matrixToMatrixMarket(steady.matrix)],
        ];
        for (const [name, m, text] of cases) {
          writeFileSync(join(dir, name), text);
          // repr() of a Python float is its shortest round-trip decimal, like String() here
          const script = [
            'import sys, scipy.io',
            'a = scipy.io.mmread(sys.argv[1]).tocoo()',
            'print(a.shape[0], a.shape[1])',
            'for i, j, v in zip(a.row, a.col, a.data): print(int(i), int(j), repr(float(v)))',
          ].join('\n');
          const out = spawnSync('python3', ['-c', script, join(dir, name)], { encoding: 'utf8' });
          expect(out.status, out.stderr).toBe(0);
          const lines = out.stdout.trim().split('\n');
          expect(lines[0]).toBe(`${m.rows} ${m.cols}`);
          const got = new Map<string, number>();
          for (const l of lines.slice(1)) {
            const [i, j, v] = l.split(' ');
            const key = `${i},${j}`;
            expect(got.has(key), `scipy gave ${key} twice`).toBe(false);
            got.set(key, Number(v));
          }
          let count = 0;
          for (let r = 0; r < m.rows; r++) {
            for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) {
              const key = `${r},${m.colIdx[p]}`;
              expect(got.has(key), `entry ${key} missing in scipy's matrix`).toBe(true);
              // −0 is printed by Python as -0.0; compare bits
              expect(Object.is(got.get(key), m.values[p]), `entry ${key}`).toBe(true);
              count++;
            }
          }
          expect(got.size).toBe(count);
        }
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
