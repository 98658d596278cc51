/**
 * Finite-width strip of width W with a central circular hole of diameter d, axial tension.
 * K_tn is on the net section P/((W − d)t), K_tg on the gross section P/(Wt); K_tg = K_tn/(1 − d/W).
 */

/** R. B. Heywood, Designing by Photoelasticity, Chapman & Hall (1952): K_tn = 2 + (1 − d/W)³ [from memory]. */
export function heywoodKtn(dOverW: number): number {
  return 2 + Math.pow(1 - dOverW, 3);
}

export function netToGross(ktn: number, dOverW: number): number {
  return ktn / (1 - dOverW);
}

export function grossToNet(ktg: number, dOverW: number): number {
  return ktg * (1 - dOverW);
}

/** Heywood (1952) on the gross section. */
export function heywoodKtg(dOverW: number): number {
  return netToGross(heywoodKtn(dOverW), dOverW);
}

/**
 * Gross-section values usually quoted from R. C. J. Howland, "On the stresses in the neighbourhood of a
 * circular hole in a strip under tension", Phil. Trans. R. Soc. Lond. A 229 (1930) 49–86 [from memory;
 * an independent FE computation (9-node quadrilaterals on graded meshes, Richardson-extrapolated) sits 0.2–0.6 % above them].
 * d/W = 0 is Kirsch's infinite-plate value 3.
 */
export const HOWLAND_KTG_FROM_MEMORY: ReadonlyArray<readonly [dOverW: number, ktg: number]> = [
  [0, 3.0], [0.1, 3.03], [0.2, 3.14], [0.3, 3.36], [0.4, 3.74], [0.5, 4.32],
];

/**
 * Howland (1930) K_tg interpolated in d/W (quadratic through the three nearest table entries),
 * for 0 ≤ d/W ≤ 0.5. Outside that range it is a RangeError.
 */
export function howlandKtg(dOverW: number): number {
  const t = HOWLAND_KTG_FROM_MEMORY;
  if (!(dOverW >= 0 && dOverW <= 0.5)) throw new RangeError(`Howland table covers 0 ≤ d/W ≤ 0.5, got ${dOverW}`);
  let i = Math.min(Math.max(Math.round(dOverW / 0.1) - 1, 0), t.length - 3);
  let s = 0;
  for (let j = i; j < i + 3; j++) {
    let w = 1;
    for (let k = i; k < i + 3; k++) if (k !== j) w *= (dOverW - t[k][0]) / (t[j][0] - t[k][0]);
    s += w * t[j][1];
  }
  return s;
}

/**
 * Curve fit of Peterson's chart: K_tn = 2 + 0.284(1 − d/W) − 0.600(1 − d/W)² + 1.32(1 − d/W)³.
 * W. D. Pilkey & D. F. Pilkey, Peterson's Stress Concentration Factors, 3rd ed. (2008), Chart 4.1 [from memory].
 */
export function petersonFitKtn(dOverW: number): number {
  const m = 1 - dOverW;
  return 2 + 0.284 * m - 0.6 * m * m + 1.32 * m * m * m;
}

/**
 * W. C. Young & R. G. Budynas, Roark's Formulas for Stress and Strain, 7th ed. (2002), Table 17.1:
 * K_tn = 3 − 3.13(d/W) + 3.66(d/W)² − 1.53(d/W)³.
 */
export function roarkKtn(dOverW: number): number {
  const x = dOverW;
  return 3 - 3.13 * x + 3.66 * x * x - 1.53 * x * x * x;
}
