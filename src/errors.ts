/**
 * Errors thrown by quadrille. Every failure has its own class with a stable
 * `code`, the offending numbers as fields, and a message that says what was
 * wrong and what would be right.
 *
 * @module
 */

/** Base class of every error quadrille throws; catch this to catch them all. */
export abstract class QuadrilleError extends Error {
  /** Stable, machine-readable identifier of the kind of failure. */
  abstract readonly code: string;

  /** @param message - what was wrong and what would be right */
  constructor(message: string) {
    super(message);
    this.name = new.target.name;
  }
}

/** A derivative order that is negative, fractional or not a number. */
export class InvalidDerivativeError extends QuadrilleError {
  /** Always `'INVALID_DERIVATIVE'`. */
  readonly code = 'INVALID_DERIVATIVE';
  /**
   * @param derivative - the value that was passed
   * @param rule - what is allowed here, and the fix
   */
  constructor(readonly derivative: number, rule = 'use a whole number ≥ 0 (1 for d/dx, 2 for d²/dx², …)') {
    super(`derivative = ${derivative} is not allowed; ${rule}`);
  }
}

/** An accuracy order p that is not a positive whole number, or odd where it must be even. */
export class InvalidAccuracyError extends QuadrilleError {
  /** Always `'INVALID_ACCURACY'`. */
  readonly code = 'INVALID_ACCURACY';
  /**
   * @param accuracy - the value that was passed
   * @param why - the rule it broke and the fix
   */
  constructor(readonly accuracy: number, why: string) {
    super(`accuracy = ${accuracy}: ${why}`);
  }
}

/** Fewer nodes than a stencil of the requested derivative needs. */
export class TooFewNodesError extends QuadrilleError {
  /** Always `'TOO_FEW_NODES'`. */
  readonly code = 'TOO_FEW_NODES';
  /**
   * @param count - nodes given
   * @param needed - nodes needed at least
   * @param what - what they were needed for
   */
  constructor(readonly count: number, readonly needed: number, what: string) {
    super(`${count} node(s) given for ${what}; at least ${needed} are needed`);
  }
}

/** Two stencil nodes at the same position. */
export class DuplicateNodesError extends QuadrilleError {
  /** Always `'DUPLICATE_NODES'`. */
  readonly code = 'DUPLICATE_NODES';
  /**
   * @param i - index of the first of the pair
   * @param j - index of the second of the pair
   * @param value - the shared position
   */
  constructor(readonly i: number, readonly j: number, readonly value: string) {
    super(`nodes[${i}] and nodes[${j}] are both ${value}; stencil nodes must be distinct`);
  }
}

/** A NaN or infinite value where a finite number is required. */
export class NonFiniteValueError extends QuadrilleError {
  /** Always `'NON_FINITE'`. */
  readonly code = 'NON_FINITE';
  /**
   * @param what - name of the input, with the index where it applies
   * @param value - the offending value
   */
  constructor(readonly what: string, readonly value: number) {
    super(`${what} is ${value}; a finite number is required`);
  }
}

/** Stencil weights too large to represent in float64. */
export class WeightOverflowError extends QuadrilleError {
  /** Always `'WEIGHT_OVERFLOW'`. */
  readonly code = 'WEIGHT_OVERFLOW';
  /**
   * @param derivative - derivative order requested
   * @param count - number of nodes
   */
  constructor(readonly derivative: number, readonly count: number) {
    super(
      `weights of derivative ${derivative} on ${count} nodes overflow float64; ` +
        'use fewer nodes, nodes closer together (scale them to unit spacing), or exactWeights',
    );
  }
}

/** A value that cannot be read as an exact rational number. */
export class InvalidRationalError extends QuadrilleError {
  /** Always `'INVALID_RATIONAL'`. */
  readonly code = 'INVALID_RATIONAL';
  /** @param input - the text or number that could not be read */
  constructor(readonly input: string) {
    super(
      `cannot read ${JSON.stringify(input)} as an exact rational; ` +
        'use an integer, a finite decimal (0.1), a fraction string ("1/3") or a bigint',
    );
  }
}

/** A stencil offset that is not a whole number, or a repeated offset. */
export class InvalidOffsetsError extends QuadrilleError {
  /** Always `'INVALID_OFFSETS'`. */
  readonly code = 'INVALID_OFFSETS';
  /** @param why - what is wrong with the offsets and the fix */
  constructor(why: string) {
    super(why);
  }
}

/** A grid spacing that is zero, negative or not finite. */
export class InvalidSpacingError extends QuadrilleError {
  /** Always `'INVALID_SPACING'`. */
  readonly code = 'INVALID_SPACING';
  /**
   * @param parameter - the parameter (`dx`, `dt`, …)
   * @param value - the offending value
   */
  constructor(readonly parameter: string, readonly value: number) {
    super(`${parameter} = ${value} is not a valid spacing; use a finite number > 0`);
  }
}

/** Arrays whose lengths or shapes do not fit together. */
export class ShapeMismatchError extends QuadrilleError {
  /** Always `'SHAPE_MISMATCH'`. */
  readonly code = 'SHAPE_MISMATCH';
  /** @param why - which shapes disagree, with their sizes, and the fix */
  constructor(why: string) {
    super(why);
  }
}

/** Node coordinates that do not increase strictly. */
export class NonIncreasingNodesError extends QuadrilleError {
  /** Always `'NON_INCREASING_NODES'`. */
  readonly code = 'NON_INCREASING_NODES';
  /**
   * @param index - first index i with x[i] ≤ x[i − 1]
   * @param previous - x[i − 1]
   * @param value - x[i]
   */
  constructor(readonly index: number, readonly previous: number, readonly value: number) {
    super(`x[${index}] = ${value} does not exceed x[${index - 1}] = ${previous}; node coordinates must increase strictly`);
  }
}

/** A cell count that is not a whole number ≥ 1. */
export class InvalidCellsError extends QuadrilleError {
  /** Always `'INVALID_CELLS'`. */
  readonly code = 'INVALID_CELLS';
  /**
   * @param where - the axis or helper the count was given to (`axis x`, `tanhAxis`, …)
   * @param cells - the value that was passed
   */
  constructor(readonly where: string, readonly cells: number) {
    super(
      `${where}: cells = ${cells} is not allowed; use a whole number ≥ 1 ` +
        '(n cells give n + 1 nodes, or n stored nodes on a periodic axis)',
    );
  }
}

/** Axis ends that are not an interval: `to` not above `from`. */
export class InvalidIntervalError extends QuadrilleError {
  /** Always `'INVALID_INTERVAL'`. */
  readonly code = 'INVALID_INTERVAL';
  /**
   * @param where - the axis or helper the ends were given to
   * @param from - the lower end that was passed
   * @param to - the upper end that was passed
   */
  constructor(readonly where: string, readonly from: number, readonly to: number) {
    super(`${where}: from = ${from}, to = ${to} is not an interval; use to > from`);
  }
}

/** An axis name other than `x`, `y` or `z`. */
export class UnknownAxisError extends QuadrilleError {
  /** Always `'UNKNOWN_AXIS'`. */
  readonly code = 'UNKNOWN_AXIS';
  /** @param axis - the name that was passed */
  constructor(readonly axis: string) {
    super(`axis ${JSON.stringify(axis)} is not known; a grid has axes named x, y and z`);
  }
}

/** An axis that is needed but absent: a gap in x, y, z, or an axis the grid lacks. */
export class MissingAxisError extends QuadrilleError {
  /** Always `'MISSING_AXIS'`. */
  readonly code = 'MISSING_AXIS';
  /**
   * @param axis - the absent axis
   * @param why - what needed it, and the fix
   */
  constructor(readonly axis: string, why: string) {
    super(`axis ${axis} is missing: ${why}`);
  }
}

/** An axis description that is neither uniform (`from`, `to`, `cells`) nor stretched (`nodes`). */
export class InvalidAxisSpecError extends QuadrilleError {
  /** Always `'INVALID_AXIS_SPEC'`. */
  readonly code = 'INVALID_AXIS_SPEC';
  /**
   * @param axis - the axis described
   * @param why - what is wrong with the description and the fix
   */
  constructor(readonly axis: string, why: string) {
    super(`axis ${axis}: ${why}`);
  }
}

/** A clustering parameter (spacing ratio, tanh stretching β) out of range or too strong for float64. */
export class InvalidClusteringError extends QuadrilleError {
  /** Always `'INVALID_CLUSTERING'`. */
  readonly code = 'INVALID_CLUSTERING';
  /**
   * @param parameter - the parameter (`ratio`, `beta`)
   * @param value - the offending value
   * @param why - the rule it broke and the fix
   */
  constructor(readonly parameter: string, readonly value: number, why: string) {
    super(`${parameter} = ${value}: ${why}`);
  }
}

/** A face name that is not one of `xmin`, `xmax`, `ymin`, `ymax`, `zmin`, `zmax`. */
export class UnknownFaceError extends QuadrilleError {
  /** Always `'UNKNOWN_FACE'`. */
  readonly code = 'UNKNOWN_FACE';
  /** @param face - the name that was passed */
  constructor(readonly face: string) {
    super(
      `face ${JSON.stringify(face)} is not known; use xmin, xmax, ymin, ymax, zmin or zmax ` +
        '(the boundary at an axis\'s `from` or `to` end)',
    );
  }
}

/** A boundary face asked for on a periodic axis, which has no boundary. */
export class PeriodicFaceError extends QuadrilleError {
  /** Always `'PERIODIC_FACE'`. */
  readonly code = 'PERIODIC_FACE';
  /**
   * @param face - the face asked for
   * @param axis - its axis, which is periodic
   */
  constructor(readonly face: string, readonly axis: string) {
    super(
      `face ${face} does not exist: axis ${axis} is periodic, so its ends are one and the same ` +
        'interior node line; ask only for faces of non-periodic axes',
    );
  }
}

/** A value passed as a field that is not an ndarray view over a Float64Array. */
export class InvalidFieldError extends QuadrilleError {
  /** Always `'INVALID_FIELD'`. */
  readonly code = 'INVALID_FIELD';
  /** @param why - what was passed instead, and the fix */
  constructor(why: string) {
    super(why);
  }
}

/** A matrix declared or required to be symmetric that is not. */
export class NotSymmetricError extends QuadrilleError {
  /** Always `'NOT_SYMMETRIC'`. */
  readonly code = 'NOT_SYMMETRIC';
  /** @param what - which matrix, and why symmetry was needed */
  constructor(what: string) {
    super(`${what} is not symmetric (A ≠ Aᵀ); declare it nonsymmetric, or use a solver for nonsymmetric systems`);
  }
}

/** An option that is missing, of the wrong kind, or outside its allowed set. */
export class InvalidOptionError extends QuadrilleError {
  /** Always `'INVALID_OPTION'`. */
  readonly code = 'INVALID_OPTION';
  /**
   * @param option - the option's name
   * @param why - what was wrong and the fix
   */
  constructor(readonly option: string, why: string) {
    super(`${option}: ${why}`);
  }
}

/** Two conditions given for one boundary face. */
export class DuplicateConditionError extends QuadrilleError {
  /** Always `'DUPLICATE_CONDITION'`. */
  readonly code = 'DUPLICATE_CONDITION';
  /** @param face - the face named twice */
  constructor(readonly face: string) {
    super(`face ${face} has two conditions; give exactly one condition per face`);
  }
}

/** A boundary face left without a condition. */
export class MissingConditionError extends QuadrilleError {
  /** Always `'MISSING_CONDITION'`. */
  readonly code = 'MISSING_CONDITION';
  /** @param faces - the faces without a condition */
  constructor(readonly faces: readonly string[]) {
    super(
      `no condition for face(s) ${faces.join(', ')}; give each a dirichlet, neumann or robin condition ` +
        '(an insulated face is { kind: "neumann", flux: 0 })',
    );
  }
}

/** A material or transfer coefficient that is zero, negative or not finite. */
export class InvalidCoefficientError extends QuadrilleError {
  /** Always `'INVALID_COEFFICIENT'`. */
  readonly code = 'INVALID_COEFFICIENT';
  /**
   * @param what - the coefficient and where, e.g. `conductivity at (0.5, 0.25)`
   * @param value - the offending value
   */
  constructor(readonly what: string, readonly value: number) {
    super(`${what} is ${value}; it must be a finite number > 0`);
  }
}

/** A matrix found singular (a zero pivot) during a direct factorisation. */
export class SingularMatrixError extends QuadrilleError {
  /** Always `'SINGULAR_MATRIX'`. */
  readonly code = 'SINGULAR_MATRIX';
  /**
   * @param index - the row/column where the pivot vanished
   * @param pivot - the pivot's value
   * @param hint - what usually causes it here, and the fix
   */
  constructor(readonly index: number, readonly pivot: number, hint: string) {
    super(`the matrix is singular to working precision: pivot ${pivot} at row ${index}; ${hint}`);
  }
}

/** An iterative solver that stopped at its iteration cap (or broke down) above its tolerance. */
export class NotConvergedError extends QuadrilleError {
  /** Always `'NOT_CONVERGED'`. */
  readonly code = 'NOT_CONVERGED';
  /**
   * @param method - the solver
   * @param iterations - iterations done
   * @param residual - final relative residual ‖b − Ax‖/‖b‖
   * @param tolerance - the requested relative residual
   * @param history - relative residual after each iteration (index 0: the start)
   * @param why - what stopped it and what usually helps
   */
  constructor(
    readonly method: string,
    readonly iterations: number,
    readonly residual: number,
    readonly tolerance: number,
    readonly history: Float64Array,
    why: string,
  ) {
    super(`${method} stopped after ${iterations} iteration(s) at relative residual ${residual.toExponential(3)} > ${tolerance}: ${why}`);
  }
}

/** Pure-flux data whose sources and boundary flows do not balance. */
export class IncompatibleFluxError extends QuadrilleError {
  /** Always `'INCOMPATIBLE_FLUX'`. */
  readonly code = 'INCOMPATIBLE_FLUX';
  /**
   * @param imbalance - net heat gain of the data (source minus outflow, W or per unit depth)
   * @param scale - sum of the magnitudes of all terms
   * @param limit - the relative imbalance accepted
   */
  constructor(readonly imbalance: number, readonly scale: number, readonly limit: number) {
    super(
      `every face prescribes a flux, so a steady state needs the sources to balance the boundary flows, ` +
        `but they miss by ${imbalance.toExponential(3)} (relative ${(Math.abs(imbalance) / scale).toExponential(2)} > ${limit}); ` +
        'fix the data, prescribe a value or convection on some face, or raise compatibilityTolerance',
    );
  }
}

/** An explicit time step above the stability limit. */
export class StepTooLargeError extends QuadrilleError {
  /** Always `'STEP_TOO_LARGE'`. */
  readonly code = 'STEP_TOO_LARGE';
  /**
   * @param dt - the step asked for (s)
   * @param dtMax - the largest stable step (s)
   * @param scheme - the explicit scheme
   * @param why - optional: which bound binds and a further fix, e.g. the advective limit and upwind differencing
   */
  constructor(readonly dt: number, readonly dtMax: number, readonly scheme: string, why?: string) {
    super(
      `dt = ${dt} s exceeds the ${scheme} stability limit ${dtMax.toPrecision(6)} s${why === undefined ? '' : ` (${why})`}; ` +
        `use dt ≤ ${dtMax.toPrecision(6)} s or an implicit scheme (backward-euler, crank-nicolson), or set stabilityGuard: false for an experiment`,
    );
  }
}

/** A solution that became NaN or infinite during a run. */
export class BlowUpError extends QuadrilleError {
  /** Always `'BLOW_UP'`. */
  readonly code = 'BLOW_UP';
  /**
   * @param step - the step at whose end the first non-finite value appeared
   * @param time - the time reached by that step (s)
   */
  constructor(readonly step: number, readonly time: number) {
    super(
      `the solution became non-finite at step ${step} (t = ${time} s); reduce dt below the stability limit, ` +
        'use an implicit scheme, or check the data for NaN',
    );
  }
}

/** A convergence study or extrapolation given fewer levels than it needs. */
export class TooFewLevelsError extends QuadrilleError {
  /** Always `'TOO_FEW_LEVELS'`. */
  readonly code = 'TOO_FEW_LEVELS';
  /**
   * @param count - levels given
   * @param needed - levels needed at least
   * @param what - what needed them
   */
  constructor(readonly count: number, readonly needed: number, what: string) {
    super(`${what} needs at least ${needed} levels of refinement, got ${count}; add finer or coarser levels`);
  }
}

/** Two successive levels of a study whose spacings do not shrink by the minimum refinement ratio. */
export class RefinementRatioError extends QuadrilleError {
  /** Always `'REFINEMENT_RATIO'`. */
  readonly code = 'REFINEMENT_RATIO';
  /**
   * @param index - index of the finer level of the pair (levels ordered coarse to fine)
   * @param ratio - coarse spacing over fine spacing of the pair (NaN if a spacing is not a positive number)
   * @param minimum - the smallest ratio accepted
   */
  constructor(readonly index: number, readonly ratio: number, readonly minimum: number) {
    super(
      `levels ${index - 1} → ${index} refine by a ratio of ${ratio}; each level's spacing must be a finite number > 0 ` +
        `and at least ${minimum} times smaller than the one before (order them coarse to fine, e.g. h, h/2, h/4)`,
    );
  }
}

/** An error norm that is zero, negative or not finite, so its logarithm (and an observed order) does not exist. */
export class UnusableErrorNormError extends QuadrilleError {
  /** Always `'UNUSABLE_ERROR_NORM'`. */
  readonly code = 'UNUSABLE_ERROR_NORM';
  /**
   * @param norm - the norm (`l2`, `linf`, `quantity`)
   * @param level - index of the level, coarse first
   * @param value - the offending value
   */
  constructor(readonly norm: string, readonly level: number, readonly value: number) {
    super(
      `the ${norm} error on level ${level} is ${value}; an observed order needs errors that are finite and > 0 ` +
        '(an exact result means the scheme reproduces this solution: pick one it cannot represent exactly)',
    );
  }
}

/** A convergence study whose observed order misses the expected order by more than the tolerance. */
export class OrderNotReachedError extends QuadrilleError {
  /** Always `'ORDER_NOT_REACHED'`. */
  readonly code = 'ORDER_NOT_REACHED';
  /**
   * @param norm - the norm checked
   * @param expected - the order the scheme promises
   * @param observed - the order measured
   * @param tolerance - the allowed |observed − expected|
   * @param table - the study as a markdown table, printed in the message
   */
  constructor(
    readonly norm: string,
    readonly expected: number,
    readonly observed: number,
    readonly tolerance: number,
    readonly table: string,
  ) {
    super(
      `observed order ${observed.toFixed(3)} in the ${norm} norm differs from the expected ${expected} by more than ${tolerance}; ` +
        `refine further if the errors are not yet asymptotic, or look for a lower-order term:\n${table}`,
    );
  }
}

/** A convergence study whose finest levels are not yet in the asymptotic range. */
export class NotAsymptoticError extends QuadrilleError {
  /** Always `'NOT_ASYMPTOTIC'`. */
  readonly code = 'NOT_ASYMPTOTIC';
  /**
   * @param norm - the norm checked
   * @param table - the study as a markdown table, printed in the message
   */
  constructor(readonly norm: string, readonly table: string) {
    super(
      `the ${norm} errors are not in the asymptotic range (the last two observed orders disagree, or the errors do not fall); ` +
        `add finer levels:\n${table}`,
    );
  }
}

/** The apparent order of three solutions could not be found (equal solutions, or the fixed-point iteration failed). */
export class ApparentOrderError extends QuadrilleError {
  /** Always `'APPARENT_ORDER_NOT_FOUND'`. */
  readonly code = 'APPARENT_ORDER_NOT_FOUND';
  /**
   * @param iterations - fixed-point iterations done
   * @param last - the last iterate of p (NaN if none)
   * @param why - what went wrong and the fix
   */
  constructor(readonly iterations: number, readonly last: number, why: string) {
    super(`apparent order not found after ${iterations} iteration(s) (last p = ${last}): ${why}`);
  }
}

/** A hyper-dual function evaluated outside its domain (log or sqrt of a non-positive number, division by zero). */
export class HyperDualDomainError extends QuadrilleError {
  /** Always `'HYPERDUAL_DOMAIN'`. */
  readonly code = 'HYPERDUAL_DOMAIN';
  /**
   * @param operation - the function (`log`, `sqrt`, `div`, `pow`)
   * @param value - the real part it was given
   */
  constructor(readonly operation: string, readonly value: number) {
    super(
      `${operation} of a hyper-dual number with real part ${value} has no finite derivatives; ` +
        'keep the manufactured solution inside the domain of its functions (e.g. log and sqrt of values > 0)',
    );
  }
}

/** A matrix row whose diagonal entry is missing, zero or not finite where a smoother divides by it. */
export class ZeroDiagonalError extends QuadrilleError {
  /** Always `'ZERO_DIAGONAL'`. */
  readonly code = 'ZERO_DIAGONAL';
  /**
   * @param row - the row (unknown) of the first such diagonal
   * @param value - its value (0 if the entry is not stored)
   * @param what - which matrix, e.g. `the fine-level matrix`
   */
  constructor(readonly row: number, readonly value: number, what: string) {
    super(
      `${what} has diagonal ${value} in row ${row}; Gauss–Seidel and Jacobi smoothing divide by the diagonal, ` +
        'so every row needs a finite nonzero diagonal (store an identity row for a prescribed value)',
    );
  }
}

/** Values to be written to a file that are NaN or ±Infinity, which the output formats cannot carry. */
export class NonFiniteOutputError extends QuadrilleError {
  /** Always `'NON_FINITE_OUTPUT'`. */
  readonly code = 'NON_FINITE_OUTPUT';
  /**
   * @param what - the data being written, e.g. `field "T"` or `matrix values`
   * @param count - how many values are not finite
   * @param index - index of the first, x first for a field (node [i, j, k]) or flat for an array
   * @param value - the first such value
   * @param where - the first position in words, with its coordinates where they apply
   * @param hint - the fix that applies to this output
   */
  constructor(
    readonly what: string,
    readonly count: number,
    readonly index: readonly number[],
    readonly value: number,
    where: string,
    hint = 'find where the non-finite values come from (a blow-up, 0/0 in a derived quantity) and write finite data',
  ) {
    super(`${what} holds ${count} non-finite value(s); the first is ${value} at ${where}; ${hint}`);
  }
}

/** A file that could not be written: the OS refused (missing directory, permissions, a directory at the path) or the content failed. */
export class WriteFailedError extends QuadrilleError {
  /** Always `'WRITE_FAILED'`. */
  readonly code = 'WRITE_FAILED';
  /**
   * @param path - the file that was to be written
   * @param reason - the OS error code (`ENOENT`, `EACCES`, `EISDIR`, …) or `'ERROR'` when there is none
   * @param detail - the underlying error's message
   * @param cause - the underlying error
   */
  constructor(readonly path: string, readonly reason: string, detail: string, override readonly cause?: unknown) {
    super(
      `could not write ${path}: ${detail.includes(reason) ? detail : `${reason}: ${detail}`}; nothing was left at the path or beside it ` +
        '(check that the directory exists and is writable — createDirectories: true makes it — and that no directory sits at the path)',
    );
  }
}

/** Matrix Market text that breaks the format: bad banner or size line, bad or missing entries, indices out of range. */
export class MalformedMatrixMarketError extends QuadrilleError {
  /** Always `'MALFORMED_MATRIX_MARKET'`. */
  readonly code = 'MALFORMED_MATRIX_MARKET';
  /**
   * @param line - 1-based line number of the fault (one past the last line when the text ends too early)
   * @param why - what is wrong there and what the format wants
   */
  constructor(readonly line: number, why: string) {
    super(`Matrix Market line ${line}: ${why}`);
  }
}

/** Well-formed Matrix Market text of a kind quadrille does not read (complex, pattern, hermitian, dense matrices). */
export class UnsupportedMatrixMarketError extends QuadrilleError {
  /** Always `'UNSUPPORTED_MATRIX_MARKET'`. */
  readonly code = 'UNSUPPORTED_MATRIX_MARKET';
  /**
   * @param line - 1-based line number of the banner or size line that declares it
   * @param what - the kind declared, and what is read instead
   */
  constructor(readonly line: number, what: string) {
    super(`Matrix Market line ${line}: ${what}`);
  }
}

/** CSV text that is not a field table as written by quadrille: bad header, ragged rows, non-numbers, nodes out of order. */
export class MalformedCsvError extends QuadrilleError {
  /** Always `'MALFORMED_CSV'`. */
  readonly code = 'MALFORMED_CSV';
  /**
   * @param line - 1-based line number of the fault (the header is line 1)
   * @param why - what is wrong there and what is expected
   */
  constructor(readonly line: number, why: string) {
    super(`CSV line ${line}: ${why}`);
  }
}

/** JSON text that is not valid JSON, or not the documented form of the document it should be. */
export class MalformedJsonError extends QuadrilleError {
  /** Always `'MALFORMED_JSON'`. */
  readonly code = 'MALFORMED_JSON';
  /**
   * @param document - the document expected, e.g. `checkpoint`
   * @param path - where in it the fault is, e.g. `state[1][4]` (`$` for the whole text)
   * @param why - what is wrong there and what is expected
   */
  constructor(readonly document: string, readonly path: string, why: string) {
    super(`${document} JSON at ${path}: ${why}`);
  }
}
