/**
 * The study's worker thread: serves the per-level function by name (src/pipeline/pool.ts). Runs
 * from dist/ only (the pool loads the compiled file).
 */
import { serveTasks } from '../pipeline/pool.js';
import { LEVEL_TASK, studyLevel } from './level.js';

serveTasks({ [LEVEL_TASK]: studyLevel });
