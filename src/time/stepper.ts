/**
 * The contract between time integrators and the run driver.
 *
 * A stepper owns the discrete state of one problem — one or more vectors
 * over the grid's nodes (the current level u, and for two-level schemes like
 * leapfrog also the previous level) — and advances it by one step of a
 * fixed size. The driver (`run.ts`) decides how many steps, records outputs
 * and probes, checks for blow-up, honours an AbortSignal and makes
 * checkpoints; it never looks inside a stepper.
 *
 * @module
 */

/** A time integrator bound to one problem and one step size. */
export interface Stepper {
  /** Scheme name for reports, e.g. `'crank-nicolson'`, `'leapfrog'`. */
  readonly scheme: string;
  /** Node count of each state vector. */
  readonly size: number;
  /**
   * The state vectors; `state[0]` is always the current solution u. A
   * stepper may rotate the vectors between steps (leapfrog writes the new
   * level over the oldest), so read `state[0]` after each step.
   */
  readonly state: readonly Float64Array[];
  /**
   * Advances the state from time t to t + dt, where dt is the step the
   * stepper was prepared for. `step` counts completed steps before this one
   * (0 for the first). Allocates nothing.
   *
   * @param t - time at the start of the step
   * @param step - index of this step
   * @returns optionally, a sum over the new state that is non-finite if any
   *   value is (so the driver can skip its own pass); undefined otherwise
   */
  advance(t: number, step: number): number | void;
  /** Iterations of the last step's linear solve (0 for explicit or direct steps). */
  readonly lastIterations: number;
}
