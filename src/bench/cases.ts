/**
 * Load cases on one factorisation (issue 14 part B): the square plate with a central hole at about
 * 200k dofs, solved once with one case and once with ten cases on the same mesh (assemble once, order
 * and factor once, every case a right-hand side). Prints the solver's CPU time for ten cases against
 * one case (goal ≤ 1.3×; CPU seconds, the fastest of three, as the machine may be shared), the
 * recovery per case apart (Gauss stresses + SPR, once per case, through the pipeline), and the
 * triangular sweeps alone: ten single solves against one block sweep of ten right-hand sides.
 * Like the mesher benchmarks with the mesher, it calls the solver itself, to time it alone.
 */
import { analyze, chooseOrdering, csrSubmatrix, factorize, solveFactor, solveFactorMany } from '../linalg/index.js';
import { assembleStiffness, solvePlateCases, supportedDofs } from '../fem/index.js';
import { parseModel } from '../model/index.js';
import { baseSizeField, meshAt, problemOf, solveMesh } from '../pipeline/index.js';
import { holePlateText } from './models.js';

/** The hole plate's model text with `n` load cases (tension, shear and pressure mixes). */
function casesText(size: number, n: number): string {
  const plain = holePlateText(size);
  const head = plain.slice(0, plain.indexOf('loads:'));
  const tail = plain.slice(plain.indexOf('mesh:'));
  const cases = Array.from({ length: n }, (_, k) =>
    `  c${k}: [ { where: { x: 200 }, traction: [${100 - 7 * k}, ${3 * k}] }, { where: { opening: hole }, pressure: ${k} } ]`).join('\n');
  return `${head}cases:\n${cases}\n${tail}`;
}

const seconds = (t0: number): number => (performance.now() - t0) / 1000;

/** CPU seconds (user + system) of this process since `from`: steadier than the wall clock on a shared machine. */
function cpuSeconds(from: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(from);
  return (d.user + d.system) / 1e6;
}

export function benchCases(quick: boolean): void {
  const target = quick ? 50_000 : 200_000;
  const A = 200 * 200 - Math.PI * 100;
  const h = Math.sqrt((4 * A) / ((Math.sqrt(3) / 4) * target));
  const one = problemOf(parseModel(casesText(h, 1), 'bench-cases-1.yaml'));
  const ten = problemOf(parseModel(casesText(h, 10), 'bench-cases-10.yaml'));
  const mesh = meshAt(one, baseSizeField(one), 2);
  const plate = { mesh, geometry: one.geometry, section: one.section, supports: one.supports, loads: [] };
  // the solver alone (assemble, loads, order, factor, sweeps, reactions), timed in CPU seconds
  type Run = { cpuS: number; wallS: number; factorS: number; dofs: number };
  const solveOnly = (p: typeof one): Run => {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const sols = solvePlateCases(plate, p.cases);
    return { cpuS: cpuSeconds(c0), wallS: seconds(t0), factorS: sols[0].timings.factorS, dofs: sols[0].dofs };
  };
  solveOnly(one); // warm-up: the first solve also compiles the kernels
  const fastest = (rs: Run[]): Run => rs.reduce((a, b) => (b.cpuS < a.cpuS ? b : a));
  const runs1: Run[] = [], runs10: Run[] = [];
  // alternate the two and keep each one's fastest of three
  for (let k = 0; k < (quick ? 1 : 3); k++) { runs1.push(solveOnly(one)); runs10.push(solveOnly(ten)); }
  const r1 = fastest(runs1), r10 = fastest(runs10);
  process.stdout.write(`  ${r1.dofs} dofs, LST: 1 case: assemble + order + factor + solve ${r1.cpuS.toFixed(2)} s CPU (${r1.wallS.toFixed(2)} s wall, factor ${r1.factorS.toFixed(2)} s)\n`);
  process.stdout.write(`  10 cases on one factor: ${r10.cpuS.toFixed(2)} s CPU (${r10.wallS.toFixed(2)} s wall) → ratio ${(r10.cpuS / r1.cpuS).toFixed(2)}× (goal ≤ 1.3×)\n`);
  // the whole pipeline step with the recovery of every case, reported apart
  const c0 = process.cpuUsage();
  const level = solveMesh(ten, mesh);
  const pipelineS = cpuSeconds(c0);
  process.stdout.write(`  recovery (Gauss stresses + SPR) per case, apart: ${(level.timings.recoverS / 10).toFixed(2)} s wall; solve + recovery of 10 cases ${pipelineS.toFixed(2)} s CPU\n`);

  // the sweeps alone on the same matrix: ten single solves against one block sweep
  const fixed = supportedDofs(mesh, one.geometry, one.supports);
  const keep: number[] = [];
  for (let i = 0; i < fixed.length; i++) if (!fixed[i]) keep.push(i);
  const K = csrSubmatrix(assembleStiffness(mesh, one.section), Int32Array.from(keep));
  const rowXY = new Float64Array(2 * keep.length);
  keep.forEach((d, k) => { rowXY[2 * k] = mesh.xy[2 * (d >> 1)]; rowXY[2 * k + 1] = mesh.xy[2 * (d >> 1) + 1]; });
  const F = factorize(K, analyze(K, chooseOrdering(K, rowXY)));
  const bs = Array.from({ length: 10 }, (_, k) => Float64Array.from({ length: K.n }, (_, i) => Math.sin(0.001 * i * (k + 1))));
  let c1 = process.cpuUsage();
  for (const b of bs) solveFactor(F, b);
  const singles = cpuSeconds(c1);
  c1 = process.cpuUsage();
  solveFactorMany(F, bs);
  const block = cpuSeconds(c1);
  process.stdout.write(`  sweeps alone, 10 right-hand sides: 10 single solves ${singles.toFixed(3)} s CPU, one block sweep ${block.toFixed(3)} s (${(singles / block).toFixed(1)}× faster)\n`);
}
