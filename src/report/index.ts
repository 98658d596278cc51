/** report/: terminal table, CSV, SVG pictures and the HTML page — pure functions returning strings. */
export { studyTable, solveSummary, equilibriumMismatch } from './terminal.js';
export type { TerminalOptions, SolveSummaryInput } from './terminal.js';
export { sitesCsv, fieldCsv, csvText, csvNumber } from './csv.js';
export { meshSvg } from './mesh-svg.js';
export type { MeshSvgOptions } from './mesh-svg.js';
export { contourSvg, resampleOnGrid, DEFAULT_LEVELS, DEFAULT_MAX_TRIANGLES } from './contour.js';
export type { ContourOptions } from './contour.js';
export { convergencePlotSvg, cutPlotSvg, slopeLabel } from './plot.js';
export type { CutPlotInput, CutSeries } from './plot.js';
export type { ConvergencePlotOptions } from './plot.js';
export { reportHtml, autoDeformationScale, measureName, siteSectionIds } from './html.js';
export type { ReportInput, ReportCheck, ReportRun } from './html.js';
export { bandScale, bandColour, bandEdge, bandIndex, colourAt, triangleBands } from './isobands.js';
export type { BandScale, BandSink } from './isobands.js';
export { stripControl, escapeXml, formatNumber } from './text.js';
export { CAUTION, capitalise, featureLabel } from './words.js';
export type { Box } from './draw.js';
