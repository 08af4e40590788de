// Synthetic dyeings for self-tests and demo data: invented "true" unit K/S spectra of a few dyes and
// invented base yarn curves; results follow K/S additivity exactly (Nobbs 1985; Berns 2000) and are
// reported only as CIELAB, as a studio would measure them. Nothing here is a real dye's data.
import type { Lab, Reflectance } from "../types";
import { BANDS, wavelengthOf } from "./cie-data";
import { dyedReflectance, ksSpectrum, saundersonForward, type SurfaceModel } from "./kubelka-munk";
import type { CalibrationDyeing, DyeAmount } from "./profile";
import { reflectanceToLab } from "./reflectance";

/** Ids of the invented dyes. */
export type SyntheticDyeId = "turquoise" | "magenta" | "golden-yellow" | "black";

/** The invented dyes with display names. */
export const SYNTHETIC_DYES: readonly { id: SyntheticDyeId; name: string }[] = [
  { id: "turquoise", name: "Turquoise" },
  { id: "magenta", name: "Magenta" },
  { id: "golden-yellow", name: "Golden yellow" },
  { id: "black", name: "Black" },
];

const gauss = (peakNm: number, widthNm: number, height: number) => (nm: number) =>
  height * Math.exp(-0.5 * ((nm - peakNm) / widthNm) ** 2);

function spectrum(...parts: ((nm: number) => number)[]): Float64Array {
  const s = new Float64Array(BANDS);
  for (let i = 0; i < BANDS; i++) s[i] = 0.005 + parts.reduce((acc, f) => acc + f(wavelengthOf(i)), 0);
  return s;
}

/** "True" K/S per 1 % DOS of each invented dye (absorption bands chosen to give the named hues). */
export const TRUE_UNIT_KS: Readonly<Record<SyntheticDyeId, Float64Array>> = {
  turquoise: spectrum(gauss(630, 45, 5.5), gauss(580, 30, 1.5), gauss(400, 25, 0.6)),
  magenta: spectrum(gauss(545, 35, 6), gauss(500, 25, 1.8), gauss(390, 30, 0.8)),
  "golden-yellow": spectrum(gauss(440, 40, 5), gauss(480, 20, 1.2), gauss(385, 20, 1)),
  black: spectrum(gauss(470, 90, 3.2), gauss(600, 70, 3.6), gauss(680, 25, 0.6)),
};

/** Invented base yarns: undyed wool (creamy), a natural grey, and an already-dyed pale blush. */
export const SYNTHETIC_BASES: Readonly<Record<"white" | "grey" | "blush", Reflectance>> = (() => {
  const white = new Float64Array(BANDS);
  for (let i = 0; i < BANDS; i++) {
    const t = (wavelengthOf(i) - 380) / 350;
    white[i] = 0.5 + 0.32 * (1 - Math.exp(-4 * t)); // rises from 0.50 at 380 nm to ~0.82
  }
  const kw = ksSpectrum(white);
  const grey = dyedReflectance(kw, [TRUE_UNIT_KS.black], [0.08]);
  const blush = dyedReflectance(kw, [TRUE_UNIT_KS.magenta, TRUE_UNIT_KS["golden-yellow"]], [0.05, 0.03]);
  return { white, grey, blush };
})();

/**
 * The "true" curve of a base after dyes (exact K/S additivity). With surface "saunderson" the base
 * curve is the body reflectance and the curve returned is what a measurement sees (Saunderson 1942).
 */
export function trueResult(base: Reflectance, dyes: readonly DyeAmount[], uptake = 1, surface: SurfaceModel = "none"): Reflectance {
  const unit = dyes.map((d) => TRUE_UNIT_KS[d.dyeId as SyntheticDyeId]);
  if (unit.some((u) => !u)) throw new RangeError(`Unknown synthetic dye in ${dyes.map((d) => d.dyeId).join(", ")}.`);
  return dyedReflectance(ksSpectrum(base), unit, dyes.map((d) => d.dosPct * uptake), surface);
}

/** What a measurement of a base sees: the curve itself, or with Saunderson's surface added. */
export function measuredBase(base: Reflectance, surface: SurfaceModel = "none"): Reflectance {
  return surface === "saunderson" ? base.map((r) => saundersonForward(r)) : base;
}

/** Seeded pseudo-random numbers in [0, 1) (mulberry32; common practice for reproducible tests). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Options of a synthetic dyeing. */
export interface SyntheticOptions {
  uptake?: number;
  /** Add Saunderson's surface to every measurement (default "none"). */
  surface?: SurfaceModel;
  /** Standard deviation of Gaussian noise added to L*, a*, b* of the result (a measuring error). */
  noiseSd?: number;
  random?: () => number;
}

function noisy(lab: Lab, sd: number, random: () => number): Lab {
  if (!sd) return lab;
  const n = () => sd * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  return { L: lab.L + n(), a: lab.a + n(), b: lab.b + n() };
}

/** One synthetic dyeing as a studio would record it: base Lab, dyes, uptake, measured result Lab. */
export function syntheticDyeing(base: Reflectance, dyes: DyeAmount[], options: SyntheticOptions = {}): CalibrationDyeing {
  const uptake = options.uptake ?? 1;
  const surface = options.surface ?? "none";
  const result = reflectanceToLab(trueResult(base, dyes, uptake, surface));
  return {
    base: reflectanceToLab(measuredBase(base, surface)),
    dyes,
    ...(options.uptake !== undefined ? { uptake } : {}),
    result: noisy(result, options.noiseSd ?? 0, options.random ?? Math.random),
  };
}

/** A calibration set: every invented dye alone on the undyed base at 0.25, 1 and 3 % DOS. */
export function syntheticCalibrationSet(options: Omit<SyntheticOptions, "uptake"> = {}): CalibrationDyeing[] {
  return SYNTHETIC_DYES.flatMap(({ id }) =>
    [0.25, 1, 3].map((dosPct) => syntheticDyeing(SYNTHETIC_BASES.white, [{ dyeId: id, dosPct }], options)),
  );
}
