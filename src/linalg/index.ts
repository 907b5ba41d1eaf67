export { factorTridiagonal, solveTridiagonal, type TridiagonalFactors } from './thomas.js';
export { factorBanded, solveBanded, type BandedLU } from './banded.js';
