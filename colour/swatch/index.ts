// Swatch reading: the robust colour of a yarn region and its dominant colours with area shares.
export { cropPixels, readRegion, readSwatch, UNCALIBRATED } from "./region";
export type { ReadOptions, SwatchCalibration, SwatchReading } from "./region";
export { groupColours, LAB_WEIGHTS, paletteOf } from "./palette";
export { classify } from "./roles";
export type { ClusterSummary, Role } from "./roles";
export { applyWindow, litWindow } from "./lit";
export type { LitWindow } from "./lit";
export type { ColourGroup, Samples } from "./palette";
export { assignNearest, kmeans, seeded } from "./kmeans";
export type { KMeansResult } from "./kmeans";
