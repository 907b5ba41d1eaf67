export {
  solveTransient, solveWave,
  type TransientProblem, type TransientOptions, type TransientResult, type DiffusionScheme, type ThetaScheme, type Initial,
  type WaveProblem, type WaveOptions, type WaveResult,
} from './transient.js';
export {
  solveSteady, type SteadyProblem, type SteadyOptions, type SteadyResult, type SteadySolver,
  type SimpleSolver, type SteadyTimes, type CgSolver, type BicgstabSolver, type MultigridSolver,
} from './steady.js';
