// Photo calibration: the reference card's patches → a checked correction from camera RGB to CIELAB.
export { calibrateCard, restoreCalibration } from "./calibrate";
export type { Calibration, CalibrationParams, CandidateScore, CardPatch, PatchResult } from "./calibrate";
export { CalibrationError } from "./errors";
export type { CalibrationErrorCode } from "./errors";
export { features, fitModel, leaveOneOutXyz, MIN_PATCHES, predictXyz } from "./fit";
export type { CalibrationModel, ModelParams } from "./fit";
export { fitToneCurve, SRGB_PARAMS, toneCurveFromParams } from "./tone-curve";
export type { NeutralSample, ToneCurve, ToneCurveKind, ToneCurveParams } from "./tone-curve";
export { CLIP_LEVEL, CLIP_SHARE, CRUSH_LEVEL, GOOD_DE00, NEUTRAL_CHROMA, UNDEREXPOSED, USABLE_DE00 } from "./checks";
export type { CalibrationQuality } from "./checks";
export { patchGrid, samplePatch, squareToQuad, squareToQuadMatrix, trimmedMean } from "./grid";
export type { PatchPlace, PixelRect, Point, RawImage } from "./grid";
