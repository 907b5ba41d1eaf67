/**
 * Derivative operators, the Laplacian and the mixed derivative on grids:
 * the documented windows, polynomial exactness on every row, observed order
 * separately on interior and boundary rows, periodic axes, the matrix-free
 * apply against the CSR form, and bad input.
 *
 * Observed order p̂ = log₂(e_h / e_{h/2}) over grids halving h, within 0.1
 * of the expected order (Roache, P. J. (1998). Verification and Validation
 * in Computational Science and Engineering, Hermosa, ch. 5), e the max-norm
 * error over one set of rows: interior rows (the interior window along every
 * axis) or boundary rows (a closure along some axis).
 *
 * Two ways of measuring the error:
 * - plain: apply the operator to samples of a smooth f and compare with the
 *   exact derivative. The rounding of the samples, ≈ ε·Σ|w|·|f| / hᵐ, grows
 *   as h shrinks, so only where four halvings fit between the asymptotic
 *   range and that floor is this measured (the ranges are stated per case).
 * - tail: the truncation error of each assembled row, Σ_q a_rq·R(x_q) with R
 *   the Taylor tail of f about the row's node (see `tailRowErrors` in
 *   helpers.ts). It equals the plain error in exact arithmetic, because
 *   every row is exact on the Taylor polynomial removed (test (a) below),
 *   and it is free of the sampling floor, so every case is measured on the
 *   same range.
 *
 * Interior order. For even p the interior window is the centred stencil,
 * of accuracy p. For odd p it is m + p consecutive nodes; when m is even,
 * m + p is odd and the window is symmetric, which gains one order (the odd
 * moments of a symmetric set vanish: the Taylor-series argument of LeVeque,
 * R. J. (2007). Finite Difference Methods for Ordinary and Partial
 * Differential Equations, SIAM, §1.5), so interior rows converge at p + 1
 * there, better than the O(hᵖ) promised. Boundary rows converge at p.
 */
import { describe, expect, it } from 'vitest';
import {
  type AxisSpec, type Grid, type Operator, centralStencil, derivative, geometricAxis, grid, laplacian,
  mixedDerivative, sampleField, stencil, tanhAxis,
} from '../../src/index.js';
import {
  SEED, type Wave, eps, expectApplyMatchesCsr, expectCode, interiorWindow, isInterior, mulberry32, nodeIndex,
  observedOrders, tailRowErrors, waveDerivative,
} from './helpers.js';

const rng = mulberry32(SEED);

/** Interior order of derivative m at accuracy p on a uniform axis (see the header). */
const interiorOrder = (m: number, p: number): number => (m % 2 === 0 && p % 2 === 1 ? p + 1 : p);

/** Cross-check of that rule against the stencil stage's own accuracy of the window. */
it('the interior order rule matches the accuracy of the interior window', () => {
  for (let m = 1; m <= 4; m++) {
    for (let p = 1; p <= 6; p++) {
      const [lo, hi] = interiorWindow(m, p);
      const offsets = Array.from({ length: hi - lo + 1 }, (_, k) => lo + k);
      expect(stencil(m, offsets).accuracy).toBe(interiorOrder(m, p));
    }
  }
});

/** Max |e| over interior rows and over boundary rows of a grid operator built from (m, p) tables on every axis. */
function splitMax(g: Grid, e: ArrayLike<number>, m: number, p: number): { interior: number; boundary: number } {
  let interior = 0;
  let boundary = 0;
  for (let r = 0; r < g.size; r++) {
    const idx = nodeIndex(g, r);
    const inside = idx.every((i, d) => g.axes[d]!.periodic || isInterior(i, g.shape[d]!, m, p));
    if (inside) interior = Math.max(interior, Math.abs(e[r]!));
    else boundary = Math.max(boundary, Math.abs(e[r]!));
  }
  return { interior, boundary };
}

/** Coordinates of every node of g, one array per unknown. */
function coordinatesOf(g: Grid): number[][] {
  return Array.from({ length: g.size }, (_, r) => nodeIndex(g, r).map((i, d) => g.axes[d]!.coordinates[i]!));
}

/** Plain error of op applied to samples of w against the exact Σ_terms ∂^α w. */
function plainErrors(g: Grid, op: Operator, w: Wave, terms: number[][]): Float64Array {
  const xs = coordinatesOf(g);
  const u = Float64Array.from(xs, (x) => waveDerivative(w, new Array<number>(g.dimension).fill(0), x));
  const y = op.apply(u);
  return Float64Array.from(xs, (x, r) => y[r]! - terms.reduce((s, a) => s + waveDerivative(w, a, x), 0));
}

const uniform1 = (cells: number, from = 0, to = 1): Grid => grid({ x: { from, to, cells } });

describe('rows follow the documented windows', () => {
  it('interior rows use the interior window, the others m + p consecutive nodes from the boundary', () => {
    const n = 25;
    for (let m = 1; m <= 4; m++) {
      for (let p = 1; p <= 6; p++) {
        const a = derivative(uniform1(n - 1), { axis: 'x', derivative: m, accuracy: p }).matrix;
        const [lo, hi] = interiorWindow(m, p);
        for (let i = 0; i < n; i++) {
          const cols = Array.from(a.colIdx.subarray(a.rowPtr[i]!, a.rowPtr[i + 1]!));
          let want: number[];
          if (isInterior(i, n, m, p)) want = Array.from({ length: hi - lo + 1 }, (_, k) => i + lo + k);
          else if (i + lo < 0) want = Array.from({ length: m + p }, (_, k) => k);
          else want = Array.from({ length: m + p }, (_, k) => n - m - p + k);
          expect(cols, `m=${m} p=${p} row ${i}`).toEqual(want);
        }
      }
    }
  });
});

describe('(a) exact on polynomials of degree ≤ N − 1 on every row, N the row\'s node count', () => {
  // Nodes on [0.3, 1.7]; monomials (x − 1)ᵈ keep |x − 1| ≤ 0.7, so no power is large.
  const X0 = 1;
  const r24 = mulberry32(SEED + 1);
  const widths = Array.from({ length: 24 }, () => 0.5 + r24());
  const total = widths.reduce((s, v) => s + v, 0);
  const uneven = [0.3];
  for (const w of widths) uneven.push(uneven[uneven.length - 1]! + (1.4 * w) / total);
  uneven[24] = 1.7;
  const axes: Array<[string, AxisSpec]> = [
    ['uniform', { from: 0.3, to: 1.7, cells: 24 }],
    ['geometric r = 1.12', geometricAxis({ from: 0.3, to: 1.7, cells: 24, ratio: 1.12, cluster: 'from' })],
    ['tanh β = 2', tanhAxis({ from: 0.3, to: 1.7, cells: 24, beta: 2, cluster: 'both' })],
    ['uneven widths (seeded, ratio up to 3)', { nodes: uneven }],
  ];
  const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));

  for (let m = 1; m <= 4; m++) {
    for (let p = 1; p <= 6; p++) {
      it(`m = ${m}, p = ${p}: uniform rows exact to degree m + p − 1; stretched rows to N − 1`, () => {
        for (const [name, spec] of axes) {
          const g = grid({ x: spec });
          const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
          expectApplyMatchesCsr(op, rng, { trials: 1 });
          const a = op.matrix;
          const x = g.x.coordinates;
          const n = g.nx;
          const [lo, hi] = interiorWindow(m, p);
          for (let d = 0; d <= m + p - 1; d++) {
            const u = Float64Array.from(x, (t) => (t - X0) ** d);
            const y = op.apply(u);
            for (let r = 0; r < n; r++) {
              const nodes = isInterior(r, n, m, p) ? hi - lo + 1 : m + p;
              // uniform: centred windows of m + p − 1 nodes are symmetric, exact one degree higher
              const top = g.x.uniform ? m + p - 1 : nodes - 1;
              if (d > top) continue;
              const want = d < m ? 0 : (factorial(d) / factorial(d - m)) * (x[r]! - X0) ** (d - m);
              // Round-off bound k·ε·S. S = Σ|a|·(|P| + |x|·|P′|) + |want|: the samples (the
              // |x|·|P′| term covers coordinates that are one rounding off from + i·h). k = 2N + d + 8:
              // N for the dot product (Higham 2002, §3.1), N for the weights (Fornberg's
              // recursion updates each weight once per later node; a uniform axis uses correctly
              // rounded weights, fewer), d for the power, 8 for the scale 1/hᵐ, the coordinates and want.
              let s = Math.abs(want);
              for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) {
                const t = x[a.colIdx[q]!]!;
                const dp = d === 0 ? 0 : d * Math.abs(t - X0) ** (d - 1);
                s += Math.abs(a.values[q]!) * (Math.abs(t - X0) ** d + Math.abs(t) * dp);
              }
              const k = 2 * nodes + d + 8;
              expect(Math.abs(y[r]! - want), `${name} row ${r} degree ${d}`).toBeLessThanOrEqual(k * eps * s);
            }
          }
          if (g.x.uniform) {
            // sharpness: degree m + p is not reproduced by the one-sided row 0 (its error is
            // C·hᵖ·(m + p)! with C ≠ 0), so the tolerance above does not hide a lower degree
            const d = m + p;
            const y = op.apply(Float64Array.from(x, (t) => (t - X0) ** d));
            const want = (factorial(d) / factorial(d - m)) * (x[0]! - X0) ** (d - m);
            expect(Math.abs(y[0]! - want)).toBeGreaterThan(1e-6);
          }
        }
      });
    }
  }
});

describe('(b) observed order on a uniform axis, interior and boundary rows separately', () => {
  // f = e^{0.5x}·sin(1.3x + 0.4) on [0, 1]; tail of order m + p (rows exact to degree m + p − 1, test (a)).
  // h = 1/64 … 1/1024 (five grids): asymptotic for every case here, the slowest being the
  // one-sided closures of m = 1, p = 6 (p̂ = 5.93 at 64 → 128; 5.62 at 16 → 32).
  const f: Wave = { z: [[0.5, 1.3]], phase: 0.4 };
  const cells = [64, 128, 256, 512, 1024];
  for (let m = 1; m <= 4; m++) {
    for (let p = 1; p <= 6; p++) {
      it(`tail: m = ${m}, p = ${p}: interior ${interiorOrder(m, p)}, boundary ${p}`, () => {
        const ei: number[] = [];
        const eb: number[] = [];
        for (const c of cells) {
          const g = uniform1(c);
          const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
          const s = splitMax(g, tailRowErrors(g, op.matrix, f, m + p), m, p);
          ei.push(s.interior);
          eb.push(s.boundary);
        }
        for (const o of observedOrders(ei)) expect(Math.abs(o - interiorOrder(m, p))).toBeLessThanOrEqual(0.1);
        for (const o of observedOrders(eb)) expect(Math.abs(o - p)).toBeLessThanOrEqual(0.1);
      });
    }
  }

  // Plain samples of f = sin(2πx + π/4) on [0, 1]: one full period, so the largest
  // |f⁽ᵏ⁾| over the interior rows sits at fixed interior points (no drift of the max with h),
  // and the phase keeps every derivative away from zero at the ends. Ranges [first, last cells],
  // five grids each, inside which truncation dominates the sampling floor; 'none' where no five
  // halvings fit in float64 (the tail test above covers those rows).
  const g2: Wave = { z: [[0, 2 * Math.PI]], phase: Math.PI / 4 };
  const plain: Array<[number, number, [number, number] | 'none', [number, number] | 'none']> = [
    // m, p, interior range, boundary range
    [1, 1, [64, 1024], [64, 1024]],
    [1, 2, [64, 1024], [64, 1024]],
    [1, 3, [64, 1024], [64, 1024]],
    [1, 4, [64, 1024], [64, 1024]],
    [1, 5, [16, 256], 'none'],
    [1, 6, [16, 256], 'none'],
    [2, 1, [64, 1024], [64, 1024]],
    [2, 2, [64, 1024], [64, 1024]],
    [2, 3, [16, 256], [64, 1024]],
    [2, 4, [16, 256], 'none'],
    [3, 2, [64, 1024], [64, 1024]],
    [3, 4, [16, 256], 'none'],
    [4, 2, [16, 256], 'none'],
  ];
  for (const [m, p, ri, rb] of plain) {
    it(`plain: m = ${m}, p = ${p}: interior on cells ${ri === 'none' ? '—' : ri.join('…')}, boundary on ${rb === 'none' ? '—' : rb.join('…')}`, () => {
      for (const [range, which, order] of [[ri, 'interior', interiorOrder(m, p)], [rb, 'boundary', p]] as const) {
        if (range === 'none') continue;
        const errs: number[] = [];
        for (let c = range[0]; c <= range[1]; c *= 2) {
          const g = uniform1(c);
          const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
          const alpha = [m];
          errs.push(splitMax(g, plainErrors(g, op, g2, [alpha]), m, p)[which]);
        }
        expect(errs.length).toBe(5);
        for (const o of observedOrders(errs)) expect(Math.abs(o - order), which).toBeLessThanOrEqual(0.1);
      }
    });
  }
});

describe('(c) Laplacian in 2-D and 3-D', () => {
  // f = sin(π/4·(x + y) + 0.3) on [0, 1]²: every even derivative is ± f, whose largest
  // value over the interior lies on the line x + y ≈ 1.62 inside the square, so the max
  // does not drift with h; π/4·h ≤ 0.1 on the coarsest grid keeps all three orders asymptotic.
  const f2: Wave = { z: [[0, Math.PI / 4], [0, Math.PI / 4]], phase: 0.3 };
  // In 3-D the plane x + y + z = 2 plays that part.
  const f3: Wave = { z: [[0, Math.PI / 4], [0, Math.PI / 4], [0, Math.PI / 4]], phase: 0 };
  const square = (c: number): Grid => grid({ x: { from: 0, to: 1, cells: c }, y: { from: 0, to: 1, cells: c } });
  const cube = (c: number): Grid =>
    grid({ x: { from: 0, to: 1, cells: c }, y: { from: 0, to: 1, cells: c }, z: { from: 0, to: 1, cells: c } });
  const lapTerms = (d: number): number[][] =>
    Array.from({ length: d }, (_, k) => Array.from({ length: d }, (_, j) => (j === k ? 2 : 0)));

  function study(make: (c: number) => Grid, cells: number[], p: number, how: 'plain' | 'tail', w: Wave): void {
    const ei: number[] = [];
    const eb: number[] = [];
    for (const c of cells) {
      const g = make(c);
      const op = laplacian(g, { accuracy: p });
      if (c === cells[0]) expectApplyMatchesCsr(op, rng, { trials: 1 });
      // the rows are exact on polynomials of degree ≤ p + 1 in each coordinate, so the tail has order p + 2
      const e = how === 'tail' ? tailRowErrors(g, op.matrix, w, p + 2) : plainErrors(g, op, w, lapTerms(g.dimension));
      const s = splitMax(g, e, 2, p);
      ei.push(s.interior);
      eb.push(s.boundary);
    }
    for (const o of observedOrders(ei)) expect(Math.abs(o - p), 'interior').toBeLessThanOrEqual(0.1);
    for (const o of observedOrders(eb)) expect(Math.abs(o - p), 'boundary').toBeLessThanOrEqual(0.1);
  }

  it('2-D, accuracy 2, plain samples, 9² … 129²', () => study(square, [8, 16, 32, 64, 128], 2, 'plain', f2));
  // the plain 129² grid at accuracy 4 is already at the sampling floor (p̂ = 3.09), so four grids
  it('2-D, accuracy 4, plain samples, 9² … 65²', () => study(square, [8, 16, 32, 64], 4, 'plain', f2));
  for (const p of [2, 4, 6]) {
    it(`2-D, accuracy ${p}, row tails, 9² … 129²`, () => study(square, [8, 16, 32, 64, 128], p, 'tail', f2));
  }
  it('3-D, accuracy 2, plain samples, 5³ … 33³', () => study(cube, [4, 8, 16, 32], 2, 'plain', f3));
  it('3-D, accuracy 4, plain samples, 7³ … 49³', () => study(cube, [6, 12, 24, 48], 4, 'plain', f3));
  // accuracy 6 needs 8 nodes per axis, and plain samples reach the floor at 33³ (p̂ = 4.3)
  it('3-D, accuracy 6, row tails, 9³ … 65³', () => study(cube, [8, 16, 32, 64], 6, 'tail', f3));

  it('3-D rows are the sum of the three 1-D second-derivative operators', () => {
    // an independent check of the assembly: Δ = ∂²x + ∂²y + ∂²z entry by entry, on unequal axes
    const g = grid({ x: { from: 0, to: 1, cells: 7 }, y: { from: 0, to: 2, cells: 8 }, z: { from: -1, to: 1, cells: 9 } });
    for (const p of [2, 4, 6]) {
      const lap = laplacian(g, { accuracy: p });
      const x = Float64Array.from({ length: g.size }, () => 2 * rng() - 1);
      const parts = (['x', 'y', 'z'] as const).map((axis) => {
        const op = derivative(g, { axis, derivative: 2, accuracy: p });
        return { y: op.apply(x), abs: absApply(op, x) };
      });
      const y = lap.apply(x);
      for (let r = 0; r < g.size; r++) {
        const s = parts[0]!.y[r]! + parts[1]!.y[r]! + parts[2]!.y[r]!;
        const scale = parts[0]!.abs[r]! + parts[1]!.abs[r]! + parts[2]!.abs[r]!;
        // the same ≤ 3·(p + 2) products summed in two orders (with the diagonal merged once):
        // ≤ 2·3(p + 2)·ε·Σ|a||x| (Higham 2002, §3.1), plus one rounding for merging the diagonal
        expect(Math.abs(y[r]! - s)).toBeLessThanOrEqual((6 * (p + 2) + 2) * eps * scale);
      }
    }
  });

  it('accuracy 2 on a smoothly stretched 2-D grid converges at order 2 (interior and boundary), 17² … 257²', () => {
    // x: tanh clustering at both ends, β = 2 fixed; y: geometric growth with ratio e^{1/n}, the
    // samples of the smooth map (e^ξ − 1)/(e − 1). Neighbouring widths then differ by a
    // factor 1 + O(h), which is what keeps the three-point rows second order. The boundary rows
    // are 4-node one-sided windows, order N − m = 2 on any node set (Fornberg 1988); their largest
    // error, at the corner (x = 1, y = 1), behaves like C·h²·(1 + a·h): measured p̂ = 1.87, 1.92,
    // 1.96, 1.98, 1.99, 1.99 from 9² → 17² up to 513² → 1025², the gap to 2 halving with h. So the
    // coarse pair 9² → 17² is pre-asymptotic, and the study starts at 17².
    const ei: number[] = [];
    const eb: number[] = [];
    for (const c of [16, 32, 64, 128, 256]) {
      const g = grid({
        x: tanhAxis({ from: 0, to: 1, cells: c, beta: 2, cluster: 'both' }),
        y: geometricAxis({ from: 0, to: 1, cells: c, ratio: Math.exp(1 / c), cluster: 'from' }),
      });
      const op = laplacian(g, { accuracy: 2 });
      if (c === 16) expectApplyMatchesCsr(op, rng, { trials: 1 });
      const s = splitMax(g, plainErrors(g, op, f2, lapTerms(2)), 2, 2);
      ei.push(s.interior);
      eb.push(s.boundary);
    }
    for (const o of observedOrders(ei)) expect(Math.abs(o - 2), 'interior').toBeLessThanOrEqual(0.1);
    for (const o of observedOrders(eb)) expect(Math.abs(o - 2), 'boundary').toBeLessThanOrEqual(0.1);
  });
});

describe('(d) periodic axes', () => {
  const periodic = (c: number): Grid => grid({ x: { from: 0, to: 1, cells: c, periodic: true } });
  const sin2pi: Wave = { z: [[0, 2 * Math.PI]], phase: 0 };

  for (const m of [1, 2]) {
    for (let p = 1; p <= 6; p++) {
      // every row is interior; tails of order m + p as in (b), h = 1/32 … 1/512
      it(`sin 2πx, m = ${m}, p = ${p}: order ${interiorOrder(m, p)} on every row`, () => {
        const errs: number[] = [];
        for (const c of [32, 64, 128, 256, 512]) {
          const g = periodic(c);
          const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
          if (c === 32) expectApplyMatchesCsr(op, rng, { trials: 1 });
          const e = tailRowErrors(g, op.matrix, sin2pi, m + p);
          errs.push(e.reduce((s, v) => Math.max(s, Math.abs(v)), 0));
        }
        for (const o of observedOrders(errs)) expect(Math.abs(o - interiorOrder(m, p))).toBeLessThanOrEqual(0.1);
      });
    }
  }

  it('plain samples of sin 2πx converge too where the floor allows (m = 1, p ≤ 4, h = 1/16 … 1/256)', () => {
    for (let p = 1; p <= 4; p++) {
      const errs: number[] = [];
      for (const c of [16, 32, 64, 128, 256]) {
        const g = periodic(c);
        const op = derivative(g, { axis: 'x', derivative: 1, accuracy: p });
        errs.push(plainErrors(g, op, sin2pi, [[1]]).reduce((s, v) => Math.max(s, Math.abs(v)), 0));
      }
      for (const o of observedOrders(errs)) expect(Math.abs(o - p), `p = ${p}`).toBeLessThanOrEqual(0.1);
    }
  });

  it('trigonometric polynomials: every row gives the modified wavenumber exactly, within truncation of the true derivative', () => {
    // A shift-invariant stencil maps e^{iωx} to σ(ωh)·e^{iωx}, σ(θ) = h⁻ᵐ Σⱼ wⱼ e^{i oⱼ θ}, with
    // the unit weights wⱼ of the interior window (a fact of common practice: Fourier analysis
    // of difference operators, LeVeque 2007, §10.5). On a periodic axis every row is that
    // stencil, wrapped; so on T(x) = Σₖ aₖ cos 2πkx + bₖ sin 2πkx, k ≤ 3, the operator must
    // give Σₖ Re/Im of σ(2πkh)·(aₖ − i bₖ)e^{2πikx} to round-off, and the error against
    // T⁽ᵐ⁾ is then the symbol error |σ − (iω)ᵐ|, bounded by the leading term.
    const n = 48;
    const h = 1 / n;
    const g = periodic(n);
    const x = g.x.coordinates;
    const coef = Array.from({ length: 3 }, () => [2 * rng() - 1, 2 * rng() - 1] as const);
    const T = Float64Array.from(x, (t) => coef.reduce((s, [a, b], k) => s + a * Math.cos(2 * Math.PI * (k + 1) * t) + b * Math.sin(2 * Math.PI * (k + 1) * t), 0));
    for (const m of [1, 2, 3, 4]) {
      for (let p = 1; p <= 6; p++) {
        const [lo, hi] = interiorWindow(m, p);
        const st = stencil(m, Array.from({ length: hi - lo + 1 }, (_, k) => lo + k));
        const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
        const y = op.apply(T);
        let sumW = 0;
        for (const w of st.weights) sumW += Math.abs(w);
        for (let i = 0; i < n; i++) {
          let predicted = 0;
          let exact = 0;
          let bound = 0;
          for (let k = 0; k < 3; k++) {
            const om = 2 * Math.PI * (k + 1);
            const th = om * h;
            let sr = 0;
            let si = 0;
            st.offsets.forEach((o, j) => {
              sr += st.weights[j]! * Math.cos(o * th);
              si += st.weights[j]! * Math.sin(o * th);
            });
            sr /= h ** m;
            si /= h ** m;
            // (aₖ − i bₖ)e^{iωx} has real part aₖ cos ωx + bₖ sin ωx
            const [a, b] = coef[k]!;
            const er = Math.cos(om * x[i]!);
            const eim = Math.sin(om * x[i]!);
            const zr = a * er + b * eim;
            const zi = a * eim - b * er;
            predicted += sr * zr - si * zi;
            // (iω)ᵐ as a complex number
            const im = [[1, 0], [0, 1], [-1, 0], [0, -1]][m % 4]!;
            exact += om ** m * (im[0]! * zr - im[1]! * zi);
            bound += Math.hypot(a, b) * Math.abs(st.leadingError.toNumber()) * h ** p * om ** (m + p);
          }
          // round-off: N-term sums of samples ≤ Σ|a|+|b| ≲ 2·3, weights ≤ Σ|w|/hᵐ;
          // k = 4N + 16 (dot product, cos/sin evaluations, the three-term sums)
          const N = hi - lo + 1;
          const scale = (sumW / h ** m) * 6;
          expect(Math.abs(y[i]! - predicted), `m=${m} p=${p} row ${i}`).toBeLessThanOrEqual((4 * N + 16) * eps * scale);
          // symbol error ≤ 1.25 × leading term at ωh ≤ 2π·3/48 ≈ 0.39 (the series in θ has terms
          // decreasing by about θ² per order here); plus the round-off above
          expect(Math.abs(y[i]! - exact), `m=${m} p=${p} row ${i}`).toBeLessThanOrEqual(1.25 * bound + (4 * N + 16) * eps * scale);
        }
      }
    }
  });

  it('a smoothly stretched periodic axis (wrap-around windows on actual coordinates) keeps the order', () => {
    // nodes ξ + 0.05·sin(2πξ)/π·… : x(ξ) = ξ + (0.3/(2π))·sin 2πξ, monotone (x′ ≥ 0.7) and periodic
    const ax = (c: number): Grid => {
      const nodes = Array.from({ length: c + 1 }, (_, i) => i / c + (0.3 / (2 * Math.PI)) * Math.sin((2 * Math.PI * i) / c));
      nodes[c] = 1;
      return grid({ x: { nodes, periodic: true } });
    };
    for (const [m, p] of [[1, 2], [1, 4], [2, 2], [1, 3]] as const) {
      const errs: number[] = [];
      for (const c of [16, 32, 64, 128, 256]) {
        const g = ax(c);
        const op = derivative(g, { axis: 'x', derivative: m, accuracy: p });
        if (c === 16) expectApplyMatchesCsr(op, rng, { trials: 1 });
        errs.push(plainErrors(g, op, sin2pi, [[m]]).reduce((s, v) => Math.max(s, Math.abs(v)), 0));
      }
      for (const o of observedOrders(errs)) expect(Math.abs(o - p), `m = ${m}, p = ${p}`).toBeLessThanOrEqual(0.1);
    }
  });
});

describe('(e) mixed derivative', () => {
  it('exact on xᵃyᵇ for a, b ≤ p on uniform and stretched grids (2-D and the x–z pair in 3-D)', () => {
    const grids: Array<[string, Grid, ['x' | 'y' | 'z', 'x' | 'y' | 'z']]> = [
      ['uniform 2-D', grid({ x: { from: 0.5, to: 1.5, cells: 10 }, y: { from: -1, to: 0.2, cells: 9 } }), ['x', 'y']],
      ['stretched 2-D', grid({
        x: geometricAxis({ from: 0.5, to: 1.5, cells: 11, ratio: 1.1, cluster: 'from' }),
        y: tanhAxis({ from: -1, to: 0.2, cells: 10, beta: 1.5, cluster: 'both' }),
      }), ['x', 'y']],
      ['uniform 3-D, x–z', grid({ x: { from: 0.5, to: 1.5, cells: 8 }, y: { from: 0, to: 1, cells: 3 }, z: { from: -1, to: 0.2, cells: 9 } }), ['x', 'z']],
    ];
    const dp = (d: number, t: number): number => (d === 0 ? 0 : d * t ** (d - 1));
    for (const [name, g, axes] of grids) {
      const da = axes[0] === 'x' ? 0 : axes[0] === 'y' ? 1 : 2;
      const db = axes[1] === 'x' ? 0 : axes[1] === 'y' ? 1 : 2;
      for (const p of [1, 2, 3, 4]) {
        const op = mixedDerivative(g, { axes, accuracy: p });
        const factors = [axes[0], axes[1]].map((axis) => derivative(g, { axis, derivative: 1, accuracy: p }));
        const xs = coordinatesOf(g);
        for (let a = 0; a <= p; a++) {
          for (let b = 0; b <= p; b++) {
            const u = Float64Array.from(xs, (c) => c[da]! ** a * c[db]! ** b);
            const y = op.apply(u);
            // scale: the product's entries by |A||B||u| is what rounding sees; bound with
            // |A·B|·|u| times the window of each factor (≤ p + 1 nodes): k = 8(p + 1)²
            const s = absCompose(factors, Float64Array.from(u, Math.abs));
            for (let r = 0; r < g.size; r++) {
              const want = dp(a, xs[r]![da]!) * dp(b, xs[r]![db]!);
              expect(Math.abs(y[r]! - want), `${name} p=${p} a=${a} b=${b} row ${r}`).toBeLessThanOrEqual(8 * (p + 1) ** 2 * eps * (s[r]! + Math.abs(want)));
            }
          }
        }
      }
    }
  });

  // f = sin(π/4·(x + y) + 0.3) as in (c); plain samples over 9² … 129² for p = 2 and tails
  // (order p + 1: the rows are exact on xᵃyᵇ, a, b ≤ p) for p = 2 and 4.
  const f2: Wave = { z: [[0, Math.PI / 4], [0, Math.PI / 4]], phase: 0.3 };
  for (const [p, how, cells] of [[2, 'plain', [8, 16, 32, 64, 128]], [2, 'tail', [8, 16, 32, 64, 128]], [4, 'tail', [8, 16, 32, 64, 128]], [4, 'plain', [8, 16, 32, 64]]] as const) {
    it(`order ${p} (${how}, ${cells[0] + 1}² … ${cells[cells.length - 1]! + 1}²), interior and boundary rows`, () => {
      const ei: number[] = [];
      const eb: number[] = [];
      for (const c of cells) {
        const g = grid({ x: { from: 0, to: 1, cells: c }, y: { from: 0, to: 1, cells: c } });
        const op = mixedDerivative(g, { axes: ['x', 'y'], accuracy: p });
        if (c === 8) {
          // A(Bx) against the CSR of the product: the bound is on |A|·(|B|·|x|)
          const b = derivative(g, { axis: 'y', derivative: 1, accuracy: p });
          const a = derivative(g, { axis: 'x', derivative: 1, accuracy: p });
          expectApplyMatchesCsr(op, rng, { trials: 1, terms: 2 * (p + 1) ** 2, scale: (x) => absApply(a, absApply(b, x)) });
        }
        const e = how === 'tail' ? tailRowErrors(g, op.matrix, f2, p + 1) : plainErrors(g, op, f2, [[1, 1]]);
        const s = splitMax(g, e, 1, p);
        ei.push(s.interior);
        eb.push(s.boundary);
      }
      for (const o of observedOrders(ei)) expect(Math.abs(o - p), 'interior').toBeLessThanOrEqual(0.1);
      for (const o of observedOrders(eb)) expect(Math.abs(o - p), 'boundary').toBeLessThanOrEqual(0.1);
    });
  }
});

/** |A|·|x| for an operator's CSR form. */
function absApply(op: Operator, x: Float64Array): Float64Array {
  const a = op.matrix;
  const y = new Float64Array(a.rows);
  for (let r = 0; r < a.rows; r++) {
    for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) y[r]! += Math.abs(a.values[q]!) * Math.abs(x[a.colIdx[q]!]!);
  }
  return y;
}

/** |Da|·(|Db|·x) for the two first-derivative factors [Da, Db] of a mixed derivative, x ≥ 0. */
function absCompose(factors: Operator[], x: Float64Array): Float64Array {
  return absApply(factors[0]!, absApply(factors[1]!, x));
}

describe('(g) bad input', () => {
  const g1 = uniform1(10);
  const g2 = grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 8 } });
  it('laplacian at accuracy 4 or 6 on a stretched axis → INVALID_ACCURACY (message names the axis)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 8 }, y: tanhAxis({ from: 0, to: 1, cells: 8, beta: 1, cluster: 'both' }) });
    for (const p of [4, 6]) expect(expectCode(() => laplacian(g, { accuracy: p }), 'INVALID_ACCURACY').message).toMatch(/axis y/);
    expect(laplacian(g, { accuracy: 2 }).rows).toBe(81);
  });
  it('laplacian at accuracy 1, 3, 8, 0, 2.5 or NaN → INVALID_ACCURACY', () => {
    for (const p of [1, 3, 8, 0, 2.5, NaN]) expectCode(() => laplacian(g2, { accuracy: p }), 'INVALID_ACCURACY');
  });
  it('derivative accuracy 0, −1, 1.5, NaN → INVALID_ACCURACY', () => {
    for (const p of [0, -1, 1.5, NaN]) expectCode(() => derivative(g1, { axis: 'x', derivative: 1, accuracy: p }), 'INVALID_ACCURACY');
  });
  it('too few nodes for the window → TOO_FEW_NODES, with the exact minimum m + p (or the periodic window)', () => {
    // m + p nodes are enough, one fewer is not. The smallest valid non-periodic axis has 2 nodes
    // (1 cell), so for m + p = 2 (m = p = 1) no axis with too few nodes can be built; the
    // 1-node periodic axis below covers that pair (its window needs 2 nodes).
    for (let m = 1; m <= 4; m++) {
      for (let p = 1; p <= 6; p++) {
        const need = m + p;
        expect(derivative(uniform1(need - 1), { axis: 'x', derivative: m, accuracy: p }).rows).toBe(need);
        if (need - 1 < 2) continue;
        const g = uniform1(need - 2); // a valid grid of need − 1 nodes
        expect(g.nx).toBe(need - 1);
        const e = expectCode(() => derivative(g, { axis: 'x', derivative: m, accuracy: p }), 'TOO_FEW_NODES');
        expect(e.message).toContain(`at least ${need}`);
      }
    }
    expectCode(() => derivative(grid({ x: { from: 0, to: 1, cells: 1, periodic: true } }), { axis: 'x', derivative: 1, accuracy: 1 }), 'TOO_FEW_NODES');
    // periodic: the interior window, 3 nodes for m = 2, p = 2
    expect(derivative(grid({ x: { from: 0, to: 1, cells: 3, periodic: true } }), { axis: 'x', derivative: 2, accuracy: 2 }).rows).toBe(3);
    expectCode(() => derivative(grid({ x: { from: 0, to: 1, cells: 2, periodic: true } }), { axis: 'x', derivative: 2, accuracy: 2 }), 'TOO_FEW_NODES');
    expectCode(() => laplacian(grid({ x: { from: 0, to: 1, cells: 8 }, y: { from: 0, to: 1, cells: 2 } })), 'TOO_FEW_NODES');
    expectCode(() => mixedDerivative(grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 1, cells: 8 } }), { axes: ['x', 'y'] }), 'TOO_FEW_NODES');
  });
  it('an axis the grid lacks → MISSING_AXIS; a name that is no axis → UNKNOWN_AXIS', () => {
    expectCode(() => derivative(g1, { axis: 'y', derivative: 1, accuracy: 2 }), 'MISSING_AXIS');
    expectCode(() => derivative(g2, { axis: 'z', derivative: 1, accuracy: 2 }), 'MISSING_AXIS');
    expectCode(() => derivative(g2, { axis: 'w' as 'x', derivative: 1, accuracy: 2 }), 'UNKNOWN_AXIS');
    expectCode(() => mixedDerivative(g1, { axes: ['x', 'y'] }), 'MISSING_AXIS');
  });
  it('derivative 0 → INVALID_DERIVATIVE pointing to identity; negative or fractional → INVALID_DERIVATIVE', () => {
    expect(expectCode(() => derivative(g1, { axis: 'x', derivative: 0, accuracy: 2 }), 'INVALID_DERIVATIVE').message).toMatch(/identity/);
    for (const m of [-1, 1.5, NaN]) expectCode(() => derivative(g1, { axis: 'x', derivative: m, accuracy: 2 }), 'INVALID_DERIVATIVE');
  });
  it('the same axis twice for mixedDerivative → INVALID_OPTION', () => {
    expectCode(() => mixedDerivative(g2, { axes: ['x', 'x'] }), 'INVALID_OPTION');
    expectCode(() => mixedDerivative(g2, { axes: ['y', 'y'], accuracy: 4 }), 'INVALID_OPTION');
  });
  it('inputs of the wrong size or with NaN are refused by apply', () => {
    const op = derivative(g1, { axis: 'x', derivative: 1, accuracy: 2 });
    expectCode(() => op.apply(new Float64Array(10)), 'SHAPE_MISMATCH');
    const u = new Float64Array(11);
    u[4] = NaN;
    expectCode(() => op.apply(u), 'NON_FINITE');
  });
  it('symmetric flags: derivative and mixed never; laplacian only on an all-periodic grid', () => {
    expect(derivative(g1, { axis: 'x', derivative: 2, accuracy: 2 }).symmetric).toBe(false);
    expect(mixedDerivative(g2, { axes: ['x', 'y'] }).symmetric).toBe(false);
    expect(laplacian(g2).symmetric).toBe(false);
    const gp = grid({ x: { from: 0, to: 1, cells: 8, periodic: true }, y: { from: 0, to: 2, cells: 10, periodic: true } });
    for (const p of [2, 4, 6]) {
      const op = laplacian(gp, { accuracy: p });
      expect(op.symmetric).toBe(true);
      expectApplyMatchesCsr(op, rng, { trials: 1 });
      // declared symmetric: the CSR must be exactly symmetric
      const a = op.matrix;
      const dense = new Map<string, number>();
      for (let r = 0; r < a.rows; r++) for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) dense.set(`${r},${a.colIdx[q]}`, a.values[q]!);
      for (const [key, v] of dense) {
        const [r, c] = key.split(',');
        expect(dense.get(`${c},${r}`)).toBe(v);
      }
    }
  });
  it('centred interior rows of derivative m at even p are centralStencil(m, p) scaled by h⁻ᵐ', () => {
    const h = 0.125;
    const g = uniform1(16, 0, 2);
    for (let m = 1; m <= 4; m++) {
      for (const p of [2, 4, 6]) {
        const st = centralStencil(m, p);
        const a = derivative(g, { axis: 'x', derivative: m, accuracy: p }).matrix;
        const i = 8;
        const vals = Array.from(a.values.subarray(a.rowPtr[i]!, a.rowPtr[i + 1]!));
        // one rounding for the scale 1/hᵐ (h a power of two: exact) and one for the product
        st.weights.forEach((w, j) => expect(Math.abs(vals[j]! - w / h ** m)).toBeLessThanOrEqual(2 * eps * Math.abs(w / h ** m)));
      }
    }
  });
});
