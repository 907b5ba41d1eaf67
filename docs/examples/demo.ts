/**
 * Demo: derivatives of a cooling-fin temperature profile by finite-difference
 * stencils, with the measured error beside the error the stencil predicts.
 *
 * Scenario (invented for this demo): a straight aluminium pin fin on a power
 * module's heat sink, base held at 85 °C, air at 25 °C. The steady profile
 * with an adiabatic tip is the closed form of any heat-transfer handbook
 * (e.g. Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed.,
 * Table 3.4, case B):
 *
 *   θ(x) = θ_b cosh(μ(L − x)) / cosh(μL),   μ² = h P / (k A) = 4h / (k D),
 *   base heat flow q = √(h P k A) · θ_b · tanh(μL).
 *
 * The table shows each stencil (derivative, accuracy, offsets, exact weights,
 * leading error C) and compares its error on the sampled profile with the
 * prediction C·dxᵖ·θ⁽ᵐ⁺ᵖ⁾. Forward stencils give the base temperature gradient
 * (and so the heat flow into the fin); central stencils the gradient and the
 * curvature at mid-length.
 *
 * Run: npm run demo
 */
import { pathToFileURL } from 'node:url';
import { type Stencil, applyStencil, centralStencil, forwardStencil } from '../../src/index.js';

/** Pin-fin data of the scenario (SI units). */
export const FIN = {
  k: 180, // aluminium alloy conductivity, W/(m·K)
  diameter: 0.004, // m
  length: 0.04, // m
  hConv: 25, // convection coefficient to air, W/(m²·K)
  baseC: 85, // °C
  airC: 25, // °C
  cells: 16, // samples along the fin: 17 nodes, dx = 2.5 mm
} as const;

/** One row of the demo's stencil table. */
export interface DemoRow {
  /** Where the derivative is taken. */
  where: 'base' | 'mid';
  /** The stencil used. */
  stencil: Stencil;
  /** Value from the stencil. */
  value: number;
  /** Closed-form value. */
  exact: number;
  /** value − exact. */
  measured: number;
  /** leadingError · dxᵖ · θ⁽ᵐ⁺ᵖ⁾ at that point. */
  predicted: number;
  /** Rounding of the samples carried into the value: ε·Σ|wⱼ|·max|T| / dxᵐ. */
  roundoff: number;
}

/** Everything the demo computes, so a test can check the printed numbers. */
export interface DemoResult {
  /** The stencil table. */
  rows: DemoRow[];
  /** Fin parameter μ (1/m). */
  mu: number;
  /** Closed-form base heat flow (W). */
  qExact: number;
  /** Base heat flow from the forward stencil of accuracy 4 (W). */
  qStencil: number;
  /** The printed report. */
  text: string;
}

/** Computes and formats the demo; prints nothing. */
export function runDemo(): DemoResult {
  const { k, diameter, length, hConv, baseC, airC, cells } = FIN;
  const mu = Math.sqrt((4 * hConv) / (k * diameter));
  const thetaB = baseC - airC;
  const dx = length / cells;
  const n = cells + 1;
  // k-th derivative of θ(x) = θ_b cosh(μ(L − x)) / cosh(μL)
  const theta = (j: number, x: number): number => {
    const arg = mu * (length - x);
    const f = j % 2 === 0 ? Math.cosh(arg) : -Math.sinh(arg);
    return (thetaB * mu ** j * f) / Math.cosh(mu * length);
  };
  const samples = Float64Array.from({ length: n }, (_, i) => airC + theta(0, i * dx));
  const mid = cells / 2;
  const rows: DemoRow[] = [];
  const add = (where: 'base' | 'mid', st: Stencil): void => {
    const at = where === 'base' ? 0 : mid;
    const value = applyStencil(st, samples, dx)[at]!;
    const x = at * dx;
    const exact = theta(st.derivative, x);
    const predicted = st.leadingError.toNumber() * dx ** st.accuracy * theta(st.derivative + st.accuracy, x);
    const sumw = st.weights.reduce((a, w) => a + Math.abs(w), 0);
    const roundoff = (Number.EPSILON * sumw * baseC) / dx ** st.derivative;
    rows.push({ where, stencil: st, value, exact, measured: value - exact, predicted, roundoff });
  };
  for (let p = 1; p <= 4; p++) add('base', forwardStencil(1, p));
  for (const p of [2, 4, 6]) add('mid', centralStencil(1, p));
  for (const p of [2, 4, 6]) add('mid', centralStencil(2, p));

  const area = (Math.PI * diameter * diameter) / 4;
  const perimeter = Math.PI * diameter;
  const qExact = Math.sqrt(hConv * perimeter * k * area) * thetaB * Math.tanh(mu * length);
  const base4 = rows.find((r) => r.where === 'base' && r.stencil.accuracy === 4)!;
  const qStencil = -k * area * base4.value;

  const lines: string[] = [];
  lines.push('quadrille demo: stencils on a pin-fin temperature profile');
  lines.push('CAUTION: illustrative numbers for an invented fin. Verify every result independently;');
  lines.push('local codes, standards and licensed engineering practice govern design decisions.');
  lines.push('');
  lines.push(`fin: k = ${k} W/(m·K), D = ${diameter * 1000} mm, L = ${length * 1000} mm, h = ${hConv} W/(m²·K),`);
  lines.push(`     base ${baseC} °C, air ${airC} °C, μ = ${mu.toFixed(3)} 1/m, ${n} samples, dx = ${dx * 1000} mm`);
  lines.push('');
  const head = ['where', 'd', 'p', 'offsets', 'exact weights', 'C', 'value', 'measured err', 'predicted err', 'ratio', 'round-off'];
  const body = rows.map((r) => [
    r.where === 'base' ? 'x=0' : 'x=L/2',
    String(r.stencil.derivative),
    String(r.stencil.accuracy),
    r.stencil.offsets.join(' '),
    r.stencil.exact.map(String).join(' '),
    r.stencil.leadingError.toString(),
    r.value.toPrecision(10),
    r.measured.toExponential(3),
    r.predicted.toExponential(3),
    (r.measured / r.predicted).toFixed(3),
    r.roundoff.toExponential(1) + (r.roundoff > 0.1 * Math.abs(r.predicted) ? ' (limits this row)' : ''),
  ]);
  const widths = head.map((h, c) => Math.max(h.length, ...body.map((b) => b[c]!.length)));
  const fmt = (cols: string[]): string => cols.map((s, c) => s.padEnd(widths[c]!)).join('  ').trimEnd();
  lines.push(fmt(head));
  lines.push(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const b of body) lines.push(fmt(b));
  lines.push('');
  lines.push('units: d=1 values in K/m, d=2 in K/m²; ratio = measured / predicted (→ 1 as dx → 0);');
  lines.push('round-off = ε·Σ|w|·max T / dxᵐ: where it rivals the predicted error, a finer grid or a higher');
  lines.push('accuracy no longer helps.');
  lines.push(
    `heat flow into the fin: closed form ${qExact.toFixed(5)} W, forward stencil (p = 4) ${qStencil.toFixed(5)} W ` +
      `(${(((qStencil - qExact) / qExact) * 100).toExponential(2)} %)`,
  );
  return { rows, mu, qExact, qStencil, text: lines.join('\n') };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  console.log(runDemo().text);
}
