/**
 * Elliptical hole, semi-axis a across the remote tension, b along it: Kt = 1 + 2a/b at the ends of a.
 * C. E. Inglis, "Stresses in a plate due to the presence of cracks and sharp corners",
 * Trans. Inst. Naval Architects 55 (1913) 219–241.
 */
export function inglisKt(a: number, b: number): number {
  return 1 + (2 * a) / b;
}

/** Same, written with the tip radius of curvature ρ = b²/a: Kt = 1 + 2√(a/ρ) (Inglis 1913). */
export function inglisKtFromRadius(a: number, rho: number): number {
  return 1 + 2 * Math.sqrt(a / rho);
}
