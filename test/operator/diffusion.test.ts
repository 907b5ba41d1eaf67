/**
 * The conservative diffusion operator ∇·(k∇u) (vertex-centred finite
 * volumes, harmonic-mean face conductivity, insulated boundary faces).
 *
 * Properties checked, each from the construction stated in diffusion.ts:
 * constant k on a uniform grid is k times the classical Laplacian inside;
 * S = diag(V)·A is symmetric (V the control volumes, the product of the
 * trapezoidal weights) and its rows sum to zero, so Σᵢ Vᵢ(Au)ᵢ = 0 for any u
 * (the fluxes telescope); a layered wall with interfaces midway between nodes
 * is reproduced exactly, the harmonic mean being the series resistance of
 * two half-cells (Incropera, F. P., DeWitt, D. P., Bergman, T. L. & Lavine,
 * A. S. (2007). Fundamentals of Heat and Mass Transfer, 6th ed., Wiley, §3.1;
 * Patankar, S. V. (1980). Numerical Heat Transfer and Fluid Flow,
 * Hemisphere, §4.2-3); second-order convergence on interior rows for smooth
 * k and u, observed p̂ within 0.1 of 2 over five grids halving h (Roache, P.
 * J. (1998). Verification and Validation in Computational Science and
 * Engineering, Hermosa, ch. 5).
 */
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import {
  type AxisSpec, type Grid, csrIsSymmetric, diffusionOperator, geometricAxis, grid, laplacian, sampleField, tanhAxis,
  trapezoidWeights,
} from '../../src/index.js';
import { SEED, eps, expectApplyMatchesCsr, expectCode, mulberry32, nodeIndex, observedOrders, randomVector } from './helpers.js';

const rng = mulberry32(SEED + 30);

/** Coordinates of every node, one array per unknown (x slowest). */
function coordinatesOf(g: Grid): number[][] {
  return Array.from({ length: g.size }, (_, r) => nodeIndex(g, r).map((i, d) => g.axes[d]!.coordinates[i]!));
}

/** Control volumes V = Π_d w_d (trapezoidal weights), multiplied in axis order. */
function volumes(g: Grid): Float64Array {
  const w = g.axes.map((a) => trapezoidWeights(a));
  return Float64Array.from({ length: g.size }, (_, r) => nodeIndex(g, r).reduce((v, i, d) => v * w[d]![i]!, 1));
}

/** Whether node r is off every non-periodic boundary. */
function interior(g: Grid, r: number): boolean {
  return nodeIndex(g, r).every((i, d) => g.axes[d]!.periodic || (i > 0 && i < g.shape[d]! - 1));
}

/** Row r of a CSR matrix as a column → value map. */
function rowOf(m: { rowPtr: Int32Array; colIdx: Int32Array; values: Float64Array }, r: number): Map<number, number> {
  const out = new Map<number, number>();
  for (let q = m.rowPtr[r]!; q < m.rowPtr[r + 1]!; q++) out.set(m.colIdx[q]!, m.values[q]!);
  return out;
}

/** Σ with Neumaier's compensation: error ≤ 2ε|Σ| + O(nε²)Σ|xᵢ| (Higham 2002, §4.3). */
function neumaier(xs: ArrayLike<number>): number {
  let s = 0;
  let c = 0;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i]!;
    const t = s + x;
    c += Math.abs(s) >= Math.abs(x) ? s - t + x : x - t + s;
    s = t;
  }
  return s + c;
}

const kSmooth2 = (x: number, y: number): number => 1 + 0.5 * Math.sin(2 * x + 1) * Math.cos(1.5 * y);

const grids2: Array<[string, Grid]> = [
  ['uniform', grid({ x: { from: 0, to: 1.3, cells: 9 }, y: { from: -0.5, to: 0.7, cells: 7 } })],
  ['tanh × geometric', grid({
    x: tanhAxis({ from: 0, to: 1.3, cells: 10, beta: 2.5, cluster: 'both' }),
    y: geometricAxis({ from: -0.5, to: 0.7, cells: 8, ratio: 1.3, cluster: 'from' }),
  })],
  ['irregular (seeded widths, ratio up to 4)', grid({
    x: { nodes: (() => { const n = [0]; for (let i = 0; i < 11; i++) n.push(n[i]! + 0.25 + rng()); return n; })() },
    y: { nodes: (() => { const n = [-1]; for (let i = 0; i < 8; i++) n.push(n[i]! + 0.25 + rng()); return n; })() },
  })],
  ['periodic x × stretched y', grid({
    x: { from: 0, to: 2, cells: 10, periodic: true },
    y: tanhAxis({ from: 0, to: 1, cells: 9, beta: 2, cluster: 'from' }),
  })],
];

describe('constant k on a uniform grid', () => {
  it('interior rows are k × the accuracy-2 Laplacian (same columns, entries to a few roundings)', () => {
    const k = 3.7;
    const gs = [
      grid({ x: { from: 0, to: 1.1, cells: 11 } }),
      grid({ x: { from: 0, to: 1.1, cells: 7 }, y: { from: -2, to: 1, cells: 9 } }),
      grid({ x: { from: 0, to: 1.1, cells: 5 }, y: { from: -2, to: 1, cells: 6 }, z: { from: 0, to: 0.3, cells: 4 } }),
    ];
    for (const g of gs) {
      const a = diffusionOperator(g, { conductivity: k }).matrix;
      const l = laplacian(g).matrix;
      for (let r = 0; r < g.size; r++) {
        if (!interior(g, r)) continue;
        const ra = rowOf(a, r);
        const rl = rowOf(l, r);
        expect([...ra.keys()]).toEqual([...rl.keys()]);
        for (const [c, v] of rl) {
          // off-diagonal: harmonic mean (3 ops) · area (≤ 2) / distance (1) · 1/V (2) vs k·(1/h²) (2);
          // diagonal: the sum of 2d such terms (2d − 1 more): k = 16 covers d ≤ 3 with margin 2
          expect(Math.abs(ra.get(c)! - k * v), `${g.dimension}-D row ${r} col ${c}`).toBeLessThanOrEqual(16 * eps * Math.abs(k * v));
        }
      }
    }
  });

  it('boundary rows are the half-cell ones: 1-D row 0 is 2k(u₁ − u₀)/h² (insulated face)', () => {
    // from the module formula: flux k(u₁ − u₀)/h into a control volume of width h/2
    const g = grid({ x: { from: 0, to: 2, cells: 8 } });
    const a = diffusionOperator(g, { conductivity: 3 }).matrix;
    // h = 1/4 is exact; every entry is an exact binary number
    expect([...rowOf(a, 0)]).toEqual([[0, -96], [1, 96]]);
    expect([...rowOf(a, 8)]).toEqual([[7, 96], [8, -96]]);
    expect([...rowOf(a, 4)]).toEqual([[3, 48], [4, -96], [5, 48]]);
  });
});

describe('diag(V)·A is symmetric to round-off (variable k)', () => {
  for (const [name, g] of grids2) {
    it(name, () => {
      const op = diffusionOperator(g, { conductivity: kSmooth2 });
      expect(op.symmetric).toBe(false);
      expectApplyMatchesCsr(op, rng, { trials: 1 });
      const a = op.matrix;
      const v = volumes(g);
      // S = V·A: row r stores c·fl(1/V_r) rounded (2 roundings), times V_r here (1): each side within
      // 3ε of the common c = area·k_face/distance, which is computed identically from both sides
      // (the harmonic mean is symmetric in float64: 2·a·b and a + b commute exactly): 6ε between them
      const s = { ...a, values: new Float64Array(a.values.length) };
      for (let r = 0; r < a.rows; r++) for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) s.values[q] = v[r]! * a.values[q]!;
      for (let r = 0; r < a.rows; r++) {
        const row = rowOf(s, r);
        for (const [c, x] of row) {
          if (c === r) continue;
          const y = rowOf(s, c).get(r);
          expect(typeof y, `(${c}, ${r}) stored`).toBe("number");
          expect(Math.abs(x - y!), `(${r}, ${c})`).toBeLessThanOrEqual(6 * eps * Math.abs(x));
        }
      }
      expect(csrIsSymmetric(s, 6 * eps)).toBe(true);
      // and A itself is not symmetric where volumes differ (the flag is honest): aᵢⱼ/aⱼᵢ = Vⱼ/Vᵢ, which
      // differs from 1 by O(1) on these grids, far beyond any round-off level such as 1e-8
      if (!g.axes.every((ax) => ax.uniform)) expect(csrIsSymmetric(a, 1e-8)).toBe(false);
    });
  }

  it('a uniform all-periodic grid is flagged symmetric, and its CSR is exactly symmetric', () => {
    const g = grid({ x: { from: 0, to: 1, cells: 8, periodic: true }, y: { from: 0, to: 3, cells: 6, periodic: true } });
    const op = diffusionOperator(g, { conductivity: kSmooth2 });
    expect(op.symmetric).toBe(true);
    expect(csrIsSymmetric(op.matrix, 0)).toBe(true);
  });
});

describe('insulated: Σᵢ Vᵢ (Au)ᵢ = 0 to round-off for any u (fluxes telescope)', () => {
  const cases: Array<[string, Grid]> = [
    ...grids2,
    ['3-D stretched', grid({
      x: tanhAxis({ from: 0, to: 1, cells: 6, beta: 2, cluster: 'both' }),
      y: { from: 0, to: 2, cells: 5 },
      z: geometricAxis({ from: 0, to: 1, cells: 5, ratio: 1.4, cluster: 'to' }),
    })],
    ['1-D irregular', grid({ x: { nodes: [0, 0.01, 0.5, 0.55, 2, 2.1, 4] } })],
  ];
  for (const [name, g] of cases) {
    it(name, () => {
      const kf = (...c: number[]): number => 1 + 0.9 * Math.sin(3 * c[0]! + (c[1] ?? 0) - 2 * (c[2] ?? 0));
      const op = diffusionOperator(g, { conductivity: kf });
      const a = op.matrix;
      const v = volumes(g);
      let worst = 0;
      for (let t = 0; t < 4; t++) {
        // magnitudes spread over six decades on the later trials
        const u = randomVector(rng, g.size).map((x) => (t < 2 ? x : x * 10 ** (6 * rng())));
        const y = op.apply(u);
        const terms = Float64Array.from(y, (x, r) => v[r]! * x);
        // per row: the product's rounding γₙ·Σ|a||u| (n ≤ 2d + 1 entries), the entries' own rounding
        // against the telescoping c's (3ε, see above; the diagonal adds γ_{2d} of Σc), V·y (1):
        // k = 2(2d + 1) + 4 per row, on Σᵣ Vᵣ Σ_c |a_rc||u_c|; the outer compensated sum adds 2ε|Σ| ≈ 0
        let scale = 0;
        for (let r = 0; r < a.rows; r++) for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) scale += v[r]! * Math.abs(a.values[q]! * u[a.colIdx[q]!]!);
        const k = 2 * (2 * g.dimension + 1) + 4;
        const total = neumaier(terms);
        expect(Math.abs(total), `trial ${t}`).toBeLessThanOrEqual(k * eps * scale);
        worst = Math.max(worst, Math.abs(total) / (k * eps * scale));
      }
      expect(worst).toBeLessThan(1);
    });
  }
});

describe('the conductivity: number, function or field', () => {
  const g = grid({ x: tanhAxis({ from: 0, to: 1, cells: 6, beta: 1.5, cluster: 'both' }), y: { from: 0, to: 2, cells: 5 } });
  const same = (a: ReturnType<typeof diffusionOperator>, b: ReturnType<typeof diffusionOperator>): void => {
    expect(Array.from(a.matrix.rowPtr)).toEqual(Array.from(b.matrix.rowPtr));
    expect(Array.from(a.matrix.colIdx)).toEqual(Array.from(b.matrix.colIdx));
    // the same nodal values enter the same arithmetic: identical
    expect(Array.from(a.matrix.values)).toEqual(Array.from(b.matrix.values));
  };
  it('a constant as number, constant function and constant field give the same matrix; the default is k = 1', () => {
    const byNumber = diffusionOperator(g, { conductivity: 2.5 });
    same(byNumber, diffusionOperator(g, { conductivity: () => 2.5 }));
    same(byNumber, diffusionOperator(g, { conductivity: sampleField(g, () => 2.5) }));
    same(diffusionOperator(g), diffusionOperator(g, { conductivity: 1 }));
  });
  it('a variable k as function, sampled field and non-contiguous view of it give the same matrix', () => {
    const fn = kSmooth2;
    const byFn = diffusionOperator(g, { conductivity: fn });
    same(byFn, diffusionOperator(g, { conductivity: sampleField(g, fn) }));
    // stored y-slowest and read through a transposed, x-reversed view
    const [nx, ny] = g.shape as readonly number[];
    const store = ndarray(new Float64Array(nx! * ny!), [ny!, nx!]);
    const view = store.transpose(1, 0).step(-1, 1);
    for (let i = 0; i < nx!; i++) for (let j = 0; j < ny!; j++) view.set(nx! - 1 - i, j, fn(g.x.coordinates[i]!, g.y!.coordinates[j]!));
    const flipped = store.transpose(1, 0).step(-1, 1).step(-1, 1);
    same(byFn, diffusionOperator(g, { conductivity: flipped }));
  });
  it('k ≤ 0, NaN or infinite (number, function or field) → INVALID_COEFFICIENT', () => {
    for (const k of [0, -1, NaN, Infinity, -0]) {
      expectCode(() => diffusionOperator(g, { conductivity: k }), 'INVALID_COEFFICIENT');
      expectCode(() => diffusionOperator(g, { conductivity: (x: number) => (x > 0.5 ? k : 1) }), 'INVALID_COEFFICIENT');
      const f = sampleField(g, () => 1);
      f.set(3, 2, k);
      expectCode(() => diffusionOperator(g, { conductivity: f }), 'INVALID_COEFFICIENT');
    }
  });
  it('a field of the wrong shape → SHAPE_MISMATCH; something that is no coefficient → INVALID_OPTION', () => {
    expectCode(() => diffusionOperator(g, { conductivity: ndarray(new Float64Array(12).fill(1), [3, 4]) }), 'SHAPE_MISMATCH');
    expectCode(() => diffusionOperator(g, { conductivity: 'steel' as unknown as number }), 'INVALID_OPTION');
  });
});

describe('layered wall: exact on the series-resistance profile (Incropera et al. 2007, §3.1)', () => {
  /**
   * Layers of conductivity kₗ between interfaces that lie midway between nodes; T(0) = T₀,
   * T(L) = T_L. The heat flux q = (T₀ − T_L)/Σ(thickness/k) is the same in every layer, and T is
   * piecewise linear with slope −q/kₗ. Sampled at the nodes, A T = 0 at every interior node.
   */
  function wall(nodes: readonly number[], interfaces: number[], ks: number[], t0: number, tl: number): { g: Grid; T: Float64Array; k: (x: number) => number } {
    const g = grid({ x: { nodes } });
    const L = nodes[nodes.length - 1]!;
    const edges = [0, ...interfaces, L];
    let res = 0;
    for (let l = 0; l < ks.length; l++) res += (edges[l + 1]! - edges[l]!) / ks[l]!;
    const q = (t0 - tl) / res;
    const layer = (x: number): number => {
      let l = 0;
      while (l < interfaces.length && x > interfaces[l]!) l++;
      return l;
    };
    // temperature at each interface, marching from T₀
    const tEdge = [t0];
    for (let l = 0; l < ks.length; l++) tEdge.push(tEdge[l]! - (q * (edges[l + 1]! - edges[l]!)) / ks[l]!);
    const T = Float64Array.from(g.x.coordinates, (x) => {
      const l = layer(x);
      return tEdge[l]! - (q * (x - edges[l]!)) / ks[l]!;
    });
    return { g, T, k: (x) => ks[layer(x)]! };
  }

  const uniformNodes = (n: number, L: number): number[] => Array.from({ length: n + 1 }, (_, i) => (i === n ? L : (i * L) / n));
  const cases: Array<[string, readonly number[], number[], number[]]> = [
    // 20 cells on [0, 1]: interface at x = 0.525, midway between nodes 10 and 11; k jumps 1000×
    ['two layers, k 1 → 1000', uniformNodes(20, 1), [0.525], [1, 1000]],
    ['two layers, k 1000 → 1', uniformNodes(20, 1), [0.525], [1000, 1]],
    // three layers (brick, insulation, plaster-like ratios) on a stretched axis; interfaces midway
    ['three layers on a stretched axis, k 0.7, 0.04, 0.22', (() => {
      const n = geometricAxis({ from: 0, to: 0.3, cells: 24, ratio: 1.05, cluster: 'from' }).nodes;
      return Array.from(n);
    })(), [], [0.7, 0.04, 0.22]],
  ];
  for (const [name, nodes, given, ks] of cases) {
    it(name, () => {
      let interfaces = given;
      if (interfaces.length === 0) {
        // midway between nodes 7 | 8 and 15 | 16
        interfaces = [(nodes[7]! + nodes[8]!) / 2, (nodes[15]! + nodes[16]!) / 2];
      }
      const { g, T, k } = wall(nodes, interfaces, ks, 350, 290);
      const op = diffusionOperator(g, { conductivity: k });
      const a = op.matrix;
      const y = op.apply(T);
      for (let i = 1; i < g.nx - 1; i++) {
        let s = 0;
        for (let q = a.rowPtr[i]!; q < a.rowPtr[i + 1]!; q++) s += Math.abs(a.values[q]! * T[a.colIdx[q]!]!);
        // a 3-term dot product (3), its entries' rounding against the exact ones (harmonic mean 3,
        // distance 1, 1/V 2, diagonal sum 1: 7), the samples of T (4 operations each: 4), the
        // coordinates' rounding (2): k = 16 on Σ|a||T|
        expect(Math.abs(y[i]!), `node ${i}`).toBeLessThanOrEqual(16 * eps * s);
      }
      // the boundary row sees the one flux q through its inner face: (A T)₀ = −q/V₀ (insulated outer face)
      const x = g.x.coordinates;
      const w = trapezoidWeights(g.x);
      const edges = [0, ...interfaces, x[g.nx - 1]!];
      let res = 0;
      for (let l = 0; l < ks.length; l++) res += (edges[l + 1]! - edges[l]!) / ks[l]!;
      const q0 = (350 - 290) / res;
      let s0 = 0;
      for (let q = a.rowPtr[0]!; q < a.rowPtr[1]!; q++) s0 += Math.abs(a.values[q]! * T[a.colIdx[q]!]!);
      // the same 16ε·Σ|a||T| as above, plus q's own rounding (one operation per layer and 4 more)
      expect(Math.abs(y[0]! + q0 / w[0]!)).toBeLessThanOrEqual(16 * eps * s0 + (2 * ks.length + 4) * eps * (q0 / w[0]!));
    });
  }
});

describe('second order for smooth k and u on interior rows (five grids halving h)', () => {
  // u = sin(1.7x + 0.9y + 0.3), k = 1 + 0.5·sin(2x + 1)·cos(1.5y) on [0, 1]²;
  // ∇·(k∇u) = k·Δu + ∇k·∇u in closed form
  const u = (x: number, y: number): number => Math.sin(1.7 * x + 0.9 * y + 0.3);
  const exact = (x: number, y: number): number => {
    const s = Math.sin(1.7 * x + 0.9 * y + 0.3);
    const c = Math.cos(1.7 * x + 0.9 * y + 0.3);
    const k = kSmooth2(x, y);
    const kx = Math.cos(2 * x + 1) * Math.cos(1.5 * y); // 0.5·2
    const ky = -0.75 * Math.sin(2 * x + 1) * Math.sin(1.5 * y); // 0.5·(−1.5)
    return -k * (1.7 ** 2 + 0.9 ** 2) * s + kx * 1.7 * c + ky * 0.9 * c;
  };
  const families: Array<[string, (c: number) => { x: AxisSpec; y: AxisSpec }]> = [
    ['uniform', (c) => ({ x: { from: 0, to: 1, cells: c }, y: { from: 0, to: 1, cells: c } })],
    // smooth maps with β fixed and ratio e^{1.5/n}: neighbouring widths differ by 1 + O(h)
    ['tanh × geometric', (c) => ({
      x: tanhAxis({ from: 0, to: 1, cells: c, beta: 2, cluster: 'both' }),
      y: geometricAxis({ from: 0, to: 1, cells: c, ratio: Math.exp(1.5 / c), cluster: 'from' }),
    })],
    ['tanh (cluster at to) × uniform', (c) => ({
      x: tanhAxis({ from: 0, to: 1, cells: c, beta: 1.5, cluster: 'to' }),
      y: { from: 0, to: 1, cells: c },
    })],
  ];
  for (const [name, make] of families) {
    it(name, () => {
      const errs: number[] = [];
      for (const c of [16, 32, 64, 128, 256]) {
        const g = grid(make(c));
        const op = diffusionOperator(g, { conductivity: kSmooth2 });
        const xs = coordinatesOf(g);
        const y = op.apply(Float64Array.from(xs, ([a, b]) => u(a!, b!)));
        let e = 0;
        xs.forEach(([a, b], r) => {
          if (interior(g, r)) e = Math.max(e, Math.abs(y[r]! - exact(a!, b!)));
        });
        errs.push(e);
      }
      const orders = observedOrders(errs);
      for (const o of orders) expect(Math.abs(o - 2), `${name}: p̂ = ${orders.map((v) => v.toFixed(3)).join(', ')}`).toBeLessThanOrEqual(0.1);
    });
  }
});
