/**
 * Many openings (issue 19, class 11): a perforated plate with k × k small round holes on a
 * square pitch, meshed at one size, so the element count per hole is the same for every k.
 * Prints the time for 400 and 1 600 holes (geometry build + mesh, median of 3 after a warm-up)
 * and their ratio; near-linear work in the number of boundary pieces gives a ratio near 4, the
 * goal is ≤ 6 (a quadratic part would give 16). Also the dof estimate made before meshing
 * (`estimateMeshSize`, a point-in-material test per quadtree leaf), which had the same problem.
 */
import { buildGeometry } from '../geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../mesh/index.js';
import { estimateMeshSize } from '../fem/health.js';
import type { Opening, Plate } from '../model/types.js';

/** Invented perforated cover plate: hole radius 2, pitch 10, mesh size 2 (about 320 LST per hole). */
export function perforatedPlate(k: number, pitch = 10, radius = 2): Plate {
  const openings: Opening[] = [];
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      openings.push({
        id: `h${i}-${j}`,
        shape: { kind: 'circle', center: [pitch * (i + 0.5), pitch * (j + 0.5)], radius },
        keyPath: `plate.openings[${openings.length}]`,
      });
    }
  }
  const side = k * pitch;
  return { outline: { kind: 'rect', center: [side / 2, side / 2], width: side, height: side, round: 0 }, openings };
}

function meshHoles(k: number): { ms: number; elements: number } {
  const t0 = performance.now();
  const geometry = buildGeometry(perforatedPlate(k));
  const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, { size: 2, local: [] }), order: 2 });
  return { ms: performance.now() - t0, elements: mesh.elemNodes.length / 6 };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[(s.length - 1) >> 1];
}

export function benchHoles(quick: boolean): void {
  const [small, large] = quick ? [10, 20] : [20, 40];
  meshHoles(small); // warm-up
  const runs = (k: number) => {
    const times: number[] = [];
    let elements = 0;
    for (let r = 0; r < 3; r++) {
      const m = meshHoles(k);
      times.push(m.ms);
      elements = m.elements;
    }
    return { ms: median(times), elements };
  };
  const a = runs(small);
  const b = runs(large);
  const line = (k: number, r: { ms: number; elements: number }) =>
    `  ${String(k * k).padStart(5)} holes: ${(r.ms / 1000).toFixed(2)} s, ${r.elements} LST (${(r.elements / (k * k)).toFixed(0)} per hole), median of 3\n`;
  process.stdout.write(line(small, a) + line(large, b));
  process.stdout.write(`  ratio ${(b.ms / a.ms).toFixed(2)} for ${((large * large) / (small * small)).toFixed(0)}× the holes (goal ≤ 6 for 4×)\n`);
  const estimate = (k: number): number => {
    const geometry = buildGeometry(perforatedPlate(k));
    const sizeAt = sizeFieldFromSettings(geometry, { size: 2, local: [] });
    const t0 = performance.now();
    estimateMeshSize(geometry, sizeAt, 2);
    return performance.now() - t0;
  };
  const ea = estimate(small), eb = estimate(large);
  process.stdout.write(`  dof estimate before meshing: ${(ea / 1000).toFixed(2)} s and ${(eb / 1000).toFixed(2)} s, ratio ${(eb / ea).toFixed(2)}\n`);
}
