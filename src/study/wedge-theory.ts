import type { FaceCondition, SiteFeature } from './types.js';
import { williamsRoots, kolosovKappa, type WilliamsRoots } from './williams.js';
import type { PlaneState } from '../model/types.js';

export interface WedgeTheory {
  /** governing eigenvalue (Re part) */
  lambda: number;
  /** eigenvalue of the symmetric (opening) family, used for the notch stress intensity */
  lambdaOpening: number;
  /** growth exponent q = 1 − λ of the peak, 0 when λ ≥ 1 */
  q: number;
  /** words: "free–free wedge 270°, λ = 0.5445" */
  why: string;
}

const clampQ = (lambda: number) => (lambda < 1 - 1e-9 ? 1 - lambda : 0);

/**
 * Williams (1952) theory for a wedge of interior angle α whose two faces are free, clamped or sliding
 * (a roller whose fixed direction is the face normal, i.e. a symmetry line). A sliding face is a mirror:
 * reflecting the wedge across it gives a wedge of angle 2α with the other face's condition on both faces and
 * only the symmetric family present (used when 2α ≤ 360°). Two sliding faces: λ = π/α (the first mode of the
 * mirror-bounded wedge) [from memory].
 */
export function wedgeTheory(alphaDeg: number, faces: [FaceCondition, FaceCondition], nu: number, state: PlaneState): WedgeTheory {
  const kappa = kolosovKappa(nu, state);
  const [a, b] = faces;
  const nSliding = (a === 'sliding' ? 1 : 0) + (b === 'sliding' ? 1 : 0);
  const nClamped = (a === 'clamped' ? 1 : 0) + (b === 'clamped' ? 1 : 0);
  const label = `${a}–${b} wedge ${round(alphaDeg)}°`;
  if (nSliding === 2) {
    const lambda = 180 / alphaDeg;
    return { lambda, lambdaOpening: lambda, q: clampQ(lambda), why: `${label}, λ = ${lambda.toFixed(4)}` };
  }
  if (nSliding === 1 && 2 * alphaDeg <= 360 + 1e-9) {
    const other = a === 'sliding' ? b : a;
    const r = williamsRoots(Math.min(2 * alphaDeg, 360), other === 'clamped' ? 'clamped-clamped' : 'free-free', kappa);
    const lambda = r.symmetric ?? r.lambdaMin;
    return { lambda, lambdaOpening: lambda, q: clampQ(lambda), why: `${label} (mirror of a ${other}–${other} wedge ${round(2 * alphaDeg)}°), λ = ${lambda.toFixed(4)}` };
  }
  // a sliding face on a wedge wider than 180° is treated as free (no mirror image fits)
  const na = a === 'sliding' ? 'free' : a;
  const nb = b === 'sliding' ? 'free' : b;
  const nc = (na === 'clamped' ? 1 : 0) + (nb === 'clamped' ? 1 : 0);
  const kind = nc === 0 ? 'free-free' : nc === 1 ? 'free-clamped' : 'clamped-clamped';
  void nClamped;
  const r: WilliamsRoots = williamsRoots(alphaDeg, kind, kappa);
  const lambda = r.lambdaMin;
  const lambdaOpening = r.symmetric ?? lambda;
  const cx = r.complex ? ` ± ${r.complex.im.toFixed(4)}i` : '';
  return { lambda, lambdaOpening, q: clampQ(lambda), why: `${label}, λ = ${lambda.toFixed(4)}${cx}` };
}

function round(v: number): string {
  return String(Math.round(v * 10) / 10);
}

/**
 * Growth exponent q = 1 − λ that theory predicts for a feature (docs/study.md, `growth.theory`): the Williams
 * (1952) wedge value at a corner, 1 for a concentrated force or point support (Flamant field ∝ 1/r), 0 for
 * fillets, smooth opening edges, plain edges and the interior.
 */
export function theoryExponent(feature: SiteFeature, section: { nu: number; state: PlaneState }): number {
  switch (feature.kind) {
    case 'point-load':
    case 'point-support':
      return 1;
    case 'corner':
    case 'support-edge': {
      const faces: [FaceCondition, FaceCondition] = feature.faceConditions
        ?? (feature.faces === 'clamped-clamped' ? ['clamped', 'clamped'] : feature.faces === 'free-clamped' ? ['free', 'clamped'] : ['free', 'free']);
      const angle = feature.interiorAngleDeg > 0 ? feature.interiorAngleDeg : 180;
      return wedgeTheory(angle, faces, section.nu, section.state).q;
    }
    default:
      return 0;
  }
}
