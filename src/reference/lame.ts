import type { PlaneState } from '../model/types.js';

/**
 * Thick ring (annulus) a ≤ r ≤ b under internal pressure p and external pressure q.
 * G. Lamé, Leçons sur la théorie mathématique de l'élasticité des corps solides (1852);
 * Timoshenko & Goodier (1970). σ_r = A − B/r², σ_θ = A + B/r² with
 * A = (p a² − q b²)/(b² − a²), B = (p − q) a² b²/(b² − a²).
 */
export function lameRing(
  ring: { a: number; b: number; p: number; q?: number },
  r: number, E: number, nu: number, state: PlaneState = 'plane-stress',
): { sr: number; st: number; sz: number; ur: number } {
  const { a, b, p } = ring;
  const q = ring.q ?? 0;
  const d = b * b - a * a;
  const A = (p * a * a - q * b * b) / d;
  const B = ((p - q) * a * a * b * b) / d;
  const sr = A - B / (r * r);
  const st = A + B / (r * r);
  if (state === 'plane-strain') {
    // plane strain: ε_z = 0, σ_z = ν(σ_r + σ_θ) = 2νA; u_r = r ε_θ with ε_θ = [(1−ν²)σ_θ − ν(1+ν)σ_r]/E
    const ur = ((1 + nu) / E) * ((1 - 2 * nu) * A * r + B / r);
    return { sr, st, sz: 2 * nu * A, ur };
  }
  const ur = ((1 - nu) * A * r + ((1 + nu) * B) / r) / E;
  return { sr, st, sz: 0, ur };
}

/**
 * Thick cylinder a ≤ r ≤ b with closed ends under internal pressure p (a body of revolution, the
 * end caps' pull carried by the wall): Lamé (1852); Timoshenko & Goodier (1970) §33; Young & Budynas,
 * Roark's Formulas for Stress and Strain, 7th ed. (2002) Table 13.5. σr = A − B/r², σθ = A + B/r²,
 * σz = A with A = p a²/(b² − a²), B = p a² b²/(b² − a²); u_r = r(σθ − ν(σr + σz))/E.
 */
export function lameClosedCylinder(a: number, b: number, p: number, r: number, E: number, nu: number): { sr: number; st: number; sz: number; ur: number } {
  const d = b * b - a * a;
  const A = (p * a * a) / d;
  const B = (p * a * a * b * b) / d;
  const sr = A - B / (r * r);
  const st = A + B / (r * r);
  return { sr, st, sz: A, ur: (r * (st - nu * (sr + A))) / E };
}
