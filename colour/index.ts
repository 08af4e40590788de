// The colour module in one import: conversions, differences, judgement, dye arithmetic, kitchen
// measures, and the spectral, calibration, swatch and synthetic-photo parts.
export type * from "./types";
export * from "./spaces";
export * from "./difference";
export * from "./judgement";
export * from "./arithmetic";
export * from "./units";

export * from "./spectral";
export * from "./calibration";
export * from "./swatch";
export * from "./synthetic";
export * from "./plan";
