/**
 * Discrete error norms on a grid.
 *
 *   L2:  ‖e‖₂ = ( Σᵢⱼₖ wxᵢ·wyⱼ·wz_k·eᵢⱼₖ² )^{1/2}   (tensor trapezoidal weights)
 *   L∞:  ‖e‖∞ = maxᵢⱼₖ |eᵢⱼₖ|
 *
 * with e = computed − exact at the stored nodes. The L2 norm approximates
 * (∫ e² dV)^{1/2} to O(h²) and, unlike the plain root-mean-square, does not
 * change with the grid's node count for a fixed smooth error, so observed
 * orders of both norms are comparable across levels. Weights: Davis, P. J.
 * & Rabinowitz, P. (1984). Methods of Numerical Integration, 2nd ed., §2.1.
 *
 * @module
 */
import { checkField } from '../grid/field.js';
import { type Field, type Grid, trapezoidWeights } from '../grid/index.js';
import { NonFiniteValueError, ShapeMismatchError } from '../errors.js';

/** Nodal values: a flat array in field order (x slowest), or a field. */
export type NodalValues = ArrayLike<number> | Field;

/** Exact values: nodal values, or a function of the node's coordinates. */
export type ExactValues = NodalValues | ((...coordinates: number[]) => number);

/** The two error norms of one level. */
export interface ErrorNorms {
  /** Trapezoid-weighted L2 norm of computed − exact. */
  readonly l2: number;
  /** Largest |computed − exact| over the nodes. */
  readonly linf: number;
}

function isField(v: unknown): v is Field {
  return typeof v === 'object' && v !== null && 'shape' in v && 'stride' in v && 'data' in v;
}

/** Reads nodal values in field order into a flat array. */
function flatten(g: Grid, v: NodalValues, name: string): ArrayLike<number> {
  if (isField(v)) {
    checkField(g, v, name);
    const out = new Float64Array(g.size);
    const [nx, ny = 1, nz = 1] = g.shape as readonly number[];
    const s = v.stride;
    let r = 0;
    for (let i = 0; i < nx; i++) {
      for (let j = 0; j < ny; j++) {
        for (let k = 0; k < nz; k++) {
          out[r++] = v.data[v.offset + i * s[0]! + (g.dimension > 1 ? j * s[1]! : 0) + (g.dimension > 2 ? k * s[2]! : 0)]!;
        }
      }
    }
    return out;
  }
  if (v.length !== g.size) throw new ShapeMismatchError(`${name} has ${v.length} entries but the grid has ${g.size} nodes`);
  return v;
}

/**
 * L2 (trapezoid-weighted) and L∞ norms of computed − exact on a grid (module
 * formulas).
 *
 * Accuracy: L∞ is exact; L2 is the trapezoidal rule applied to e², so it
 * approximates (∫e²)^{1/2} with relative error O(h²) for a smooth error.
 * Round-off: a few ε relative (sums of positive terms).
 *
 * @param g - the grid
 * @param computed - nodal values, flat in field order (x slowest) or a field
 * @param exact - nodal values, or a function of the node coordinates
 * @returns both norms
 * @throws ShapeMismatchError if a flat array has the wrong length; NonFiniteValueError at the first non-finite difference
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 2 } });
 * errorNorms(g, Float64Array.of(1, 1, 1), () => 0) // { l2: 1, linf: 1 }
 * ```
 */
export function errorNorms(g: Grid, computed: NodalValues, exact: ExactValues): ErrorNorms {
  const u = flatten(g, computed, 'computed');
  const [nx, ny = 1, nz = 1] = g.shape as readonly number[];
  const wx = trapezoidWeights(g.x);
  const wy = g.dimension > 1 ? trapezoidWeights(g.axes[1]!) : Float64Array.of(1);
  const wz = g.dimension > 2 ? trapezoidWeights(g.axes[2]!) : Float64Array.of(1);
  const cx = g.x.coordinates;
  const cy = g.dimension > 1 ? g.axes[1]!.coordinates : undefined;
  const cz = g.dimension > 2 ? g.axes[2]!.coordinates : undefined;
  const ex = typeof exact === 'function' ? undefined : flatten(g, exact, 'exact');
  const fn = typeof exact === 'function' ? exact : undefined;
  let sum = 0;
  let max = 0;
  let r = 0;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++) {
        let want: number;
        if (fn === undefined) want = ex![r]!;
        else if (cz !== undefined) want = fn(cx[i]!, cy![j]!, cz[k]!);
        else if (cy !== undefined) want = fn(cx[i]!, cy[j]!);
        else want = fn(cx[i]!);
        const e = u[r]! - want;
        if (!Number.isFinite(e)) {
          throw new NonFiniteValueError(`computed − exact at node ${[i, j, k].slice(0, g.dimension).join(', ')}`, e);
        }
        sum += wx[i]! * wy[j]! * wz[k]! * e * e;
        const a = Math.abs(e);
        if (a > max) max = a;
        r++;
      }
    }
  }
  return { l2: Math.sqrt(sum), linf: max };
}
