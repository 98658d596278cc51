/** Closed-form solutions used to check the solver and the study (pure functions). */
export { kolosov } from './elastic.js';
export { kirschPolar, kirschCartesian, kirschDisplacement, kirschHoopAtEdge, KIRSCH_KT } from './kirsch.js';
export { lameRing, lameClosedCylinder } from './lame.js';
export { inglisKt, inglisKtFromRadius, inglisField } from './inglis.js';
export {
  heywoodKtn, heywoodKtg, netToGross, grossToNet, howlandKtg, HOWLAND_KTG_FROM_MEMORY, petersonFitKtn, roarkKtn,
} from './strip.js';
export { cantileverStress, cantileverDisplacement, cantileverTipDeflection, type CantileverData } from './cantilever.js';
export { flamantStress, FLAMANT_EXPONENT } from './flamant.js';
export { wedgeModeIB, wedgeModeIField, lShapeModeIField, L_SHAPE_LAMBDA, type WedgeModeI } from './wedge.js';
