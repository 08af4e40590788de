// Judging colour: lot against target, grey-scale grades for colour change, prediction against
// measurement, and plain words for which way a colour differs. All Lab values are CIELAB D65.
import { TEXTILE_KL, deltaE00, deltaECMC, deltaEab } from "./difference";
import type { Lab } from "./types";

/**
 * Smallest lightness, chroma or hue difference (CIELAB units) worth putting into words.
 * Our product choice: below about half a unit the words would describe noise, not a colour.
 */
export const DIRECTION_THRESHOLD = 0.5;

/** Below this chroma a colour counts as near-neutral and hue is described by a* and b* (our choice). */
export const NEAR_NEUTRAL_CHROMA = 4;

/** Verdict bands for prediction vs measurement in ΔE00 (our product choice, not a standard). */
export const VERDICT_CLOSE = 2;
export const VERDICT_NOTICEABLE = 5;

export type LotMetric = "cmc21" | "de00";

export interface LotJudgement {
  pass: boolean;
  /** The difference in the chosen metric. */
  deltaE: number;
  /** CIEDE2000 with the textile weight kL (default TEXTILE_KL = 2). */
  de00: number;
  /** CMC(2:1), target as the standard (ISO 105-J03). */
  cmc21: number;
  /** Which way a failing lot missed ("darker", "duller", "redder", …); empty when it passes. */
  misses: string[];
}

/**
 * Plain words for how `sample` differs from `reference`: lighter/darker (ΔL*), brighter/duller
 * (ΔC*ab), and redder/yellower/greener/bluer (hue, by the direction of the hue-angle change in the
 * reference's quadrant of the a*b* plane; by the signs of Δa*, Δb* for a near-neutral reference).
 */
export function describeDifference(reference: Lab, sample: Lab, threshold = DIRECTION_THRESHOLD): string[] {
  const words: string[] = [];
  const dL = sample.L - reference.L;
  if (dL > threshold) words.push("lighter");
  else if (dL < -threshold) words.push("darker");

  const C1 = Math.hypot(reference.a, reference.b);
  const C2 = Math.hypot(sample.a, sample.b);
  if (C1 < NEAR_NEUTRAL_CHROMA) {
    const da = sample.a - reference.a, db = sample.b - reference.b;
    if (da > threshold) words.push("redder");
    else if (da < -threshold) words.push("greener");
    if (db > threshold) words.push("yellower");
    else if (db < -threshold) words.push("bluer");
    return words;
  }

  const dC = C2 - C1;
  if (dC > threshold) words.push("brighter");
  else if (dC < -threshold) words.push("duller");

  const h1 = hueDeg(reference), h2 = hueDeg(sample);
  let dh = h2 - h1;
  if (dh > 180) dh -= 360;
  else if (dh <= -180) dh += 360;
  const dH = 2 * Math.sqrt(C1 * C2) * Math.sin((dh * Math.PI) / 360); // ΔH*ab, signed
  if (Math.abs(dH) > threshold) {
    // Quadrants from a* (red, 0°) through b* (yellow, 90°), −a* (green, 180°), −b* (blue, 270°):
    // a positive hue change moves towards the next of these, a negative one towards the previous.
    const names = ["redder", "yellower", "greener", "bluer"];
    const q = Math.min(3, Math.floor(h1 / 90));
    words.push(dH > 0 ? names[(q + 1) % 4] : names[q]);
  }
  return words;
}

/**
 * Judge a dye lot against its colourway target. Passes when the chosen difference is at most
 * `max` (exactly at the tolerance passes). CMC(2:1) with ΔE_CMC ≤ 1 is textile practice
 * (ISO 105-J03); CIEDE2000 uses the textile weight kL = 2 unless `kL` is given.
 */
export function judgeLot(
  target: Lab,
  lot: Lab,
  tolerance: { metric: LotMetric; max: number; kL?: number },
): LotJudgement {
  if (!(tolerance.max >= 0) || !Number.isFinite(tolerance.max)) {
    throw new RangeError("The tolerance must be a number of ΔE units, zero or more.");
  }
  const cmc21 = deltaECMC(target, lot, 2, 1);
  const de00 = deltaE00(target, lot, { kL: tolerance.kL ?? TEXTILE_KL });
  const deltaE = tolerance.metric === "cmc21" ? cmc21 : de00;
  const pass = deltaE <= tolerance.max;
  return { pass, deltaE, de00, cmc21, misses: pass ? [] : describeDifference(target, lot) };
}

/**
 * Grey-scale grade (5 = no change … 1) from a colour difference, ISO 105-A05 §8:
 * GS = 5 − ΔE/1.7 for ΔE ≤ 3.4, else 5 − log10(ΔE/0.85)/log10 2; at least 1, rounded to 0.1.
 */
export function greyScaleGrade(deltaE: number): number {
  if (!(deltaE >= 0) || !Number.isFinite(deltaE)) {
    throw new RangeError("A colour difference is a number, zero or more.");
  }
  const gs = deltaE <= 3.4 ? 5 - deltaE / 1.7 : 5 - Math.log10(deltaE / 0.85) / Math.log10(2);
  return Math.round(Math.max(1, gs) * 10) / 10;
}

/** "4-5" style label of a grade, to the nearest half step (ties go to the better grade). */
export function greyScaleLabel(grade: number): string {
  const half = Math.round(grade * 2) / 2;
  return Number.isInteger(half) ? String(half) : `${Math.floor(half)}-${Math.ceil(half)}`;
}

/**
 * Approximate colour-change grade after washing, from ΔE*ab through the ISO 105-A05 mapping.
 * Approximate: the standard weights ΔC and ΔH first (ΔE_F), which is not implemented here, and a
 * phone photo is an indication, not a laboratory assessment.
 */
export function approximateWashGrade(
  before: Lab,
  after: Lab,
): { grade: number; label: string; deltaEab: number; de00: number; approximate: true } {
  const dEab = deltaEab(before, after);
  const grade = greyScaleGrade(dEab);
  return { grade, label: greyScaleLabel(grade), deltaEab: dEab, de00: deltaE00(before, after), approximate: true };
}

/**
 * Prediction against measurement in ΔE00 (kL = 1), with a verdict — close ≤ 2, noticeable ≤ 5,
 * far above (our product's bands) — and words for how the measured colour differs.
 */
export function compareVerdict(
  predicted: Lab,
  measured: Lab,
): { de00: number; verdict: "close" | "noticeable" | "far"; differences: string[] } {
  const de00 = deltaE00(predicted, measured);
  const verdict = de00 <= VERDICT_CLOSE ? "close" : de00 <= VERDICT_NOTICEABLE ? "noticeable" : "far";
  return { de00, verdict, differences: describeDifference(predicted, measured) };
}

/** Summary of prediction errors in ΔE00: count, mean, median, 95th percentile (linear interpolation), max. */
export function errorSummary(pairs: { predicted: Lab; measured: Lab }[]): {
  n: number; mean: number; median: number; p95: number; max: number;
} {
  if (pairs.length === 0) throw new RangeError("No predictions with measurements to summarise yet.");
  const d = pairs.map((p) => deltaE00(p.predicted, p.measured)).sort((x, y) => x - y);
  const mean = d.reduce((s, v) => s + v, 0) / d.length;
  return { n: d.length, mean, median: quantile(d, 0.5), p95: quantile(d, 0.95), max: d[d.length - 1] };
}

/** Quantile of sorted values, linear interpolation between closest ranks (Hyndman & Fan type 7). */
function quantile(sorted: number[], p: number): number {
  const pos = (sorted.length - 1) * p;
  const lo = Math.floor(pos), hi = Math.ceil(pos);
  return sorted[lo] + (sorted[hi] - sorted[lo]) * (pos - lo);
}

function hueDeg(lab: Lab): number {
  const h = (Math.atan2(lab.b, lab.a) * 180) / Math.PI;
  return h < 0 ? h + 360 : h;
}
