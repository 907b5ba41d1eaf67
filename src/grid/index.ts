export {
  type AxisName, type AxisSpec, type UniformAxisSpec, type StretchedAxisSpec,
  type Axis, type AxisBase, type UniformAxis, type StretchedAxis,
} from './axis.js';
export {
  grid, axisOf,
  type Dimension, type Grid, type GridSpec, type GridSpec1, type GridSpec2, type GridSpec3,
  type GridShape, type GridAxes,
} from './grid.js';
export {
  geometricAxis, tanhAxis,
  type ClusterEnd, type ClusterOptions, type GeometricOptions, type TanhOptions, type ClusteredAxisSpec,
} from './stretching.js';
export { zeros, sampleField, copyField, type Field, type NodeFunction } from './field.js';
export { faceView, interiorView, boundaryFaces, type FaceName } from './views.js';
export { trapezoidWeights, integrate } from './integrate.js';
