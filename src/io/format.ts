/**
 * Helpers shared by the writers: exact number text, the non-finite scan,
 * node walks in either ordering, XML escaping and base64. Internal: not
 * re-exported.
 *
 * @module
 */
import { InvalidOptionError, NonFiniteOutputError } from '../errors.js';
import { checkField } from '../grid/field.js';
import type { Field, Grid } from '../grid/index.js';

/**
 * The shortest decimal text that reads back as exactly `v`
 * (ECMAScript Number::toString, which is correctly rounded both ways), with
 * the sign of −0 kept. Finite values only.
 *
 * @internal
 */
export function numberText(v: number): string {
  return v === 0 && 1 / v < 0 ? '-0' : String(v);
}

/** A field, checked against its grid, as its data, offset and three strides (1 for absent axes). @internal */
export interface View3 {
  readonly data: Float64Array;
  readonly offset: number;
  readonly s0: number;
  readonly s1: number;
  readonly s2: number;
}

/** Node counts of a grid padded to three axes (1 for absent ones). @internal */
export function counts3(g: Grid): [number, number, number] {
  return [g.shape[0], g.shape[1] ?? 1, g.shape[2] ?? 1];
}

/**
 * Checks `f` against `g` (ShapeMismatchError / InvalidFieldError) and gives
 * its strided view padded to three axes.
 *
 * @internal
 */
export function view3(g: Grid, f: unknown, name: string): View3 {
  checkField(g, f, name);
  const st = f.stride;
  return { data: f.data, offset: f.offset, s0: st[0] ?? 0, s1: st[1] ?? 0, s2: st[2] ?? 0 };
}

function nodeText(g: Grid, i: number, j: number, k: number): string {
  const idx = [i, j, k].slice(0, g.dimension);
  const coords = g.axes.map((a, d) => `${a.name} = ${a.coordinates[idx[d]!]}`);
  return `node [${idx.join(', ')}] (${coords.join(', ')})`;
}

/**
 * Throws NonFiniteOutputError if any value of the field is NaN or ±Infinity,
 * with the count and the first node (x slowest order) and its coordinates.
 *
 * @internal
 */
export function checkFieldFinite(g: Grid, v: View3, what: string, hint?: string): void {
  const [nx, ny, nz] = counts3(g);
  const { data, offset, s0, s1, s2 } = v;
  let count = 0;
  let first: [number, number, number] | undefined;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      let p = offset + i * s0 + j * s1;
      for (let k = 0; k < nz; k++) {
        if (!Number.isFinite(data[p]!)) {
          if (count === 0) first = [i, j, k];
          count++;
        }
        p += s2;
      }
    }
  }
  if (first !== undefined) {
    const [i, j, k] = first;
    throw new NonFiniteOutputError(
      what, count, [i, j, k].slice(0, g.dimension), data[offset + i * s0 + j * s1 + k * s2]!, nodeText(g, i, j, k), hint,
    );
  }
}

/**
 * Throws NonFiniteOutputError if any entry of `a` is NaN or ±Infinity, with
 * the count and the first (flat, 0-based) index.
 *
 * @internal
 */
export function checkArrayFinite(a: ArrayLike<number>, what: string): void {
  let count = 0;
  let first = -1;
  for (let p = 0; p < a.length; p++) {
    if (!Number.isFinite(a[p]!)) {
      if (count === 0) first = p;
      count++;
    }
  }
  if (count > 0) throw new NonFiniteOutputError(what, count, [first], a[first]!, `index ${first}`);
}

/** Throws NonFiniteOutputError unless the scalar `v` (a time, a step) is finite. @internal */
export function checkNumberFinite(what: string, v: number): void {
  if (!Number.isFinite(v)) throw new NonFiniteOutputError(what, 1, [], v, what);
}

/**
 * Checks a list of names to be written as column or array names: non-empty,
 * distinct, no control characters, none of `reserved`.
 *
 * @internal
 */
export function checkNames(option: string, names: readonly string[], reserved: readonly string[] = []): void {
  const seen = new Set<string>();
  for (const n of names) {
    if (typeof n !== 'string' || n.length === 0) {
      throw new InvalidOptionError(option, `name ${JSON.stringify(n)} is not a non-empty string; give each column a name`);
    }
    if (/[\u0000-\u001f\u007f]/.test(n)) {
      throw new InvalidOptionError(option, `name ${JSON.stringify(n)} holds a control character (a line break, a tab); use printable text`);
    }
    if (reserved.includes(n)) {
      throw new InvalidOptionError(option, `name ${JSON.stringify(n)} is reserved for ${reserved.join(', ')}; choose another`);
    }
    if (seen.has(n)) throw new InvalidOptionError(option, `name ${JSON.stringify(n)} is given twice; names must be distinct`);
    seen.add(n);
  }
}

/**
 * Text escaped for an XML attribute value or character data (XML 1.0 §2.4,
 * §3.3.3): & < > " ' become entity references.
 *
 * @internal
 */
export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/**
 * Base64 of `bytes`, RFC 4648 §4: the standard alphabet, `=` padding, no line
 * breaks. Written here rather than with Buffer or btoa so that it runs the
 * same in every JavaScript engine.
 *
 * @internal
 */
export function base64(bytes: Uint8Array): string {
  const n = bytes.length;
  const out: string[] = [];
  // chunks keep the intermediate strings and the join small
  let chunk = '';
  let p = 0;
  for (; p + 2 < n; p += 3) {
    const w = (bytes[p]! << 16) | (bytes[p + 1]! << 8) | bytes[p + 2]!;
    chunk += ALPHABET[w >>> 18]! + ALPHABET[(w >>> 12) & 63]! + ALPHABET[(w >>> 6) & 63]! + ALPHABET[w & 63]!;
    if (chunk.length >= 8192) {
      out.push(chunk);
      chunk = '';
    }
  }
  const rest = n - p;
  if (rest === 1) {
    const w = bytes[p]! << 16;
    chunk += ALPHABET[w >>> 18]! + ALPHABET[(w >>> 12) & 63]! + '==';
  } else if (rest === 2) {
    const w = (bytes[p]! << 16) | (bytes[p + 1]! << 8);
    chunk += ALPHABET[w >>> 18]! + ALPHABET[(w >>> 12) & 63]! + ALPHABET[(w >>> 6) & 63]! + '=';
  }
  out.push(chunk);
  return out.join('');
}
