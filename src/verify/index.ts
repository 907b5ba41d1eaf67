export { plateWithHeatedEdge } from './plate.js';
export { erf, erfc, erfcx } from './erf.js';
export { HyperDual, type HyperDualLike } from './hyperdual.js';
export {
  manufacturedSolution,
  type ManufacturedFunction, type ManufacturedOptions, type ManufacturedFace, type ManufacturedSolution,
  type ManufacturedValueFace, type ManufacturedFluxFace, type ManufacturedConvectionFace,
  type WaveSourceOptions, type CoordinatesThenTime,
} from './manufactured.js';
export { errorNorms, type ErrorNorms, type NodalValues, type ExactValues } from './norms.js';
export {
  convergenceStudy, spacingsFor, fitOrder, MIN_REFINEMENT_RATIO,
  type ConvergenceStudy, type Refinement, type StudyLevel, type StudyOptions, type LevelOutcome, type LevelSolution,
  type LevelErrors, type LevelResult, type LevelPair, type OrderFit, type NormName, type QuantityPair,
} from './study.js';
export { studyTable, studyCsv } from './report.js';
export { apparentOrder, richardsonExtrapolation, type ApparentOrder, type RichardsonResult } from './richardson.js';
export { gridConvergenceIndex, representativeSpacing, type GridConvergence, type GciOptions } from './gci.js';
export {
  sineDecay, separableDecay, planeWallRoot, planeWallCoefficient, planeWallTemperature, planeWallOneTerm,
  semiInfiniteStep, semiInfiniteConvection,
  type SineDecayOptions, type SeparableDecayOptions, type PlaneWallOptions, type SemiInfiniteConvectionOptions,
} from './conduction.js';
export {
  stringMode, pluckedString, membraneMode, type StringOptions, type PluckOptions, type MembraneOptions,
} from './waves.js';
