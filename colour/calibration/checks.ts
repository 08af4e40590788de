// Refusals before a fit (clipped, crushed, underexposed, no patches) and the quality grade after it.
import type { Rgb } from "../types";
import { CalibrationError } from "./errors";
import { MIN_PATCHES, type CalibrationModel } from "./fit";
import type { ToneCurveKind } from "./tone-curve";

export type CalibrationQuality = "good" | "usable" | "retake";

/** A patch whose C*ab is below this counts as neutral (grey) [our choice: printed greys sit well under it]. */
export const NEUTRAL_CHROMA = 5;
/** A mean channel at or above this is clipped (a JPEG's noise reaches 255 around it) [our choice]. */
export const CLIP_LEVEL = 250;
/** A patch with more than this share of pixels at 255 is clipped [our choice]. */
export const CLIP_SHARE = 0.02;
/** A mean channel below this is crushed to black: its value says nothing [our choice]. */
export const CRUSH_LEVEL = 2;
/** The brightest patch must reach this in its brightest channel, else the photo is underexposed [our choice]. */
export const UNDEREXPOSED = 64;
/** Leave-one-out mean ΔE00 up to which a calibration is "good" (Undertone's product threshold). */
export const GOOD_DE00 = 1.5;
/** Leave-one-out mean ΔE00 up to which a calibration is "usable"; above it, "retake" (Undertone's product threshold). */
export const USABLE_DE00 = 3;

interface PatchLike {
  rgb: Rgb;
  clippedFraction?: number;
  name?: string;
}

const label = (p: PatchLike, i: number) => (p.name ? `"${p.name}"` : `#${i + 1}`);
const list = (ps: readonly PatchLike[], idx: number[]) => idx.map((i) => label(ps[i], i)).join(", ");

/** Throw CalibrationError for input no fit should be made from. */
export function checkPatches(patches: readonly PatchLike[]): void {
  if (patches.length === 0) {
    throw new CalibrationError("too-few", "No patches were read from the card: mark its corners and try again.");
  }
  const clipped = patches.flatMap((p, i) =>
    Math.max(...p.rgb) >= CLIP_LEVEL || (p.clippedFraction ?? 0) > CLIP_SHARE ? [i] : [],
  );
  if (clipped.length) {
    throw new CalibrationError(
      "clipped",
      `Patch ${list(patches, clipped)} ${clipped.length > 1 ? "are" : "is"} overexposed (clipped at white): ` +
        "retake the photo a little darker or out of direct light.",
      clipped,
    );
  }
  const brightest = Math.max(...patches.map((p) => Math.max(...p.rgb)));
  if (brightest < UNDEREXPOSED) {
    throw new CalibrationError(
      "too-dark",
      `The photo is too dark: the brightest patch reads ${brightest.toFixed(0)} of 255. Retake it with more light.`,
    );
  }
  const crushed = patches.flatMap((p, i) => (Math.min(...p.rgb) < CRUSH_LEVEL ? [i] : []));
  if (crushed.length) {
    throw new CalibrationError(
      "too-dark",
      `Patch ${list(patches, crushed)} ${crushed.length > 1 ? "are" : "is"} too dark to read (crushed to black): ` +
        "retake the photo a little brighter.",
      crushed,
    );
  }
}

/** Grade a chosen correction by its leave-one-out mean ΔE00 and say why in plain words. */
export function assessQuality(
  best: { model: CalibrationModel; looMeanDe00: number; looMaxDe00: number },
  perPatch: readonly { looDe00: number | null }[],
  patches: readonly PatchLike[],
  curve: ToneCurveKind,
  models: readonly CalibrationModel[],
): { quality: CalibrationQuality; reasons: string[] } {
  const reasons: string[] = [];
  const name = { "white-balance": "white balance", matrix3x3: "3×3 matrix", "root-polynomial": "root-polynomial" }[best.model];
  let quality: CalibrationQuality;
  if (Number.isNaN(best.looMeanDe00)) {
    quality = "usable";
    reasons.push(`${name} from a single grey patch: no patch is left over to check it, so its accuracy is unknown.`);
  } else {
    const m = best.looMeanDe00.toFixed(2), x = best.looMaxDe00.toFixed(2);
    reasons.push(`${name} chosen: each patch predicted without itself is off by ${m} ΔE00 on average, ${x} at worst.`);
    if (best.looMeanDe00 <= GOOD_DE00) {
      quality = "good";
      reasons.push(`Good: the average is within ${GOOD_DE00} ΔE00.`);
    } else if (best.looMeanDe00 <= USABLE_DE00) {
      quality = "usable";
      reasons.push(`Usable: the average is over ${GOOD_DE00} but within ${USABLE_DE00} ΔE00; treat small differences with care.`);
    } else {
      quality = "retake";
      reasons.push(`Retake: the average is over ${USABLE_DE00} ΔE00 — look for glare, shadow or mixed light on the card.`);
    }
    const worst = perPatch.reduce((w, p, i) => ((p.looDe00 ?? -1) > (perPatch[w].looDe00 ?? -1) ? i : w), 0);
    if (perPatch.length > 0 && (perPatch[worst].looDe00 ?? 0) > USABLE_DE00) {
      reasons.push(`Patch ${label(patches[worst], worst)} is the worst fit (${perPatch[worst].looDe00!.toFixed(1)} ΔE00): check it for glare or a shadow.`);
    }
  }
  if (curve === "srgb") reasons.push("Tone curve assumed to be sRGB: the card needs two greys of clearly different lightness to measure it.");
  if (!models.includes("matrix3x3")) {
    reasons.push(`Only white balance: ${patches.length} patches, a colour matrix needs ${MIN_PATCHES.matrix3x3}.`);
  } else if (!models.includes("root-polynomial")) {
    reasons.push(`No root-polynomial: ${patches.length} patches, it needs ${MIN_PATCHES["root-polynomial"]}.`);
  }
  return { quality, reasons };
}
