export { stabilityLimit, type StabilityLimit, type AdvectiveLimit } from './stability.js';
export {
  checkpointToBytes, checkpointFromBytes,
  type Checkpoint, type RunOptions, type RunResult, type Progress, type StepView, type ProbeSeries, type Snapshot,
} from './run.js';
export type { StepSolver } from './implicit.js';
