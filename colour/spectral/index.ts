// The spectral layering model: reflectance curves from colours (Burns's LHTSS), Kubelka-Munk K/S,
// dye profiles learnt from calibration dyeings, and layer predictions with coverage and gradients.
// Internal helpers (the RGB frame, NNLS, the refinement, caches) are imported from their files.
export * from "./cie-data";
export * from "./reflectance";
export * from "./kubelka-munk";
export * from "./profile";
export * from "./predict";
