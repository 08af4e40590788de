// The synthetic camera: scene colours (CIE XYZ as seen under D65) → 8-bit camera RGB.
//
// Chain: a non-D65 light (a von Kries shift of the scene's XYZ, in the Bradford cone space), the
// camera's own primaries (a crosstalk matrix on linear sRGB), an imperfect automatic white balance,
// an exposure, photon and read noise, and a tone curve that is not sRGB (a power law with a
// highlight shoulder). Everything a calibration has to undo, with known values.
import { inverse, Matrix } from "ml-matrix";
import { D65_WHITE, XYZ_TO_SRGB } from "../spaces";
import type { Xyz } from "../types";
import type { Random } from "./random";

export interface SyntheticCameraSpec {
  /** White of the scene's light (Y = 1). */
  light: Xyz;
  /** Camera primaries as a mix of linear sRGB channels, row-major 3×3, rows summing to 1, all ≥ 0 (a sensor never reads below zero). */
  crosstalk: number[];
  /** Share (0–1) of the light's colour cast that the camera's white balance removes. */
  whiteBalance: number;
  /** Camera linear value of a perfect white's brightest channel. */
  exposure: number;
  /** Encoding exponent: code ∝ linear^(1/gamma) before the shoulder. */
  gamma: number;
  /** Highlight compression of the tone curve (0 = pure power law). */
  shoulder: number;
  /** Noise in linear units: σ² = read² + shot · value. */
  readNoise: number;
  shotNoise: number;
}

/** A warm lamp (white xy 0.41, 0.40), a soft-primaried camera, gamma 2.0 with a shoulder, mild noise. */
export const DEFAULT_CAMERA: SyntheticCameraSpec = {
  light: { X: 0.41 / 0.4, Y: 1, Z: (1 - 0.41 - 0.4) / 0.4 },
  crosstalk: [0.78, 0.2, 0.02, 0.08, 0.84, 0.08, 0.02, 0.16, 0.82],
  whiteBalance: 0.75,
  exposure: 0.93,
  gamma: 2.0,
  shoulder: 0.2,
  readNoise: 0.001,
  shotNoise: 0.0001,
};

// Bradford cone-response matrix (K. M. Lam, 1985, as used by ICC and CIECAM97s; values from memory).
const BRADFORD = new Matrix([
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
]);

export interface SyntheticCamera {
  spec: SyntheticCameraSpec;
  /** Row-major 3×3: scene XYZ (as under D65) → camera linear RGB, light and white balance included. */
  matrix: number[];
  /** The tone curve: camera linear value (0–1) → code value 0–255 (unrounded). */
  encode(linear: number): number;
  /** Render one scene colour into out[o..o+2] as noisy 8-bit camera values. */
  shoot(X: number, Y: number, Z: number, rand: Random, out: Uint8Array, o: number): void;
}

/** Build a synthetic camera from its description. */
export function makeCamera(spec: SyntheticCameraSpec = DEFAULT_CAMERA): SyntheticCamera {
  const cone = (w: Xyz) => BRADFORD.mmul(Matrix.columnVector([w.X, w.Y, w.Z])).to1DArray();
  const lw = cone(spec.light), dw = cone(D65_WHITE);
  const vonKries = inverse(BRADFORD).mmul(Matrix.diag([0, 1, 2].map((i) => lw[i] / dw[i]))).mmul(BRADFORD);
  const raw = new Matrix([0, 1, 2].map((r) => spec.crosstalk.slice(r * 3, r * 3 + 3)))
    .mmul(new Matrix([0, 1, 2].map((r) => [...XYZ_TO_SRGB.slice(r * 3, r * 3 + 3)])))
    .mmul(vonKries);
  // White balance: gains that would neutralise the light, applied only in part.
  const white = raw.mmul(Matrix.columnVector([D65_WHITE.X, D65_WHITE.Y, D65_WHITE.Z])).to1DArray();
  const gains = white.map((w) => Math.pow(white[1] / w, spec.whiteBalance));
  const peak = Math.max(...white.map((w, i) => w * gains[i]));
  const total = Matrix.diag(gains.map((g) => (g * spec.exposure) / peak)).mmul(raw);
  const matrix = total.to1DArray();

  const inv = 1 / spec.gamma, s = spec.shoulder;
  const encode = (v: number) => {
    const p = Math.pow(Math.min(Math.max(v, 0), 1), inv);
    return (255 * p * (1 + s)) / (1 + s * p);
  };
  // A fine lookup table keeps rendering of large photos quick.
  const N = 1 << 16;
  const table = Float32Array.from({ length: N + 1 }, (_, i) => encode(i / N));
  const [m0, m1, m2, m3, m4, m5, m6, m7, m8] = matrix;
  const channel = (v: number, rand: Random) => {
    const noisy = v + Math.sqrt(spec.readNoise * spec.readNoise + spec.shotNoise * Math.max(v, 0)) * rand.normal();
    const i = Math.min(Math.max(noisy, 0), 1) * N;
    return Math.round(table[Math.round(i)]);
  };
  return {
    spec,
    matrix,
    encode,
    shoot(X, Y, Z, rand, out, o) {
      out[o] = channel(m0 * X + m1 * Y + m2 * Z, rand);
      out[o + 1] = channel(m3 * X + m4 * Y + m5 * Z, rand);
      out[o + 2] = channel(m6 * X + m7 * Y + m8 * Z, rand);
    },
  };
}
