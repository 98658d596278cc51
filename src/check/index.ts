/** The built-in verification suite (`peakwise check`): cases, table, JSON. */
export type { CheckResult, CheckCase } from './types.js';
export { CHECK_CASES } from './cases.js';
export { runChecks, checksTable, checksJson, type RunChecksOptions, type ChecksJson } from './run.js';
export { tadaCentreCrackK, feddersenCentreCrackK, extrapolateK } from './crack.js';
export { checksHtml } from './html.js';
export { checksMarkdown } from './markdown.js';
