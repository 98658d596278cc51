/**
 * A signboard base plate with a cable hole, shared by the cut tests: wide against the hole
 * (d/W = 0.1) so Kirsch (1898) applies at the hole edge.
 */
export const SIGN_PLATE_MODEL = `
title: Sign base plate, cable hole
params: { W: 200, L: 400, a: 10, S: 100 }
material: { E: 200000, nu: 0.3 }
thickness: 6
plate:
  outline: [[0, 0], [L, 0], [L, W], [0, W], [0, W/2]]
  openings:
    - { id: cable, circle: { center: [L/2, W/2], radius: a } }
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { point: [0, W/2] }, fix: [y] }
loads:
  - { where: { x: L }, traction: [S, 0] }
mesh:
  size: 20
  local: [ { near: [L/2, W/2], size: 0.8, radius: 25 } ]
`;
