/** Shared by the pipeline tests: the built binary, and a small plate with a far-field stress load. */
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { bin, root } from '../helpers/bin.js';
export { root };

/** The built binary run with `args` in `cwd` (default the repository), colour off. */
export function runCli(args: string[], cwd = root): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 120_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

/**
 * An invented bracket plate, 100 × 60 with a central hole, held by two symmetry rollers, pulled
 * up by an edge traction and — unless `farField` is false — stretched by a far-field stress
 * state σxx = sx on its right edge. Coarse on purpose: the tests compare runs, not accuracy.
 */
export function farFieldPlateText(farField = true): string {
  return `
title: bracket plate with a hole, far-field tension
params: { r: 8, sx: 50 }
material: { E: 210000, nu: 0.3 }
thickness: 2
plate:
  outline: [[0, 0], [100, 0], [100, 60], [0, 60]]
  openings: [ { id: hole, circle: { center: [50, 30], radius: r } } ]
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { y: 0 }, fix: [y] }
loads:
${farField ? '  - { where: { x: 100 }, stress: [sx, 0, 0] }\n' : ''}  - { where: { y: 60 }, traction: [0, 20] }
mesh: { size: 10, order: 2 }
study: { levels: 3 }
`;
}

/** A study without its timings and health warnings (the CLI adds those), for comparing runs. */
export function comparable(study: { timings?: unknown; warnings?: unknown }): unknown {
  const { timings: _t, warnings: _w, ...rest } = study;
  return JSON.parse(JSON.stringify(rest, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v)));
}

/** A field.csv as columns by header name (after the run-id stamp line). */
export function readFieldColumns(file: string): Record<string, number[]> {
  const [, header, ...rows] = readFileSync(file, 'utf8').trim().split('\r\n');
  const names = header.split(',').map((h) => h.replace(/"/g, ''));
  const cols: Record<string, number[]> = Object.fromEntries(names.map((n) => [n, []]));
  for (const r of rows) r.split(',').forEach((v, i) => cols[names[i]].push(Number(v)));
  return cols;
}
