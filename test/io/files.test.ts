import { chmodSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  NonFiniteOutputError, QuadrilleError, WriteFailedError, grid, sampleField, solveTransient, writeFileAtomic, writeVtkSeries,
} from '../../src/index.js';
import { child, childrenNamed, parseXml } from '../support/xml-tree.js';

const root = mkdtempSync(join(tmpdir(), 'quadrille-io-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

let n = 0;
/** A fresh empty directory under the test's temp root. */
function freshDir(): string {
  const d = join(root, `case-${n++}`);
  mkdirSync(d);
  return d;
}

async function rejection(p: Promise<unknown>): Promise<QuadrilleError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof QuadrilleError) return e;
    throw e;
  }
  throw new Error('expected a QuadrilleError, but the promise resolved');
}

describe('writeFileAtomic', () => {
  it('writes text, bytes and chunks; replaces an existing file; leaves no temporary file', async () => {
    const d = freshDir();
    const p = join(d, 'a.csv');
    await writeFileAtomic(p, 'x,T\n0,1\n');
    expect(readFileSync(p, 'utf8')).toBe('x,T\n0,1\n');
    await writeFileAtomic(p, Uint8Array.of(0, 255, 10));
    expect(Array.from(readFileSync(p))).toEqual([0, 255, 10]);
    await writeFileAtomic(p, ['é', Uint8Array.of(65), 'z']);
    expect(readFileSync(p, 'utf8')).toBe('éAz');
    function* big(): Generator<string> {
      for (let k = 0; k < 1000; k++) yield `${k}\n`;
    }
    await writeFileAtomic(p, big());
    expect(readFileSync(p, 'utf8').split('\n').length).toBe(1001);
    expect(readdirSync(d)).toEqual(['a.csv']);
  });

  it('a missing directory: WRITE_FAILED (ENOENT) naming the path, nothing created; createDirectories makes it', async () => {
    const d = freshDir();
    const p = join(d, 'no', 'such', 'dir', 'a.csv');
    const e = await rejection(writeFileAtomic(p, 'x'));
    expect(e).toBeInstanceOf(WriteFailedError);
    expect(e.code).toBe('WRITE_FAILED');
    expect((e as WriteFailedError).path).toBe(p);
    expect((e as WriteFailedError).reason).toBe('ENOENT');
    expect(e.message).toContain(p);
    expect(readdirSync(d)).toEqual([]);
    await writeFileAtomic(p, 'x', { createDirectories: true });
    expect(readFileSync(p, 'utf8')).toBe('x');
  });

  it('a parent that is a file: WRITE_FAILED (ENOTDIR), the file untouched', async () => {
    const d = freshDir();
    writeFileSync(join(d, 'file'), 'keep');
    const e = await rejection(writeFileAtomic(join(d, 'file', 'a.csv'), 'x'));
    expect((e as WriteFailedError).reason).toBe('ENOTDIR');
    expect(readdirSync(d)).toEqual(['file']);
    expect(readFileSync(join(d, 'file'), 'utf8')).toBe('keep');
  });

  it('a path that is a directory: the rename fails, the temporary file is removed, the directory stays', async () => {
    const d = freshDir();
    mkdirSync(join(d, 'out.vti'));
    writeFileSync(join(d, 'out.vti', 'inside'), 'keep');
    const e = await rejection(writeFileAtomic(join(d, 'out.vti'), 'x'));
    expect(e).toBeInstanceOf(WriteFailedError);
    expect(['EISDIR', 'ENOTEMPTY', 'EEXIST', 'EPERM']).toContain((e as WriteFailedError).reason);
    expect(readdirSync(d)).toEqual(['out.vti']);
    expect(readdirSync(join(d, 'out.vti'))).toEqual(['inside']);
  });

  it('content that fails half-way: no temporary file, the old file kept as it was', async () => {
    const d = freshDir();
    const p = join(d, 'a.csv');
    writeFileSync(p, 'old');
    function* failing(): Generator<string> {
      yield 'x,T\n';
      yield '0,1\n';
      throw new Error('producer broke');
    }
    const e = await rejection(writeFileAtomic(p, failing()));
    expect(e).toBeInstanceOf(WriteFailedError);
    expect(e.message).toMatch(/producer broke/);
    expect(readdirSync(d)).toEqual(['a.csv']);
    expect(readFileSync(p, 'utf8')).toBe('old');
    // a QuadrilleError from the content passes through unchanged
    function* nonFinite(): Generator<string> {
      yield 'x';
      throw new NonFiniteOutputError('field "T"', 1, [0], NaN, 'node [0]');
    }
    const q = await rejection(writeFileAtomic(p, nonFinite()));
    expect(q.code).toBe('NON_FINITE_OUTPUT');
    // a chunk of the wrong type
    const bad = await rejection(writeFileAtomic(p, [1 as unknown as string]));
    expect(bad.code).toBe('INVALID_OPTION');
    expect(readdirSync(d)).toEqual(['a.csv']);
    expect(readFileSync(p, 'utf8')).toBe('old');
  });

  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  it.skipIf(isRoot || process.platform === 'win32')(
    `a directory without write permission: WRITE_FAILED (EACCES), nothing left${isRoot ? ' (skipped: running as root, which ignores permissions)' : ''}`,
    async () => {
      const d = freshDir();
      chmodSync(d, 0o500);
      try {
        const e = await rejection(writeFileAtomic(join(d, 'a.csv'), 'x'));
        expect((e as WriteFailedError).reason).toBe('EACCES');
        expect(readdirSync(d)).toEqual([]);
      } finally {
        chmodSync(d, 0o700);
      }
    },
  );
});

describe('writeVtkSeries', () => {
  const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: { nodes: [0, 0.1, 0.3, 1] } });
  const r = solveTransient(
    { grid: g, initial: (x: number, y: number) => x * (1 - x) * (1 + y), boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] },
    { scheme: 'backward-euler', dt: 0.01, endTime: 0.05, outputTimes: [0, 0.02, 0.05] },
  );

  it('one dataset file per snapshot and a .pvd listing them with their times', async () => {
    const d = join(freshDir(), 'series');
    const out = await writeVtkSeries(d, 'plate', g, r.outputs, { name: 'T', unit: 'K', createDirectories: true });
    expect(out.files).toEqual(['plate_0000.vtr', 'plate_0001.vtr', 'plate_0002.vtr'].map((f) => join(d, f)));
    expect(out.collection).toBe(join(d, 'plate.pvd'));
    expect(readdirSync(d).sort()).toEqual(['plate.pvd', 'plate_0000.vtr', 'plate_0001.vtr', 'plate_0002.vtr']);
    const sets = childrenNamed(child(parseXml(readFileSync(out.collection, 'utf8')), 'Collection'), 'DataSet');
    expect(sets.map((s) => [Number(s.attributes['timestep']), s.attributes['file']])).toEqual([
      [0, 'plate_0000.vtr'], [0.02, 'plate_0001.vtr'], [0.05, 'plate_0002.vtr'],
    ]);
    const arr = child(child(child(child(parseXml(readFileSync(out.files[1]!, 'utf8')), 'RectilinearGrid'), 'Piece'), 'PointData'), 'DataArray');
    expect([arr.attributes['Name'], arr.attributes['Units']]).toEqual(['T', 'K']);
  });

  it('bad data is refused before anything is written', async () => {
    const d = freshDir();
    const bad = sampleField(g, () => 1);
    bad.set(3, 2, NaN);
    const e = await rejection(writeVtkSeries(d, 'plate', g, [r.outputs[0]!, { time: 1, field: bad }]));
    expect(e.code).toBe('NON_FINITE_OUTPUT');
    expect(readdirSync(d)).toEqual([]);
    expect((await rejection(writeVtkSeries(d, 'a/b', g, r.outputs))).code).toBe('INVALID_OPTION');
  });
});
