/**
 * Quadrature rules of the reference elements, in one convention each.
 *
 * Triangle rules: points (ξ, η) on the reference triangle (0, 0), (1, 0), (0, 1) and weights that
 * **sum to 1**; a rule integrates over an element as
 *
 *     ∫_T f dA ≈ Σ_q w_q · f(x_q) · |J_q| / 2,
 *
 * |J| / 2 being the local area factor of the element map (the area itself on a straight triangle,
 * since the reference triangle has area ½). Edge rules: Gauss–Legendre points s on [−1, 1] and
 * weights that sum to 2 (the interval's length); ∫_edge f ds ≈ Σ_g w_g · f(x(s_g)) · |dx/ds|.
 *
 * A rule "of degree d" integrates every polynomial of total degree ≤ d exactly
 * (test/element/rules.test.ts checks each against ∫ ξ^a η^b = a! b! / (a + b + 2)!).
 */

/** A rule on the reference triangle; weights sum to 1 (multiply by |J|/2). */
export interface TriangleRule {
  xi: Float64Array;
  eta: Float64Array;
  w: Float64Array;
  /** highest total degree integrated exactly */
  degree: number;
}

/** A Gauss–Legendre rule on [−1, 1]; weights sum to 2. */
export interface EdgeRule {
  s: Float64Array;
  w: Float64Array;
  /** highest degree integrated exactly (2n − 1 for n points) */
  degree: number;
}

/** The centroid, weight 1: exact for degree 1. */
export const TRI_1: TriangleRule = { xi: Float64Array.of(1 / 3), eta: Float64Array.of(1 / 3), w: Float64Array.of(1), degree: 1 };

/**
 * Three interior points (1/6, 1/6), (2/3, 1/6), (1/6, 2/3), weight 1/3 each: exact for degree 2
 * (Strang & Fix, "An Analysis of the Finite Element Method", 1973, Table 4.1), hence exact for the
 * stiffness BᵀDB of a straight-sided LST, whose strains are linear; these are also the LST's
 * stress sampling points.
 */
export const TRI_3: TriangleRule = {
  xi: Float64Array.of(1 / 6, 2 / 3, 1 / 6),
  eta: Float64Array.of(1 / 6, 1 / 6, 2 / 3),
  w: Float64Array.of(1 / 3, 1 / 3, 1 / 3),
  degree: 2,
};

/**
 * Seven points exact for degree 5: the centroid and two orbits of three (J. Radon, "Zur
 * mechanischen Kubatur", Monatshefte für Mathematik 52, 1948; in the form tabulated by D. A.
 * Dunavant, "High degree efficient symmetrical Gaussian quadrature rules for the triangle",
 * IJNME 21, 1985), with its closed-form points and weights:
 * weights 9/40 and (155 ∓ √15)/1200, summing to 1.
 */
export const TRI_7: TriangleRule = (() => {
  const r = Math.sqrt(15);
  const b1 = (6 - r) / 21;
  const a1 = (9 + 2 * r) / 21;
  const b2 = (6 + r) / 21;
  const a2 = (9 - 2 * r) / 21;
  const w1 = (155 - r) / 1200;
  const w2 = (155 + r) / 1200;
  // (ξ, η, weight); ξ = L2, η = L3
  const pts: [number, number, number][] = [
    [1 / 3, 1 / 3, 9 / 40],
    [b1, b1, w1],
    [a1, b1, w1],
    [b1, a1, w1],
    [b2, b2, w2],
    [a2, b2, w2],
    [b2, a2, w2],
  ];
  return {
    xi: Float64Array.from(pts, (p) => p[0]),
    eta: Float64Array.from(pts, (p) => p[1]),
    w: Float64Array.from(pts, (p) => p[2]),
    degree: 5,
  };
})();

/**
 * Gauss–Legendre rules on [−1, 1] in closed form (Abramowitz & Stegun 1964, Table 25.4):
 * 3 points ±√(3/5), 0 with weights 5/9, 8/9; 5 points 0, ±⅓√(5 ∓ 2√(10/7)) with weights 128/225,
 * (322 ± 13√70)/900.
 */
export const GAUSS_LEGENDRE_3: EdgeRule = {
  s: Float64Array.of(-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)),
  w: Float64Array.of(5 / 9, 8 / 9, 5 / 9),
  degree: 5,
};

export const GAUSS_LEGENDRE_5: EdgeRule = (() => {
  const inner = Math.sqrt(5 - 2 * Math.sqrt(10 / 7)) / 3;
  const outer = Math.sqrt(5 + 2 * Math.sqrt(10 / 7)) / 3;
  const wInner = (322 + 13 * Math.sqrt(70)) / 900;
  const wOuter = (322 - 13 * Math.sqrt(70)) / 900;
  return {
    s: Float64Array.of(-outer, -inner, 0, inner, outer),
    w: Float64Array.of(wOuter, wInner, 128 / 225, wInner, wOuter),
    degree: 9,
  };
})();
