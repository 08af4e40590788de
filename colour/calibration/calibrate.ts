// calibrateCard: from the reference card's patches (known CIELAB, camera RGB) to a checked correction.
//
// Steps: refuse photos that cannot be trusted (clipped, crushed, underexposed, too few patches,
// degenerate patches); fit a tone curve from the greys; fit every model the patch count allows;
// score each by leave-one-out CIEDE2000 (each patch predicted by a fit — tone curve included —
// that never saw it); keep the best and grade it.
import { deltaE00 } from "../difference";
import { labToXyz, xyzToLab } from "../spaces";
import type { Lab, Rgb, Xyz } from "../types";
import { CalibrationError } from "./errors";
import { fitModel, leaveOneOutXyz, MIN_PATCHES, predictXyz, type CalibrationModel, type ModelParams } from "./fit";
import { fitToneCurve, toneCurveFromParams, type ToneCurve, type ToneCurveParams } from "./tone-curve";
import { assessQuality, checkPatches, NEUTRAL_CHROMA, type CalibrationQuality } from "./checks";

/** One card patch as read from the photo. */
export interface CardPatch {
  /** The patch's known colour (CIELAB D65), e.g. from the card's measured values. */
  known: Lab;
  /** Mean camera 8-bit RGB of the patch (floats allowed). */
  rgb: Rgb;
  /** Share of the patch's pixels with a channel at 255 (0–1), when the reader counted them. */
  clippedFraction?: number;
  /** A name for messages ("grey 50"); otherwise patches are named by 1-based number. */
  name?: string;
}

/** How one patch fared under the chosen correction. */
export interface PatchResult {
  index: number;
  known: Lab;
  /** The corrected reading of the patch, with the patch in the fit. */
  fitted: Lab;
  de00: number;
  /** ΔE00 of the patch predicted by a fit made without it; null when no such fit exists. */
  looDe00: number | null;
  neutral: boolean;
}

/** Leave-one-out score of one candidate model. */
export interface CandidateScore {
  model: CalibrationModel;
  looMeanDe00: number;
  looMaxDe00: number;
}

/** Everything needed to rebuild a calibration (plain numbers, storable as JSON). */
export interface CalibrationParams {
  toneCurve: ToneCurveParams;
  fit: ModelParams;
}

/** A checked photo correction: camera 8-bit RGB → CIE XYZ / CIELAB D65. */
export interface Calibration {
  model: CalibrationModel;
  toneCurve: ToneCurve;
  params: CalibrationParams;
  /** Camera 8-bit RGB (floats allowed) → CIELAB D65. */
  apply(rgb: Rgb): Lab;
  /** Camera 8-bit RGB (floats allowed) → CIE XYZ (white Y = 1). */
  applyXyz(rgb: Rgb): Xyz;
  /** Camera linear RGB (after the tone curve) → CIE XYZ; the bulk reader uses it with `toneCurve.lut`. */
  linearToXyz(lin: Rgb): Xyz;
  looMeanDe00: number;
  looMaxDe00: number;
  meanDe00: number;
  maxDe00: number;
  perPatch: PatchResult[];
  candidates: CandidateScore[];
  quality: CalibrationQuality;
  reasons: string[];
}

/** Calibrate a photo from its reference-card patches; throws CalibrationError when it cannot be trusted. */
export function calibrateCard(patches: readonly CardPatch[]): Calibration {
  checkPatches(patches);
  const xyz = patches.map((p) => labToXyz(p.known));
  const neutral = patches.map((p) => Math.hypot(p.known.a, p.known.b) < NEUTRAL_CHROMA);
  const models = (["white-balance", "matrix3x3", "root-polynomial"] as const).filter(
    (m) => patches.length >= MIN_PATCHES[m],
  );

  if (!models.includes("matrix3x3") && !neutral.some(Boolean)) {
    throw new CalibrationError(
      "too-few",
      `Too few patches: ${patches.length} and none of them grey. White balance needs one grey (neutral) ` +
        `patch; a colour matrix needs at least ${MIN_PATCHES.matrix3x3} patches.`,
    );
  }
  const full = fitAll(patches, xyz, neutral, models);
  const fitted = models.filter((m) => full.fits[m] !== null);
  if (patches.length >= MIN_PATCHES.matrix3x3 && full.fits.matrix3x3 === null) {
    throw new CalibrationError(
      "degenerate",
      `The ${patches.length} patches do not span three independent colours (all grey, or all alike), ` +
        "so no colour correction can be fitted: check that the card was found in the photo.",
    );
  }
  if (fitted.length === 0) {
    throw new CalibrationError("degenerate", "No correction could be fitted to these patches: check the card's grey patches.");
  }

  // Leaving out a colour patch leaves the tone curve as it is, so its leave-one-out prediction has a
  // closed form; leaving out a grey changes the curve, so those fits are redone in full.
  const closed = Object.fromEntries(
    fitted.map((m) => [m, leaveOneOutXyz(full.fits[m]!, full.lin, xyz, neutral)]),
  ) as Record<CalibrationModel, (Xyz | null)[]>;
  const loo = patches.map((_, i) => {
    if (!neutral[i]) {
      const out: Partial<Record<CalibrationModel, number>> = {};
      for (const m of fitted) {
        const p = closed[m][i];
        if (p) out[m] = deltaE00(patches[i].known, xyzToLab(p));
      }
      return out;
    }
    const keep = (_: unknown, j: number) => j !== i;
    let fitsWithout: ReturnType<typeof fitAll> | null = null;
    try {
      fitsWithout = fitAll(patches.filter(keep), xyz.filter(keep), neutral.filter(keep), fitted);
    } catch {
      return null; // e.g. the only grey left out: no tone curve without it
    }
    const out: Partial<Record<CalibrationModel, number>> = {};
    for (const m of fitted) {
      const f = fitsWithout.fits[m];
      if (f) out[m] = deltaE00(patches[i].known, xyzToLab(predictXyz(f, fitsWithout.curve.toLinear(patches[i].rgb))));
    }
    return out;
  });

  const candidates: CandidateScore[] = fitted.map((m) => {
    const d = loo.map((r) => r?.[m]).filter((v): v is number => v !== undefined);
    return {
      model: m,
      looMeanDe00: d.length ? d.reduce((s, v) => s + v, 0) / d.length : NaN,
      looMaxDe00: d.length ? Math.max(...d) : NaN,
    };
  });
  const best = chooseModel(candidates);
  const params: CalibrationParams = { toneCurve: stripCurve(full.curve), fit: full.fits[best.model]! };
  const cal = restoreCalibration(params);

  const perPatch: PatchResult[] = patches.map((p, i) => {
    const fittedLab = cal.apply(p.rgb);
    return {
      index: i,
      known: p.known,
      fitted: fittedLab,
      de00: deltaE00(p.known, fittedLab),
      looDe00: loo[i]?.[best.model] ?? null,
      neutral: neutral[i],
    };
  });
  const de = perPatch.map((p) => p.de00);
  const { quality, reasons } = assessQuality(best, perPatch, patches, full.curve.kind, models);
  return {
    ...cal,
    looMeanDe00: best.looMeanDe00,
    looMaxDe00: best.looMaxDe00,
    meanDe00: de.reduce((s, v) => s + v, 0) / de.length,
    maxDe00: Math.max(...de),
    perPatch,
    candidates,
    quality,
    reasons,
  };
}

/** The calibration's evaluators rebuilt from stored parameters (no quality figures). */
export function restoreCalibration(params: CalibrationParams): Pick<
  Calibration,
  "model" | "toneCurve" | "params" | "apply" | "applyXyz" | "linearToXyz"
> {
  const toneCurve = toneCurveFromParams(params.toneCurve);
  const linearToXyz = (lin: Rgb) => predictXyz(params.fit, lin);
  const applyXyz = (rgb: Rgb) => linearToXyz(toneCurve.toLinear(rgb));
  return { model: params.fit.model, toneCurve, params, apply: (rgb) => xyzToLab(applyXyz(rgb)), applyXyz, linearToXyz };
}

/** Lowest leave-one-out mean wins; a simpler model keeps its place unless beaten by more than 0.05 ΔE00. */
function chooseModel(candidates: CandidateScore[]): CandidateScore {
  let best = candidates[0];
  for (const c of candidates.slice(1)) {
    if (Number.isNaN(best.looMeanDe00) || c.looMeanDe00 < best.looMeanDe00 - 0.05) best = c;
  }
  return best;
}

function fitAll(
  patches: readonly CardPatch[],
  xyz: readonly Xyz[],
  neutral: readonly boolean[],
  models: readonly CalibrationModel[],
) {
  const curve = fitToneCurve(
    patches.flatMap((p, i) => (neutral[i] ? [{ rgb: p.rgb, Y: xyz[i].Y, index: i }] : [])),
  );
  const lin = patches.map((p) => curve.toLinear(p.rgb));
  const fits: Partial<Record<CalibrationModel, ModelParams | null>> = {};
  for (const m of models) fits[m] = fitModel(m, lin, xyz, neutral);
  return { curve, fits, lin };
}

function stripCurve(c: ToneCurve): ToneCurveParams {
  return { kind: c.kind, gamma: c.gamma, gain: c.gain, nodes: c.nodes };
}
