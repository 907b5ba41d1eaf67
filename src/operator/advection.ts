/**
 * Advection b·∇u with central or first-order upwind differences, and the
 * cell Péclet number that says when central differences will oscillate.
 *
 * - central: each ∂u/∂xₐ by the accuracy-2 rows of `derivative` (centred
 *   inside, one-sided second order at the boundary). Error O(h²); for an
 *   advection–diffusion problem with diffusivity α its steady solution is
 *   free of wiggles only while the cell Péclet number Pe = |bₐ|·hₐ/α ≤ 2
 *   (Patankar 1980, §5.2; Morton, K. W. (1996). Numerical Solution of
 *   Convection–Diffusion Problems, Chapman & Hall, ch. 2).
 * - upwind: bₐ·(uᵢ − uᵢ₋₁)/hᵢ₋₁ where bₐ ≥ 0 and bₐ·(uᵢ₊₁ − uᵢ)/hᵢ where
 *   bₐ < 0: first order, monotone at any Péclet number, with artificial
 *   diffusion |bₐ|hₐ/2. At an inflow boundary node, whose upwind neighbour
 *   lies outside the domain, the one-sided difference into the domain is
 *   used (the inflow value itself is normally prescribed).
 *
 * @module
 */
import { InvalidOptionError, NonFiniteValueError } from '../errors.js';
import type { Grid } from '../grid/index.js';
import { CsrBuilder } from './matrix.js';
import { addLineRow, gridStrides } from './derivative.js';
import { forEachNode, nodeCoordinates } from './diffusion.js';
import { lineTable } from './lines.js';
import { type Operator, makeOperator } from './operator.js';

/**
 * A velocity field: one component per axis, each a constant or a function of
 * the node's coordinates.
 */
export type Velocity = readonly (number | ((...coordinates: number[]) => number))[];

/** What {@link advection} builds. */
export interface AdvectionOptions {
  /** b, one component per grid axis (m/s). */
  readonly velocity: Velocity;
  /** 'central' (second order) or 'upwind' (first order, monotone). */
  readonly scheme: 'central' | 'upwind';
}

function sampleVelocity(g: Grid, velocity: Velocity): Float64Array[] {
  if (!Array.isArray(velocity) || velocity.length !== g.dimension) {
    throw new InvalidOptionError('velocity', `give ${g.dimension} component(s), one per axis (${['x', 'y', 'z'].slice(0, g.dimension).join(', ')})`);
  }
  return velocity.map((c, d) => {
    const out = new Float64Array(g.size);
    forEachNode(g, (r, i, j, k) => {
      const v = typeof c === 'number' ? c : c(...nodeCoordinates(g, i, j, k));
      if (!Number.isFinite(v)) throw new NonFiniteValueError(`velocity component ${d} at node ${r}`, v);
      out[r] = v;
    });
    return out;
  });
}

/**
 * The advection operator u ↦ b·∇u at every node (see the module for both
 * schemes and their accuracy).
 *
 * @param g - the grid (uniform or stretched)
 * @param options - velocity and scheme
 * @returns a square, nonsymmetric operator on the grid's nodes
 * @example advection(grid({ x: { from: 0, to: 1, cells: 4 } }), { velocity: [2], scheme: 'upwind' }).apply(Float64Array.of(0, 0.25, 0.5, 0.75, 1)) // all 2
 */
export function advection(g: Grid, options: Readonly<AdvectionOptions>): Operator {
  const b = sampleVelocity(g, options.velocity);
  const scheme = options.scheme;
  if (scheme !== 'central' && scheme !== 'upwind') {
    throw new InvalidOptionError('scheme', `${JSON.stringify(scheme)} is not a scheme; use "central" or "upwind"`);
  }
  const strides = gridStrides(g);
  const tables = scheme === 'central' ? g.axes.map((a) => lineTable(a, 1, 2)) : undefined;
  const build = () => {
    const m = new CsrBuilder(g.size, g.size, g.size * (2 * g.dimension + 1));
    const idx = [0, 0, 0];
    forEachNode(g, (r, i, j, k) => {
      idx[0] = i;
      idx[1] = j;
      idx[2] = k;
      for (let d = 0; d < g.dimension; d++) {
        const v = b[d]![r]!;
        if (v === 0) continue;
        const axis = g.axes[d]!;
        const p = idx[d]!;
        if (tables !== undefined) {
          addLineRow(m, tables[d]!, r, p, strides[d]!, axis.periodic, v);
          continue;
        }
        const n = axis.count;
        const x = axis.coordinates;
        const period = axis.to - axis.from;
        // upwind side: behind the flow; at an inflow boundary, the side that exists
        let side = v >= 0 ? -1 : 1;
        if (!axis.periodic && (p + side < 0 || p + side >= n)) side = -side;
        let q = p + side;
        let dist: number;
        if (axis.periodic) {
          if (n === 1) continue; // a one-node periodic axis: u is constant along it
          const wrapped = q < 0 || q >= n;
          q = (q + n) % n;
          // signed distance x_q − x_p, measured the short way across the seam
          dist = x[q]! - x[p]! + (wrapped ? (side > 0 ? period : -period) : 0);
        } else {
          dist = x[q]! - x[p]!;
        }
        // ∂u/∂x ≈ (u_q − u_p)/(x_q − x_p)
        const c = v / dist;
        m.add(r + (q - p) * strides[d]!, c);
        m.add(r, -c);
      }
      m.add(r, 0); // keep the diagonal in the pattern
      m.endRow();
    });
    return m.finish();
  };
  return makeOperator({ rows: g.size, cols: g.size, shape: g.shape, symmetric: false, build });
}

/** Largest cell Péclet number per axis, and overall. */
export interface PecletReport {
  /** max over nodes of |bₐ|·hₐ/α along each axis, hₐ the larger adjacent cell. */
  readonly perAxis: readonly number[];
  /** The largest of `perAxis`. */
  readonly max: number;
  /** Whether central differencing may oscillate (max > 2). */
  readonly centralMayOscillate: boolean;
}

/**
 * The cell Péclet number Pe = |bₐ|·hₐ/α of an advection–diffusion problem:
 * central differences give a monotone steady solution only where Pe ≤ 2
 * (Patankar 1980, §5.2).
 *
 * @param g - the grid
 * @param velocity - b, one component per axis
 * @param diffusivity - α > 0 (m²/s), a constant
 * @returns the largest Péclet number per axis and overall
 * @example cellPeclet(grid({ x: { from: 0, to: 1, cells: 10 } }), [5], 0.1).max // 5
 */
export function cellPeclet(g: Grid, velocity: Velocity, diffusivity: number): PecletReport {
  if (!(Number.isFinite(diffusivity) && diffusivity > 0)) {
    throw new InvalidOptionError('diffusivity', `${diffusivity} is not a finite number > 0`);
  }
  const b = sampleVelocity(g, velocity);
  const perAxis = g.axes.map(() => 0);
  const idx = [0, 0, 0];
  forEachNode(g, (r, i, j, k) => {
    idx[0] = i;
    idx[1] = j;
    idx[2] = k;
    for (let d = 0; d < g.dimension; d++) {
      const ax = g.axes[d]!;
      const w = ax.widths;
      const p = idx[d]!;
      // the cells on either side of the node; on a periodic axis node 0 also borders the wrap-around cell
      const left = p > 0 ? w[p - 1]! : ax.periodic ? w[w.length - 1]! : 0;
      const h = Math.max(left, p < w.length ? w[p]! : 0);
      perAxis[d] = Math.max(perAxis[d]!, (Math.abs(b[d]![r]!) * h) / diffusivity);
    }
  });
  const max = Math.max(...perAxis);
  return { perAxis, max, centralMayOscillate: max > 2 };
}
