/**
 * The generic worker pool (src/pipeline/pool.ts): tasks by name on worker threads, our errors raised
 * again in the caller's thread as the class they were thrown as (with key path, line, column, the
 * limit's kind), a task given up ends its worker and the pool goes on. Uses the compiled study
 * worker (dist/study/study-worker.js), which serves the per-level function.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ModelError, MeshError } from '../../src/errors.js';
import { errorData, errorFromData } from '../../src/pipeline/pool.js';
import { LimitError } from '../../src/fem/health.js';

type PoolModule = typeof import('../../src/pipeline/pool.js');
type StudyModule = typeof import('../../src/study/index.js');
type ModelModule = typeof import('../../src/model/index.js');
type ErrorsModule = typeof import('../../src/errors.js');
type HealthModule = typeof import('../../src/fem/health.js');

const root = join(import.meta.dirname, '..', '..');
const dist = (p: string) => import(pathToFileURL(join(root, 'dist', p)).href);
const modelFile = join(root, 'models', 'l-bracket-sharp.yaml');

describe('errors across the thread boundary (plain data)', () => {
  it('keep their class, stage, message, key path, line and column, the point and the limit', () => {
    const m = errorFromData(errorData(new ModelError('bad value', 'loads[0].traction', 12, 7)));
    expect(m).toBeInstanceOf(ModelError);
    expect(m).toMatchObject({ message: 'bad value', keyPath: 'loads[0].traction', line: 12, col: 7, stage: 'model' });
    const p = errorFromData(errorData(new MeshError('outside', undefined, [1, 2])));
    expect(p).toBeInstanceOf(MeshError);
    expect((p as MeshError).at).toEqual([1, 2]);
    const l = errorFromData(errorData(new LimitError('dofs', 'too many', 'mesh.size')));
    expect(l).toBeInstanceOf(LimitError);
    expect((l as LimitError).limit).toBe('dofs');
    const bug = errorFromData(errorData(new TypeError('x is undefined')));
    expect(bug.constructor).toBe(Error);
    expect(bug.message).toBe('x is undefined');
  });
});

describe('the pool', () => {
  let P: PoolModule;
  let S: StudyModule;
  let M: ModelModule;
  let E: ErrorsModule;
  let H: HealthModule;
  let pool: InstanceType<PoolModule['TaskPool']>;

  beforeAll(async () => {
    [P, S, M, E, H] = await Promise.all([dist('pipeline/pool.js'), dist('study/index.js'), dist('model/index.js'), dist('errors.js'), dist('fem/health.js')]);
    pool = S.studyPool(2);
  });
  afterAll(async () => {
    await pool?.close();
  });

  const setup = () => S.prepareStudy(M.parseModel(readFileSync(modelFile, 'utf8'), modelFile), { levels: 2 });

  it('runs a task by name and returns what the same function returns in this thread', async () => {
    const s = setup();
    const here = S.studyLevel(S.levelInput(s, 1), s.problem);
    const there = await pool.run<typeof here>(S.LEVEL_TASK, S.levelInput(s, 1)).result;
    expect(there).toEqual(here);
  });

  it('an unknown name is a plain error; a limit hit in the worker arrives as the LimitError it was', async () => {
    await expect(pool.run('no-such-task', {}).result).rejects.toThrow(/no task called "no-such-task"/);
    const s = setup();
    const err = await pool.run(S.LEVEL_TASK, { ...S.levelInput(s, 1), limits: { maxDofs: 100 } }).result.catch((e: unknown) => e);
    expect(err).toBeInstanceOf(H.LimitError);
    expect(err).toBeInstanceOf(E.PeakwiseError);
    expect((err as InstanceType<HealthModule['LimitError']>).limit).toBe('dofs');
  });

  it('a task given up rejects with PoolCancelled, and the pool runs the next tasks on a fresh worker', async () => {
    const s = setup();
    const run = pool.run(S.LEVEL_TASK, S.levelInput(s, 1));
    run.cancel();
    await expect(run.result).rejects.toBeInstanceOf(P.PoolCancelled);
    const again = await Promise.all([0, 1].map((k) => pool.run<{ k: number }>(S.LEVEL_TASK, S.levelInput(s, k)).result));
    expect(again.map((r) => r.k)).toEqual([0, 1]);
  });
});
