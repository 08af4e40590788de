// Kubelka-Munk single-constant theory for an opaque dyed fibre, band by band, with the optional
// Saunderson correction for the surface reflection.
import type { Reflectance } from "../types";

/** K/S of an opaque layer from its reflectance R∞: (1 − R)² / 2R (Kubelka & Munk 1931). */
export function ksFromReflectance(r: number): number {
  return ((1 - r) * (1 - r)) / (2 * r);
}

/**
 * R∞ from K/S: 1 + K/S − √((K/S)² + 2 K/S) (Kubelka & Munk 1931), computed as its reciprocal form
 * 1 / (1 + K/S + √((K/S)² + 2 K/S)), which is the same number without cancellation at deep shades.
 */
export function reflectanceFromKs(ks: number): number {
  return 1 / (1 + ks + Math.sqrt(ks * ks + 2 * ks));
}

/** Saunderson's surface coefficients: k1 external (Fresnel, n = 1.5 → 0.04), k2 internal. */
export interface SaundersonCoefficients {
  k1: number;
  k2: number;
}

/** k1 = 0.04 (n = 1.5) and k2 = 0.6, the values quoted for textiles (Allen 1980, in Grum & Bartleson vol. 2). */
export const SAUNDERSON_DEFAULT: SaundersonCoefficients = Object.freeze({ k1: 0.04, k2: 0.6 });

/** Measured reflectance from the body reflectance R∞: k1 + (1−k1)(1−k2)R∞ / (1 − k2 R∞) (Saunderson 1942). */
export function saundersonForward(rInf: number, c: SaundersonCoefficients = SAUNDERSON_DEFAULT): number {
  return c.k1 + ((1 - c.k1) * (1 - c.k2) * rInf) / (1 - c.k2 * rInf);
}

// Body reflectances below this are treated as this (a measured value under k1 has no body reflectance).
const MIN_BODY_REFLECTANCE = 1e-4;

/**
 * Body reflectance R∞ from a measured reflectance (Saunderson 1942, solved for R∞):
 * R∞ = (Rm − k1) / ((1−k1)(1−k2) + k2 (Rm − k1)); values at or below k1 give a floor of 1e-4.
 */
export function saundersonInverse(rm: number, c: SaundersonCoefficients = SAUNDERSON_DEFAULT): number {
  const u = rm - c.k1;
  const r = u / ((1 - c.k1) * (1 - c.k2) + c.k2 * u);
  return Math.min(1, Math.max(MIN_BODY_REFLECTANCE, r));
}

/** How a reflectance curve is turned into K/S: plain, or through Saunderson's correction first. */
export type SurfaceModel = "none" | "saunderson";

/** K/S per band of a reflectance curve (writes into `out`), optionally Saunderson-corrected first. */
export function ksSpectrum(rho: Reflectance, surface: SurfaceModel = "none", out = new Float64Array(rho.length)): Float64Array {
  for (let i = 0; i < rho.length; i++) {
    const r = surface === "saunderson" ? saundersonInverse(rho[i]) : rho[i];
    out[i] = ksFromReflectance(r);
  }
  return out;
}

/** Reflectance per band from K/S (writes into `out`), re-applying Saunderson's surface when asked. */
export function reflectanceFromKsSpectrum(ks: Float64Array, surface: SurfaceModel = "none", out: Reflectance = new Float64Array(ks.length)): Reflectance {
  for (let i = 0; i < ks.length; i++) {
    const r = reflectanceFromKs(ks[i]);
    out[i] = surface === "saunderson" ? saundersonForward(r) : r;
  }
  return out;
}

/**
 * K/S additivity for dyed fibre, band by band: K/S = K/S(substrate) + Σ cᵢ·(k/s)ᵢ, then back to
 * reflectance (Nobbs, Rev. Prog. Coloration 15, 1985; Berns, Principles of Color Technology, 2000).
 * `conc[i]` is the effective depth (% DOS × uptake) of the dye whose unit K/S is `unitKs[i]`.
 */
export function dyedReflectance(
  substrateKs: Float64Array,
  unitKs: readonly Float64Array[],
  conc: ArrayLike<number>,
  surface: SurfaceModel = "none",
  out: Reflectance = new Float64Array(substrateKs.length),
): Reflectance {
  const n = unitKs.length;
  const saunderson = surface === "saunderson";
  for (let band = 0; band < substrateKs.length; band++) {
    let ks = substrateKs[band];
    for (let d = 0; d < n; d++) ks += conc[d] * unitKs[d][band];
    const r = 1 / (1 + ks + Math.sqrt(ks * ks + 2 * ks)); // reflectanceFromKs, inlined for the hot loop
    out[band] = saunderson ? saundersonForward(r) : r;
  }
  return out;
}
