/**
 * `--case NAME` of `solve` and `study` (docs/model-format.md, "Load cases"): which load case or
 * combination the terminal, `--json` and the field file show. Without it a solve shows the first case
 * and a study the envelope; study.json always holds every case.
 */
import { PeakwiseError } from '../errors.js';
import type { Model } from '../model/types.js';
import { didYouMean } from '../model/index.js';
import type { SolvedLevel } from '../pipeline/index.js';

/** The names of a model's cases, then its combinations (empty without cases). */
export function loadSetNames(model: Pick<Model, 'cases' | 'combinations'>): string[] {
  return [...(model.cases ?? []).map((c) => c.name), ...(model.combinations ?? []).map((c) => c.name)];
}

/** `--case` checked against the model before any work: a usage error naming the cases when it names none. */
export function checkCaseOption(model: Pick<Model, 'cases' | 'combinations'>, name: string | undefined): void {
  if (name === undefined) return;
  const names = loadSetNames(model);
  if (names.length === 0) throw new PeakwiseError('usage', `--case ${name}: the model has no load cases (add cases: to the model, or drop --case)`);
  if (!names.includes(name)) throw new PeakwiseError('usage', `--case ${name}: no load case or combination of that name${didYouMean(name, names)}; the model has ${names.join(', ')}`);
}

/** The level as one case or combination shows it: that set's solution, stresses and measure (the first set without a name). */
export function levelOfCase<T extends SolvedLevel>(level: T, name: string | undefined): T {
  const set = name === undefined ? level.sets[0] : level.sets.find((s) => s.name === name);
  if (!set) return level;
  // a combination is superposed, not solved: it shows the solve's own timings
  return { ...level, solution: { ...set.solution, timings: level.solution.timings }, gauss: set.gauss, field: set.field, nodal: set.nodal };
}
