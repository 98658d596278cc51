/** `peakwise study` after the study: study.json, sites.csv, and from the first solve field.csv and report.html. */
import { join } from 'node:path';
import type { Model } from '../model/types.js';
import type { BaseSolve } from '../study/index.js';
import type { StudyResult } from '../study/types.js';
import { fieldCsv, reportHtml, sitesCsv, type CutPlotInput } from '../report/index.js';
import { recordedChecks } from './checks-record.js';
import { fieldColumns, studyJson } from './common.js';
import { writeFileAtomic } from './io.js';

export function writeStudyOutputs(model: Model, study: StudyResult, base: BaseSolve | undefined, outDir: string, file: string, cut?: CutPlotInput): void {
  const protect = [file];
  writeFileAtomic(join(outDir, 'study.json'), studyJson(study) + '\n', protect);
  writeFileAtomic(join(outDir, 'sites.csv'), sitesCsv(study), protect);
  if (!base) return;
  const { mesh, field, solution, geometry, nodal } = base;
  writeFileAtomic(join(outDir, 'field.csv'), fieldCsv(mesh, solution.u, fieldColumns(model, field), { length: model.units.length, stress: study.units.stress }), protect);
  writeFileAtomic(join(outDir, 'report.html'), reportHtml({ model, study, mesh, geometry, field: nodal, u: solution.u, checks: recordedChecks(), ...(cut ? { cut } : {}) }), protect);
}
