/**
 * `npm run bench`: speed and memory figures for this machine (never in tests).
 *
 *   node dist/bench/main.js [--quick] [--skip startup,commands,watch,mesh,holes,solver,pipeline,cases,study,rates]
 *
 * 0. startup   `peakwise --version` and `--help` in a fresh process (src/bench/commands.ts)
 *    commands  whole `study` of every demo and `mesh` of a ~300 000-node plate in a fresh process,
 *              as ratios to the yardstick (plain delaunator, 1 000 000 random points, this run),
 *              with the study's breakdown start / mesh / solve / recover / study / write / gc
 *    watch     warm reruns of `study --watch` on l-bracket-sharp: a comment-only save, a load-only
 *              edit and a geometry edit, interleaved, as ratios to the yardstick (src/bench/watch-rerun.ts)
 * 1. mesh      quality mesh of a multi-opening plate (~300 000 vertices) against plain delaunator
 *    holes     perforated plate, 400 and 1 600 holes: time ratio (src/bench/holes.ts)
 * 2. solver    sparse Cholesky on clamped-rectangle stiffness matrices (anchor table sizes),
 *              with the anchor library's figures on the same matrices when /tmp/cholmod_mtx exists
 * 3. pipeline  square plate with a central hole, LST, ~50k / 200k / 1M dofs: assemble, order,
 *              factor, solve, nnz(L), peak memory, factor-time growth exponent
 *    cases     ten load cases on one factorisation against one case, ~200k dofs (src/bench/cases.ts)
 * 4. study     whole `study` time of each demo model
 * 5. rates     energy-norm error rates at the 270° corner of the L plate: uniform meshes and
 *              the adaptive loop (issue 4)
 *
 * Every goal is recorded (src/bench/goals.ts) and printed at the end with its figure and ratio.
 */
import { readFileSync, readdirSync, existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { benchMesh } from './mesh.js';
import { benchHoles } from './holes.js';
import { benchCases } from './cases.js';
import { ANCHOR, ANCHOR_CPU, benchSolver, runAnchor, writeMatrixMarket } from './solver.js';
import { L_SECTION, lProblem, lSolve, lTrueError, logSlope, type LField } from './lshape.js';
import { lShapeMesh } from './lshape-mesh.js';
import { supportedDofs, assembleStiffness } from '../fem/index.js';
import { chooseOrderingDetailed, csrSubmatrix, factorize, symbolicFactor } from '../linalg/index.js';
import { adaptiveSolve, solveProblem } from '../pipeline/index.js';
import { holePlateProblem } from './models.js';
import { parseModel } from '../model/index.js';
import { runStudy } from '../study/index.js';
import { lShapeModeIField } from '../reference/index.js';
import { goalsText, recordGoal, sampleYardstick, yardstick } from './goals.js';
import { measureWatchRerun, watchRerunGoals, watchRerunText } from './watch-rerun.js';
import { benchMeshCommand, benchStartup, benchStudyCommands } from './commands.js';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const skipArg = args.indexOf('--skip');
const skip = new Set(skipArg >= 0 ? (args[skipArg + 1] ?? '').split(',') : []);
const root = join(import.meta.dirname, '..', '..');

function heading(t: string): void {
  process.stdout.write(`\n== ${t}\n`);
}

function rssMiB(): number {
  return process.resourceUsage().maxRSS / 1024;
}

async function benchPipeline(): Promise<void> {
  heading('solve pipeline: square plate with a central hole, LST');
  const targets = quick ? [50_000] : [50_000, 200_000, 1_000_000];
  const rows: { dofs: number; factorS: number }[] = [];
  for (const target of targets) {
    // LST on a plate of area A ≈ 4e4: dofs ≈ 2·(2·A/(√3/4·h²)) → h from the target
    const A = 200 * 200 - Math.PI * 100;
    const h = Math.sqrt((4 * A) / ((Math.sqrt(3) / 4) * target));
    const problem = holePlateProblem(h);
    const { mesh, solution: s, timings: { meshS } } = solveProblem(problem);
    const { geometry, section, supports } = problem;
    rows.push({ dofs: s.dofs, factorS: s.timings.factorS });
    const line = `  ${s.dofs} dofs: mesh ${meshS.toFixed(2)} s, assemble ${s.timings.assembleS.toFixed(2)} s, order ${s.timings.orderS.toFixed(2)} s, factor ${s.timings.factorS.toFixed(2)} s, solve ${s.timings.solveS.toFixed(3)} s, nnz(L) ${(s.nnzL / 1e6).toFixed(2)} M, residual ${s.residual.toExponential(1)}, peak RSS ${rssMiB().toFixed(0)} MiB`;
    process.stdout.write(line + '\n');
    if (existsSync(ANCHOR)) {
      const fixed = supportedDofs(mesh, geometry, supports);
      const keep: number[] = [];
      for (let i = 0; i < fixed.length; i++) if (!fixed[i]) keep.push(i);
      const K = csrSubmatrix(assembleStiffness(mesh, section), Int32Array.from(keep));
      const file = `/tmp/peakwise-bench-hole-${target}.mtx`;
      await writeMatrixMarket(K, file);
      const a = runAnchor(file);
      rmSync(file, { force: true });
      if (a) {
        // ours again on the very same matrix, in CPU seconds as well (the second factorisation of
        // this size in the process, as the anchor's analyze + factor follow its reading)
        const rowXY = new Float64Array(2 * keep.length);
        keep.forEach((d, k) => { rowXY[2 * k] = mesh.xy[2 * (d >> 1)]; rowXY[2 * k + 1] = mesh.xy[2 * (d >> 1) + 1]; });
        const c0 = process.cpuUsage();
        const w0 = performance.now();
        factorize(K, symbolicFactor(K, chooseOrderingDetailed(K, rowXY).ordering));
        const oursWall = (performance.now() - w0) / 1000;
        const cu = process.cpuUsage(c0);
        const oursCpu = (cu.user + cu.system) / 1e6;
        const ours = ANCHOR_CPU ? oursCpu : oursWall;
        const theirs = a.t_analyze + a.t_factorize;
        const clock = ANCHOR_CPU ? 'CPU' : 'wall';
        process.stdout.write(
          `    anchor (same matrix): ordering ${a.ordering}, analyze ${a.t_analyze.toFixed(3)} s, factor ${a.t_factorize.toFixed(3)} s (${clock}), nnz(L) ${(a.lnz / 1e6).toFixed(2)} M; ` +
            `ours on it order + symbolic + factor ${oursWall.toFixed(3)} s wall, ${oursCpu.toFixed(3)} s CPU → ratios: order+factor ${(ours / theirs).toFixed(2)}× (${clock}), nnz(L) ${(s.nnzL / a.lnz).toFixed(2)}×\n`,
        );
        if (target >= 200_000) {
          recordGoal({
            what: `solver order + factor, hole plate LST ${s.dofs} dofs`,
            measured: `ours ${ours.toFixed(2)} s, anchor ${theirs.toFixed(2)} s (analyze ${a.t_analyze.toFixed(2)} s, ${a.ordering}; ${clock} seconds)`,
            value: ours / theirs, limit: 1, unit: '×', against: 'the anchor (optimised BLAS, 1 thread)',
          });
        }
      }
    }
  }
  for (let i = 1; i < rows.length; i++) {
    const g = Math.log(rows[i].factorS / rows[i - 1].factorS) / Math.log(rows[i].dofs / rows[i - 1].dofs);
    process.stdout.write(`  factor-time growth exponent ${rows[i - 1].dofs} → ${rows[i].dofs}: ${g.toFixed(2)} (goal ≤ 1.5)\n`);
  }
}

function benchStudies(): void {
  heading('study of each demo model (whole command, default levels)');
  const dir = join(root, 'models');
  const files = readdirSync(dir).filter((f) => f.endsWith('.yaml')).sort();
  for (const f of quick ? files.slice(0, 2) : files) {
    const model = parseModel(readFileSync(join(dir, f), 'utf8'), `models/${f}`);
    const t0 = performance.now();
    const r = runStudy(model);
    const s = (performance.now() - t0) / 1000;
    const verdicts = r.sites.map((p) => `${p.id} ${p.verdict}`).join(', ');
    process.stdout.write(`  ${f}: ${s.toFixed(2)} s, ${r.sites.length} sites × ${model.study.levels} levels (${verdicts})\n`);
  }
}

function benchRates(): void {
  heading('energy-norm error rates at the 270° corner (L plate, exact Williams field)');
  const field: LField = {
    stress: (x, y) => {
      const f = lShapeModeIField(x, y, L_SECTION.E, L_SECTION.nu);
      return [f.sxx, f.syy, f.sxy];
    },
    displacement: (x, y) => {
      const f = lShapeModeIField(x, y, L_SECTION.E, L_SECTION.nu);
      return [f.ux, f.uy];
    },
  };
  for (const order of [1, 2] as const) {
    const N: number[] = [];
    const err: number[] = [];
    for (const n of quick ? [2, 4, 8] : [2, 4, 8, 16, 32]) {
      const { mesh, geometry } = lShapeMesh(n, order);
      const { gauss, dofs } = lSolve(mesh, geometry, field);
      N.push(dofs);
      err.push(lTrueError(gauss));
    }
    const r = -logSlope(N.slice(-3), err.slice(-3));
    process.stdout.write(`  uniform ${order === 1 ? 'CST' : 'LST'}: dofs ${N.join(' ')} → ‖e‖ ~ N^-${r.toFixed(3)} (theory λ/2 = 0.272)\n`);
  }
  for (const order of [1, 2] as const) {
    const N: number[] = [];
    const err: number[] = [];
    adaptiveSolve(
      lProblem(field, order, 0.25),
      { targetPercent: order === 2 ? 0.5 : 3, onCycle: (c, res) => { N.push(c.dofs); err.push(lTrueError(res.gauss)); } },
      { maxDofs: quick ? 20_000 : 60_000 },
    );
    const r = -logSlope(N.slice(1), err.slice(1));
    process.stdout.write(`  adaptive ${order === 1 ? 'CST' : 'LST'}: dofs ${N.join(' ')} → ‖e‖ ~ N^-${r.toFixed(3)} (optimal p/2 = ${order / 2})\n`);
  }
}

async function main(): Promise<void> {
  process.stdout.write(`peakwise benchmark — node ${process.version}, ${quick ? 'quick' : 'full'} run\n`);
  if (!skip.has('startup')) { heading('start-up (fresh process)'); benchStartup(quick); }
  if (!skip.has('commands')) {
    heading('whole commands (fresh process) against the yardstick');
    benchStudyCommands(quick);
    benchMeshCommand(quick);
  }
  if (!skip.has('watch')) {
    heading('watch mode: warm reruns (comment, load, geometry edits, interleaved) against the yardstick');
    sampleYardstick();
    const r = await measureWatchRerun(join(root, 'models', 'l-bracket-sharp.yaml'), quick ? 3 : 5);
    sampleYardstick();
    process.stdout.write(watchRerunText(r, yardstick()));
    for (const g of watchRerunGoals(r, yardstick())) recordGoal(g);
  }
  if (!skip.has('mesh')) {
    heading('mesher');
    const m = await benchMesh(quick ? 6 : 1.5);
    if (!quick) {
      recordGoal({ what: `mesher in process, ${m.vertices} vertices`, measured: `${m.meshMs.toFixed(0)} ms (median of 3)`, value: m.ratio, limit: 3, unit: '×', against: `delaunator on the same points (${m.delaunatorMs.toFixed(0)} ms)` });
    }
  }
  if (!skip.has('holes')) { heading('mesher: many openings (perforated plate)'); benchHoles(quick); }
  if (!skip.has('solver')) {
    heading('sparse Cholesky (clamped rectangle, CST, anchor sizes)');
    await benchSolver({ max: quick ? 60_000 : 1_000_000 });
  }
  if (!skip.has('pipeline')) await benchPipeline();
  if (!skip.has('cases')) { heading('load cases: ten right-hand sides on one factorisation'); benchCases(quick); }
  if (!skip.has('study')) benchStudies();
  if (!skip.has('rates')) benchRates();
  process.stdout.write(`\npeak RSS ${rssMiB().toFixed(0)} MiB\n`);
  process.stdout.write(goalsText());
}

main().catch((e: unknown) => {
  process.stderr.write(`bench failed: ${e instanceof Error ? e.stack : String(e)}\n`);
  process.exitCode = 1;
});
