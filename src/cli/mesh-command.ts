/**
 * `peakwise mesh`: read the model, mesh it at its own sizes, print counts and quality (and draw it
 * with --svg). A module of its own so that the command loads the model, geometry and mesh stages
 * and not the study, report and solver code of the other commands (docs/speed.md, start-up).
 */
import pc from 'picocolors';
import { meshQuality } from '../mesh/index.js';
import { baseSizeField, meshAt, problemOf } from '../pipeline/index.js';
import { writeFileAtomic } from './io.js';
import { plain } from './report-error.js';
import { fmt, loadModel, useColor, type CliContext, type CommonOptions } from './common.js';

export async function runMesh(ctx: CliContext, file: string, opts: CommonOptions & { svg?: string }): Promise<void> {
  const model = loadModel(ctx, file, opts);
  const problem = problemOf(model);
  const t0 = performance.now();
  const mesh = meshAt(problem, baseSizeField(problem), problem.meshSettings.order);
  const meshS = (performance.now() - t0) / 1000;
  const q = meshQuality(mesh);
  const { geometry } = problem;
  if (opts.svg) {
    const { meshSvg } = await import('../report/mesh-svg.js');
    writeFileAtomic(opts.svg, meshSvg(mesh, geometry, { title: model.title }), [file]);
  }
  if (opts.json) {
    const { nodes, elements, order, minAngleDeg, maxAngleDeg, area, minEdge, maxEdge } = q;
    const out = { mesh: { nodes, elements, order, minAngleDeg, maxAngleDeg, area, exactArea: geometry.area, minEdge, maxEdge }, timings: { meshS } };
    process.stdout.write(JSON.stringify(out, null, 2) + '\n');
    return;
  }
  const c = useColor(opts) ? pc : pc.createColors(false);
  const L = model.units.length;
  const lines = [
    c.bold(plain(model.title)),
    `  nodes      ${q.nodes}`,
    `  elements   ${q.elements} (${q.order === 2 ? '6-node LST' : '3-node CST'})`,
    `  angles     min ${q.minAngleDeg.toFixed(1)}°, max ${q.maxAngleDeg.toFixed(1)}°`,
    `  area       ${fmt(q.area)} ${plain(L)}² (exact ${fmt(geometry.area)}, ${((q.area / geometry.area - 1) * 100).toFixed(4)} %)`,
    `  edge sizes ${fmt(q.minEdge)} … ${fmt(q.maxEdge)} ${plain(L)}`,
    `  time       ${(meshS * 1000).toFixed(0)} ms`,
  ];
  if (opts.svg) lines.push(`  picture    ${opts.svg}`);
  process.stdout.write(lines.join('\n') + '\n');
}
