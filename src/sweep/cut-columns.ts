/**
 * The stress columns a cut from another analysis may carry (--cut-other): a leaf module, so the
 * command definitions can name them in their help without loading the cut code.
 */
export const OTHER_CUT_COLUMNS = ['sxx', 'syy', 'sxy', 'szz', 's1', 's2', 'von_mises', 'tresca', 'tangential'] as const;
export type OtherCutColumn = (typeof OTHER_CUT_COLUMNS)[number];
