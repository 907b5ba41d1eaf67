/**
 * Tick values and their labels for linear and logarithmic axes. Internal.
 *
 * Linear axes use "nice" steps s = m·10ᵏ, m ∈ {1, 2, 5} (Heckbert 1990):
 * the ticks are the multiples j·s inside [lo, hi]. Candidate steps are
 * tried from fine to coarse and the first whose labels pass the caller's
 * layout test (`fits`: no two label boxes closer than a gap) is kept, so
 * tick labels thin out exactly when they would collide.
 *
 * Logarithmic axes label whole decades 10ᵏ, every d-th decade with
 * d ∈ {1, 2, 5, 10, 20, …} as space requires, when three or more decades
 * are in view; otherwise 1-2-5 multiples of each decade (at least three
 * ticks), then two bare decades, then 1 … 9 multiples; a range too short
 * for any of these (under about a factor 3) falls back to linear nice
 * ticks of the values themselves.
 *
 * Source: Heckbert, P. S. (1990). Nice numbers for graph labels. In
 * A. S. Glassner (ed.), Graphics Gems, 61–63. Academic Press.
 *
 * @module
 */

/** A tick: its value (in data units, not log10) and its label. */
export interface Tick {
  /** Position along the axis, in data units. */
  readonly value: number;
  /** The label text. */
  readonly label: string;
}

/** Layout test for a candidate set of ticks: true if their labels can be drawn without collisions. */
export type Fits = (ticks: readonly Tick[]) => boolean;

const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻',
};

/** The integer `k` in superscript digits: −3 ↦ "⁻³". */
export function superscript(k: number): string {
  return String(k).replace(/[-0-9]/g, (c) => SUPERSCRIPT[c] ?? c);
}

/** A typographic minus (U+2212) instead of the hyphen. */
function minus(s: string): string {
  return s.replace(/^-/, '−');
}

/** m·10ᵏ computed as m / 10⁻ᵏ for k < 0, so 3·10⁻¹ is the double nearest 0.3. */
function scaled(m: number, k: number): number {
  return k < 0 ? m / 10 ** -k : m * 10 ** k;
}

/** Whether labels for values up to |v| = `magnitude` are written as mantissa×10ᵉ. */
function scientific(magnitude: number): boolean {
  return magnitude >= 1e6 || (magnitude > 0 && magnitude < 1e-3);
}

/**
 * The label of tick value `v` on an axis with step 10ᵏ·m (`k` given):
 * fixed notation with max(0, −k) decimals, or mantissa×10ᵉ with e − k
 * mantissa decimals when the axis' largest magnitude is ≥ 10⁶ or < 10⁻³.
 */
export function formatStep(v: number, k: number, magnitude: number): string {
  if (Math.abs(v) < scaled(1, k) * 1e-6) return '0';
  if (!scientific(magnitude)) return minus(v.toFixed(Math.min(20, Math.max(0, -k))));
  let e = Math.floor(Math.log10(Math.abs(v)));
  const d = Math.min(20, Math.max(0, e - k));
  let mantissa = (v / 10 ** e).toFixed(d);
  if (Math.abs(Number(mantissa)) >= 10) {
    e += 1;
    mantissa = (v / 10 ** e).toFixed(Math.max(0, d - 1));
  }
  return `${minus(mantissa)}×10${superscript(e)}`;
}

/** A short label for any finite value: up to 4 significant digits, mantissa×10ᵉ outside [10⁻³, 10⁶). */
export function formatCompact(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (!scientific(a)) return minus(String(Number(v.toPrecision(4))));
  const [m, e] = v.toExponential(3).split('e');
  return `${minus(String(Number(m)))}×10${superscript(Number(e))}`;
}

/** Nice-step ticks inside [lo, hi] (lo < hi, both finite), the finest whose labels fit. */
export function linearTicks(lo: number, hi: number, fits: Fits): Tick[] {
  const span = hi - lo;
  const magnitude = Math.max(Math.abs(lo), Math.abs(hi));
  let single: Tick[] = [];
  // start where a step gives at most ~100 ticks; stop once a step exceeds the span
  for (let k = Math.floor(Math.log10(span)) - 2; k <= Math.floor(Math.log10(span)) + 1; k++) {
    for (const m of [1, 2, 5]) {
      const step = scaled(m, k);
      const first = Math.ceil(lo / step - 1e-9);
      const last = Math.floor(hi / step + 1e-9);
      const count = last - first + 1;
      if (count > 60) continue;
      const ticks: Tick[] = [];
      for (let j = first; j <= last; j++) {
        const v = k < 0 ? (j * m) / 10 ** -k : j * m * 10 ** k;
        ticks.push({ value: v, label: formatStep(v, k, magnitude) });
      }
      if (count >= 2 && fits(ticks)) return ticks;
      if (count === 1 && single.length === 0 && fits(ticks)) single = ticks;
      if (count <= 1) return single;
    }
  }
  return single;
}

/**
 * Ticks for a logarithmic axis over [10^lo10, 10^hi10] (lo10 < hi10):
 * decades, then 1-2-5 multiples, then linear nice ticks, the first that
 * gives at least two labels that fit.
 */
export function logTicks(lo10: number, hi10: number, fits: Fits): Tick[] {
  const eps = 1e-9;
  const kLo = Math.ceil(lo10 - eps);
  const kHi = Math.floor(hi10 + eps);
  // plain decimals (0.01 … 1000) only when every decade in view is one of them, so one axis never mixes notations
  const plain = kLo >= -2 && kHi <= 3;
  const decade = (k: number): string => (plain ? minus(String(scaled(1, k))) : `10${superscript(k)}`);
  const decades = (least: number): Tick[] | undefined => {
    for (const every of [1, 2, 5, 10, 20, 50, 100]) {
      const ticks: Tick[] = [];
      for (let k = Math.ceil(kLo / every) * every; k <= kHi; k += every) ticks.push({ value: scaled(1, k), label: decade(k) });
      if (ticks.length < least) return undefined;
      if (fits(ticks)) return ticks;
    }
    return undefined;
  };
  const multiples = (mantissas: readonly number[]): Tick[] | undefined => {
    const ticks: Tick[] = [];
    for (let k = Math.floor(lo10) - 1; k <= Math.ceil(hi10); k++) {
      for (const m of mantissas) {
        const v = scaled(m, k);
        const l = Math.log10(v);
        if (l >= lo10 - eps && l <= hi10 + eps) ticks.push({ value: v, label: m === 1 ? decade(k) : formatCompact(v) });
      }
    }
    return ticks.length >= 3 && fits(ticks) ? ticks : undefined;
  };
  // three or more decades; else 1-2-5 multiples; else two decades; else 1 … 9 multiples; else linear
  const found = decades(3) ?? multiples([1, 2, 5]) ?? decades(2) ?? multiples([1, 2, 3, 4, 5, 6, 7, 8, 9]);
  if (found !== undefined) return found;
  return linearTicks(10 ** lo10, 10 ** hi10, fits);
}
