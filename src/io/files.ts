/**
 * Writing files atomically (Node.js only; every other part of `io/` is pure
 * and produces strings that run anywhere).
 *
 * A write goes to a temporary file in the target's own directory,
 * `.<name>.<pid>.<random>.tmp` (same file system, so the final step is a
 * rename and not a copy), which is flushed to disk (`fsync`), closed, and
 * renamed over the target. POSIX `rename` replaces the target atomically:
 * a reader sees the old file or the new one, never a part. On any failure —
 * the directory is missing or not writable, the target is a directory, the
 * content throws half-way, the disk is full — the temporary file is removed
 * and a WriteFailedError naming the path and the OS error code is thrown
 * (a QuadrilleError thrown by the content itself, e.g. NonFiniteOutputError,
 * is passed on unchanged). Nothing is left at the path or beside it, and an
 * existing file at the path is kept as it was.
 *
 * Parent directories are not created unless `createDirectories: true` is
 * passed.
 *
 * @module
 */
import { randomBytes } from 'node:crypto';
import { type FileHandle, mkdir, open, rename, rm } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { InvalidOptionError, QuadrilleError, WriteFailedError } from '../errors.js';
import type { Grid } from '../grid/index.js';
import type { Snapshot } from '../time/index.js';
import { type VtkOptions, vtkCollection, vtkDocument } from './vtk.js';

/**
 * What {@link writeFileAtomic} writes: text (as UTF-8), bytes, or an
 * iterable of chunks of either — e.g. a generator that produces a large
 * file piece by piece; if it throws, nothing is left behind.
 */
export type FileContent = string | Uint8Array | Iterable<string | Uint8Array>;

/** Options of the file writers. */
export interface WriteOptions {
  /** Create missing parent directories first (default false: a missing directory is an error). */
  readonly createDirectories?: boolean;
}

function osCode(e: unknown): string {
  const c = (e as { code?: unknown } | null)?.code;
  return typeof c === 'string' ? c : 'ERROR';
}

function failure(path: string, e: unknown): QuadrilleError {
  if (e instanceof QuadrilleError) return e;
  return new WriteFailedError(path, osCode(e), e instanceof Error ? e.message : String(e), e);
}

function* chunksOf(content: FileContent): Iterable<string | Uint8Array> {
  if (typeof content === 'string' || content instanceof Uint8Array) {
    yield content;
    return;
  }
  if (content === null || typeof content !== 'object' || typeof (content as Iterable<unknown>)[Symbol.iterator] !== 'function') {
    throw new InvalidOptionError('content', 'give a string, a Uint8Array, or an iterable of them');
  }
  for (const c of content) {
    if (typeof c !== 'string' && !(c instanceof Uint8Array)) {
      throw new InvalidOptionError('content', `a chunk is ${typeof c}; every chunk must be a string or a Uint8Array`);
    }
    yield c;
  }
}

/**
 * Writes `content` to `path` atomically (module doc): a temporary file in
 * the same directory, flushed and renamed over the target; on failure no
 * file is left behind and an existing target is untouched.
 *
 * @param path - the file to write (relative paths resolve against the working directory)
 * @param content - text (UTF-8), bytes, or an iterable of chunks
 * @param options - `createDirectories` to make missing parent directories
 * @returns a promise that settles once the file is in place
 * @throws WriteFailedError (rejects) naming the path and the OS error code (`ENOENT`,
 *   `EACCES`, `EISDIR`, …); a QuadrilleError thrown by the content, unchanged
 * @example await writeFileAtomic('out/plate.csv', fieldCsv(g, [{ name: 'T', unit: 'K', field: T }]), { createDirectories: true })
 */
export async function writeFileAtomic(path: string, content: FileContent, options: Readonly<WriteOptions> = {}): Promise<void> {
  if (typeof path !== 'string' || path.length === 0) {
    throw new InvalidOptionError('path', `${JSON.stringify(path)} is not a file path; give a non-empty string`);
  }
  const dir = dirname(path);
  const temp = join(dir, `.${basename(path)}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  let handle: FileHandle | undefined;
  let created = false;
  try {
    if (options.createDirectories === true) await mkdir(dir, { recursive: true });
    // 'wx': never open a file someone else made under this name
    handle = await open(temp, 'wx');
    created = true;
    for (const chunk of chunksOf(content)) await handle.writeFile(chunk);
    await handle.sync();
    const h = handle;
    handle = undefined;
    await h.close();
    await rename(temp, path);
  } catch (e) {
    if (handle !== undefined) await handle.close().catch(() => undefined);
    if (created) await rm(temp, { force: true }).catch(() => undefined);
    throw failure(path, e);
  }
}

/** Options of {@link writeVtkSeries}. */
export interface VtkSeriesOptions extends VtkOptions, WriteOptions {
  /** Name of the point-data array, default `'u'`. */
  readonly name?: string;
  /** Unit of the field, written as the array's `Units` attribute. */
  readonly unit?: string;
}

/** The files written by {@link writeVtkSeries}. */
export interface VtkSeriesFiles {
  /** Path of the `.pvd` collection. */
  readonly collection: string;
  /** Paths of the dataset files, one per snapshot, in time order as given. */
  readonly files: readonly string[];
}

/**
 * A transient run's snapshots as VTK files plus a `.pvd` collection that
 * lists them with their times: `<base>_0000.vti` (or `.vtr`), `<base>_0001…`,
 * and `<base>.pvd`, all in `directory`; each written atomically.
 *
 * Every document is built before the first file is written, so bad data
 * (NaN, a field of the wrong shape) leaves nothing on disk. The collection is
 * written last: if a later write fails, the snapshot files already written
 * stay (each complete) but no `.pvd` refers to them.
 *
 * @param directory - where to write (made first if `createDirectories`)
 * @param base - the file name stem, without directories
 * @param g - the grid of the snapshots
 * @param snapshots - e.g. `result.outputs` of a transient solve
 * @param options - array name and unit, VTK encoding, `createDirectories`
 * @returns the paths written
 * @throws InvalidOptionError for an empty or path-like `base`; the errors of
 *   {@link vtkDocument}; WriteFailedError (rejects) when a file cannot be written
 * @example (await writeVtkSeries('out', 'wall', g, result.outputs, { name: 'T', unit: 'K' })).collection // 'out/wall.pvd'
 */
export async function writeVtkSeries(
  directory: string,
  base: string,
  g: Grid,
  snapshots: readonly Snapshot[],
  options: Readonly<VtkSeriesOptions> = {},
): Promise<VtkSeriesFiles> {
  if (typeof base !== 'string' || base.length === 0 || /[/\\]/.test(base)) {
    throw new InvalidOptionError('base', `${JSON.stringify(base)} is not a file name stem; give a non-empty name without / or \\`);
  }
  const name = options.name ?? 'u';
  const docs = snapshots.map((s) => vtkDocument(g, [{ name, field: s.field, unit: options.unit }], options));
  const digits = Math.max(4, String(Math.max(0, snapshots.length - 1)).length);
  const names = docs.map((d, k) => `${base}_${String(k).padStart(digits, '0')}${d.extension}`);
  const collection = vtkCollection(snapshots.map((s, k) => ({ time: s.time, file: names[k]! })));
  const write: WriteOptions = { createDirectories: options.createDirectories === true };
  const files: string[] = [];
  for (let k = 0; k < docs.length; k++) {
    const path = join(directory, names[k]!);
    await writeFileAtomic(path, docs[k]!.text, write);
    files.push(path);
  }
  const pvd = join(directory, `${base}.pvd`);
  await writeFileAtomic(pvd, collection, write);
  return { collection: pvd, files };
}
