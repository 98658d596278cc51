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
