/** The convergence study: Williams corner theory, convergence fits, verdicts, readouts, ladders. */
export type * from './types.js';
export { williamsRoots, familyRoots, brentRoot, kolosovKappa, type WedgeFaces, type WedgeRoot, type WilliamsRoots } from './williams.js';
export {
  threeLevelFit, observedOrderVariableRatio, lineFit, logLogSlope, incrementExponent, GCI_SAFETY_FACTOR,
  type ThreeLevelFit, type ConvergenceClass,
} from './fit.js';
export { judgeSite, VERDICT_RULES, type SiteVerdict, type SiteEstimate, type FitHistoryEntry } from './verdict.js';
export {
  ecaHoekstraBand, fixedOrderFit, freeOrderFit, finestSpread, farFieldHalfWidth, BAND_RULES,
  type BandEstimate, type LevelFit, type FitForm,
} from './band.js';
export { coarsenedOuterField } from './far-field.js';
export {
  tanhSinh, criticalDistance, pointMethod, lineMethod, lineAverage, sampledAverage, notchStressIntensity, nsifUnits,
  extrapolateToZero, hotSpotLinear, hotSpotQuadratic, hotSpotTypeB, hotSpotPoints,
} from './readouts.js';
export { wedgeTheory, theoryExponent, type WedgeTheory } from './wedge-theory.js';
export { findSites, snapSitePoint, listedSitePoints, SITE_RULES, type SiteCandidate } from './sites.js';
export { levelSizeField, probeLevel, LADDER_GRADING, NEIGHBOURHOOD_SIZES, APEX_SIZES, type SiteProbe } from './ladder.js';
export { runStudy, type StudyOptions, type BaseSolve } from './run.js';
export { reportedSites, roundToScale, isAboveYield } from './reported.js';
export { intensityBand, siteProbe, siteReadouts, reportedPosition, withPlateauExtent, DEFAULT_READOUT_FRACTION } from './site-readouts.js';
export { intensityNorm, reciprocalIntensity, singularTerm, type IntensitySetup, type IntensityNorm } from './stress-intensity.js';
export { atSupportEnd, isCrackLike, siteAdvice, withCauseAdvice } from './advice.js';
