/**
 * The chain model → problem → mesh → solve → recover is written once (issue 13): exactly one
 * module of src/ — the pipeline's — imports the mesher (`meshPlate`), the solver (`solvePlate`)
 * and the recovery (`recoverSpr` / `recoverAverage`) together, and the commands, the checks, the
 * sweep, the benchmark, the study and the library API reach them through it.
 */
import { describe, expect, it } from 'vitest';
import { importEdges, sourceFiles, type ImportEdge } from './import-graph.js';

const edges = importEdges();
const files = sourceFiles();

/** names a file imports as values (re-exports excluded: a barrel hands a name on, it does not use it) */
function valueImports(file: string): Set<string> {
  return new Set(edges.filter((e) => e.from === file && e.kind !== 'export' && !e.typeOnly).flatMap((e) => e.names));
}

const MESHER = ['meshPlate'];
const SOLVER = ['solvePlate', 'solvePlateCases'];
const RECOVERY = ['recoverSpr', 'recoverAverage'];
const usesAny = (names: Set<string>, list: string[]): boolean => list.some((n) => names.has(n));
const stageOf = (file: string): string => (file.includes('/') ? file.slice(0, file.indexOf('/')) : '');

describe('one pipeline', () => {
  it('exactly one module imports the mesher, the solver and the recovery together: src/pipeline/solve.ts', () => {
    const together = files.filter((f) => {
      const names = valueImports(f);
      return usesAny(names, MESHER) && usesAny(names, SOLVER) && usesAny(names, RECOVERY);
    });
    expect(together).toEqual(['pipeline/solve.ts']);
  });

  it('outside their own stage, only the pipeline calls the solver and the recovery (and the mesher and the solver, besides their benchmarks)', () => {
    const users = (list: string[], own: string) => files.filter((f) => stageOf(f) !== own && usesAny(valueImports(f), list));
    // the load-case benchmark times the solver alone (one factor, many right-hand sides)
    expect(users(SOLVER, 'fem')).toEqual(['bench/cases.ts', 'pipeline/solve.ts']);
    expect(users(RECOVERY, 'recovery')).toEqual(['pipeline/solve.ts']);
    // the mesher benchmarks time meshPlate alone, against plain delaunator and over many openings
    expect(users(MESHER, 'mesh')).toEqual(['bench/holes.ts', 'bench/mesh.ts', 'pipeline/solve.ts']);
  });

  it('the commands, the checks, the sweep, the benchmark, the study and the API import the pipeline', () => {
    const importsPipeline = (file: string) => edges.some((e: ImportEdge) => e.from === file && e.kind !== 'export' && e.to.startsWith('pipeline/'));
    for (const f of ['cli/commands.ts', 'cli/common.ts', 'check/pipeline.ts', 'sweep/runner.ts', 'bench/main.ts', 'bench/models.ts', 'bench/lshape.ts', 'study/run.ts', 'index.ts']) {
      expect(importsPipeline(f), f).toBe(true);
    }
  });

  it('sits between the stages: below study, check, sweep, cli, bench and report; above model … recovery', () => {
    const upstream = new Set(['model', 'geometry', 'mesh', 'fem', 'linalg', 'recovery', 'element']);
    const downstream = new Set(['study', 'check', 'sweep', 'cli', 'bench', 'report']);
    for (const e of edges) {
      if (upstream.has(stageOf(e.from))) expect(stageOf(e.to), `${e.from} → ${e.to}`).not.toBe('pipeline');
      if (stageOf(e.from) === 'pipeline') expect(downstream.has(stageOf(e.to)), `${e.from} → ${e.to}`).toBe(false);
    }
  });

  it('the reference element (src/element) is a leaf: it imports nothing else of src/, so mesh, fem and recovery can all use it', () => {
    const out = edges.filter((e) => stageOf(e.from) === 'element' && stageOf(e.to) !== 'element');
    expect(out).toEqual([]);
    for (const user of ['mesh/quality.ts', 'mesh/validate.ts', 'fem/elements.ts', 'fem/edge-load.ts', 'recovery/estimate.ts']) {
      expect(edges.some((e) => e.from === user && stageOf(e.to) === 'element'), user).toBe(true);
    }
  });
});
