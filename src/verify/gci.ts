/**
 * The Grid Convergence Index: a banded estimate of the discretisation error
 * of the finest of two or three solutions.
 *
 * With the notation of `richardson.ts` (φ₁ finest, r₂₁ = h₂/h₁, …, p the
 * apparent order for three grids or the scheme's order for two):
 *
 *   φ_ext²¹ = (r₂₁ᵖ φ₁ − φ₂)/(r₂₁ᵖ − 1),   φ_ext³² = (r₃₂ᵖ φ₂ − φ₃)/(r₃₂ᵖ − 1)
 *   e_a²¹ = |(φ₁ − φ₂)/φ₁|                 approximate relative error
 *   e_ext²¹ = |(φ_ext²¹ − φ₁)/φ_ext²¹|      extrapolated relative error
 *   GCI_fine²¹ = F_s·e_a²¹/(r₂₁ᵖ − 1)       F_s = 1.25 (three grids), 3 (two)
 *
 * Convergence type from R = ε₂₁/ε₃₂: monotone for 0 < R < 1, oscillatory for
 * −1 < R < 0 (s < 0), divergent for |R| ≥ 1 (the changes do not shrink, of
 * either sign; R ≤ −1 is oscillatory divergence and sets both flags). The
 * GCI is only meaningful for monotone convergence in the asymptotic range.
 * The numbers are still returned when a flag is set; read the flags first.
 *
 * Representative spacing of a grid of N cells in D dimensions over a
 * domain of size V: h = (V/N)^{1/D}.
 *
 * Sources: Roache, P. J. (1994). Perspective: a method for uniform reporting
 * of grid refinement studies. J. Fluids Eng. 116(3), 405–413; Celik, I. B.
 * et al. (2008). J. Fluids Eng. 130(7), 078001 (the procedure and its
 * worked example); Stern, F., Wilson, R. V., Coleman, H. W. & Paterson,
 * E. G. (2001). Comprehensive approach to verification and validation of
 * CFD simulations. J. Fluids Eng. 123(4), 793–802 (the ratio R).
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';
import { apparentOrder, checkLevels } from './richardson.js';

/** The Grid Convergence Index of two or three solutions (module formulas). */
export interface GridConvergence {
  /** p: apparent order (three grids) or the given order (two grids). */
  readonly order: number;
  /** Whether p was observed (three grids) or given. */
  readonly observed: boolean;
  /** Fixed-point iterations used to find p (0 if given or r₂₁ = r₃₂). */
  readonly iterations: number;
  /** r₂₁ = h₂/h₁. */
  readonly ratio21: number;
  /** r₃₂ = h₃/h₂ (undefined for two grids). */
  readonly ratio32: number | undefined;
  /** ε₂₁ = φ₂ − φ₁. */
  readonly change21: number;
  /** ε₃₂ = φ₃ − φ₂ (undefined for two grids). */
  readonly change32: number | undefined;
  /** φ_ext²¹. */
  readonly extrapolated: number;
  /** φ_ext³² (undefined for two grids). */
  readonly extrapolated32: number | undefined;
  /** e_a²¹ (a fraction, not a percentage). */
  readonly approximateError: number;
  /** e_ext²¹ (a fraction). */
  readonly extrapolatedError: number;
  /** GCI_fine²¹ (a fraction). */
  readonly gciFine: number;
  /** The safety factor F_s used. */
  readonly safetyFactor: number;
  /** Convergence type from R = ε₂₁/ε₃₂: 'monotone' 0 < R < 1, 'oscillatory' −1 < R < 0, 'divergent' |R| ≥ 1 ('assumed' for two grids, where it cannot be seen). */
  readonly convergence: 'monotone' | 'oscillatory' | 'divergent' | 'assumed';
  /** True when s = sign(ε₃₂/ε₂₁) < 0: the change flips sign between the pairs (converging or not). */
  readonly oscillatory: boolean;
  /** True when |R| ≥ 1: the change does not shrink on refinement (monotone or oscillatory divergence). */
  readonly divergent: boolean;
}

/** What {@link gridConvergenceIndex} needs besides the values. */
export interface GciOptions {
  /** The scheme's order p: required for two grids, ignored (observed instead) for three. */
  readonly order?: number;
  /** F_s (default 1.25 for three grids, 3 for two). */
  readonly safetyFactor?: number;
}

/**
 * Representative spacing h = (V/N)^{1/D} of a grid of N cells (or nodes) in
 * D dimensions over a domain of size V.
 *
 * @param cells - N > 0
 * @param dimension - D: 1, 2 or 3
 * @param size - V (default 1)
 * @returns h
 * @throws InvalidOptionError for N or V not finite and > 0, or D not 1–3
 * @example representativeSpacing(18000, 2) // 0.00745… (= 1/√18000)
 */
export function representativeSpacing(cells: number, dimension: 1 | 2 | 3, size = 1): number {
  if (!(Number.isFinite(cells) && cells > 0)) throw new InvalidOptionError('cells', `${cells}; give a count > 0`);
  if (dimension !== 1 && dimension !== 2 && dimension !== 3) throw new InvalidOptionError('dimension', `${String(dimension)}; use 1, 2 or 3`);
  if (!(Number.isFinite(size) && size > 0)) throw new InvalidOptionError('size', `${size}; give a finite size > 0`);
  return (size / cells) ** (1 / dimension);
}

/**
 * The Grid Convergence Index of the finest of two or three solutions,
 * with the extrapolated value, relative errors and convergence type
 * (module formulas).
 *
 * Accuracy: the formulas are evaluated to round-off; as an error *band*
 * the GCI with F_s = 1.25 is meant to bracket the true error with about 95 %
 * confidence in the asymptotic range (Roache 1994).
 *
 * @param values - φ₁, φ₂ (, φ₃), fine first; φ₁ and φ_ext must be ≠ 0 for the relative errors
 * @param spacings - h₁ < h₂ (< h₃), ratio ≥ 1.1 each
 * @param options - the order (two grids), the safety factor
 * @returns the index and its ingredients
 * @throws InvalidOptionError for two grids without an order, a bad safety factor, or φ₁ = 0;
 *   the errors of `apparentOrder` for three grids
 * @example gridConvergenceIndex([1.01, 1.04, 1.16], [1, 2, 4]).gciFine // 0.012376… (φ = 1 + 0.01h², p = 2)
 */
export function gridConvergenceIndex(values: readonly number[], spacings: readonly number[], options: Readonly<GciOptions> = {}): GridConvergence {
  const ratios = checkLevels(values, spacings, 2, 3, 'the Grid Convergence Index');
  const three = values.length === 3;
  const fs = options.safetyFactor ?? (three ? 1.25 : 3);
  if (!(Number.isFinite(fs) && fs >= 1)) throw new InvalidOptionError('safetyFactor', `${fs}; give a finite factor ≥ 1 (1.25 for three grids, 3 for two)`);
  const [phi1, phi2] = values as [number, number];
  if (phi1 === 0) throw new InvalidOptionError('values[0]', 'φ₁ = 0, so relative errors are undefined; shift the quantity to a nonzero reference or report absolute errors');
  let p: number;
  let iterations = 0;
  let observed = false;
  if (three) {
    const a = apparentOrder(values, spacings);
    p = a.order;
    iterations = a.iterations;
    observed = true;
  } else {
    if (options.order === undefined) throw new InvalidOptionError('order', 'two grids need the order p of the scheme; give it, or a third, coarser grid to observe it');
    if (!(Number.isFinite(options.order) && options.order > 0)) throw new InvalidOptionError('order', `${options.order}; give a finite order > 0`);
    p = options.order;
  }
  const r21 = ratios[0]!;
  const r32 = three ? ratios[1]! : undefined;
  const e21 = phi2 - phi1;
  const e32 = three ? values[2]! - phi2 : undefined;
  const r21p = r21 ** p;
  const ext = (r21p * phi1 - phi2) / (r21p - 1);
  const ext32 = three ? (r32! ** p * phi2 - values[2]!) / (r32! ** p - 1) : undefined;
  const ea = Math.abs((phi1 - phi2) / phi1);
  const eext = Math.abs((ext - phi1) / ext);
  const gci = (fs * ea) / (r21p - 1);
  let convergence: GridConvergence['convergence'] = 'assumed';
  let oscillatory = false;
  if (three) {
    const R = e21 / e32!;
    oscillatory = R < 0;
    convergence = Math.abs(R) >= 1 ? 'divergent' : oscillatory ? 'oscillatory' : 'monotone';
  }
  return Object.freeze({
    order: p,
    observed,
    iterations,
    ratio21: r21,
    ratio32: r32,
    change21: e21,
    change32: e32,
    extrapolated: ext,
    extrapolated32: ext32,
    approximateError: ea,
    extrapolatedError: eext,
    gciFine: gci,
    safetyFactor: fs,
    convergence,
    oscillatory,
    divergent: convergence === 'divergent',
  });
}
