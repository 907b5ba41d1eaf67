export {
  solveTransient, solveWave,
  type TransientProblem, type TransientOptions, type TransientResult, type DiffusionScheme, type Initial,
  type WaveProblem, type WaveOptions, type WaveResult,
} from './transient.js';
