/**
 * Discrete integrals over a grid's domain by the trapezoidal rule, one axis
 * at a time (tensor product).
 *
 * Along one axis with cell widths hᵢ the weights are
 *
 *   w₀ = h₀/2,  wᵢ = (hᵢ₋₁ + hᵢ)/2 (0 < i < n),  wₙ = hₙ₋₁/2,
 *
 * and on a periodic axis every node gets the half-spacings on both sides,
 * wᵢ = (hᵢ₋₁ + hᵢ)/2 with h₋₁ the wrap-around cell (wᵢ = dx when uniform).
 * The grid integral is Σᵢⱼₖ wxᵢ·wyⱼ·wz_k·f[i, j, k].
 *
 * Accuracy: exact for the piecewise-linear interpolant of the node values (in
 * several dimensions, the piecewise-multilinear one); for smooth f the error
 * is −(to − from)·h²·f″(ξ)/12 on a uniform axis and O(h²) on an axis stretched
 * by a smooth map, h the largest cell. On a periodic axis with equal cells the
 * rule is exact for trigonometric polynomials of degree below the node count
 * and converges geometrically for analytic periodic f. Sources: Davis, P. J.
 * & Rabinowitz, P. (1984). Methods of Numerical Integration, 2nd ed.,
 * Academic Press, §2.1; Trefethen, L. N. & Weideman, J. A. C. (2014). The
 * exponentially convergent trapezoidal rule. SIAM Rev. 56(3), 385–458.
 *
 * @module
 */
import { NonFiniteValueError } from '../errors.js';
import type { Axis } from './axis.js';
import { weightedSum1, weightedSum2, weightedSum3 } from './base/weighted-sum.js';
import { checkField, type Field } from './field.js';
import type { Grid } from './grid.js';

/**
 * Trapezoidal weights of one axis, one per stored node (see the module
 * formula): w₀ = h₀/2, wᵢ = (hᵢ₋₁ + hᵢ)/2, wₙ = hₙ₋₁/2; on a periodic axis
 * wᵢ = (hᵢ₋₁ + hᵢ)/2 all round. They sum to to − from.
 *
 * @param axis - the axis (e.g. `g.x`)
 * @returns a new array of `axis.count` weights (same unit as the coordinates)
 * @example Array.from(trapezoidWeights(grid({ x: { from: 0, to: 1, cells: 4 } }).x)) // [0.125, 0.25, 0.25, 0.25, 0.125]
 */
export function trapezoidWeights(axis: Axis): Float64Array {
  const h = axis.widths;
  const n = axis.cells;
  const w = new Float64Array(axis.count);
  if (axis.periodic) {
    w[0] = 0.5 * (h[n - 1] + h[0]);
    for (let i = 1; i < n; i++) w[i] = 0.5 * (h[i - 1] + h[i]);
  } else {
    w[0] = 0.5 * h[0];
    for (let i = 1; i < n; i++) w[i] = 0.5 * (h[i - 1] + h[i]);
    w[n] = 0.5 * h[n - 1];
  }
  return w;
}

function firstNonFinite(g: Grid, f: Field): [string, number] | undefined {
  const [nx, ny = 1, nz = 1] = g.shape as readonly number[];
  const s = f.stride;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++) {
        const v = f.data[f.offset + i * s[0] + (g.dimension > 1 ? j * s[1] : 0) + (g.dimension > 2 ? k * s[2] : 0)];
        if (!Number.isFinite(v)) return [`field[${[i, j, k].slice(0, g.dimension).join(', ')}]`, v];
      }
    }
  }
  return undefined;
}

/**
 * ∫ f over the domain of `g` by the tensor-product trapezoidal rule:
 * Σᵢⱼₖ wxᵢ·wyⱼ·wz_k·f[i, j, k] with the weights of {@link trapezoidWeights}.
 *
 * Exact (to round-off) for piecewise-linear node data in 1-D and
 * piecewise-multilinear data in 2-D/3-D; error O(h²) for smooth f on uniform
 * or smoothly stretched axes; spectrally accurate along uniform periodic axes
 * (exact for trigonometric polynomials of degree below the node count).
 * Round-off: nested sums, at most about (nx + ny + nz + 12)·ε/2·Σ|w·f|.
 * Sources: Davis & Rabinowitz (1984); Trefethen & Weideman (2014).
 *
 * @param g - the grid
 * @param field - values at the stored nodes, shape `g.shape`, any strides
 * @returns the integral (field unit × coordinate unitᵈ)
 * @throws ShapeMismatchError / InvalidFieldError if `field` does not fit `g`;
 *   NonFiniteValueError at the first NaN or infinite value, or if the sum overflows
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 2, cells: 4 }, y: { from: 0, to: 1, cells: 4 } });
 * integrate(g, sampleField(g, (x, y) => x + y)) // 3 (= ∫∫ (x + y) dy dx, exact: linear)
 * ```
 */
export function integrate(g: Grid, field: Field): number {
  checkField(g, field);
  const wx = trapezoidWeights(g.x);
  const s = field.stride;
  let sum: number;
  switch (g.dimension) {
    case 1:
      sum = weightedSum1(g.nx, wx, field.data, s[0], field.offset);
      break;
    case 2: {
      const y = g.y as Axis;
      sum = weightedSum2(g.nx, y.count, wx, trapezoidWeights(y), field.data, s[0], s[1], field.offset);
      break;
    }
    default: {
      const y = g.y as Axis;
      const z = g.z as Axis;
      sum = weightedSum3(g.nx, y.count, z.count, wx, trapezoidWeights(y), trapezoidWeights(z),
        field.data, s[0], s[1], s[2], field.offset);
    }
  }
  if (!Number.isFinite(sum)) {
    // checked only on failure, so a good field costs one pass
    const bad = firstNonFinite(g, field);
    if (bad !== undefined) throw new NonFiniteValueError(bad[0], bad[1]);
    throw new NonFiniteValueError('the integral (finite values, but the sum overflows float64)', sum);
  }
  return sum;
}
