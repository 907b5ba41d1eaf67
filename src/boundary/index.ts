export {
  boundaryConditions,
  type BoundaryConditions, type BoundarySpec, type Condition, type ConditionEntry, type ValueCondition, type FluxCondition,
  type ConvectionCondition, type FaceSelection, type FaceCondition, type FaceData, type FaceCoefficient,
} from './conditions.js';
export {
  discretize,
  type Discretization, type DiscretizeOptions, type LinearSystem, type HeatBalance, type FaceFlow, type Source,
} from './discretize.js';
