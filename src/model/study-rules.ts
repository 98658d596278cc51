/**
 * The one rule for the study's `levels` and `ratio`, wherever they come from: the model file
 * (`study.levels`, `study.ratio`), the command line (`--levels`, `--ratio` of study and sweep) or
 * the library (`runStudy` options). A study runs with one level or more; a verdict needs three
 * (fewer leave every site undecided, docs/study.md). Twelve levels of ratio 4 already span a
 * size factor of 4¹² ≈ 1.7·10⁷, far past any mesh a machine holds.
 */

/** Refinement levels per site: a whole number from 1 to 12. */
export const STUDY_LEVELS = { min: 1, max: 12 } as const;

/** Element size ratio between levels: above 1, at most 4. */
export const STUDY_RATIO = { above: 1, max: 4 } as const;

/** `undefined` when `levels` is allowed, else the rule it breaks ("must be …"). */
export function levelsRule(levels: number): string | undefined {
  return Number.isInteger(levels) && levels >= STUDY_LEVELS.min && levels <= STUDY_LEVELS.max
    ? undefined
    : `must be a whole number from ${STUDY_LEVELS.min} to ${STUDY_LEVELS.max}`;
}

/** `undefined` when `ratio` is allowed, else the rule it breaks ("must be …"). */
export function ratioRule(ratio: number): string | undefined {
  return ratio > STUDY_RATIO.above && ratio <= STUDY_RATIO.max
    ? undefined
    : `must be > ${STUDY_RATIO.above} (the size shrinks by this factor per level) and at most ${STUDY_RATIO.max}`;
}
