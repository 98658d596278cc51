/** Small builders for plates in geometry tests (the model loader is not needed here). */
import type { Opening, Plate, Point, PolygonVertex, Shape } from '../../src/model/types.js';

export function poly(points: ReadonlyArray<readonly [number, number]>, rounds: Record<number, number> = {}): Shape {
  const vertices: PolygonVertex[] = points.map((p, i) => ({ at: [p[0], p[1]] as Point, round: rounds[i] ?? 0 }));
  return { kind: 'polygon', vertices };
}

export function rectPoints(x0: number, y0: number, w: number, h: number): Array<[number, number]> {
  return [[x0, y0], [x0 + w, y0], [x0 + w, y0 + h], [x0, y0 + h]];
}

export function circle(cx: number, cy: number, r: number): Shape {
  return { kind: 'circle', center: [cx, cy], radius: r };
}

export function ellipse(cx: number, cy: number, a: number, b: number, angleDeg = 0): Shape {
  return { kind: 'ellipse', center: [cx, cy], a, b, angleDeg };
}

export function rect(cx: number, cy: number, width: number, height: number, round = 0): Shape {
  return { kind: 'rect', center: [cx, cy], width, height, round };
}

export function plate(outline: Shape, ...openings: Shape[]): Plate {
  const ops: Opening[] = openings.map((shape, i) => ({ id: `h${i}`, shape, keyPath: `plate.openings[${i}]` }));
  return { outline, openings: ops };
}

/** L-shaped bracket: 100 × 100 with the top-right 60 × 60 quadrant removed; vertex 3 is the re-entrant corner. */
export const L_POINTS: Array<[number, number]> = [[0, 0], [100, 0], [100, 40], [40, 40], [40, 100], [0, 100]];
