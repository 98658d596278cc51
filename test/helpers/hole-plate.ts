/**
 * The 100 × 60 plate with a central hole (r = 8) the load-case tests share: held in x on x = 0 and in
 * y at the origin, so any case of edge tractions can be put on it. `rest` adds the loads or cases,
 * mesh and study keys.
 */
export function holePlateModel(title: string, rest: string): string {
  return `
title: ${title}
material: { E: 210000, nu: 0.3 }
thickness: 1
plate:
  outline: [[0, 0], [100, 0], [100, 60], [0, 60]]
  openings: [ { id: hole, circle: { center: [50, 30], radius: 8 } } ]
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { point: [0, 0] }, fix: [y] }
${rest.replace(/^\n/, '')}`;
}
