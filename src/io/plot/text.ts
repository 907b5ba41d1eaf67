/**
 * Text in plots: escaping, the label-box estimate every layout decision
 * uses, and the house font stack. Internal: not re-exported.
 *
 * The box estimate is deliberately simple and font-independent: a label of
 * n characters (code points) at font size s is 0.6·s·n wide and s high, the
 * baseline 0.8·s below the top (ascent 0.8·s, descent 0.2·s). 0.6·s is a
 * little wider than the mean advance of common sans-serif faces (≈ 0.5·s
 * for digits in Arial or Helvetica), so boxes that do not overlap by the
 * estimate do not overlap on screen either.
 *
 * @module
 */

/** Font stack for every plot: humanist sans faces first, then the platform's own. */
export const FONT_STACK = "'Source Sans 3', 'Segoe UI', 'Noto Sans', 'Helvetica Neue', Arial, sans-serif";

/** Font sizes (px); none below 11 so that every label stays readable. */
export const SIZE = { title: 16, axis: 13, tick: 12, legend: 12, small: 11 } as const;

/** An axis-aligned box in SVG user units (px), y down. */
export interface Box {
  /** Left edge. */
  readonly x0: number;
  /** Top edge. */
  readonly y0: number;
  /** Right edge. */
  readonly x1: number;
  /** Bottom edge. */
  readonly y1: number;
}

/** How a label is anchored at its (x, y) point, as SVG's text-anchor. */
export type Anchor = 'start' | 'middle' | 'end';

/** Number of characters (code points, so "10⁻³" is 4) of `s`. */
export function charCount(s: string): number {
  let n = 0;
  for (const _ of s) n++;
  return n;
}

/** Estimated width (px) of `s` at font size `size`: 0.6·size per character. */
export function textWidth(s: string, size: number): number {
  return 0.6 * size * charCount(s);
}

/**
 * The estimated box of a label drawn at (x, y) — y is the baseline — with
 * the given anchor; `rotated` means rotate(−90 x y), text running upwards.
 */
export function labelBox(s: string, x: number, y: number, size: number, anchor: Anchor, rotated = false): Box {
  const w = textWidth(s, size);
  const shift = anchor === 'start' ? 0 : anchor === 'middle' ? w / 2 : w;
  if (!rotated) return { x0: x - shift, y0: y - 0.8 * size, x1: x - shift + w, y1: y + 0.2 * size };
  // rotate(−90): the baseline direction becomes up the page, the ascent points left
  return { x0: x - 0.8 * size, y0: y + shift - w, x1: x + 0.2 * size, y1: y + shift };
}

/** Whether two boxes overlap by more than `pad` px of clearance (touching is fine when pad = 0). */
export function overlaps(a: Box, b: Box, pad = 0): boolean {
  return a.x0 < b.x1 + pad && b.x0 < a.x1 + pad && a.y0 < b.y1 + pad && b.y0 < a.y1 + pad;
}

/** `s` with XML's five special characters escaped, safe in text and in double-quoted attributes. */
export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** `s` cut to at most `maxWidth` px at `size`, ending in "…" when cut. */
export function fitText(s: string, size: number, maxWidth: number): string {
  const chars = [...s];
  // the tolerance keeps 0.6·12·14 = 100.80000000000001 from cutting a label that fits exactly
  const room = Math.floor(maxWidth / (0.6 * size) + 1e-9);
  if (chars.length <= room) return s;
  return room <= 1 ? '…' : chars.slice(0, room - 1).join('') + '…';
}

/** A coordinate for SVG output: two decimals, no "-0". */
export function px(v: number): string {
  const r = Math.round(v * 100) / 100;
  return (r === 0 ? 0 : r).toString();
}
