// Camera linear RGB → CIE XYZ fits: white balance, a 3×3 matrix, and a root-polynomial.
//
// All three are exposure-invariant: scaling the camera's linear RGB by k scales the fitted XYZ by
// k, so a reading does not depend on how bright the photo came out (Finlayson, Mackiewicz &
// Hurlbert, "Color correction using root-polynomial regression", IEEE TIP 24(5):1460–1470, 2015).
// Fits are ordinary least squares in XYZ, solved with ml-matrix.
import { inverse, Matrix, SingularValueDecomposition, solve } from "ml-matrix";
import { SRGB_TO_XYZ, xyzToLinearSrgb } from "../spaces";
import type { Rgb, Xyz } from "../types";

export type CalibrationModel = "white-balance" | "matrix3x3" | "root-polynomial";

/** A fitted model as plain numbers: XYZ = C · features(rgb), C row-major (3 rows). */
export interface ModelParams {
  model: CalibrationModel;
  coefficients: number[];
}

/** Fewest patches each model is fitted from (with one left out for checking, one more). */
export const MIN_PATCHES: Record<CalibrationModel, number> = {
  "white-balance": 1,
  matrix3x3: 6,
  "root-polynomial": 10,
};

/** Ratio of largest to smallest singular value beyond which a fit is called degenerate. */
const MAX_CONDITION = 1e4;

/** Terms the model regresses on: R,G,B, plus √RG, √RB, √GB for the root-polynomial (Finlayson 2015, 2nd order). */
export function features(model: CalibrationModel, lin: Rgb): number[] {
  const r = Math.max(lin[0], 0), g = Math.max(lin[1], 0), b = Math.max(lin[2], 0);
  if (model !== "root-polynomial") return [r, g, b];
  return [r, g, b, Math.sqrt(r * g), Math.sqrt(r * b), Math.sqrt(g * b)];
}

/** Apply a fitted model to camera linear RGB. */
export function predictXyz(params: ModelParams, lin: Rgb): Xyz {
  const f = features(params.model, lin);
  const c = params.coefficients;
  const n = f.length;
  let X = 0, Y = 0, Z = 0;
  for (let j = 0; j < n; j++) {
    X += c[j] * f[j];
    Y += c[n + j] * f[j];
    Z += c[2 * n + j] * f[j];
  }
  return { X, Y, Z };
}

/**
 * Least-squares fit of one model from camera linear RGB to known XYZ. White balance uses only the
 * patches marked neutral: a per-channel gain (diagonal scaling, von Kries style) that takes the
 * camera's greys to the greys' linear sRGB, then the sRGB matrix (IEC 61966-2-1) — it assumes the
 * camera's primaries are close to sRGB's. Returns null when the patches cannot determine the model
 * (too few, or rank-deficient: condition number above 1e4).
 */
export function fitModel(
  model: CalibrationModel,
  lin: readonly Rgb[],
  xyz: readonly Xyz[],
  neutral: readonly boolean[],
): ModelParams | null {
  if (model === "white-balance") return fitWhiteBalance(lin, xyz, neutral);
  if (lin.length < MIN_PATCHES[model] - 1) return null;
  const A = new Matrix(lin.map((p) => features(model, p)));
  const svd = new SingularValueDecomposition(A, { computeLeftSingularVectors: false, computeRightSingularVectors: false });
  const s = svd.diagonal;
  if (!(s[s.length - 1] > 0) || s[0] / s[s.length - 1] > MAX_CONDITION) return null;
  const B = new Matrix(xyz.map((t) => [t.X, t.Y, t.Z]));
  const C = solve(A, B); // terms × 3
  const coefficients: number[] = [];
  for (let row = 0; row < 3; row++) for (let j = 0; j < C.rows; j++) coefficients.push(C.get(j, row));
  return { model, coefficients };
}

function fitWhiteBalance(lin: readonly Rgb[], xyz: readonly Xyz[], neutral: readonly boolean[]): ModelParams | null {
  const num = [0, 0, 0], den = [0, 0, 0];
  lin.forEach((p, i) => {
    if (!neutral[i]) return;
    const target = xyzToLinearSrgb(xyz[i]);
    for (let c = 0; c < 3; c++) {
      num[c] += target[c] * p[c];
      den[c] += p[c] * p[c];
    }
  });
  if (!(den[0] > 0 && den[1] > 0 && den[2] > 0)) return null;
  const k = num.map((v, c) => v / den[c]);
  const M = SRGB_TO_XYZ;
  return {
    model: "white-balance",
    coefficients: [0, 1, 2].flatMap((row) => [0, 1, 2].map((col) => M[row * 3 + col] * k[col])),
  };
}

/**
 * Each patch's prediction by the same model fitted without it, without refitting: for ordinary
 * least squares ŷ₋ᵢ = yᵢ − (yᵢ − ŷᵢ) / (1 − hᵢᵢ), hᵢᵢ the diagonal of the hat matrix A(AᵀA)⁻¹Aᵀ
 * (the leave-one-out identity of linear regression; e.g. Hastie, Tibshirani & Friedman, The Elements
 * of Statistical Learning, 2nd ed., §7.10 — section from memory). White balance uses only the greys,
 * so for any other patch its prediction is already a leave-one-out one. Null where no such fit
 * exists (a grey under white balance; hᵢᵢ ≈ 1).
 */
export function leaveOneOutXyz(params: ModelParams, lin: readonly Rgb[], xyz: readonly Xyz[], neutral: readonly boolean[]): (Xyz | null)[] {
  if (params.model === "white-balance") return lin.map((p, i) => (neutral[i] ? null : predictXyz(params, p)));
  const F = lin.map((p) => features(params.model, p));
  const G = inverse(new Matrix(F).transpose().mmul(new Matrix(F)));
  return F.map((f, i) => {
    const gf = G.mmul(Matrix.columnVector(f)).to1DArray();
    const h = f.reduce((s, v, j) => s + v * gf[j], 0);
    if (!(1 - h > 1e-9)) return null;
    const pred = predictXyz(params, lin[i]), y = xyz[i], k = 1 / (1 - h);
    return { X: y.X - (y.X - pred.X) * k, Y: y.Y - (y.Y - pred.Y) * k, Z: y.Z - (y.Z - pred.Z) * k };
  });
}
