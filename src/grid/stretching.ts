/**
 * Stretched axes whose nodes cluster towards one or both ends, for boundary
 * layers and other steep gradients near a wall. Each helper returns a
 * {@link StretchedAxisSpec} for {@link grid}: strictly increasing nodes whose
 * first is `from` and whose last is `to`, exactly.
 *
 * Notation: L = to − from, n = cells, ξᵢ = i/n, hᵢ = xᵢ₊₁ − xᵢ.
 *
 * References: geometric growth of successive spacings is common practice in
 * grid generation, with no single source. The tanh maps are those analysed
 * in Vinokur, M. (1983). On one-dimensional stretching functions for
 * finite-difference calculations. J. Comput. Phys. 50(2), 215–234.
 *
 * @module
 */
import { checkFinite } from '../check.js';
import {
  InvalidCellsError, InvalidClusteringError, InvalidIntervalError, InvalidOptionError, NonFiniteValueError,
} from '../errors.js';
import type { StretchedAxisSpec } from './axis.js';
import type { grid } from './grid.js';

/**
 * Where the nodes cluster: at `from`, at `to`, or at both ends symmetrically.
 *
 * @example Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'to' }).nodes) // [0, 4, 6, 7]
 */
export type ClusterEnd = 'from' | 'to' | 'both';

/**
 * Options shared by the clustering helpers.
 *
 * @example tanhAxis({ from: 0, to: 1, cells: 8, beta: 2, cluster: 'from' }).nodes.length // 9
 */
export interface ClusterOptions {
  /** Lower end (finite). */
  readonly from: number;
  /** Upper end (finite, > from). */
  readonly to: number;
  /** Number of cells, a whole number ≥ 1; the axis has cells + 1 nodes. */
  readonly cells: number;
  /** Which end or ends get the finest cells. */
  readonly cluster: ClusterEnd;
}

/**
 * Options of {@link geometricAxis}.
 *
 * @example Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'both' }).nodes) // [0, 1.75, 5.25, 7]
 */
export interface GeometricOptions extends ClusterOptions {
  /**
   * r > 0, the ratio of successive spacings going away from the clustered
   * end(s): r > 1 clusters there, r = 1 is uniform, r < 1 puts the finest
   * cells away from the named end instead.
   */
  readonly ratio: number;
}

/**
 * Options of {@link tanhAxis}.
 *
 * @example tanhAxis({ from: 0, to: 1, cells: 4, beta: 3, cluster: 'both' }).nodes[2] // 0.5
 */
export interface TanhOptions extends ClusterOptions {
  /** β > 0, the stretching strength; β → 0 tends to uniform, larger β clusters harder. */
  readonly beta: number;
}

/**
 * The nodes of a clustered axis, ready for {@link grid}.
 *
 * @example grid({ x: tanhAxis({ from: 0, to: 1, cells: 8, beta: 2, cluster: 'both' }) }).x.uniform // false
 */
export type ClusteredAxisSpec = StretchedAxisSpec & {
  /** The node coordinates, x₀ = from … xₙ = to, strictly increasing. */
  readonly nodes: Float64Array;
};

function checkRange(where: string, o: ClusterOptions): number {
  checkFinite(`${where}: from`, o.from);
  checkFinite(`${where}: to`, o.to);
  if (!(o.to > o.from)) throw new InvalidIntervalError(where, o.from, o.to);
  if (!Number.isSafeInteger(o.cells) || o.cells < 1) throw new InvalidCellsError(where, o.cells);
  const length = o.to - o.from;
  if (!Number.isFinite(length)) throw new NonFiniteValueError(`${where}: to − from`, length);
  if (o.cluster !== 'from' && o.cluster !== 'to' && o.cluster !== 'both') {
    throw new InvalidOptionError('cluster', `${where}: cluster is ${JSON.stringify(o.cluster)}; use 'from', 'to' or 'both'`);
  }
  return length;
}

function checkParameter(parameter: string, v: number): void {
  if (!(Number.isFinite(v) && v > 0)) {
    throw new InvalidClusteringError(parameter, v, 'use a finite number > 0');
  }
}

/**
 * Lays out nodes for the three cluster ends. `oneSided(m)` gives fractions
 * t₀ = 0 < … < tₘ = 1 of L on m cells, finest at t = 0; `leftHalf(n)` gives
 * the fractions of nodes 0 … ⌊n/2⌋ of the symmetric layout on n cells, whose
 * right half is their mirror image.
 */
function layout(
  o: ClusterOptions, length: number, parameter: string, value: number,
  oneSided: (m: number) => Float64Array,
  leftHalf: (n: number) => Float64Array,
): Float64Array {
  const n = o.cells;
  const x = new Float64Array(n + 1);
  switch (o.cluster) {
    case 'from': {
      const t = oneSided(n);
      for (let i = 0; i < n; i++) x[i] = o.from + length * t[i];
      break;
    }
    case 'to': {
      const t = oneSided(n);
      // mirror image: spacing i from `to` equals spacing i from `from` above
      for (let i = 1; i <= n; i++) x[n - i] = o.to - length * t[i];
      break;
    }
    case 'both': {
      const k = Math.floor(n / 2);
      const t = leftHalf(n);
      for (let i = 0; i <= k; i++) x[i] = o.from + length * t[i];
      for (let i = 1; i < n - k; i++) x[n - i] = o.to - length * t[i];
      break;
    }
    default: {
      const unreachable: never = o.cluster;
      throw new InvalidOptionError('cluster', `${String(unreachable)} is not 'from', 'to' or 'both'`);
    }
  }
  // the end nodes are `from` and `to` by definition; from + L may round away from `to`
  x[0] = o.from;
  x[n] = o.to;
  for (let i = 1; i <= n; i++) {
    if (!(x[i] > x[i - 1])) {
      throw new InvalidClusteringError(
        parameter, value,
        `too strong for float64 with ${n} cells on [${o.from}, ${o.to}]: nodes ${i - 1} and ${i} coincide at ${x[i]}; ` +
          `use a value nearer ${parameter === 'ratio' ? 1 : 0} or fewer cells`,
      );
    }
  }
  return x;
}

/**
 * Left-half fractions of the symmetric geometric layout on n cells, nodes
 * 0 … k = ⌊n/2⌋: the one-sided layout u on ⌈n/2⌉ cells scaled by
 * 1/(1 + u_k), so that the two mirrored halves (sharing the middle node
 * when n is even, the middle cell when n is odd) fill [0, 1].
 */
function geometricHalf(n: number, lambda: number): Float64Array {
  const k = Math.floor(n / 2);
  const u = geometricFractions(n - k, lambda);
  const scale = 1 / (1 + u[k]);
  const t = new Float64Array(k + 1);
  for (let i = 0; i <= k; i++) t[i] = u[i] * scale;
  // n even: u[k] = 1 and t[k] = 1/2 exactly, the middle node
  return t;
}

/** (rⁱ − 1)/(rᵐ − 1) for i = 0 … m with λ = ln r, by expm1 so that r near 1 keeps its digits and r ≫ 1 does not overflow. */
function geometricFractions(m: number, lambda: number): Float64Array {
  const t = new Float64Array(m + 1);
  if (lambda === 0) {
    for (let i = 0; i <= m; i++) t[i] = i / m;
  } else if (lambda > 0) {
    // (rⁱ − 1)/(rᵐ − 1) = r^(i−m)·(1 − r⁻ⁱ)/(1 − r⁻ᵐ): every factor ≤ 1
    const den = Math.expm1(-m * lambda);
    for (let i = 0; i <= m; i++) t[i] = (Math.exp((i - m) * lambda) * Math.expm1(-i * lambda)) / den;
  } else {
    const den = Math.expm1(m * lambda);
    for (let i = 0; i <= m; i++) t[i] = Math.expm1(i * lambda) / den;
  }
  t[m] = 1;
  return t;
}

/**
 * A stretched axis whose successive spacings grow by a constant ratio r away
 * from the clustered end(s) (a geometric progression).
 *
 * cluster 'from': hᵢ = h₀·rⁱ, h₀ = L(r − 1)/(rⁿ − 1), so
 * xᵢ = from + L·(rⁱ − 1)/(rⁿ − 1) (r = 1: uniform).
 * cluster 'to': the mirror image, the last cell finest: hₙ₋₁₋ᵢ = hₙ₋₁·rⁱ.
 * cluster 'both': hᵢ = h₀·r^min(i, n−1−i), symmetric about the middle; the
 * ratio of successive spacings is r up to the middle and 1/r after it (1
 * between the two middle cells when n is even).
 *
 * Each node is computed from the closed form (by expm1, not by summing
 * spacings), so its error is about (n·|ln r| + 8)·ε/2 of max(|from|, |to|),
 * the n·|ln r| from rounding the exponent. Source: common practice in grid
 * generation (no single reference).
 *
 * @param options - from, to, cells, cluster and the ratio r > 0
 * @returns `{ nodes }` with x₀ = from and xₙ = to exactly, strictly increasing
 * @throws NonFiniteValueError, InvalidIntervalError, InvalidCellsError for bad ends or cells;
 *   InvalidOptionError for an unknown `cluster`; InvalidClusteringError if r is not finite and > 0, or so far from 1 that nodes coincide in float64
 * @example Array.from(geometricAxis({ from: 0, to: 7, cells: 3, ratio: 2, cluster: 'from' }).nodes) // [0, 1, 3, 7]
 */
export function geometricAxis(options: Readonly<GeometricOptions>): ClusteredAxisSpec {
  const length = checkRange('geometricAxis', options);
  checkParameter('ratio', options.ratio);
  const lambda = Math.log(options.ratio);
  const nodes = layout(options, length, 'ratio', options.ratio,
    (m) => geometricFractions(m, lambda), (n) => geometricHalf(n, lambda));
  return { nodes };
}

/**
 * The one-sided tanh fraction t(ξ) = 1 + tanh(β(ξ − 1))/tanh β, rewritten as
 * t = [expm1(−2βξ)/expm1(−2β)]·2q/(1 + q), q = e^(−2β(1−ξ)):
 * the same function without the cancellation of 1 + (≈ −1) near ξ = 0,
 * where the cells are finest, and without overflow for large β. t(0) = 0 and
 * t(1) = 1 exactly.
 */
function tanhFraction(xi: number, beta: number): number {
  const q = Math.exp(-2 * beta * (1 - xi));
  return (Math.expm1(-2 * beta * xi) / Math.expm1(-2 * beta)) * ((2 * q) / (1 + q));
}

function tanhOneSided(m: number, beta: number): Float64Array {
  const t = new Float64Array(m + 1);
  for (let i = 0; i <= m; i++) t[i] = tanhFraction(i / m, beta);
  return t;
}

/** ½(1 + tanh(β(ξ − ½))/tanh(β/2)) = ½·t(2ξ; β/2) at ξ = i/n, i = 0 … ⌊n/2⌋. */
function tanhHalf(n: number, beta: number): Float64Array {
  const k = Math.floor(n / 2);
  const t = new Float64Array(k + 1);
  for (let i = 0; i <= k; i++) t[i] = 0.5 * tanhFraction((2 * i) / n, beta / 2);
  return t;
}

/**
 * A stretched axis clustered by a hyperbolic-tangent map of ξ = i/n.
 *
 * cluster 'from': x = from + L·(1 + tanh(β(ξ − 1))/tanh β);
 * cluster 'to': x = from + L·tanh(βξ)/tanh β (the mirror image);
 * cluster 'both': x = from + (L/2)·(1 + tanh(β(ξ − ½))/tanh(β/2)), symmetric about the middle.
 *
 * The map is smooth, so the ratio of neighbouring spacings is 1 + O(1/n) and
 * schemes keep their order of accuracy as n grows with β fixed. The
 * smallest spacing, at the clustered end(s), is about 2βL/(n·sinh 2β) for
 * 'from' and 'to' and βL/(n·sinh β) for 'both' (L·t′(0)/n, t = (x − from)/L). Source: Vinokur
 * (1983), J. Comput. Phys. 50, 215–234.
 *
 * @param options - from, to, cells, cluster and the strength β > 0
 * @returns `{ nodes }` with x₀ = from and xₙ = to exactly, strictly increasing
 * @throws NonFiniteValueError, InvalidIntervalError, InvalidCellsError for bad ends or cells;
 *   InvalidOptionError for an unknown `cluster`; InvalidClusteringError if β is not finite and > 0, or so large that nodes coincide in float64
 * @example tanhAxis({ from: 0, to: 1, cells: 2, beta: 2, cluster: 'both' }).nodes[1] // 0.5
 */
export function tanhAxis(options: Readonly<TanhOptions>): ClusteredAxisSpec {
  const length = checkRange('tanhAxis', options);
  checkParameter('beta', options.beta);
  const beta = options.beta;
  const nodes = layout(options, length, 'beta', beta, (m) => tanhOneSided(m, beta), (n) => tanhHalf(n, beta));
  return { nodes };
}
