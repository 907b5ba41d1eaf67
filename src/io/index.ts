/**
 * Outputs: CSV, JSON, VTK XML, Matrix Market, SVG plots and the HTML report.
 *
 * @module
 */
export * from './plot/index.js';
export {
  fieldCsv, probeCsv, readFieldCsv,
  type NamedField, type NonFinitePolicy, type FieldCsvOptions, type ProbeCsvOptions,
  type FieldTable, type TableAxis, type TableField,
} from './csv.js';
export { checkpointToJson, checkpointFromJson, runResultJson, type RunJsonOptions } from './json.js';
export {
  vtkDocument, vtkCollection,
  type VtkDocument, type VtkOptions, type VtkEncoding, type VtkHeaderType, type VtkDataset, type CollectionEntry,
} from './vtk.js';
export {
  matrixToMatrixMarket, vectorToMatrixMarket, matrixFromMatrixMarket, vectorFromMatrixMarket,
  type MatrixMarketOptions, type VectorMarketOptions,
} from './matrix-market.js';
export {
  writeFileAtomic, writeVtkSeries,
  type FileContent, type WriteOptions, type VtkSeriesOptions, type VtkSeriesFiles,
} from './files.js';
