/** sweep/: a study repeated over parameter values — values, product, site matching, CSV, HTML, runner. */
export type * from './types.js';
export { parseVary, expandRange, cartesian, checkAxes, MAX_AXIS_VALUES, MAX_SWEEP_POINTS } from './values.js';
export { matchSites, memberAt, featureClass, matchTolerance, MATCH_TOLERANCE_FRACTION, MATCH_RADIUS_FACTOR } from './match.js';
export { sweepCsv, FAMILY_COLUMNS } from './csv.js';
export { sweepHtml, familyPlotSvg, roundTicks, tickLabel } from './html.js';
export { pointKey, runPoint, toJson, fromJson, type PointTask, type PointOutcome } from './point.js';
export { runSweep, parseShard, WORKER_URL, type SweepOptions, type PointCache, type Shard } from './runner.js';
