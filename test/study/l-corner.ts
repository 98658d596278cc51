/**
 * The 270° L plate the stress-intensity tests share: unit material in plane stress, the re-entrant
 * corner at the origin, and the reciprocal-work setup at that corner (bisector, Williams λ, the
 * annulus 0.25 ≤ r ≤ 0.5 the integral runs over).
 */
import { LAMBDA_270 } from '../recovery/williams-field.js';

export const E = 1, nu = 0.3, mu = E / (2 * (1 + nu)), kappa = (3 - nu) / (1 + nu);
export const section = { E, nu, state: 'plane-stress' as const };
export const lPlate = { outline: { kind: 'polygon' as const, vertices: [[0, 0], [1, 0], [1, 1], [-1, 1], [-1, -1], [0, -1]].map((at) => ({ at: at as [number, number], round: 0 })) }, openings: [] };
export const setup = {
  apex: [0, 0] as [number, number], bisector: [-Math.SQRT1_2, Math.SQRT1_2] as [number, number],
  alphaDeg: 270, lambda: LAMBDA_270, mirrorFactor: 1, innerRadius: 0.25, outerRadius: 0.5,
};
