// CIE data for the spectral model: 36 bands, 380–730 nm at 10 nm (the band set of Burns's
// reflectance-recovery papers).
//
// Sources:
// - x̄, ȳ, z̄: CIE 1931 2° standard observer, CIE 15:2004 (the 10 nm rows of the CIE table, six
//   decimals as printed there) — written down from that table [memory], then verified against the
//   D65-weighted CMF table shipped by spectral.js 3.0.0 (MIT): for every band here the ratio
//   (x̄·S)/(its weight) is the same constant to 1.2e-4 (worst: x̄ at 720 nm, where the 1 nm CIE table
//   carries 0.002899327 and the 10 nm row 0.002899), i.e. the numbers are the same.
// - S: CIE standard illuminant D65 relative spectral power, CIE 15:2004 Table T.1 (10 nm rows)
//   [memory; verified the same way, since spectral.js's weights are x̄·S products].
//
// The weights below are x̄·S, ȳ·S, z̄·S normalised so that Σ ȳ·S over these 36 bands is 1: a
// perfect white (ρ = 1 everywhere) has Y = 1 exactly. Plain 10 nm sampling over 380–730 nm gives
// the white X 0.950119, Z 1.088161 (computed from the rows below), not the ASTM E308 values
// (0.95047, 1.08883) that come from 1 nm data or from E308's own 10 nm weighting tables. The
// spectral path therefore uses its own white (SPECTRAL_WHITE) for CIELAB, so that a flat
// reflectance is exactly neutral (a* = b* = 0); the gap to the sRGB white is below 0.1 %.
import type { Xyz } from "../types";

/** Number of bands, 380–730 nm at 10 nm. */
export const BANDS = 36;
/** Wavelength of band i in nm. */
export const wavelengthOf = (i: number): number => 380 + 10 * i;

/** CIE 1931 2° x̄, 380–730 nm at 10 nm (CIE 15:2004). */
export const CMF_X: readonly number[] = [
  0.001368, 0.004243, 0.01431, 0.04351, 0.13438, 0.2839, 0.34828, 0.3362, 0.2908, 0.19536,
  0.09564, 0.03201, 0.0049, 0.0093, 0.06327, 0.1655, 0.2904, 0.43345, 0.5945, 0.7621,
  0.9163, 1.0263, 1.0622, 1.0026, 0.85445, 0.6424, 0.4479, 0.2835, 0.1649, 0.0874,
  0.04677, 0.0227, 0.011359, 0.00579, 0.002899, 0.00144,
];
/** CIE 1931 2° ȳ, 380–730 nm at 10 nm (CIE 15:2004). */
export const CMF_Y: readonly number[] = [
  0.000039, 0.00012, 0.000396, 0.00121, 0.004, 0.0116, 0.023, 0.038, 0.06, 0.09098,
  0.13902, 0.20802, 0.323, 0.503, 0.71, 0.862, 0.954, 0.99495, 0.995, 0.952,
  0.87, 0.757, 0.631, 0.503, 0.381, 0.265, 0.175, 0.107, 0.061, 0.032,
  0.017, 0.00821, 0.004102, 0.002091, 0.001047, 0.00052,
];
/** CIE 1931 2° z̄, 380–730 nm at 10 nm (CIE 15:2004). */
export const CMF_Z: readonly number[] = [
  0.00645, 0.02005, 0.06785, 0.2074, 0.6456, 1.3856, 1.74706, 1.77211, 1.6692, 1.28764,
  0.81295, 0.46518, 0.272, 0.1582, 0.07825, 0.04216, 0.0203, 0.00875, 0.0039, 0.0021,
  0.00165, 0.0011, 0.0008, 0.00034, 0.00019, 0.00005, 0.00002, 0, 0, 0,
  0, 0, 0, 0, 0, 0,
];
/** CIE standard illuminant D65, relative spectral power, 380–730 nm at 10 nm (CIE 15:2004). */
export const D65_SPD: readonly number[] = [
  49.9755, 54.6482, 82.7549, 91.486, 93.4318, 86.6823, 104.865, 117.008, 117.812, 114.861,
  115.923, 108.811, 109.354, 107.802, 104.79, 107.689, 104.405, 104.046, 100, 96.3342,
  95.788, 88.6856, 90.0062, 89.5991, 87.6987, 83.2886, 83.6992, 80.0268, 80.2146, 82.2778,
  78.2842, 69.7213, 71.6091, 74.349, 61.604, 69.8856,
];

function weights(cmf: readonly number[], norm: number): Float64Array {
  const w = new Float64Array(BANDS);
  for (let i = 0; i < BANDS; i++) w[i] = (cmf[i] * D65_SPD[i]) / norm;
  return w;
}

let yNorm = 0;
for (let i = 0; i < BANDS; i++) yNorm += CMF_Y[i] * D65_SPD[i];

/** x̄·S_D65 per band, normalised so that Σ ȳ·S = 1 (reflectance → X). */
export const WEIGHT_X: Float64Array = weights(CMF_X, yNorm);
/** ȳ·S_D65 per band, normalised so that Σ ȳ·S = 1 (reflectance → Y). */
export const WEIGHT_Y: Float64Array = weights(CMF_Y, yNorm);
/** z̄·S_D65 per band, normalised so that Σ ȳ·S = 1 (reflectance → Z). */
export const WEIGHT_Z: Float64Array = weights(CMF_Z, yNorm);

const sum = (a: Float64Array): number => a.reduce((s, v) => s + v, 0);

/** XYZ of the perfect white under this table (D65, 2°, 10 nm, 380–730 nm); Y = 1. */
export const SPECTRAL_WHITE: Xyz = Object.freeze({ X: sum(WEIGHT_X), Y: sum(WEIGHT_Y), Z: sum(WEIGHT_Z) });
