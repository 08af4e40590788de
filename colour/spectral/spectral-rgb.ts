// The linear-RGB frame of the spectral path: sRGB primaries with the white of the 10 nm CIE table,
// and the 3×36 matrix T that maps a reflectance to linear RGB (Burns, "Generating reflectance
// curves from sRGB triplets", arXiv:1710.05732 / Color Res. Appl. 45(1), 2020).
//
// Why not the stock sRGB matrix: T = M⁻¹·A (A = CMF × D65 weights) has rows summing to 1 only if M's
// white is the white of A. Deriving M from the sRGB primaries and SPECTRAL_WHITE makes ρ = 1 map to
// RGB (1, 1, 1) exactly and a flat ρ = c to (c, c, c) — which Burns's LHTSS relies on (grey → flat).
// The stock matrix (white xy 0.3127, 0.3290) differs by under 0.1 % in X and Z.
import type { Rgb, Xyz } from "../types";
import { BANDS, SPECTRAL_WHITE, WEIGHT_X, WEIGHT_Y, WEIGHT_Z } from "./cie-data";

/** Inverse of a row-major 3×3 matrix (cofactor formula). */
export function invert3(m: ArrayLike<number>): Float64Array {
  const [a, b, c, d, e, f, g, h, i] = Array.from(m);
  const A = e * i - f * h, B = f * g - d * i, C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!Number.isFinite(det) || Math.abs(det) < 1e-300) throw new RangeError("The 3×3 matrix is singular.");
  return Float64Array.of(
    A / det, (c * h - b * i) / det, (b * f - c * e) / det,
    B / det, (a * i - c * g) / det, (c * d - a * f) / det,
    C / det, (b * g - a * h) / det, (a * e - b * d) / det,
  );
}

/** RGB → XYZ matrix from primaries' xy and a white XYZ (the usual derivation, e.g. SMPTE RP 177). */
export function rgbToXyzMatrix(primaries: readonly (readonly [number, number])[], white: Xyz): Float64Array {
  const cols = primaries.map(([x, y]) => [x / y, 1, (1 - x - y) / y]);
  const P = Float64Array.of(
    cols[0][0], cols[1][0], cols[2][0],
    cols[0][1], cols[1][1], cols[2][1],
    cols[0][2], cols[1][2], cols[2][2],
  );
  const Pi = invert3(P);
  const s = [0, 1, 2].map((r) => Pi[3 * r] * white.X + Pi[3 * r + 1] * white.Y + Pi[3 * r + 2] * white.Z);
  return P.map((v, k) => v * s[k % 3]);
}

/** sRGB primaries xy (IEC 61966-2-1). */
const SRGB_PRIMARIES = [[0.64, 0.33], [0.3, 0.6], [0.15, 0.06]] as const;

/** Linear RGB (sRGB primaries, white = SPECTRAL_WHITE) → XYZ, row-major. */
export const SPECTRAL_RGB_TO_XYZ: Float64Array = rgbToXyzMatrix(SRGB_PRIMARIES, SPECTRAL_WHITE);
/** XYZ → linear RGB of the spectral path, row-major. */
export const SPECTRAL_XYZ_TO_RGB: Float64Array = invert3(SPECTRAL_RGB_TO_XYZ);

/** T (3×36, row-major): reflectance → linear RGB, T = M⁻¹·A (Burns 2020); each row sums to 1. */
export const T_MATRIX: Float64Array = (() => {
  const t = new Float64Array(3 * BANDS);
  const Mi = SPECTRAL_XYZ_TO_RGB;
  for (let r = 0; r < 3; r++) {
    for (let j = 0; j < BANDS; j++) {
      t[r * BANDS + j] = Mi[3 * r] * WEIGHT_X[j] + Mi[3 * r + 1] * WEIGHT_Y[j] + Mi[3 * r + 2] * WEIGHT_Z[j];
    }
  }
  return t;
})();

/** XYZ → linear RGB of the spectral path. */
export function xyzToSpectralRgb(xyz: Xyz): Rgb {
  const m = SPECTRAL_XYZ_TO_RGB;
  return [
    m[0] * xyz.X + m[1] * xyz.Y + m[2] * xyz.Z,
    m[3] * xyz.X + m[4] * xyz.Y + m[5] * xyz.Z,
    m[6] * xyz.X + m[7] * xyz.Y + m[8] * xyz.Z,
  ];
}

/** Linear RGB of the spectral path → XYZ. */
export function spectralRgbToXyz(rgb: Rgb): Xyz {
  const m = SPECTRAL_RGB_TO_XYZ;
  return {
    X: m[0] * rgb[0] + m[1] * rgb[1] + m[2] * rgb[2],
    Y: m[3] * rgb[0] + m[4] * rgb[1] + m[5] * rgb[2],
    Z: m[6] * rgb[0] + m[7] * rgb[1] + m[8] * rgb[2],
  };
}
