/**
 * Convergence studies: run a computation on three or more levels of
 * refinement, measure its error against an exact solution on each, and
 * report the observed order of accuracy.
 *
 * Refinement is in space (the level's measure is the spacing h), in time
 * (the measure is the step dt), or in both (the measure is h; the caller ties
 * dt to it, e.g. dt = λh or dt = λh²). Levels are ordered coarse to fine and
 * successive measures shrink by a ratio r ≥ 1.1; ratios may differ.
 *
 * For each norm (L2 with trapezoidal weights, L∞, and optionally the error
 * |Q − Q_exact| of a derived scalar Q):
 * - observed order of each successive pair: p̂ = ln(e₁/e₂) / ln(h₁/h₂);
 * - least-squares order over all levels: the slope p of ln e = ln C + p ln h,
 *   with its standard error s·(Σ(ln hᵢ − mean)²)^{−1/2},
 *   s² = Σ residual² / (n − 2) (0 for an exact fit);
 * - asymptotic-range flag: the errors fall from level to level and the last
 *   two pair orders agree to within a relative tolerance (default 0.1), so
 *   the leading error term dominates on the finest levels.
 *
 * Sources: Roache, P. J. (1998). Verification and Validation in
 * Computational Science and Engineering. Hermosa, ch. 5; Oberkampf, W. L. &
 * Roy, C. J. (2010). Verification and Validation in Scientific Computing.
 * Cambridge, §5.4 and §8.3.
 *
 * @module
 */
import {
  InvalidOptionError, RefinementRatioError, TooFewLevelsError, UnusableErrorNormError,
} from '../errors.js';
import type { Grid } from '../grid/index.js';
import { type ExactValues, type NodalValues, errorNorms } from './norms.js';

/** A derived scalar of a level (a heat flux, a centre value) and its exact value. */
export interface QuantityPair {
  /** The computed value. */
  readonly computed: number;
  /** The exact value. */
  readonly exact: number;
}

/** The norms a study can report. */
export type NormName = 'l2' | 'linf' | 'quantity';

/** How the levels of a study are refined. */
export type Refinement =
  | {
      /** Refine the spacing only (time is absent or fixed). */
      readonly refine: 'space';
      /** Spacing h of each level, coarse first. */
      readonly spacings: readonly number[];
    }
  | {
      /** Refine the time step only (the spacing is fixed, and fine enough). */
      readonly refine: 'time';
      /** Step dt of each level, coarse first. */
      readonly timeSteps: readonly number[];
    }
  | {
      /** Refine spacing and time step together; orders are reported against h. */
      readonly refine: 'both';
      /** Spacing h of each level, coarse first. */
      readonly spacings: readonly number[];
      /** The step tied to the spacing, e.g. `(h) => 0.4 * h * h`. */
      readonly timeStep: (h: number) => number;
    };

/** What a study passes to the caller's computation. */
export interface StudyLevel {
  /** Index of the level, 0 the coarsest. */
  readonly index: number;
  /** The spacing h (space and both), or undefined in a time study. */
  readonly spacing: number | undefined;
  /** The time step dt (time and both), or undefined in a space study. */
  readonly timeStep: number | undefined;
}

/** A level's outcome as a solution: the library computes the norms. */
export interface LevelSolution {
  /** The grid of the level. */
  readonly grid: Grid;
  /** Computed nodal values (flat in field order, or a field). */
  readonly computed: NodalValues;
  /** Exact nodal values, or a function of the node coordinates. */
  readonly exact: ExactValues;
  /** Optional derived scalar (a flux, an integral, a probe value) and its exact value. */
  readonly quantity?: QuantityPair;
}

/** A level's outcome as error values the caller measured. */
export interface LevelErrors {
  /** L2 error. */
  readonly l2?: number;
  /** L∞ error. */
  readonly linf?: number;
  /** Error of a derived scalar. */
  readonly quantity?: number;
}

/** What the caller's computation returns for one level. */
export type LevelOutcome = LevelSolution | LevelErrors;

/** One level of a finished study. */
export interface LevelResult extends StudyLevel {
  /** The measure orders are reported against: h (space, both) or dt (time). */
  readonly measure: number;
  /** Error in each reported norm. */
  readonly errors: Readonly<Partial<Record<NormName, number>>>;
}

/** Observed orders between two successive levels. */
export interface LevelPair {
  /** Index of the coarser level. */
  readonly coarse: number;
  /** Index of the finer level. */
  readonly fine: number;
  /** Refinement ratio measure(coarse) / measure(fine). */
  readonly ratio: number;
  /** p̂ = ln(e_coarse/e_fine) / ln(ratio) per norm. */
  readonly orders: Readonly<Partial<Record<NormName, number>>>;
}

/** Least-squares fit ln e = ln C + p ln h over all levels. */
export interface OrderFit {
  /** The slope p. */
  readonly order: number;
  /** Standard error of p (0 for an exact fit). */
  readonly standardError: number;
  /** The constant C of e ≈ C·hᵖ. */
  readonly constant: number;
}

/** A finished convergence study (plain data; see `studyTable`, `studyCsv`, `studyPlot`). */
export interface ConvergenceStudy {
  /** What was refined. */
  readonly refine: 'space' | 'time' | 'both';
  /** The norms reported, in the order l2, linf, quantity. */
  readonly norms: readonly NormName[];
  /** The levels, coarse first. */
  readonly levels: readonly LevelResult[];
  /** Observed orders of successive pairs. */
  readonly pairs: readonly LevelPair[];
  /** Least-squares order per norm. */
  readonly fits: Readonly<Partial<Record<NormName, OrderFit>>>;
  /** Asymptotic-range flag per norm (module doc). */
  readonly asymptotic: Readonly<Partial<Record<NormName, boolean>>>;
}

/** What {@link convergenceStudy} does besides refining. */
export interface StudyOptions {
  /** Relative agreement of the last two pair orders that counts as asymptotic (default 0.1). */
  readonly asymptoticTolerance?: number;
}

/** Smallest refinement ratio accepted between successive levels. */
export const MIN_REFINEMENT_RATIO = 1.1;

const ALL_NORMS: readonly NormName[] = ['l2', 'linf', 'quantity'];

/**
 * Spacings (to − from)/cells for a list of cell counts, for a space or both study.
 *
 * @param length - domain length to − from
 * @param cells - cell counts, coarse first
 * @returns the spacings
 * @throws InvalidOptionError unless length is finite and > 0 and every count a whole number ≥ 1
 * @example spacingsFor(1, [4, 8, 16]) // [0.25, 0.125, 0.0625]
 */
export function spacingsFor(length: number, cells: readonly number[]): number[] {
  if (!(Number.isFinite(length) && length > 0)) throw new InvalidOptionError('length', `${length}; give a finite number > 0`);
  return cells.map((n, i) => {
    if (!(Number.isSafeInteger(n) && n >= 1)) throw new InvalidOptionError(`cells[${i}]`, `${n}; give whole numbers ≥ 1`);
    return length / n;
  });
}

/** The levels' measures, checked ordered with ratio ≥ 1.1. */
function measuresOf(r: Readonly<Refinement>): readonly number[] {
  let list: readonly number[];
  switch (r.refine) {
    case 'space':
    case 'both':
      list = r.spacings;
      break;
    case 'time':
      list = r.timeSteps;
      break;
    default: {
      const unreachable: never = r;
      throw new InvalidOptionError('refine', `${JSON.stringify((unreachable as { refine?: unknown }).refine)} is not a refinement; use "space", "time" or "both"`);
    }
  }
  if (!Array.isArray(list)) throw new InvalidOptionError(r.refine === 'time' ? 'timeSteps' : 'spacings', 'give an array of numbers, coarse first');
  if (list.length < 3) throw new TooFewLevelsError(list.length, 3, 'a convergence study');
  for (let i = 0; i < list.length; i++) {
    const h = list[i]!;
    if (!(Number.isFinite(h) && h > 0)) throw new RefinementRatioError(Math.max(i, 1), NaN, MIN_REFINEMENT_RATIO);
    if (i > 0) {
      const ratio = list[i - 1]! / h;
      if (!(ratio >= MIN_REFINEMENT_RATIO)) throw new RefinementRatioError(i, ratio, MIN_REFINEMENT_RATIO);
    }
  }
  return list;
}

/**
 * Least-squares slope p of ln e = ln C + p ln h over all levels, with its
 * standard error s·(Σ(ln hᵢ − mean)²)^{−1/2}, s² = Σ residual²/(n − 2)
 * (0 when n = 2). Source: any regression text, e.g. Draper, N. R. & Smith, H.
 * (1998). Applied Regression Analysis, 3rd ed., Wiley, §1.4.
 *
 * @param measures - spacings (or steps) h, all > 0
 * @param errors - errors e, all > 0, one per measure
 * @returns slope, standard error and constant C
 * @example fitOrder([0.1, 0.05, 0.025], [0.01, 0.0025, 0.000625]).order // 2 (to round-off)
 */
export function fitOrder(measures: readonly number[], errors: readonly number[]): OrderFit {
  const n = measures.length;
  const x = measures.map(Math.log);
  const y = errors.map(Math.log);
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - mx) ** 2;
    sxy += (x[i]! - mx) * (y[i]! - my);
  }
  const p = sxy / sxx;
  const c = my - p * mx;
  let ssr = 0;
  for (let i = 0; i < n; i++) ssr += (y[i]! - c - p * x[i]!) ** 2;
  const se = n > 2 ? Math.sqrt(ssr / (n - 2) / sxx) : 0;
  return { order: p, standardError: se, constant: Math.exp(c) };
}

/**
 * Runs `run` on every level and reports errors, observed orders, the
 * least-squares order and the asymptotic-range flag (module formulas).
 *
 * Accuracy of the reported orders: exact arithmetic on the errors given;
 * they measure the scheme only as far as the errors are free of round-off
 * and solver tolerance (keep both ≪ the finest truncation error).
 *
 * @param run - computes one level: returns its grid, computed and exact
 *   values (and optionally a derived scalar), or error values it measured
 * @param refinement - what is refined and the levels, coarse first (≥ 3, ratio ≥ 1.1)
 * @param options - asymptotic tolerance
 * @returns the study
 * @throws TooFewLevelsError, RefinementRatioError for bad levels;
 *   UnusableErrorNormError for an error that is zero, negative or not finite;
 *   InvalidOptionError if the levels report different norms or a dt mapping gives a bad step
 * @example
 * ```ts
 * const s = convergenceStudy(({ spacing }) => ({ linf: 3 * spacing! ** 2 }), { refine: 'space', spacings: [0.1, 0.05, 0.025] });
 * s.fits.linf!.order // 2 (to round-off)
 * ```
 */
export function convergenceStudy(
  run: (level: StudyLevel) => LevelOutcome,
  refinement: Readonly<Refinement>,
  options: Readonly<StudyOptions> = {},
): ConvergenceStudy {
  if (typeof run !== 'function') throw new InvalidOptionError('run', 'give a function of the level that returns its solution or errors');
  const tol = options.asymptoticTolerance ?? 0.1;
  if (!(Number.isFinite(tol) && tol > 0)) throw new InvalidOptionError('asymptoticTolerance', `${tol}; give a finite number > 0`);
  const measures = measuresOf(refinement);
  const levels: LevelResult[] = [];
  let norms: NormName[] | undefined;
  for (let index = 0; index < measures.length; index++) {
    const m = measures[index]!;
    let spacing: number | undefined;
    let timeStep: number | undefined;
    if (refinement.refine === 'time') timeStep = m;
    else spacing = m;
    if (refinement.refine === 'both') {
      timeStep = refinement.timeStep(m);
      if (!(Number.isFinite(timeStep) && timeStep > 0)) {
        throw new InvalidOptionError('timeStep', `maps h = ${m} to dt = ${timeStep}; it must give a finite step > 0`);
      }
    }
    const level: StudyLevel = Object.freeze({ index, spacing, timeStep });
    const out = run(level);
    const errors: Partial<Record<NormName, number>> = {};
    if (out !== null && typeof out === 'object' && 'grid' in out) {
      const e = errorNorms(out.grid, out.computed, out.exact);
      errors.l2 = e.l2;
      errors.linf = e.linf;
      if (out.quantity !== undefined) errors.quantity = Math.abs(out.quantity.computed - out.quantity.exact);
    } else if (out !== null && typeof out === 'object') {
      for (const n of ALL_NORMS) if ((out as LevelErrors)[n] !== undefined) errors[n] = (out as LevelErrors)[n];
    } else {
      throw new InvalidOptionError('run', `level ${index} returned ${String(out)}; return { grid, computed, exact } or { l2, linf, quantity }`);
    }
    const present = ALL_NORMS.filter((n) => errors[n] !== undefined);
    if (present.length === 0) throw new InvalidOptionError('run', `level ${index} reported no error; return at least one of l2, linf, quantity`);
    if (norms === undefined) norms = present;
    else if (present.join() !== norms.join()) {
      throw new InvalidOptionError('run', `level ${index} reports ${present.join(', ')} but level 0 reported ${norms.join(', ')}; report the same norms on every level`);
    }
    for (const n of present) {
      const v = errors[n]!;
      if (!(Number.isFinite(v) && v > 0)) throw new UnusableErrorNormError(n, index, v);
    }
    levels.push(Object.freeze({ ...level, measure: m, errors: Object.freeze(errors) }));
  }
  const used = norms!;
  const pairs: LevelPair[] = [];
  for (let i = 1; i < levels.length; i++) {
    const ratio = levels[i - 1]!.measure / levels[i]!.measure;
    const orders: Partial<Record<NormName, number>> = {};
    for (const n of used) orders[n] = Math.log(levels[i - 1]!.errors[n]! / levels[i]!.errors[n]!) / Math.log(ratio);
    pairs.push(Object.freeze({ coarse: i - 1, fine: i, ratio, orders: Object.freeze(orders) }));
  }
  const fits: Partial<Record<NormName, OrderFit>> = {};
  const asymptotic: Partial<Record<NormName, boolean>> = {};
  for (const n of used) {
    fits[n] = Object.freeze(fitOrder(levels.map((l) => l.measure), levels.map((l) => l.errors[n]!)));
    const falling = pairs.every((p) => p.orders[n]! > 0);
    const a = pairs[pairs.length - 1]!.orders[n]!;
    const b = pairs[pairs.length - 2]!.orders[n]!;
    asymptotic[n] = falling && Math.abs(a - b) <= tol * Math.abs(a);
  }
  return Object.freeze({
    refine: refinement.refine,
    norms: Object.freeze(used),
    levels: Object.freeze(levels),
    pairs: Object.freeze(pairs),
    fits: Object.freeze(fits),
    asymptotic: Object.freeze(asymptotic),
  });
}
