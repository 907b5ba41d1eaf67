/**
 * quadrille: finite-difference stencils, operators and solvers on structured grids.
 *
 * @packageDocumentation
 */
export * from './stencil/index.js';
export * from './errors.js';
