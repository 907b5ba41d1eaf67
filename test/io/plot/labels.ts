/**
 * The label-box estimate, written again for the tests from the SVG alone:
 * a <text> of n characters (code points) at font size s is 0.6·s·n wide
 * and s high, the baseline 0.8·s below the top; text-anchor start, middle
 * or end places the box; `transform="rotate(-90 x y)"` turns it to read
 * upwards about its anchor. Font size and anchor are inherited from
 * ancestors as in SVG (defaults 16 px and start). Any other transform on a
 * text or its ancestors fails the test, so a layout change cannot slip
 * past the estimate unseen.
 */
import { type XmlElement, textContent } from './xml.js';

/** A label's estimated box and what it says. */
export interface TextBox {
  readonly text: string;
  readonly kind: string;
  readonly size: number;
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
}

/** Estimated boxes of every <text> in the SVG tree. */
export function textBoxes(root: XmlElement): TextBox[] {
  const out: TextBox[] = [];
  const walk = (e: XmlElement, size: number, anchor: string): void => {
    const s = e.attrs['font-size'] !== undefined ? Number(e.attrs['font-size']) : size;
    const a = e.attrs['text-anchor'] ?? anchor;
    if (e.name !== 'text' && e.attrs['transform'] !== undefined) throw new Error(`transform on <${e.name}>: the test estimate does not follow it`);
    if (e.name === 'text') {
      if (e.children.some((c) => typeof c !== 'string')) throw new Error('child elements in <text>: the test estimate does not follow them');
      const text = textContent(e);
      const x = Number(e.attrs['x']);
      const y = Number(e.attrs['y']);
      const n = [...text].length;
      const w = 0.6 * s * n;
      const shift = a === 'middle' ? w / 2 : a === 'end' ? w : 0;
      const t = e.attrs['transform'];
      let box: [number, number, number, number];
      if (t === undefined) {
        box = [x - shift, y - 0.8 * s, x - shift + w, y + 0.2 * s];
      } else {
        const m = /^rotate\(-90 ([-\d.e]+) ([-\d.e]+)\)$/.exec(t);
        if (m === null || Number(m[1]) !== x || Number(m[2]) !== y) throw new Error(`unexpected transform ${t}`);
        // reading upwards: the text runs from y + shift up to y + shift − w; the ascent points left
        box = [x - 0.8 * s, y + shift - w, x + 0.2 * s, y + shift];
      }
      out.push({ text, kind: e.attrs['class'] ?? '', size: s, x0: box[0], y0: box[1], x1: box[2], y1: box[3] });
      return;
    }
    for (const c of e.children) if (typeof c !== 'string') walk(c, s, a);
  };
  walk(root, 16, 'start');
  return out;
}

/** Pairs of boxes that overlap with positive area. */
export function overlapping(boxes: readonly TextBox[]): [TextBox, TextBox][] {
  const out: [TextBox, TextBox][] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i]!;
      const b = boxes[j]!;
      if (a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1) out.push([a, b]);
    }
  }
  return out;
}

/** Boxes that leave the sheet [0, width] × [0, height]. */
export function outside(boxes: readonly TextBox[], width: number, height: number): TextBox[] {
  return boxes.filter((b) => b.x0 < 0 || b.y0 < 0 || b.x1 > width || b.y1 > height);
}
