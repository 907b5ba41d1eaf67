/**
 * SVG plots and the HTML report. Every function here is pure: data in,
 * SVG or HTML text out; nothing touches files, a DOM or a browser.
 *
 * @module
 */
export { fieldMap, type FieldMapOptions } from './field-map.js';
export {
  linePlot, profilePlot, historyPlot,
  type LineSeries, type LinePlotOptions, type ProfileLine, type ProfileOptions, type HistoryOptions,
} from './line.js';
export type { SeriesStyle } from './chart.js';
export { logLogPlot, type LogLogOptions } from './loglog.js';
export { scaleColour } from './colour.js';
export { htmlReport, type ReportBlock, type ReportSection, type ReportContent } from './html-report.js';
export { studyPlot, type PlotOptions } from './study-plot.js';
