/**
 * Concentrated normal force on the straight edge of a half-plane (Flamant 1892; Timoshenko & Goodier 1970).
 * A compressive force P (per thickness t, so the line load is P/t) acts at the origin on the edge y = 0 of the
 * half-plane y < 0, pushing into the material (−y). The field is purely radial:
 * σ_r = −(2P/(π t r)) cos φ, σ_φ = τ_rφ = 0, φ measured from the load line (the inward normal).
 * The stress grows like 1/r: the peak on a mesh of size h grows like h^-1, so q = 1.
 */
export function flamantStress(P: number, t: number, x: number, y: number): { sxx: number; syy: number; sxy: number } {
  const r2 = x * x + y * y;
  // unit radial vector (x, y)/r; φ from the inward normal (0, −1): cos φ = −y/r
  const r = Math.sqrt(r2);
  const srr = (-(2 * P) / (Math.PI * t * r)) * (-y / r);
  const ex = x / r, ey = y / r;
  return { sxx: srr * ex * ex, syy: srr * ey * ey, sxy: srr * ex * ey };
}

/** Stress growth exponent of a concentrated force or point support (Flamant field ∝ 1/r). */
export const FLAMANT_EXPONENT = 1;
