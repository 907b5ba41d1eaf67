/**
 * A minimal, strict XML reader for tests: elements, double- or
 * single-quoted attributes, character data, the five predefined entities,
 * the XML declaration and comments. No DTDs, CDATA or namespaces. Written
 * as a character scanner (no regular expressions) so that the writer's
 * output is checked by something that does not share its assumptions.
 */

/** One element: its name, attributes, children and concatenated character data. */
export interface XmlElement {
  readonly name: string;
  readonly attributes: Readonly<Record<string, string>>;
  readonly children: XmlElement[];
  text: string;
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function decode(s: string): string {
  let out = '';
  let p = 0;
  while (p < s.length) {
    const c = s[p]!;
    if (c !== '&') {
      out += c;
      p++;
      continue;
    }
    const end = s.indexOf(';', p);
    if (end < 0) throw new Error(`unterminated entity at ${p}`);
    const name = s.slice(p + 1, end);
    const v = ENTITIES[name];
    if (v === undefined) throw new Error(`unknown entity &${name};`);
    out += v;
    p = end + 1;
  }
  return out;
}

function isSpace(c: string | undefined): boolean {
  return c === ' ' || c === '\n' || c === '\t' || c === '\r';
}

function isNameChar(c: string | undefined): boolean {
  if (c === undefined) return false;
  const k = c.charCodeAt(0);
  return (k >= 48 && k <= 57) || (k >= 65 && k <= 90) || (k >= 97 && k <= 122) || c === '_' || c === '-' || c === '.' || c === ':';
}

/** Parses a whole document and returns its root element; throws on anything not well-formed. */
export function parseXml(text: string): XmlElement {
  let p = 0;
  const n = text.length;
  const skipSpace = (): void => {
    while (p < n && isSpace(text[p])) p++;
  };
  const expect = (s: string): void => {
    if (text.slice(p, p + s.length) !== s) throw new Error(`expected ${JSON.stringify(s)} at ${p}, got ${JSON.stringify(text.slice(p, p + 20))}`);
    p += s.length;
  };
  const name = (): string => {
    const s = p;
    while (isNameChar(text[p])) p++;
    if (p === s) throw new Error(`expected a name at ${p}`);
    return text.slice(s, p);
  };
  const skipMisc = (): void => {
    for (;;) {
      skipSpace();
      if (text.startsWith('<?', p)) {
        const e = text.indexOf('?>', p);
        if (e < 0) throw new Error('unterminated processing instruction');
        p = e + 2;
      } else if (text.startsWith('<!--', p)) {
        const e = text.indexOf('-->', p);
        if (e < 0) throw new Error('unterminated comment');
        p = e + 3;
      } else return;
    }
  };
  const element = (): XmlElement => {
    expect('<');
    const tag = name();
    const attributes: Record<string, string> = {};
    for (;;) {
      const before = p;
      skipSpace();
      if (text[p] === '/' || text[p] === '>') break;
      if (p === before) throw new Error(`expected space before attribute at ${p}`);
      const key = name();
      skipSpace();
      expect('=');
      skipSpace();
      const q = text[p];
      if (q !== '"' && q !== "'") throw new Error(`expected a quoted value at ${p}`);
      const e = text.indexOf(q, p + 1);
      if (e < 0) throw new Error('unterminated attribute value');
      const raw = text.slice(p + 1, e);
      if (raw.includes('<')) throw new Error(`< in attribute ${key}`);
      if (key in attributes) throw new Error(`attribute ${key} repeated`);
      attributes[key] = decode(raw);
      p = e + 1;
    }
    const el: XmlElement = { name: tag, attributes, children: [], text: '' };
    if (text[p] === '/') {
      expect('/>');
      return el;
    }
    expect('>');
    for (;;) {
      if (p >= n) throw new Error(`element ${tag} not closed`);
      if (text.startsWith('</', p)) {
        p += 2;
        const closing = name();
        if (closing !== tag) throw new Error(`</${closing}> closes <${tag}>`);
        skipSpace();
        expect('>');
        return el;
      }
      if (text.startsWith('<!--', p)) {
        const e = text.indexOf('-->', p);
        if (e < 0) throw new Error('unterminated comment');
        p = e + 3;
      } else if (text[p] === '<') {
        el.children.push(element());
      } else {
        const e = text.indexOf('<', p);
        const raw = text.slice(p, e < 0 ? n : e);
        if (raw.includes('>')) {
          // legal in XML but never produced by our writers: flag it
          throw new Error(`unescaped > in character data of ${tag}`);
        }
        el.text += decode(raw);
        p = e < 0 ? n : e;
      }
    }
  };
  skipMisc();
  const root = element();
  skipMisc();
  if (p !== n) throw new Error(`content after the root element at ${p}`);
  return root;
}

/** The direct children of `el` named `name`. */
export function childrenNamed(el: XmlElement, name: string): XmlElement[] {
  return el.children.filter((c) => c.name === name);
}

/** The only direct child of `el` named `name`; throws unless there is exactly one. */
export function child(el: XmlElement, name: string): XmlElement {
  const c = childrenNamed(el, name);
  if (c.length !== 1) throw new Error(`${el.name} has ${c.length} <${name}> children, expected 1`);
  return c[0]!;
}

/** Decodes RFC 4648 base64 (standard alphabet, padding required), independently of the writer. */
export function decodeBase64(s: string): Uint8Array {
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
  if (s.length % 4 !== 0) throw new Error(`base64 length ${s.length} is not a multiple of 4`);
  let pad = 0;
  if (s.endsWith('==')) pad = 2;
  else if (s.endsWith('=')) pad = 1;
  const out = new Uint8Array((s.length / 4) * 3 - pad);
  let o = 0;
  for (let p = 0; p < s.length; p += 4) {
    let w = 0;
    for (let q = 0; q < 4; q++) {
      const c = s[p + q]!;
      const v = c === '=' ? 0 : alphabet.indexOf(c);
      if (v < 0) throw new Error(`not base64: ${c}`);
      if (c === '=' && p + 4 < s.length) throw new Error('padding inside base64');
      w = w * 64 + v;
    }
    const bytes = [(w >> 16) & 255, (w >> 8) & 255, w & 255];
    for (const b of bytes) if (o < out.length) out[o++] = b;
  }
  return out;
}
