/**
 * quadrille: finite-difference stencils, operators and solvers on structured grids.
 *
 * @packageDocumentation
 */
export * from './stencil/index.js';
export * from './grid/index.js';
export * from './operator/index.js';
export * from './boundary/index.js';
export * from './linalg/index.js';
export * from './time/index.js';
export * from './problem/index.js';
export * from './verify/index.js';
export * from './io/index.js';
export * from './errors.js';
