import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { FIN, runDemo } from '../../docs/examples/demo.js';
import { quickStart } from '../../docs/examples/quick-start.js';
import { plateStudy } from '../../docs/examples/convergence.js';
import { wallWarmUp } from '../../docs/examples/wall.js';
import { erfc } from '../../src/index.js';

describe('docs/examples run and print true numbers', () => {
  it('quick start: weights from Fornberg (1988) Table 1, exact on a quadratic profile', () => {
    const r = quickStart();
    expect(r.weights).toEqual(['-1/12', '4/3', '-5/2', '4/3', '-1/12']);
    expect(r.leadingError).toBe('-1/90');
    // T = 20 + 300x²: T″ = 600 exactly; the stencil is exact on quadratics, rounding of
    // ~Σ|w|·|T|/dx² = 5.3·110/1e-4 ≈ 6e6 times ε leaves ≤ 1.3e-9 — 16× that bounds it
    expect(Math.abs(r.curvature - 600)).toBeLessThanOrEqual(16 * Number.EPSILON * 6e6);
    // hand derivation in test/stencil/nonuniform.test.ts: [−2/3, 1/2, 1/6]
    expect(r.biased.map((w) => w * 6)).toEqual([-4, 3, 1]);
  });

  it('demo: measured error matches the predicted leading term, heat flow matches the closed form', () => {
    const d = runDemo();
    expect(d.text).toMatch(/CAUTION/);
    expect(d.text).toMatch(/licensed engineering practice/);
    expect(d.rows.length).toBe(10);
    for (const r of d.rows) {
      if (r.roundoff > 0.1 * Math.abs(r.predicted)) continue; // the row the demo flags
      // one-sided p = 4 at dx = 2.5 mm: next term is ~11 % (μ·dx·C₅/C₄ ≈ 0.03·3.7)
      expect(Math.abs(r.measured / r.predicted - 1)).toBeLessThanOrEqual(0.12);
    }
    expect(d.rows.filter((r) => r.roundoff > 0.1 * Math.abs(r.predicted)).length).toBe(1);
    // fin with adiabatic tip (Incropera et al., 6th ed., Table 3.4): μ = √(4h/(kD))
    expect(d.mu).toBe(Math.sqrt((4 * FIN.hConv) / (FIN.k * FIN.diameter)));
    expect(Math.abs(d.qStencil / d.qExact - 1)).toBeLessThan(2e-7);
  });

  it('convergence example: the plate value converges at order 2 to the Fourier series (Carslaw & Jaeger 1959, §5.2)', () => {
    const s = plateStudy();
    expect(Math.abs(s.fits.quantity!.order - 2)).toBeLessThanOrEqual(0.1);
    expect(s.asymptotic.quantity).toBe(true);
  });

  it('wall example: early on the mid-wall probe follows the semi-infinite solid (Carslaw & Jaeger 1959, §2.4)', () => {
    const r = wallWarmUp();
    expect(r.steps).toBe(480);
    // α = 1.4/1.9e6 m²/s; after 1 h the heat has gone 2√(αt) ≈ 0.1 m, the far face is 0.2 m away,
    // so the probe at 0.1 m is close to 20 + 100·erfc(0.1/(2√(αt))) (within ~1 K: the far face is felt)
    const alpha = 1.4 / 1.9e6;
    const k = r.times.indexOf(3600);
    const want = 20 + 100 * erfc(0.1 / (2 * Math.sqrt(alpha * 3600)));
    expect(Math.abs(r.probes[0]!.values[k]! - want)).toBeLessThanOrEqual(1);
    const last = r.probes[0]!.values[r.probes[0]!.values.length - 1]!;
    expect(last).toBeGreaterThan(20);
    expect(last).toBeLessThan(120);
  });

  it('npm run demo prints the table with the caution', () => {
    const out = execFileSync(process.execPath, ['--import', 'tsx', 'docs/examples/demo.ts'], { encoding: 'utf8' });
    expect(out).toMatch(/CAUTION/);
    expect(out).toMatch(/-1\/12 4\/3 -5\/2 4\/3 -1\/12/);
    expect(out.split('\n').filter((l) => /^x=/.test(l)).length).toBe(10);
  });
});
