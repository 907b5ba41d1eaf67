import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PLATE_CAUTION, runPlateDemo, slabSteady } from '../../docs/examples/plate.js';

type Demo = Awaited<ReturnType<typeof runPlateDemo>>;

describe('docs/examples/plate.ts: the heated mounting plate demo (quick grids)', () => {
  let dir: string;
  let r: Demo;
  const lines: string[] = [];

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'quadrille-plate-'));
    r = await runPlateDemo({ outDir: dir, quick: true, log: (l) => lines.push(l) });
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('heat balance closes: the accuracy-2 operator is conservative, so heater inflow = convective outflow to the solver tolerance', () => {
    // steady solve at relative residual 1e-12 (src/problem/steady.ts); the balance is
    // Σ of the residual rows (src/boundary/discretize.ts heatBalance), far below 1e-8
    expect(r.relativeImbalance).toBeLessThanOrEqual(1e-8);
    expect(Math.abs(r.imbalance)).toBeLessThanOrEqual(1e-8);
    expect(r.heaterInflow).toBeGreaterThan(0);
    expect(r.uniformRelativeImbalance).toBeLessThanOrEqual(1e-8);
  });

  it('maximum principle: no source, so ambient ≤ T ≤ heater temperature, the peak on the heater edge', () => {
    // discrete maximum principle of the M-matrix of the 5-point operator (Morton & Mayers 2005, §6.4)
    expect(r.peakTemperature).toBeLessThanOrEqual(r.heaterTemperature + 1e-9);
    expect(r.peakTemperature).toBeGreaterThanOrEqual(r.ambientTemperature);
    expect(r.minTemperature).toBeGreaterThanOrEqual(r.ambientTemperature);
    expect(r.peakX).toBe(0);
  });

  it('without the insert the field is the 1-D slab: linear, T(L) from series resistances L/k and 1/h', () => {
    // Incropera et al., 6th ed., ch. 3 (thermal resistance): q = ΔT/(L/k + 1/h) = 100/(0.2/170 + 1/25)
    const q = 100 / (0.2 / 170 + 1 / 25);
    expect(slabSteady(0.2).q).toBeCloseTo(q, 10);
    expect(r.slabEdgeTemperature).toBeCloseTo(120 - (q * 0.2) / 170, 10);
    // the 3-point scheme is exact on a linear profile, so only solver round-off remains
    expect(r.uniformMaxError).toBeLessThanOrEqual(1e-7);
    expect(r.uniformFluxError).toBeLessThanOrEqual(1e-8);
    // the low-conductivity insert adds resistance: the cooled edge is colder than the slab's
    expect(r.convectiveEdgeMax).toBeLessThan(r.slabEdgeTemperature);
  });

  it('t95 is positive and finite; on the uniform slab it matches the slowest eigenmode', () => {
    // one-term eigenfunction series, λ cot λ = −Bi (Carslaw & Jaeger 1959, §3.10); the
    // second mode decays ≥ 9× faster, so by t95 the one-term form is exact to ~e⁻²⁰
    expect(Number.isFinite(r.t95) && r.t95 > 0).toBe(true);
    expect(r.t95).toBeLessThan(2400);
    expect(Number.isFinite(r.t95Centre) && r.t95Centre > 0).toBe(true);
    // CN at dt = 2 s and h = 4 mm: time and space errors ≪ 1 %
    expect(Math.abs(r.t95Slab / r.t95Estimate - 1)).toBeLessThanOrEqual(0.01);
  });

  it('leapfrog cable: energy conserved, single mode follows the standing-wave closed form', () => {
    // leapfrog conserves its discrete energy exactly (src/time/wave.ts): only round-off drift
    expect(r.energyDrift).toBeLessThanOrEqual(1e-10);
    // u = A sin(πx/L) cos(πct/L) (Kreyszig 2011, §12.3); phase error O((kh)²) over 5¼ periods
    expect(r.cableDeviation / r.cableAmplitude).toBeLessThanOrEqual(0.005);
  });

  it('convergence study of the cable: observed orders within 0.1 of 2', () => {
    // second-order leapfrog in space and time, dt ∝ h (src/verify/study.ts, refine: both)
    expect(Math.abs(r.orderL2 - 2)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(r.orderLinf - 2)).toBeLessThanOrEqual(0.1);
  });

  it('writes every output, non-empty; SVGs are SVG; the report carries the caution', () => {
    const names = [
      'plate-steady.svg', 'plate-profile.svg', 'plate-probes.svg', 'plate-convergence.svg', 'plate-report.html',
      'plate-steady.vti', 'plate-warmup.pvd', 'plate-warmup_0000.vti', 'plate-steady.csv', 'plate-probes.csv',
    ];
    for (const n of names) expect(statSync(join(dir, n)).size, n).toBeGreaterThan(0);
    for (const n of names.filter((n) => n.endsWith('.svg'))) expect(readFileSync(join(dir, n), 'utf8').startsWith('<svg'), n).toBe(true);
    const html = readFileSync(join(dir, 'plate-report.html'), 'utf8');
    expect(html).toContain('CAUTION');
    expect(html).toContain('licensed engineering practice');
    expect(readFileSync(join(dir, 'plate-warmup.pvd'), 'utf8')).toContain('plate-warmup_0005.vti');
    expect(r.files.length).toBe(15);
  });

  it('prints the summary with the caution, and progress bars', () => {
    expect(PLATE_CAUTION).toMatch(/CAUTION/);
    expect(PLATE_CAUTION).toMatch(/licensed engineering practice/);
    expect(lines).toContain(PLATE_CAUTION);
    expect(lines.some((l) => l.startsWith('warm-up') && l.includes('100 %'))).toBe(true);
    expect(lines.some((l) => l.startsWith('heat balance:'))).toBe(true);
    expect(r.seconds).toBeLessThan(15);
  });
});
