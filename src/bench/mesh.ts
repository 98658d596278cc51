/**
 * Mesher benchmark: an invented machine-base plate, 1000 × 600, with five bolt and cable holes
 * and one rounded cooling slot, meshed at a uniform size to about 200 000 triangles. Prints the
 * mesher's time (median of 3), triangles per second, the time plain `delaunator` takes on the
 * same final points (median of 3) and the ratio; the goal (issue 2) is a ratio ≤ 3.
 */
import Delaunator from 'delaunator';
import { fileURLToPath } from 'node:url';
import { buildGeometry } from '../geometry/index.js';
import { meshPlate, meshQuality, sizeFieldFromSettings } from '../mesh/index.js';
import type { Plate } from '../model/types.js';

const BASE_PLATE: Plate = {
  outline: { kind: 'rect', center: [500, 300], width: 1000, height: 600, round: 30 },
  openings: [
    { id: 'bolt-a', shape: { kind: 'circle', center: [120, 120], radius: 22 }, keyPath: 'plate.openings[0]' },
    { id: 'bolt-b', shape: { kind: 'circle', center: [880, 120], radius: 22 }, keyPath: 'plate.openings[1]' },
    { id: 'bolt-c', shape: { kind: 'circle', center: [120, 480], radius: 22 }, keyPath: 'plate.openings[2]' },
    { id: 'bolt-d', shape: { kind: 'circle', center: [880, 480], radius: 22 }, keyPath: 'plate.openings[3]' },
    { id: 'cable', shape: { kind: 'circle', center: [640, 300], radius: 60 }, keyPath: 'plate.openings[4]' },
    { id: 'slot', shape: { kind: 'rect', center: [330, 300], width: 220, height: 50, round: 24 }, keyPath: 'plate.openings[5]' },
  ],
};

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[(s.length - 1) >> 1];
}

export async function benchMesh(size = 2.55, log = true): Promise<Record<string, number>> {
  const geom = buildGeometry(BASE_PLATE);
  const sizeAt = sizeFieldFromSettings(geom, { size, local: [] });
  // warm-up on a coarse mesh so the timed runs measure compiled code
  meshPlate(geom, { sizeAt: sizeFieldFromSettings(geom, { size: 20, local: [] }), order: 1 });
  const meshTimes: number[] = [];
  let mesh = meshPlate(geom, { sizeAt, order: 1 });
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    mesh = meshPlate(geom, { sizeAt, order: 1 });
    meshTimes.push(performance.now() - t0);
  }
  const q = meshQuality(mesh);
  const pts = mesh.xy.slice(0, 2 * mesh.nVertices);
  const delTimes: number[] = [];
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    const d = new Delaunator(pts);
    delTimes.push(performance.now() - t0);
    if (d.triangles.length === 0) throw new Error('delaunator returned no triangles');
  }
  const t2 = performance.now();
  meshPlate(geom, { sizeAt, order: 2 });
  const order2Ms = performance.now() - t2;
  // a study-sized mesh (about 5 000 triangles), remeshed many times by the refinement ladder
  const smallSize = size * Math.sqrt(q.elements / 5000);
  const smallAt = sizeFieldFromSettings(geom, { size: smallSize, local: [] });
  const smallTimes: number[] = [];
  let smallTris = 0;
  for (let k = 0; k < 7; k++) {
    const t0 = performance.now();
    smallTris = meshPlate(geom, { sizeAt: smallAt, order: 2 }).elemNodes.length / 6;
    smallTimes.push(performance.now() - t0);
  }
  const meshMs = median(meshTimes);
  const delMs = median(delTimes);
  const r = {
    triangles: q.elements,
    vertices: mesh.nVertices,
    meshMs,
    trianglesPerSecond: q.elements / (meshMs / 1000),
    delaunatorMs: delMs,
    ratio: meshMs / delMs,
    order2Ms,
    minAngleDeg: q.minAngleDeg,
    smallTriangles: smallTris,
    smallOrder2Ms: median(smallTimes),
  };
  if (log) {
    console.log(`mesh: machine-base plate 1000×600, 6 openings, size ${size}`);
    console.log(`  triangles            ${r.triangles} (${r.vertices} vertices), min angle ${r.minAngleDeg.toFixed(2)}°`);
    console.log(`  mesher (order 1)     ${r.meshMs.toFixed(0)} ms  (median of 3)`);
    console.log(`  triangles per second ${Math.round(r.trianglesPerSecond)}`);
    console.log(`  delaunator alone     ${r.delaunatorMs.toFixed(0)} ms on the same points (median of 3)`);
    console.log(`  ratio mesher / Delaunay ${r.ratio.toFixed(2)}  (goal ≤ 3)`);
    console.log(`  mesher (order 2)     ${r.order2Ms.toFixed(0)} ms`);
    console.log(`  study-sized mesh     ${r.smallTriangles} triangles, order 2: ${r.smallOrder2Ms.toFixed(1)} ms (median of 7)`);
  }
  return r;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  await benchMesh();
}
