// Exact kitchen measures and temperature scales (no imports, shared by parsing and formatting).

// US customary, exact from the definitions (NIST Handbook 44, Appendix C): gallon = 231 in³ =
// 3.785411784 l; cup = 1/16 gal; fl oz = 1/8 cup; tbsp = 1/2 fl oz; tsp = 1/3 tbsp.
export const US_GALLON_ML = 3785.411784;
export const US_CUP_ML = 236.5882365;
export const US_FLOZ_ML = 29.5735295625;
export const US_TBSP_ML = 14.78676478125;
export const US_TSP_ML = 4.92892159375;
/** Metric cup and Australian tablespoon (DOMAIN.md). */
export const METRIC_CUP_ML = 250;
export const AU_TBSP_ML = 20;
/** Avoirdupois ounce and pound, exact (NIST Handbook 44, Appendix C). */
export const OUNCE_G = 28.349523125;
export const POUND_G = 453.59237;

/** °C → °F. */
export const cToF = (c: number): number => (c * 9) / 5 + 32;
/** °F → °C. */
export const fToC = (f: number): number => ((f - 32) * 5) / 9;
