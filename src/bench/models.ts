/**
 * The benchmark's model builder: the square plate (side 20a) with a central hole of radius a
 * under uniaxial tension, LST, meshed at a given size, as a pipeline problem. The tension is a
 * traction on the right edge (what `npm run bench` times) or, the same load written as a
 * far-field stress state σxx = 100 on that edge; both go through `problemOf`, so neither can lose
 * its load on the way to the solver.
 */
import { parseModel } from '../model/index.js';
import { problemOf, type Problem } from '../pipeline/index.js';

export type HolePlateLoad = 'traction' | 'far-field';

/** The model text of the hole plate at element size `size`. */
export function holePlateText(size: number, load: HolePlateLoad = 'traction'): string {
  const tension = load === 'traction' ? 'traction: [100, 0]' : 'stress: [100, 0, 0]';
  return `
title: bench square plate with a central hole
material: { E: 210000, nu: 0.3 }
thickness: 1
plate:
  outline: [[0, 0], [200, 0], [200, 200], [0, 200]]
  openings: [ { id: hole, circle: { center: [100, 100], radius: 10 } } ]
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { point: [0, 0] }, fix: [y] }
loads:
  - { where: { x: 200 }, ${tension} }
mesh: { size: ${size}, order: 2 }
`;
}

/** The hole plate as the pipeline's problem. */
export function holePlateProblem(size: number, load: HolePlateLoad = 'traction'): Problem {
  return problemOf(parseModel(holePlateText(size, load), 'bench-hole.yaml'));
}
