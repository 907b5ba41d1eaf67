export { type CsrMatrix, csrTranspose, csrIsSymmetric } from './matrix.js';
export { type Operator, type Vector, fromCsr } from './operator.js';
export { sum, scale, compose, transpose, identity, diagonal, kronecker } from './algebra.js';
export {
  derivative, laplacian, mixedDerivative,
  type DerivativeOptions, type LaplacianOptions, type MixedDerivativeOptions,
} from './derivative.js';
export { diffusionOperator, type Coefficient, type DiffusionOptions } from './diffusion.js';
export { advection, cellPeclet, type AdvectionOptions, type Velocity, type PecletReport } from './advection.js';
