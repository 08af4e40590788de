// Reflectance curves ↔ colour values for the layering model: XYZ by summing the CIE weights,
// CIELAB against the table's own white, and a reflectance from a colour by Burns's LHTSS.
import type { Lab, Reflectance, Rgb, Xyz } from "../types";
import { labToXyz, xyzToLab } from "../spaces";
import { BANDS, SPECTRAL_WHITE, WEIGHT_X, WEIGHT_Y, WEIGHT_Z } from "./cie-data";
import { lhtss } from "./lhtss";
import { T_MATRIX, spectralRgbToXyz, xyzToSpectralRgb } from "./spectral-rgb";

export { BLACK_REFLECTANCE, differenceMatrix, lhtss } from "./lhtss";
export { T_MATRIX } from "./spectral-rgb";

// Module-local aliases: hot loops then read plain bindings (some bundlers turn imports into getters).
const WX = WEIGHT_X, WY = WEIGHT_Y, WZ = WEIGHT_Z, NB = BANDS, WHITE = SPECTRAL_WHITE;

/** Reflectance → XYZ under D65, 2° observer, Y of the perfect white = 1 (CIE 15:2004 weighted sums). */
export function reflectanceToXyz(rho: Reflectance): Xyz {
  let X = 0, Y = 0, Z = 0;
  for (let i = 0; i < NB; i++) {
    const r = rho[i];
    X += WX[i] * r;
    Y += WY[i] * r;
    Z += WZ[i] * r;
  }
  return { X, Y, Z };
}

/** Reflectance → CIELAB D65 (white = the table's white, so a flat curve is neutral; CIE 15:2004). */
export function reflectanceToLab(rho: Reflectance): Lab {
  return xyzToLab(reflectanceToXyz(rho), WHITE);
}

/** Reflectance → linear RGB (sRGB primaries) through Burns's T matrix. */
export function reflectanceToLinearRgb(rho: Reflectance): Rgb {
  const T = T_MATRIX;
  let r = 0, g = 0, b = 0;
  for (let i = 0; i < NB; i++) {
    r += T[i] * rho[i];
    g += T[NB + i] * rho[i];
    b += T[2 * NB + i] * rho[i];
  }
  return [r, g, b];
}

/** Linear RGB (sRGB primaries, 0–1) → reflectance by LHTSS (Burns 2020); channels must be in [0, 1]. */
export function linearRgbToReflectance(lin: Rgb, out?: Reflectance): Reflectance {
  return lhtss(lin, out);
}

/** What `labToReflectance` found. */
export interface ReflectanceEstimate {
  reflectance: Reflectance;
  /** False when the colour lies outside the sRGB gamut. */
  inGamut: boolean;
  /** True when the curve reproduces the colour itself (always, inside sRGB; usually, outside). */
  matched: boolean;
  /** Plain words for the person when the curve stands for a less saturated colour. */
  note?: string;
}

// Linear channels this far outside [0, 1] count as rounding, not as out of gamut.
const GAMUT_SLACK = 1e-9;

const fmt = (l: Lab) => `L* ${l.L.toFixed(1)}, a* ${l.a.toFixed(1)}, b* ${l.b.toFixed(1)}`;

/** Options of `labToReflectance`. */
export interface LabToReflectanceOptions {
  /**
   * Lowest reflectance allowed (default 0). With Saunderson's correction a measured curve cannot
   * fall below k1 (the light the surface reflects), so that path asks for a floor of k1.
   */
  floor?: number;
  /** Curve to write into. */
  out?: Reflectance;
}

/**
 * CIELAB D65 → reflectance by LHTSS (Burns 2020): Lab → XYZ (table white) → linear RGB → curve.
 * A colour outside sRGB is still solved as it is when a curve in (0, 1) reaches it (deep
 * turquoises and yellows usually do). Otherwise it is pulled toward the grey of the same Y, to the
 * most saturated colour a curve reaches (bisection), and a note says so; beyond white or black it
 * is clamped. With a floor f the curve is f + (1 − f)·ρ′, ρ′ solved for (rgb − f)/(1 − f), which
 * is exact because T's rows sum to 1.
 */
export function labToReflectance(lab: Lab, options: LabToReflectanceOptions = {}): ReflectanceEstimate {
  const floor = options.floor ?? 0;
  const out = options.out;
  const lin = xyzToSpectralRgb(labToXyz(lab, WHITE));
  const inGamut = lin.every((v) => v >= -GAMUT_SLACK && v <= 1 + GAMUT_SLACK);
  const scaled = lin.map((v) => (v - floor) / (1 - floor)) as unknown as Rgb;
  const lift = (rho: Reflectance): Reflectance => {
    if (floor > 0) for (let i = 0; i < rho.length; i++) rho[i] = floor + (1 - floor) * rho[i];
    return rho;
  };
  if (scaled.every((v) => v >= -GAMUT_SLACK && v <= 1 + GAMUT_SLACK)) {
    const c = scaled.map((v) => Math.min(1, Math.max(0, v))) as unknown as Rgb;
    return { reflectance: lift(lhtss(c, out)), inGamut, matched: true };
  }
  const loose = { allowOutOfGamut: true, maxIterations: 40 };
  try {
    return { reflectance: lift(lhtss(scaled, out, loose)), inGamut, matched: true };
  } catch {
    // fall through: no curve in range reaches this colour
  }
  const Yraw = spectralRgbToXyz(scaled).Y;
  const Y = Number.isFinite(Yraw) ? Math.min(1, Math.max(0, Yraw)) : 0;
  const toward = (t: number): Rgb => [Y + t * (scaled[0] - Y), Y + t * (scaled[1] - Y), Y + t * (scaled[2] - Y)];
  let lo = 0, hi = 1;
  for (let step = 0; step < 12; step++) {
    const t = (lo + hi) / 2;
    try {
      lhtss(toward(t), undefined, loose);
      lo = t;
    } catch {
      hi = t;
    }
  }
  const best = lift(lo > 0 ? lhtss(toward(lo), out, loose) : lhtss([Y, Y, Y], out));
  const got = reflectanceToLab(best);
  const note =
    `This colour (${fmt(lab)}) is beyond what the model's smooth reflectance curves can reach; it works from ` +
    `the nearest reachable colour (${fmt(got)}), so treat its prediction as approximate.`;
  return { reflectance: best, inGamut, matched: false, note };
}

/** A new flat reflectance curve (every band = value). */
export function flatReflectance(value: number): Reflectance {
  return new Float64Array(BANDS).fill(value);
}
