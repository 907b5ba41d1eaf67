/**
 * Advection b·∇u: central (second order) and first-order upwind
 * differences, and the cell Péclet number.
 *
 * Expected behaviour, from advection.ts and the facts it cites: upwind is
 * the two-point difference towards the side the flow comes from, exact on
 * linear functions (a two-point difference quotient of a linear function is
 * its slope) and first order on smooth ones, with leading error
 * (|b|h/2)·u″; at an inflow boundary node it falls back to the difference
 * into the domain. Central uses the accuracy-2 first-derivative rows:
 * centred inside, three-point one-sided at the boundary, exact on
 * quadratics in each coordinate and second order everywhere (LeVeque, R. J.
 * (2007). Finite Difference Methods for Ordinary and Partial Differential
 * Equations, SIAM, §1.5). The cell Péclet number Pe = |b|·h/α and the
 * threshold 2 are those of Patankar, S. V. (1980). Numerical Heat Transfer
 * and Fluid Flow, Hemisphere, §5.2. Observed order p̂ = log₂(e_h/e_{h/2})
 * within 0.1 of p over five grids halving h (Roache 1998, ch. 5).
 */
import { describe, expect, it } from 'vitest';
import {
  type AxisSpec, type Grid, QuadrilleError, advection, cellPeclet, geometricAxis, grid, tanhAxis,
} from '../../src/index.js';
import { SEED, eps, expectApplyMatchesCsr, expectCode, mulberry32, nodeIndex, observedOrders } from './helpers.js';

const rng = mulberry32(SEED + 40);

function coordinatesOf(g: Grid): number[][] {
  return Array.from({ length: g.size }, (_, r) => nodeIndex(g, r).map((i, d) => g.axes[d]!.coordinates[i]!));
}

/** Row r as [column, value] pairs. */
function rowOf(m: { rowPtr: Int32Array; colIdx: Int32Array; values: Float64Array }, r: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) out.push([m.colIdx[q]!, m.values[q]!]);
  return out;
}

/** Max |Au − want| over the rows selected, A applied to samples of f. */
function maxError(g: Grid, y: Float64Array, want: (c: number[]) => number, pick: (r: number) => boolean = () => true): number {
  const xs = coordinatesOf(g);
  let e = 0;
  xs.forEach((c, r) => {
    if (pick(r)) e = Math.max(e, Math.abs(y[r]! - want(c)));
  });
  return e;
}

/** (|A|·|u|)ᵣ. */
function absRow(m: { rowPtr: Int32Array; colIdx: Int32Array; values: Float64Array }, u: Float64Array, r: number): number {
  let s = 0;
  for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) s += Math.abs(m.values[q]! * u[m.colIdx[q]!]!);
  return s;
}

const grids: Array<[string, Grid]> = [
  ['1-D uniform', grid({ x: { from: -1, to: 2, cells: 12 } })],
  ['1-D geometric', grid({ x: geometricAxis({ from: 0, to: 1, cells: 10, ratio: 1.3, cluster: 'from' }) })],
  ['2-D uniform', grid({ x: { from: 0, to: 1, cells: 7 }, y: { from: -1, to: 1, cells: 6 } })],
  ['2-D tanh × irregular', grid({
    x: tanhAxis({ from: 0, to: 1, cells: 8, beta: 2, cluster: 'both' }),
    y: { nodes: [0, 0.05, 0.3, 0.35, 0.9, 1.6, 1.7] },
  })],
  ['3-D mixed', grid({ x: { from: 0, to: 1, cells: 4 }, y: geometricAxis({ from: 0, to: 2, cells: 5, ratio: 1.5, cluster: 'to' }), z: { from: 0, to: 1, cells: 3 } })],
];

/** A velocity that changes sign inside the domain on every axis. */
const swirl = (d: number): Array<(...c: number[]) => number> =>
  [(...c: number[]) => 0.5 - c[0]! + 0.3 * (c[1] ?? 0), (...c: number[]) => Math.sin(3 * c[0]!) - 0.2, (...c: number[]) => c[0]! - c[2]! + 0.1].slice(0, d);

describe('upwind', () => {
  for (const [name, g] of grids) {
    it(`${name}: exact on linear functions for constant and sign-changing velocities`, () => {
      const slope = [1.3, -0.7, 2.1].slice(0, g.dimension);
      const lin = (c: number[]): number => 0.4 + c.reduce((s, x, d) => s + slope[d]! * x, 0);
      const xs = coordinatesOf(g);
      const u = Float64Array.from(xs, lin);
      for (const velocity of [[2, -1, 0.5].slice(0, g.dimension), [-3, 4, -1].slice(0, g.dimension), swirl(g.dimension)]) {
        const op = advection(g, { velocity, scheme: 'upwind' });
        expectApplyMatchesCsr(op, rng, { trials: 1 });
        const y = op.apply(u);
        xs.forEach((c, r) => {
          const b = velocity.map((v) => (typeof v === 'number' ? v : v(...c)));
          const want = b.reduce((s, v, d) => s + v * slope[d]!, 0);
          // per axis c·(u_q − u_p): the samples (3 roundings each) and c = v/dist (2): k = 8 per
          // axis on Σ|a||u|, plus the d-term sum of want: k = 8d + d
          const k = 9 * g.dimension;
          expect(Math.abs(y[r]! - want), `row ${r}`).toBeLessThanOrEqual(k * eps * (absRow(op.matrix, u, r) + Math.abs(want)));
        });
      }
    });
  }

  it('uses the node behind the flow: hand values on a uniform axis, both signs, and the inflow fallback', () => {
    // h = 1/4: v/h = ±8 exactly
    const g = grid({ x: { from: 0, to: 1, cells: 4 } });
    const pos = advection(g, { velocity: [2], scheme: 'upwind' }).matrix;
    expect(rowOf(pos, 2)).toEqual([[1, -8], [2, 8]]); // 2(u₂ − u₁)/h
    expect(rowOf(pos, 4)).toEqual([[3, -8], [4, 8]]);
    expect(rowOf(pos, 0)).toEqual([[0, -8], [1, 8]]); // inflow node: forward difference into the domain
    const neg = advection(g, { velocity: [-2], scheme: 'upwind' }).matrix;
    expect(rowOf(neg, 2)).toEqual([[2, 8], [3, -8]]); // −2(u₃ − u₂)/h
    expect(rowOf(neg, 0)).toEqual([[0, 8], [1, -8]]);
    expect(rowOf(neg, 4)).toEqual([[3, 8], [4, -8]]); // inflow node at x = 1: backward difference
  });

  it('a sign-changing velocity picks the side per node; b = 0 gives a zero row', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4 } });
    // b(x) = 1 − 2x: +1, +0.5, 0, −0.5, −1 at the nodes
    const m = advection(g, { velocity: [(x) => 1 - 2 * x], scheme: 'upwind' }).matrix;
    expect(rowOf(m, 1)).toEqual([[0, -2], [1, 2]]);
    expect(rowOf(m, 2).every(([, v]) => v === 0)).toBe(true);
    expect(rowOf(m, 3)).toEqual([[3, 2], [4, -2]]);
  });

  it('monotone structure: rows sum to zero; off-diagonals ≤ 0 except at inflow boundary nodes', () => {
    // zero row sums and nonpositive neighbours: the M-matrix structure behind monotonicity of
    // upwinding (Morton, K. W. (1996). Numerical Solution of Convection–Diffusion Problems, ch. 2)
    for (const [name, g] of grids) {
      const velocity = swirl(g.dimension);
      const m = advection(g, { velocity, scheme: 'upwind' }).matrix;
      const xs = coordinatesOf(g);
      for (let r = 0; r < g.size; r++) {
        const row = rowOf(m, r);
        const idx = nodeIndex(g, r);
        const b = velocity.map((v) => v(...xs[r]!));
        const inflow = idx.some((i, d) => (i === 0 && b[d]! > 0) || (i === g.shape[d]! - 1 && b[d]! < 0));
        // the diagonal is −Σ c: one rounding per axis
        const sum = row.reduce((s, [, v]) => s + v, 0);
        const mag = row.reduce((s, [, v]) => s + Math.abs(v), 0);
        expect(Math.abs(sum), `${name} row ${r}`).toBeLessThanOrEqual(2 * g.dimension * eps * mag);
        if (!inflow) for (const [c, v] of row) if (c !== r) expect(v, `${name} row ${r} col ${c}`).toBeLessThanOrEqual(0);
      }
    }
  });
});

describe('central', () => {
  for (const [name, g] of grids) {
    it(`${name}: exact on products of quadratics, any velocity`, () => {
      const xs = coordinatesOf(g);
      // u = Π_d (1 + a_d x_d + b_d x_d²): quadratic in each coordinate; 3-node rows are exact on it
      const a = [0.7, -1.1, 0.4];
      const bq = [0.5, 0.8, -0.6];
      const f = (c: number[]): number => c.reduce((s, x, d) => s * (1 + a[d]! * x + bq[d]! * x * x), 1);
      const df = (c: number[], e: number): number =>
        c.reduce((s, x, d) => s * (d === e ? a[d]! + 2 * bq[d]! * x : 1 + a[d]! * x + bq[d]! * x * x), 1);
      const u = Float64Array.from(xs, f);
      const velocity = swirl(g.dimension);
      const op = advection(g, { velocity, scheme: 'central' });
      expectApplyMatchesCsr(op, rng, { trials: 1 });
      const y = op.apply(u);
      xs.forEach((c, r) => {
        const want = velocity.reduce((s, v, d) => s + v(...c) * df(c, d), 0);
        // per axis a 3-term dot (3), Fornberg weights (3), samples (2d + 2), the product b·w (1):
        // k = 16 per axis on Σ|a||u| + |want| (|x|·|u′| terms of coordinate rounding are inside the
        // weights' scale, coordinates here ≤ 2)
        const k = 16 * g.dimension;
        expect(Math.abs(y[r]! - want), `row ${r}`).toBeLessThanOrEqual(k * eps * (2 * absRow(op.matrix, u, r) + Math.abs(want)));
      });
    });
  }

  it('interior rows are b·(u₊ − u₋)/(2h), boundary rows b·(−3u₀ + 4u₁ − u₂)/(2h)', () => {
    const g = grid({ x: { from: 0, to: 2, cells: 4 } }); // h = 1/2
    const m = advection(g, { velocity: [3], scheme: 'central' }).matrix;
    expect(rowOf(m, 2)).toEqual([[1, -3], [2, 0], [3, 3]]);
    expect(rowOf(m, 0)).toEqual([[0, -9], [1, 12], [2, -3]]);
    expect(rowOf(m, 4)).toEqual([[2, 3], [3, -12], [4, 9]]);
  });
});

describe('observed order (five grids halving h, max over the rows named)', () => {
  // u = sin(2.3x + 1.1y + 0.4), b = (1 + 0.5 cos y, −0.8 + 0.3 x) on [0, 1]²; 1-D: y = 0
  const u2 = (x: number, y: number): number => Math.sin(2.3 * x + 1.1 * y + 0.4);
  const grad = (x: number, y: number): [number, number] => {
    const c = Math.cos(2.3 * x + 1.1 * y + 0.4);
    return [2.3 * c, 1.1 * c];
  };
  const bx = (x: number, y = 0): number => 1 + 0.5 * Math.cos(y);
  const by = (x: number): number => -0.8 + 0.3 * x;
  const coarse = [16, 32, 64, 128, 256];
  // The 1-D tanh boundary rows sit on the finest cell h₀ = L·t(1/n), t the tanh map, whose
  // curvature makes h₀ = t′(0)/n·(1 + O(1/n)) with a large O(1/n): from 17 nodes p̂ is 1.11, 1.06,
  // 1.03, 1.01 (upwind) and 2.17, 2.09, 2.05, 2.02 (central), the gap halving with h. That range is
  // pre-asymptotic, so this family starts at 65 nodes.
  const fine = [64, 128, 256, 512, 1024];
  const families: Array<[string, (c: number) => Grid, number[]]> = [
    ['1-D uniform', (c) => grid({ x: { from: 0, to: 1, cells: c } }), coarse],
    ['1-D tanh', (c) => grid({ x: tanhAxis({ from: 0, to: 1, cells: c, beta: 2, cluster: 'both' }) }), fine],
    ['2-D uniform', (c) => grid({ x: { from: 0, to: 1, cells: c }, y: { from: 0, to: 1, cells: c } }), coarse],
    ['2-D tanh × geometric', (c) => grid({
      x: tanhAxis({ from: 0, to: 1, cells: c, beta: 2, cluster: 'both' }),
      y: geometricAxis({ from: 0, to: 1, cells: c, ratio: Math.exp(1.5 / c), cluster: 'from' }),
    }), coarse],
  ];
  for (const [name, make, cells] of families) {
    for (const scheme of ['upwind', 'central'] as const) {
      const p = scheme === 'upwind' ? 1 : 2;
      it(`${name}, ${scheme}: order ${p} on interior and on boundary rows, ${cells[0]! + 1} … ${cells[4]! + 1} nodes per axis`, () => {
        const ei: number[] = [];
        const eb: number[] = [];
        for (const c of cells) {
          const g = make(c);
          const velocity = g.dimension === 1 ? [(x: number) => bx(x)] : [(x: number, y: number) => bx(x, y), (x: number) => by(x)];
          const op = advection(g, { velocity, scheme });
          const xs = coordinatesOf(g);
          const y = op.apply(Float64Array.from(xs, (c2) => u2(c2[0]!, c2[1] ?? 0)));
          const want = (c2: number[]): number => {
            const [gx, gy] = grad(c2[0]!, c2[1] ?? 0);
            return g.dimension === 1 ? bx(c2[0]!) * gx : bx(c2[0]!, c2[1]!) * gx + by(c2[0]!) * gy;
          };
          const inside = (r: number): boolean => nodeIndex(g, r).every((i, d) => i > 0 && i < g.shape[d]! - 1);
          ei.push(maxError(g, y, want, inside));
          eb.push(maxError(g, y, want, (r) => !inside(r)));
        }
        const oi = observedOrders(ei);
        const ob = observedOrders(eb);
        const text = `interior ${oi.map((v) => v.toFixed(3)).join(', ')}; boundary ${ob.map((v) => v.toFixed(3)).join(', ')}`;
        for (const o of [...oi, ...ob]) expect(Math.abs(o - p), text).toBeLessThanOrEqual(0.1);
      });
    }
  }
});

describe('periodic axes', () => {
  const sinWave = (x: number): number => Math.sin(2 * Math.PI * x + 0.3);
  const dsin = (x: number): number => 2 * Math.PI * Math.cos(2 * Math.PI * x + 0.3);

  it('upwind wraps to the node behind the flow across the seam (hand values, n = 4)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 4, periodic: true } }); // h = 1/4
    const pos = advection(g, { velocity: [2], scheme: 'upwind' }).matrix;
    expect(rowOf(pos, 0)).toEqual([[0, 8], [3, -8]]); // 2(u₀ − u₋₁)/h, u₋₁ = u₃
    const neg = advection(g, { velocity: [-2], scheme: 'upwind' }).matrix;
    expect(rowOf(neg, 3)).toEqual([[0, -8], [3, 8]]); // −2(u₄ − u₃)/h, u₄ = u₀
  });

  it('upwind on the smallest periodic axis, n = 2: still the node behind the flow', () => {
    // nodes 0 and 1/2, period 1; u = (0, 1). Behind node 0 (b > 0) is node 1 at x = −1/2:
    // (u₀ − u₋₁)/h = (0 − 1)/(1/2) = −2; at node 1, (u₁ − u₀)/h = 2. For b < 0 the node ahead:
    // at node 0, −(u₁ − u₀)/h = −2; at node 1, −(u₂ − u₁)/h = −(0 − 1)/(1/2) = 2.
    const g = grid({ x: { from: 0, to: 1, cells: 2, periodic: true } });
    const u = Float64Array.of(0, 1);
    expect(Array.from(advection(g, { velocity: [1], scheme: 'upwind' }).apply(u))).toEqual([-2, 2]);
    expect(Array.from(advection(g, { velocity: [-1], scheme: 'upwind' }).apply(u))).toEqual([-2, 2]);
  });

  it('a 1-node periodic axis: refused, or a matrix of finite entries (no 0/0)', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 1, periodic: true } });
    let ok = false;
    try {
      const m = advection(g, { velocity: [1], scheme: 'upwind' }).matrix;
      ok = Array.from(m.values).every(Number.isFinite);
    } catch (e) {
      ok = e instanceof QuadrilleError;
    }
    expect(ok).toBe(true);
  });

  it('central with constant b on a uniform periodic axis is skew: Aᵀ = −A exactly (a fact of common practice)', () => {
    const g = grid({ x: { from: 0, to: 2, cells: 10, periodic: true }, y: { from: 0, to: 1, cells: 6, periodic: true } });
    const m = advection(g, { velocity: [1.7, -0.6], scheme: 'central' }).matrix;
    const entry = new Map<string, number>();
    for (let r = 0; r < m.rows; r++) for (const [c, v] of rowOf(m, r)) entry.set(`${r},${c}`, v);
    for (const [key, v] of entry) {
      const [r, c] = key.split(',');
      if (r === c) expect(v).toBe(0);
      else expect(entry.get(`${c},${r}`)).toBe(-v);
    }
  });

  for (const scheme of ['upwind', 'central'] as const) {
    const p = scheme === 'upwind' ? 1 : 2;
    for (const [name, spec] of [
      ['uniform', (c: number): AxisSpec => ({ from: 0, to: 1, cells: c, periodic: true })],
      // x(ξ) = ξ + (0.3/2π) sin 2πξ: smooth, periodic, monotone
      ['smoothly stretched', (c: number): AxisSpec => {
        const nodes = Array.from({ length: c + 1 }, (_, i) => i / c + (0.3 / (2 * Math.PI)) * Math.sin((2 * Math.PI * i) / c));
        nodes[c] = 1;
        return { nodes, periodic: true };
      }],
    ] as const) {
      it(`${scheme}, ${name} periodic axis: order ${p} on every row (h = 1/16 … 1/256)`, () => {
        const errs: number[] = [];
        for (const c of [16, 32, 64, 128, 256]) {
          const g = grid({ x: spec(c) });
          const op = advection(g, { velocity: [(x) => 1 + 0.5 * Math.sin(2 * Math.PI * x)], scheme });
          const y = op.apply(Float64Array.from(g.x.coordinates, sinWave));
          errs.push(maxError(g, y, ([x]) => (1 + 0.5 * Math.sin(2 * Math.PI * x!)) * dsin(x!)));
        }
        const o = observedOrders(errs);
        for (const v of o) expect(Math.abs(v - p), o.map((t) => t.toFixed(3)).join(', ')).toBeLessThanOrEqual(0.1);
      });
    }
  }
});

describe('cellPeclet', () => {
  // Pe = |b|·h/α with h the larger adjacent cell (advection.ts); each value below is one product
  // and one quotient of the inputs: |got − want| ≤ 4ε·want (two roundings, and h itself one)
  const close = (got: number, want: number): void => expect(Math.abs(got - want)).toBeLessThanOrEqual(4 * eps * Math.abs(want));

  it('the documented example: 10 cells on [0, 1], b = 5, α = 0.1 → 5', () => {
    const r = cellPeclet(grid({ x: { from: 0, to: 1, cells: 10 } }), [5], 0.1);
    close(r.max, 5);
    expect(r.centralMayOscillate).toBe(true);
  });

  it('per axis on a 2-D grid: h = 0.5 and 0.1, b = (1, −3), α = 0.5 → (1, 0.6)', () => {
    const r = cellPeclet(grid({ x: { from: 0, to: 2, cells: 4 }, y: { from: 0, to: 1, cells: 10 } }), [1, -3], 0.5);
    close(r.perAxis[0]!, 1);
    close(r.perAxis[1]!, 0.6);
    close(r.max, 1);
    expect(r.centralMayOscillate).toBe(false);
  });

  it('stretched axis, variable b: the largest |b|·(larger adjacent cell)/α over the nodes', () => {
    // nodes 0, 0.1, 0.4, 1; b = x: node values 0·0.1, 0.1·0.3, 0.4·0.6, 1·0.6 → 0.6/α
    const g = grid({ x: { nodes: [0, 0.1, 0.4, 1] } });
    close(cellPeclet(g, [(x) => x], 0.25).max, 2.4);
    // constant b = 2, α = 1: the largest cell, 0.6 → 1.2
    close(cellPeclet(g, [2], 1).max, 1.2);
  });

  it('the threshold is Pe > 2 (Patankar 1980, §5.2): exactly 2 is not flagged', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 2 } }); // h = 1/2
    const at = cellPeclet(g, [4], 1);
    expect(at.max).toBe(2);
    expect(at.centralMayOscillate).toBe(false);
    expect(cellPeclet(g, [4 * (1 + 4 * eps)], 1).centralMayOscillate).toBe(true);
  });

  it('periodic stretched axis: node 0 is adjacent to the wrap-around cell too', () => {
    // stored nodes 0, 0.1, 0.5, period 1: cells 0.1, 0.4 and the wrap-around 0.5. With b = 1 − x:
    // node 0: 1·max(0.5, 0.1) = 0.5; node 1: 0.9·0.4 = 0.36; node 2: 0.5·0.5 = 0.25 → max 0.5
    const g = grid({ x: { nodes: [0, 0.1, 0.5, 1], periodic: true } });
    close(cellPeclet(g, [(x) => 1 - x], 1).max, 0.5);
  });
});

describe('bad input', () => {
  const g2 = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4 } });
  it('velocity with the wrong number of components, or not an array → INVALID_OPTION', () => {
    for (const velocity of [[1], [1, 2, 3], [], 1, undefined, null, { 0: 1, 1: 2, length: 2 }] as unknown[]) {
      for (const scheme of ['upwind', 'central'] as const) {
        expectCode(() => advection(g2, { velocity: velocity as number[], scheme }), 'INVALID_OPTION');
      }
      expectCode(() => cellPeclet(g2, velocity as number[], 1), 'INVALID_OPTION');
    }
  });
  it('non-finite velocity (constant or from the function) → NON_FINITE', () => {
    expectCode(() => advection(g2, { velocity: [NaN, 1], scheme: 'upwind' }), 'NON_FINITE');
    expectCode(() => advection(g2, { velocity: [1, (x) => (x > 0.6 ? Infinity : 1)], scheme: 'central' }), 'NON_FINITE');
  });
  it('an unknown scheme → INVALID_OPTION; diffusivity ≤ 0 or not finite → INVALID_OPTION', () => {
    expectCode(() => advection(g2, { velocity: [1, 1], scheme: 'quick' as 'upwind' }), 'INVALID_OPTION');
    for (const a of [0, -1, NaN, Infinity]) expectCode(() => cellPeclet(g2, [1, 1], a), 'INVALID_OPTION');
  });
  it('central needs 3 nodes per axis → TOO_FEW_NODES on a 2-node axis; upwind works there', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 1 } });
    expectCode(() => advection(g, { velocity: [1], scheme: 'central' }), 'TOO_FEW_NODES');
    expect(Array.from(advection(g, { velocity: [1], scheme: 'upwind' }).apply(Float64Array.of(0, 3)))).toEqual([3, 3]);
  });
  it('the operator is never flagged symmetric', () => {
    expect(advection(g2, { velocity: [1, 1], scheme: 'central' }).symmetric).toBe(false);
    expect(advection(g2, { velocity: [1, 1], scheme: 'upwind' }).symmetric).toBe(false);
  });
});
