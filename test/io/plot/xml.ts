/**
 * A small, strict XML well-formedness checker and parser for the plot
 * tests (no dependencies). It accepts what XML 1.0 calls well-formed for
 * the documents we write: an optional <?xml …?> prolog, an optional
 * <!DOCTYPE …> (for the polyglot HTML report), comments, CDATA, elements
 * with quoted attributes, text with the five predefined entities and
 * numeric character references. It rejects: a tag that closes the wrong
 * element or never closes, duplicate attributes, unquoted attribute
 * values, `<` inside attribute values, a bare `&`, unknown entities, more
 * than one root element, and non-whitespace text outside the root.
 */

/** An element: name, attributes (entity-decoded), children in order. */
export interface XmlElement {
  readonly name: string;
  readonly attrs: Readonly<Record<string, string>>;
  readonly children: readonly XmlNode[];
}

/** A child: an element or decoded text. */
export type XmlNode = XmlElement | string;

const NAME = /[A-Za-z_:][-A-Za-z0-9_:.]*/y;
const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function fail(src: string, at: number, why: string): never {
  const line = src.slice(0, at).split('\n').length;
  throw new Error(`XML not well-formed at line ${line} (offset ${at}): ${why}: …${src.slice(Math.max(0, at - 30), at + 30)}…`);
}

/** Decodes entities of a text or attribute run; throws on a bare & or an unknown entity. */
function decode(src: string, start: number, s: string): string {
  return s.replace(/&([^;]*);?/g, (whole, body: string, offset: number) => {
    if (!whole.endsWith(';')) fail(src, start + offset, 'bare & (escape it as &amp;)');
    if (body in ENTITIES) return ENTITIES[body]!;
    const m = /^#(?:x([0-9a-fA-F]+)|([0-9]+))$/.exec(body);
    if (m === null) fail(src, start + offset, `unknown entity &${body};`);
    const code = m[1] !== undefined ? parseInt(m[1], 16) : parseInt(m[2]!, 10);
    if (!(code === 0x9 || code === 0xa || code === 0xd || (code >= 0x20 && code <= 0x10ffff))) fail(src, start + offset, `character &#${code}; not allowed in XML`);
    return String.fromCodePoint(code);
  });
}

/** Parses `src` as one well-formed XML document; returns its root element. */
export function parseXml(src: string): XmlElement {
  let i = 0;
  const skipSpace = (): void => {
    while (i < src.length && /\s/.test(src[i]!)) i++;
  };
  const skipMisc = (allowDoctype: boolean): void => {
    for (;;) {
      skipSpace();
      if (src.startsWith('<!--', i)) {
        const end = src.indexOf('-->', i + 4);
        if (end < 0) fail(src, i, 'unclosed comment');
        if (src.slice(i + 4, end).includes('--')) fail(src, i, '"--" inside a comment');
        i = end + 3;
      } else if (src.startsWith('<?', i)) {
        const end = src.indexOf('?>', i);
        if (end < 0) fail(src, i, 'unclosed processing instruction');
        i = end + 2;
      } else if (allowDoctype && src.startsWith('<!DOCTYPE', i)) {
        const end = src.indexOf('>', i);
        if (end < 0) fail(src, i, 'unclosed DOCTYPE');
        i = end + 1;
      } else return;
    }
  };
  const name = (): string => {
    NAME.lastIndex = i;
    const m = NAME.exec(src);
    if (m === null) fail(src, i, 'expected a name');
    i += m[0].length;
    return m[0];
  };
  const element = (): XmlElement => {
    if (src[i] !== '<') fail(src, i, 'expected <');
    i++;
    const tag = name();
    const attrs: Record<string, string> = {};
    for (;;) {
      const before = i;
      skipSpace();
      if (src.startsWith('/>', i)) {
        i += 2;
        return { name: tag, attrs, children: [] };
      }
      if (src[i] === '>') {
        i++;
        break;
      }
      if (i === before) fail(src, i, 'attributes must be separated by white space');
      const an = name();
      skipSpace();
      if (src[i] !== '=') fail(src, i, `attribute ${an} without a value`);
      i++;
      skipSpace();
      const q = src[i];
      if (q !== '"' && q !== "'") fail(src, i, `value of ${an} is not quoted`);
      const end = src.indexOf(q, i + 1);
      if (end < 0) fail(src, i, `unclosed value of ${an}`);
      const raw = src.slice(i + 1, end);
      if (raw.includes('<')) fail(src, i, `< inside the value of ${an}`);
      if (an in attrs) fail(src, i, `duplicate attribute ${an}`);
      attrs[an] = decode(src, i + 1, raw);
      i = end + 1;
    }
    const children: XmlNode[] = [];
    for (;;) {
      if (i >= src.length) fail(src, i, `<${tag}> never closed`);
      if (src.startsWith('</', i)) {
        i += 2;
        const closing = name();
        if (closing !== tag) fail(src, i, `</${closing}> closes <${tag}>`);
        skipSpace();
        if (src[i] !== '>') fail(src, i, 'expected > after the end tag name');
        i++;
        return { name: tag, attrs, children };
      }
      if (src.startsWith('<!--', i)) {
        const end = src.indexOf('-->', i + 4);
        if (end < 0) fail(src, i, 'unclosed comment');
        i = end + 3;
      } else if (src.startsWith('<![CDATA[', i)) {
        const end = src.indexOf(']]>', i);
        if (end < 0) fail(src, i, 'unclosed CDATA');
        children.push(src.slice(i + 9, end));
        i = end + 3;
      } else if (src[i] === '<') {
        children.push(element());
      } else {
        const end = src.indexOf('<', i);
        const stop = end < 0 ? src.length : end;
        const raw = src.slice(i, stop);
        if (raw.includes(']]>')) fail(src, i, '"]]>" in text');
        children.push(decode(src, i, raw));
        i = stop;
      }
    }
  };
  skipMisc(true);
  if (src[i] !== '<') fail(src, i, 'no root element');
  const root = element();
  skipMisc(false);
  if (i !== src.length) fail(src, i, 'content after the root element');
  return root;
}

/** Every element under `root` (itself included), depth first, optionally only those named `name`. */
export function elements(root: XmlElement, name?: string): XmlElement[] {
  const out: XmlElement[] = [];
  const walk = (e: XmlElement): void => {
    if (name === undefined || e.name === name) out.push(e);
    for (const c of e.children) if (typeof c !== 'string') walk(c);
  };
  walk(root);
  return out;
}

/** Elements under `root` with class `cls` (class lists split on white space). */
export function byClass(root: XmlElement, cls: string): XmlElement[] {
  return elements(root).filter((e) => (e.attrs['class'] ?? '').split(/\s+/).includes(cls));
}

/** The concatenated text of `e` and its descendants. */
export function textContent(e: XmlElement): string {
  return e.children.map((c) => (typeof c === 'string' ? c : textContent(c))).join('');
}
