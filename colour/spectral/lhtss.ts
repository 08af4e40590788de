// Burns's LHTSS: the least hyperbolic-tangent slope-squared reflectance for a linear RGB triplet.
// S. A. Burns, "Generating reflectance curves from sRGB triplets", arXiv:1710.05732 and
// Color Res. Appl. 45(1):8–21, 2020. Minimise Σ (z[i+1] − z[i])² subject to T·ρ(z) = rgb with
// ρ = (tanh z + 1)/2, so ρ stays in (0, 1); Newton's method on the Lagrangian from z = 0, λ = 0.
import type { Reflectance, Rgb } from "../types";
import { BANDS } from "./cie-data";
import { T_MATRIX } from "./spectral-rgb";

const N = BANDS;
const SIZE = N + 3;

/** D (36×36, row-major): the tridiagonal difference matrix, 4 on the diagonal, 2 at both ends, −2 beside it (Burns 2020). */
export function differenceMatrix(): Float64Array {
  const d = new Float64Array(N * N);
  for (let i = 0; i < N; i++) {
    d[i * N + i] = i === 0 || i === N - 1 ? 2 : 4;
    if (i > 0) d[i * N + i - 1] = -2;
    if (i < N - 1) d[i * N + i + 1] = -2;
  }
  return d;
}

// Work buffers, reused by every call (the solver is synchronous, so sharing is safe).
const z = new Float64Array(N);
const lambda = new Float64Array(3);
const rho = new Float64Array(N);
const dRho = new Float64Array(N);
const tl = new Float64Array(N);
const J = new Float64Array(SIZE * SIZE);
const F = new Float64Array(SIZE);

/** Reflectance of a black (Burns's special case: LHTSS cannot reach 0). */
export const BLACK_REFLECTANCE = 1e-4;

/** Options of the solver. */
export interface LhtssOptions {
  /** Stop when every residual is below this (default 1e-12). */
  tolerance?: number;
  /** Give up after this many Newton steps (default 60). */
  maxIterations?: number;
  /**
   * Accept channels outside [0, 1] (default false). Such colours are outside sRGB but can still be
   * real surface colours (a deep turquoise); Newton then either finds a curve or throws.
   */
  allowOutOfGamut?: boolean;
}

/**
 * Reflectance (36 bands, each in (0, 1)) whose linear RGB is `lin` — Burns's LHTSS. White (1,1,1)
 * returns all ones and black all 1e-4, as in Burns. Channels must lie in [0, 1] unless
 * `allowOutOfGamut`. Throws if Newton does not converge.
 */
export function lhtss(lin: Rgb, out: Reflectance = new Float64Array(N), options: LhtssOptions = {}): Reflectance {
  const tol = options.tolerance ?? 1e-12;
  const maxIt = options.maxIterations ?? 60;
  const [r, g, b] = lin;
  if (!options.allowOutOfGamut && !(r >= 0 && r <= 1 && g >= 0 && g <= 1 && b >= 0 && b <= 1)) {
    throw new RangeError(`Linear RGB (${r}, ${g}, ${b}) is outside [0, 1]; clamp it before LHTSS.`);
  }
  if (r === 1 && g === 1 && b === 1) return out.fill(1);
  if (r === 0 && g === 0 && b === 0) return out.fill(BLACK_REFLECTANCE);
  const T = T_MATRIX;
  z.fill(0);
  lambda.fill(0);
  for (let it = 0; it < maxIt; it++) {
    // ρ, dρ/dz and Tᵀλ at the current point.
    for (let i = 0; i < N; i++) {
      const t = Math.tanh(z[i]);
      rho[i] = (t + 1) / 2;
      dRho[i] = (1 - t * t) / 2;
      tl[i] = T[i] * lambda[0] + T[N + i] * lambda[1] + T[2 * N + i] * lambda[2];
    }
    // F = [D z + dρ ⊙ Tᵀλ ; T ρ − rgb] and its Jacobian J (Burns 2020, LHTSS listing).
    J.fill(0);
    let resid = 0;
    for (let i = 0; i < N; i++) {
      const t = 2 * rho[i] - 1;
      const dz = (i > 0 ? z[i] - z[i - 1] : 0) + (i < N - 1 ? z[i] - z[i + 1] : 0);
      F[i] = 2 * dz + dRho[i] * tl[i];
      const row = i * SIZE;
      J[row + i] = (i === 0 || i === N - 1 ? 2 : 4) - 2 * dRho[i] * t * tl[i];
      if (i > 0) J[row + i - 1] = -2;
      if (i < N - 1) J[row + i + 1] = -2;
      for (let k = 0; k < 3; k++) {
        const v = dRho[i] * T[k * N + i];
        J[row + N + k] = v;
        J[(N + k) * SIZE + i] = v;
      }
      resid = Math.max(resid, Math.abs(F[i]));
    }
    for (let k = 0; k < 3; k++) {
      let s = 0;
      for (let i = 0; i < N; i++) s += T[k * N + i] * rho[i];
      F[N + k] = s - lin[k];
      resid = Math.max(resid, Math.abs(F[N + k]));
    }
    if (!(resid < Infinity)) break; // NaN or overflow: no curve reaches this colour from here
    if (resid < tol) {
      out.set(rho);
      return out;
    }
    solveInPlace(J, F); // F ← J⁻¹ F
    for (let i = 0; i < N; i++) z[i] -= F[i];
    for (let k = 0; k < 3; k++) lambda[k] -= F[N + k];
  }
  throw new Error(`LHTSS did not converge for linear RGB (${r}, ${g}, ${b}).`);
}

/** Gaussian elimination with partial pivoting on the SIZE×SIZE system A x = b; b is overwritten by x. */
function solveInPlace(A: Float64Array, bv: Float64Array): void {
  const n = SIZE;
  for (let c = 0; c < n; c++) {
    let p = c;
    let best = Math.abs(A[c * n + c]);
    for (let r = c + 1; r < n; r++) {
      const v = Math.abs(A[r * n + c]);
      if (v > best) { best = v; p = r; }
    }
    if (best === 0) throw new Error("LHTSS: singular Newton system.");
    if (p !== c) {
      for (let k = c; k < n; k++) {
        const tmp = A[c * n + k]; A[c * n + k] = A[p * n + k]; A[p * n + k] = tmp;
      }
      const tb = bv[c]; bv[c] = bv[p]; bv[p] = tb;
    }
    const piv = A[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = A[r * n + c] / piv;
      if (f === 0) continue;
      for (let k = c + 1; k < n; k++) A[r * n + k] -= f * A[c * n + k];
      bv[r] -= f * bv[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = bv[r];
    for (let k = r + 1; k < n; k++) s -= A[r * n + k] * bv[k];
    bv[r] = s / A[r * n + r];
  }
}
