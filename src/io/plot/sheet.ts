/**
 * An SVG document under construction that remembers the box of every label
 * it holds, so that optional labels (ticks, contour values, legends) are
 * placed only where they collide with nothing. Internal.
 *
 * @module
 */
import { InvalidOptionError } from '../../errors.js';
import { type Anchor, type Box, FONT_STACK, escapeXml, labelBox, overlaps, px } from './text.js';

/** One label to draw. */
export interface Label {
  /** The text (plain; escaped on output). */
  readonly text: string;
  /** Anchor x (px). */
  readonly x: number;
  /** Baseline y (px). */
  readonly y: number;
  /** Font size (px), ≥ 11. */
  readonly size: number;
  /** text-anchor. */
  readonly anchor: Anchor;
  /** Rotate by −90° about (x, y), reading upwards. */
  readonly rotated?: boolean;
  /** CSS class, for readers of the SVG (and the tests). */
  readonly kind: string;
  /** Fill colour (default the ink colour). */
  readonly fill?: string;
  /** Font weight. */
  readonly weight?: number;
  /** Draw a halo of this colour behind the glyphs (for labels over a colour map). */
  readonly halo?: string;
}

/** Ink and paper of every plot. */
export const INK = '#22252b';
/** Secondary ink: ticks, frames. */
export const MUTED = '#5d6068';
/** Grid lines. */
export const RULE = '#e4e2dc';
/** Background. */
export const PAPER = '#fdfcf9';

/** Clearance (px) kept between any two labels. */
export const LABEL_GAP = 2;

/** Checks an SVG size option: finite and in [200, 8000] px. */
export function checkSize(width: number, height: number): void {
  for (const [name, v] of [['width', width], ['height', height]] as const) {
    if (!(typeof v === 'number' && Number.isFinite(v) && v >= 200 && v <= 8000)) {
      throw new InvalidOptionError(name, `${String(v)} px; give a finite size from 200 to 8000 px`);
    }
  }
}

/** An SVG document being built; `text` refuses labels that would collide. */
export class Sheet {
  private readonly parts: string[] = [];
  private readonly boxes: Box[] = [];

  /**
   * @param width - sheet width (px)
   * @param height - sheet height (px)
   */
  constructor(readonly width: number, readonly height: number) {}

  /** Whether `b` lies on the sheet and clears every label placed so far. */
  free(b: Box, pad = LABEL_GAP): boolean {
    if (b.x0 < 0 || b.y0 < 0 || b.x1 > this.width || b.y1 > this.height) return false;
    for (const o of this.boxes) if (overlaps(b, o, pad)) return false;
    return true;
  }

  /** Appends raw SVG markup (already escaped). */
  raw(markup: string): void {
    this.parts.push(markup);
  }

  /**
   * Draws a label if it is free (or `force`d) and records its box.
   * @returns whether it was drawn
   */
  text(l: Label, force = false): boolean {
    const b = labelBox(l.text, l.x, l.y, l.size, l.anchor, l.rotated ?? false);
    if (!force && !this.free(b)) return false;
    this.boxes.push(b);
    const rot = l.rotated === true ? ` transform="rotate(-90 ${px(l.x)} ${px(l.y)})"` : '';
    const weight = l.weight !== undefined ? ` font-weight="${l.weight}"` : '';
    const halo = l.halo !== undefined ? ` stroke="${l.halo}" stroke-width="3" stroke-linejoin="round" paint-order="stroke"` : '';
    this.parts.push(
      `<text class="${l.kind}" x="${px(l.x)}" y="${px(l.y)}" font-size="${l.size}" text-anchor="${l.anchor}"` +
        `${rot}${weight} fill="${l.fill ?? INK}"${halo}>${escapeXml(l.text)}</text>`,
    );
    return true;
  }

  /** The finished document: an `<svg>` root with its namespace, size and font stack. */
  finish(): string {
    const w = this.width;
    const h = this.height;
    return [
      `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}" font-family="${FONT_STACK}" style="font-variant-numeric: tabular-nums">`,
      `<rect class="paper" width="${w}" height="${h}" fill="${PAPER}"/>`,
      ...this.parts,
      '</svg>',
    ].join('\n');
  }
}
