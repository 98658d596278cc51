/**
 * Stress intensity of a sharp notch or crack tip from a finite element solution, by the reciprocal work
 * (interaction) integral in its domain form.
 *
 * Method. Two elastic fields without body forces, both traction-free on the faces of a wedge, satisfy
 * Betti's reciprocal theorem, so the contour integral H = ∮_Γ (t·u* − t*·u) ds over an arc Γ around the apex
 * is the same for every arc. With u* the Williams (1952) eigenfunction of exponent −λ (the "dual" of the
 * symmetric eigenfunction of exponent λ: −λ is a root of the same characteristic equation), every term of the
 * Williams expansion of the FE field other than the λ term gives an r-dependent contribution and so none
 * at all: H picks out the λ term's amplitude exactly, whatever the higher terms, the T-stress and the rigid
 * motion. M. Stern, E. B. Becker & R. S. Dunham, "A contour integral computation of mixed-mode stress
 * intensity factors", Int. J. Fracture 12 (1976) 359–368 (cracks); W. C. Carpenter, "Calculation of fracture
 * mechanics parameters for a general corner", Int. J. Fracture 24 (1984) 45–58 (notches) [from memory for the
 * page numbers]. The contour is turned into an integral over an annulus with a weight q (1 inside r ≤ R₁,
 * 0 outside r ≥ R₂, linear in r between; nodal values interpolated by the element's shape functions), as
 * for the J integral: H = −∫_A (σ_ij u*_i − σ*_ij u_i) ∂q/∂x_j dA. F. Z. Li, C. F. Shih & A. Needleman,
 * "A comparison of methods for calculating energy release rates", Eng. Fract. Mech. 21 (1985) 405–421.
 * The annulus keeps away from the apex, where the polynomial elements cannot follow r^(λ−1), and the area
 * integral averages out the pointwise error of the stresses; for a crack (360°, λ = 1/2) H is the mode I
 * interaction integral and K is K_I with its usual meaning.
 *
 * K is normalised as the generalised notch stress intensity K = lim √(2π) r^(1−λ) σ_θθ(r, 0) on the bisector
 * (Gross & Mendelson 1972): K = K₁ · H_FE / H₁, with H₁ the same integral between the unit eigenfunction and
 * its dual (by quadrature over the arc r = 1) and K₁ that eigenfunction's own K.
 *
 * Body loads (issue 14). With a body force b and a thermal strain ε₀ = c·(1, 1, 0) in the plate, the FE field
 * satisfies div σ + b = 0 with σ = D(ε − ε₀), so the integrand F_j = σ_ij u*_i − σ*_ij u_i is no longer
 * divergence-free: div F = −(b·u* + ε₀:σ*). The contour integral as the arc shrinks to the apex (which is what
 * K measures) is then H = −∫ F·∇q dA + ∫ q (b·u* + c tr σ*) dA, σ the stress in the material. The second
 * integral covers the whole disk r ≤ R₂, apex included, where tr σ* ~ r^(−λ−1) defeats quadrature; so c is
 * split into its apex value c₀ and the rest: tr σ* = div(σ*·ξ) (ξ = x − apex, div σ* = 0) turns
 * ∫ q c₀ tr σ* dA into −c₀ ∫ σ*_ij ξ_i ∂q/∂x_j dA over the annulus (no boundary terms: q = 0 outside,
 * σ*·n = 0 on the faces, σ*·ξ·r → 0 at the apex), and (c − c₀) tr σ* ~ r^(−λ) and b·u* ~ r^(−λ) are
 * integrable by the element rule. Without body loads the integral is exactly the one above.
 *
 * A mirror (a straight face whose normal displacement is held: a symmetry line) is a face of the mirrored
 * wedge's bisector: both fields are symmetric, so t·u* − t*·u vanishes on it, the integral over the real
 * (half) wedge is exactly half the mirrored wedge's, and K is 2·(half integral)·K₁/H₁.
 */
import type { Mesh } from '../mesh/types.js';
import type { Point } from '../model/types.js';
import type { ElasticSection } from '../fem/types.js';
import { cstGradients, elasticityMatrix, gatherElementXY, lstGradients, lstShape, type BodyFields } from '../fem/index.js';
import { wedgeModeIField } from '../reference/index.js';
import { TRI_7 } from '../element/index.js';

/** Where and how to take K at one site. */
export interface IntensitySetup {
  apex: Point;
  /** unit bisector of the (mirrored) free–free wedge, into the material */
  bisector: Point;
  /** material angle of the free–free wedge the eigenfunction lives on (the mirrored one at a mirror), degrees */
  alphaDeg: number;
  /** exponent of its symmetric (opening) family, 0 < λ < 1 */
  lambda: number;
  /** (mirrored angle) / (real angle): 2 at a mirror, 1 otherwise */
  mirrorFactor: number;
  /** annulus of the domain integral: q = 1 for r ≤ innerRadius, 0 for r ≥ outerRadius */
  innerRadius: number;
  outerRadius: number;
}

/** The eigenfunction's own integral H₁ and stress intensity K₁ (amplitude A = 1). */
export interface IntensityNorm {
  H1: number;
  K1: number;
}

// the 7-point degree-5 rule (element/rules.ts): the dual field varies like r^(−λ−1) across an element, so the
// element's own 3-point rule is not enough (it scattered K by a few tenths of a per cent)
const RULE = TRI_7;

const fieldOf = (alphaDeg: number, lambda: number, bisectorDeg: number, section: Pick<ElasticSection, 'E' | 'nu' | 'state'>) =>
  (x: number, y: number) => wedgeModeIField({ alphaDeg, lambda, bisectorDeg, A: 1, E: section.E, nu: section.nu, state: section.state }, x, y);

/**
 * H₁ by composite Simpson quadrature over the arc r = 1 (the integrand is a trigonometric polynomial in θ:
 * 2000 panels are exact to round-off) and K₁ = √(2π) σ_θθ(1, 0) of the unit eigenfunction.
 */
export function intensityNorm(alphaDeg: number, lambda: number, section: Pick<ElasticSection, 'E' | 'nu' | 'state'>): IntensityNorm {
  const alpha = (alphaDeg * Math.PI) / 180;
  const f = fieldOf(alphaDeg, lambda, 0, section);
  const g = fieldOf(alphaDeg, -lambda, 0, section);
  const n = 2000;
  let s = 0;
  for (let i = 0; i <= n; i++) {
    const th = -alpha / 2 + (alpha * i) / n;
    const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
    const x = Math.cos(th), y = Math.sin(th);
    const a = f(x, y), b = g(x, y);
    const tx = a.sxx * x + a.sxy * y, ty = a.sxy * x + a.syy * y;
    const sx = b.sxx * x + b.sxy * y, sy = b.sxy * x + b.syy * y;
    s += w * (tx * b.ux + ty * b.uy - sx * a.ux - sy * a.uy);
  }
  const H1 = (s * (alpha / n)) / 3;
  // on the bisector (local x axis) σ_θθ is σ_yy
  const K1 = Math.sqrt(2 * Math.PI) * f(1, 0).syy;
  return { H1, K1 };
}

/**
 * K at one site from the displacements u of one solve (whole-thickness units cancel: stresses only).
 * Elements with all their nodes at one value of q add nothing and are skipped.
 */
export function reciprocalIntensity(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>, u: Float64Array, section: Pick<ElasticSection, 'E' | 'nu' | 'state'>,
  setup: IntensitySetup, norm: IntensityNorm, body: BodyFields = {},
): number {
  const { apex, innerRadius: R1, outerRadius: R2 } = setup;
  const D = elasticityMatrix(section);
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  const dual = fieldOf(setup.alphaDeg, -setup.lambda, (Math.atan2(setup.bisector[1], setup.bisector[0]) * 180) / Math.PI, section);
  const exy = new Float64Array(2 * npe), dNdx = new Float64Array(6), dNdy = new Float64Array(6), N = new Float64Array(6), qe = new Float64Array(6);
  const qAt = (x: number, y: number) => {
    const r = Math.hypot(x - apex[0], y - apex[1]);
    return r <= R1 ? 1 : r >= R2 ? 0 : (R2 - r) / (R2 - R1);
  };
  const { force, strain } = body;
  const c0 = strain ? strain(apex[0], apex[1]) : 0;
  let H = 0;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    let varies = false;
    let inside = false;
    for (let i = 0; i < npe; i++) {
      qe[i] = qAt(exy[2 * i], exy[2 * i + 1]);
      if (qe[i] !== qe[0]) varies = true;
      if (qe[i] > 0) inside = true;
    }
    // elements with q constant add to the body-load integral only (where q = 1)
    if (!varies && !((force || strain) && inside)) continue;
    let det = 0;
    if (npe === 3) det = cstGradients(exy, dNdx, dNdy);
    for (let g = 0; g < RULE.w.length; g++) {
      const xi = RULE.xi[g], eta = RULE.eta[g];
      if (npe === 3) {
        N[0] = 1 - xi - eta; N[1] = xi; N[2] = eta;
      } else {
        det = lstGradients(exy, xi, eta, dNdx, dNdy);
        lstShape(xi, eta, N);
      }
      let px = 0, py = 0, ux = 0, uy = 0, ex = 0, ey = 0, gxy = 0, qx = 0, qy = 0, q = 0;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        const ui = u[2 * n], vi = u[2 * n + 1];
        px += N[i] * exy[2 * i]; py += N[i] * exy[2 * i + 1];
        ux += N[i] * ui; uy += N[i] * vi;
        ex += dNdx[i] * ui; ey += dNdy[i] * vi; gxy += dNdy[i] * ui + dNdx[i] * vi;
        qx += dNdx[i] * qe[i]; qy += dNdy[i] * qe[i]; q += N[i] * qe[i];
      }
      // the stress in the material: the thermal strain off the total strain
      const c = strain ? strain(px, py) : 0;
      if (c !== 0) {
        ex -= c;
        ey -= c;
      }
      const sxx = D[0] * ex + D[1] * ey + D[2] * gxy;
      const syy = D[3] * ex + D[4] * ey + D[5] * gxy;
      const sxy = D[6] * ex + D[7] * ey + D[8] * gxy;
      const dx = px - apex[0], dy = py - apex[1];
      const b = dual(dx, dy);
      let Fx = sxx * b.ux + sxy * b.uy - (b.sxx * ux + b.sxy * uy);
      let Fy = sxy * b.ux + syy * b.uy - (b.sxy * ux + b.syy * uy);
      // c₀ tr σ* as −σ*·ξ·∇q (see above): F gains −c₀ σ*_ij ξ_i, so the −F·∇q below carries it
      if (c0 !== 0) {
        Fx += c0 * (b.sxx * dx + b.sxy * dy);
        Fy += c0 * (b.sxy * dx + b.syy * dy);
      }
      // weights sum to 1: the area factor is |J|/2
      H -= (Fx * qx + Fy * qy) * RULE.w[g] * det * 0.5;
      if (q !== 0 && (force || strain)) {
        let src = (c - c0) * (b.sxx + b.syy);
        if (force) {
          const [bx, by] = force(px, py);
          src += bx * b.ux + by * b.uy;
        }
        H += q * src * RULE.w[g] * det * 0.5;
      }
    }
  }
  return (setup.mirrorFactor * H * norm.K1) / norm.H1;
}

/**
 * The singular term of the site's (mirrored) wedge with stress intensity K at distance r along the bisector:
 * the unit eigenfunction's stresses (global axes) scaled by K/K₁.
 */
export function singularTerm(setup: IntensitySetup & { norm: IntensityNorm }, K: number, section: Pick<ElasticSection, 'E' | 'nu' | 'state'>) {
  const f = fieldOf(setup.alphaDeg, setup.lambda, (Math.atan2(setup.bisector[1], setup.bisector[0]) * 180) / Math.PI, section);
  const c = K / setup.norm.K1;
  return (r: number): { sxx: number; syy: number; sxy: number } => {
    const p = f(r * setup.bisector[0], r * setup.bisector[1]);
    return { sxx: c * p.sxx, syy: c * p.syy, sxy: c * p.sxy };
  };
}
