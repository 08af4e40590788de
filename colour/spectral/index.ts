// The spectral layering model: reflectance curves from colours (Burns's LHTSS), Kubelka-Munk K/S,
// dye profiles learnt from calibration dyeings, and layer predictions with coverage and gradients.
export * from "./cie-data";
export * from "./spectral-rgb";
export * from "./reflectance";
export * from "./kubelka-munk";
export * from "./profile";
export * from "./predict";
export { cachedLabToReflectance } from "./cache";
export { nnls } from "./nnls";
