export { factorTridiagonal, solveTridiagonal, type TridiagonalFactors } from './thomas.js';
export { factorBanded, solveBanded, type BandedLU } from './banded.js';
export { conjugateGradient, bicgstab, createKrylovWorkspace, type KrylovOptions, type KrylovWorkspace } from './krylov.js';
export {
  jacobiPreconditioner, ssorPreconditioner, incompleteCholesky, incompleteLU, type Preconditioner,
} from './preconditioners.js';
export type { SolveResult, IterativeOptions } from './result.js';
export { createMultigrid, type Multigrid, type MultigridOptions } from './multigrid.js';
