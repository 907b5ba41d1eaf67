export { Rational, type RationalInput } from './rational.js';
export { fornbergWeights, exactWeights } from './fornberg.js';
export { stencil, centralStencil, forwardStencil, backwardStencil, type Stencil } from './stencil.js';
export {
  applyStencil, nodeWeights, applyNodeWeights, type Samples, type NodeWeights,
} from './apply.js';
