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

// Work buffers, reused by every call (the solver is synchronous, so sharing is safe). The Newton
// matrix is kept compact: its diagonal, its constant −2 off-diagonals (from D) and its border
// dρ ⊙ Tᵀ (symmetric); a dense copy is built only when the structured solve declines.
const z = new Float64Array(N);
const lambda = new Float64Array(3);
const rho = new Float64Array(N);
const diag = new Float64Array(N);
const border = new Float64Array(N * 3);
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
    // F = [D z + dρ ⊙ Tᵀλ ; T ρ − rgb] and its Jacobian (Burns 2020, LHTSS listing).
    let resid = 0;
    for (let i = 0; i < N; i++) {
      const t = Math.tanh(z[i]);
      rho[i] = (t + 1) / 2;
      const dRho = (1 - t * t) / 2;
      const tl = T[i] * lambda[0] + T[N + i] * lambda[1] + T[2 * N + i] * lambda[2];
      const dz = (i > 0 ? z[i] - z[i - 1] : 0) + (i < N - 1 ? z[i] - z[i + 1] : 0);
      F[i] = 2 * dz + dRho * tl;
      diag[i] = (i === 0 || i === N - 1 ? 2 : 4) - 2 * dRho * t * tl;
      border[3 * i] = dRho * T[i];
      border[3 * i + 1] = dRho * T[N + i];
      border[3 * i + 2] = dRho * T[2 * N + i];
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
    if (it === 0) firstStep(F); // F ← J⁻¹ F
    else if (!solveBordered(F)) solveInPlace(denseJacobian(), F);
    for (let i = 0; i < N; i++) z[i] -= F[i];
    for (let k = 0; k < 3; k++) lambda[k] -= F[N + k];
  }
  throw new Error(`LHTSS did not converge for linear RGB (${r}, ${g}, ${b}).`);
}

// Buffers of the structured solve.
const piv = new Float64Array(N);
const bB = new Float64Array(N * 3);
const fB = new Float64Array(N);
const sol = new Float64Array(SIZE);
const S3 = new Float64Array(9);

/**
 * Solves the Newton system using its shape: a tridiagonal block (D plus a diagonal) bordered by
 * three dense rows and columns. Tridiagonal elimination without pivoting, then the 3×3 Schur
 * complement — O(36) instead of O(39³). Returns false (leaving J and F untouched) when a pivot is
 * too small to trust, e.g. at the first step where the block is D itself and singular.
 */
function solveBordered(Fv: Float64Array): boolean {
  const S = S3;
  S.fill(0);
  let g0 = Fv[N], g1 = Fv[N + 1], g2 = Fv[N + 2];
  let c0 = 0, c1 = 0, c2 = 0; // fill carried into the border rows from the previous column
  for (let i = 0; i < N; i++) {
    let p = diag[i];
    let f = Fv[i];
    let b0 = border[3 * i], b1 = border[3 * i + 1], b2 = border[3 * i + 2];
    if (i > 0) {
      const m = -2 / piv[i - 1]; // sub-diagonal multiplier
      p += 2 * m;
      f -= m * fB[i - 1];
      b0 -= m * bB[3 * i - 3];
      b1 -= m * bB[3 * i - 2];
      b2 -= m * bB[3 * i - 1];
    }
    if (!(Math.abs(p) > 1e-9)) return false;
    piv[i] = p;
    fB[i] = f;
    bB[3 * i] = b0; bB[3 * i + 1] = b1; bB[3 * i + 2] = b2;
    const up = i < N - 1 ? -2 : 0;
    const m0 = (border[3 * i] + c0) / p, m1 = (border[3 * i + 1] + c1) / p, m2 = (border[3 * i + 2] + c2) / p;
    S[0] -= m0 * b0; S[1] -= m0 * b1; S[2] -= m0 * b2;
    S[3] -= m1 * b0; S[4] -= m1 * b1; S[5] -= m1 * b2;
    S[6] -= m2 * b0; S[7] -= m2 * b1; S[8] -= m2 * b2;
    g0 -= m0 * f; g1 -= m1 * f; g2 -= m2 * f;
    c0 = -m0 * up; c1 = -m1 * up; c2 = -m2 * up;
  }
  // 3×3 Schur complement by the cofactor formula.
  const A = S[4] * S[8] - S[5] * S[7], B = S[5] * S[6] - S[3] * S[8], C = S[3] * S[7] - S[4] * S[6];
  const det = S[0] * A + S[1] * B + S[2] * C;
  if (!(Math.abs(det) > 1e-300)) return false;
  const y0 = (A * g0 + (S[2] * S[7] - S[1] * S[8]) * g1 + (S[1] * S[5] - S[2] * S[4]) * g2) / det;
  const y1 = (B * g0 + (S[0] * S[8] - S[2] * S[6]) * g1 + (S[2] * S[3] - S[0] * S[5]) * g2) / det;
  const y2 = (C * g0 + (S[1] * S[6] - S[0] * S[7]) * g1 + (S[0] * S[4] - S[1] * S[3]) * g2) / det;
  sol[N] = y0; sol[N + 1] = y1; sol[N + 2] = y2;
  for (let i = N - 1; i >= 0; i--) {
    let v = fB[i] - bB[3 * i] * y0 - bB[3 * i + 1] * y1 - bB[3 * i + 2] * y2;
    if (i < N - 1) v += 2 * sol[i + 1];
    sol[i] = v / piv[i];
  }
  for (let i = 0; i < SIZE; i++) if (!Number.isFinite(sol[i])) return false;
  Fv.set(sol);
  return true;
}

// The first Newton step starts from z = 0, λ = 0 for every colour: the matrix is then always the same
// (diagonal of D, border T/2) and singular in its D block, so solve it once for the three unit
// right-hand sides that can occur (F = [0; T·½ − rgb]) and combine them.
const FIRST = (() => {
  const T = T_MATRIX;
  for (let i = 0; i < N; i++) {
    diag[i] = i === 0 || i === N - 1 ? 2 : 4;
    for (let k = 0; k < 3; k++) border[3 * i + k] = 0.5 * T[k * N + i];
  }
  return [0, 1, 2].map((k) => {
    const e = new Float64Array(SIZE);
    e[N + k] = 1;
    solveInPlace(denseJacobian(), e);
    return e;
  });
})();

function firstStep(Fv: Float64Array): void {
  const f0 = Fv[N], f1 = Fv[N + 1], f2 = Fv[N + 2]; // Fv[0..N) is zero at z = 0, λ = 0
  for (let i = 0; i < SIZE; i++) Fv[i] = FIRST[0][i] * f0 + FIRST[1][i] * f1 + FIRST[2][i] * f2;
}

/** The Newton matrix written out densely, for the pivoting fallback. */
function denseJacobian(): Float64Array {
  J.fill(0);
  for (let i = 0; i < N; i++) {
    const row = i * SIZE;
    J[row + i] = diag[i];
    if (i > 0) J[row + i - 1] = -2;
    if (i < N - 1) J[row + i + 1] = -2;
    for (let k = 0; k < 3; k++) {
      J[row + N + k] = border[3 * i + k];
      J[(N + k) * SIZE + i] = border[3 * i + k];
    }
  }
  return J;
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
