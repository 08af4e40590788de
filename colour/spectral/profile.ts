// Dye profiles: the unit K/S spectrum of one dye on one fibre class (per 1 % DOS), learnt from the
// studio's calibration dyeings by non-negative least squares, band by band:
//   K/S(result) − K/S(base) = Σ cᵢ · kᵢ,   cᵢ = DOS % × uptake
// (K/S additivity: Nobbs, Rev. Prog. Coloration 15, 1985; Berns, Principles of Color Technology, 2000).
import { Matrix, SingularValueDecomposition } from "ml-matrix";
import type { Lab } from "../types";
import { deltaE00 } from "../difference";
import { BANDS } from "./cie-data";
import { cachedKs, cachedLabToReflectance, floorFor } from "./cache";
import { dyedReflectance, type SurfaceModel } from "./kubelka-munk";
import { nnls } from "./nnls";
import { refineProfiles } from "./refine";
import { reflectanceToLab } from "./reflectance";

/** One dye of a recipe and its depth of shade (% on weight of fibre). */
export interface DyeAmount {
  dyeId: string;
  dosPct: number;
}

/** A calibration dyeing: the base's colour, what went on, and the measured result. */
export interface CalibrationDyeing {
  base: Lab;
  dyes: DyeAmount[];
  /** Share of the dye that ended up on the fibre, 0–1 (1 = exhausted bath; default 1). */
  uptake?: number;
  result: Lab;
}

/** How well a profile reproduces the dyeings it was learnt from (CIEDE2000, kL = kC = kH = 1). */
export interface FitQuality {
  n: number;
  meanDE00: number;
  maxDE00: number;
}

/** What the model knows about one dye on one fibre class. */
export interface DyeProfile {
  dyeId: string;
  fibre?: string;
  /** K/S added per 1 % DOS, 36 bands 380–730 nm. */
  unitKs: Float64Array;
  surface: SurfaceModel;
  quality: FitQuality;
  /** Deepest effective depth (DOS % × uptake) among the dyeings it was learnt from. */
  calibratedUpTo?: number;
}

/** Options of the fit. */
export interface FitOptions {
  /** Apply Saunderson's surface correction before K-M (default "none"). */
  surface?: SurfaceModel;
  /** Fibre class the dyeings were made on, copied onto each profile. */
  fibre?: string;
  /**
   * After NNLS, adjust the spectra so the model reproduces the measured colours themselves
   * (see refine.ts; default true). False keeps the plain NNLS spectra.
   */
  refine?: boolean;
}

/** The outcome of a fit: profiles with their quality, or a plain reason why none could be learnt. */
export type ProfileFit =
  | { ok: true; profiles: DyeProfile[]; quality: FitQuality; skipped: Skipped[]; notes: string[] }
  | { ok: false; message: string; skipped: Skipped[] };

/** A dyeing left out of the fit, and why. */
export interface Skipped {
  index: number;
  reason: string;
}

const finiteLab = (l: Lab | undefined): boolean =>
  !!l && Number.isFinite(l.L) && Number.isFinite(l.a) && Number.isFinite(l.b) && l.L >= 0 && l.L <= 100;

/** Why a dyeing cannot be used, or null when it can. */
function unusable(d: CalibrationDyeing): string | null {
  if (!finiteLab(d.base)) return "the base colour is missing or not a CIELAB value";
  if (!finiteLab(d.result)) return "the result colour is missing or not a CIELAB value";
  if (!d.dyes || d.dyes.length === 0) return "no dye is listed";
  for (const x of d.dyes) {
    if (!x.dyeId) return "a dye has no name";
    if (!(Number.isFinite(x.dosPct) && x.dosPct > 0)) return `the depth of ${x.dyeId} is not above 0 %`;
  }
  const u = d.uptake ?? 1;
  if (!(Number.isFinite(u) && u > 0 && u <= 1)) return "the uptake is not between 0 and 1";
  return null;
}

/**
 * Learn unit K/S spectra for every dye named in `dyeings`, jointly (mixes included), by NNLS per
 * band (Lawson & Hanson 1974). Each profile carries its own fit quality: mean/max ΔE00 between the
 * measured results and the model's re-prediction of the dyeings that used the dye.
 */
export function fitDyeProfiles(dyeings: readonly CalibrationDyeing[], options: FitOptions = {}): ProfileFit {
  const surface = options.surface ?? "none";
  const skipped: Skipped[] = [];
  const used: CalibrationDyeing[] = [];
  dyeings.forEach((d, index) => {
    const why = unusable(d);
    if (why) skipped.push({ index, reason: why });
    else used.push(d);
  });
  if (used.length === 0) {
    const message =
      dyeings.length === 0
        ? "No calibration dyeings were given: dye a sample of the base with this dye, measure it, and try again."
        : "None of the calibration dyeings can be used (see the reasons listed); fix or add one and try again.";
    return { ok: false, message, skipped };
  }

  const ids = [...new Set(used.flatMap((d) => d.dyes.map((x) => x.dyeId)))];
  const col = new Map(ids.map((id, i) => [id, i]));
  // Design matrix: one row per dyeing, one column per dye, entries = DOS × uptake (summed if repeated).
  const A = Matrix.zeros(used.length, ids.length);
  used.forEach((d, r) => {
    for (const x of d.dyes) A.set(r, col.get(x.dyeId)!, A.get(r, col.get(x.dyeId)!) + x.dosPct * (d.uptake ?? 1));
  });
  const notes: string[] = [];
  const rank = new SingularValueDecomposition(A, { autoTranspose: true }).rank;
  if (rank < ids.length) {
    notes.push(
      "Some dyes only ever appear together in the same proportions, so their profiles cannot be told apart; " +
        "add a dyeing of each dye on its own.",
    );
  }

  const baseKs: Float64Array[] = [];
  const deltaKs: Float64Array[] = [];
  for (const d of used) {
    const b = cachedLabToReflectance(d.base, floorFor(surface));
    const res = cachedLabToReflectance(d.result, floorFor(surface));
    if (!b.matched || !res.matched) {
      notes.push("A calibration colour is more saturated than the model's curves can reach; the profile is approximate.");
    }
    const kb = cachedKs(b.reflectance, surface);
    const kr = cachedKs(res.reflectance, surface);
    baseKs.push(kb);
    deltaKs.push(kr.map((v, i) => v - kb[i]));
  }

  let unit: Float64Array[] = ids.map(() => new Float64Array(BANDS));
  for (let band = 0; band < BANDS; band++) {
    const k = nnls(A, deltaKs.map((dk) => dk[band]));
    k.forEach((v, i) => (unit[i][band] = v));
  }
  if (options.refine !== false) {
    const rows = used.map((d, r) => ({ baseKs: baseKs[r], conc: ids.map((_, i) => A.get(r, i)), result: d.result }));
    unit = refineProfiles(rows, unit, surface);
  }

  // Re-predict every used dyeing and score it.
  const errors = used.map((d, r) => {
    const conc = ids.map((_, i) => A.get(r, i));
    const rho = dyedReflectance(baseKs[r], unit, conc, surface);
    return deltaE00(reflectanceToLab(rho), d.result);
  });
  const quality = (rows: number[]): FitQuality => {
    const e = rows.map((r) => errors[r]);
    return { n: e.length, meanDE00: e.reduce((s, v) => s + v, 0) / e.length, maxDE00: Math.max(...e) };
  };
  const all = used.map((_, r) => r);
  const profiles = ids.map((dyeId, i) => ({
    dyeId,
    ...(options.fibre !== undefined ? { fibre: options.fibre } : {}),
    unitKs: unit[i],
    surface,
    quality: quality(all.filter((r) => A.get(r, i) > 0)),
    calibratedUpTo: Math.max(...all.map((r) => A.get(r, i))),
  }));
  return { ok: true, profiles, quality: quality(all), skipped, notes: [...new Set(notes)] };
}

/** Learn the profile of one dye (its single-dye and mixed dyeings all count); see `fitDyeProfiles`. */
export function fitDyeProfile(
  dyeings: readonly CalibrationDyeing[],
  dyeId: string,
  options: FitOptions = {},
): { ok: true; profile: DyeProfile; notes: string[]; skipped: Skipped[] } | { ok: false; message: string; skipped: Skipped[] } {
  const fit = fitDyeProfiles(dyeings, options);
  if (!fit.ok) return fit;
  const profile = fit.profiles.find((p) => p.dyeId === dyeId);
  if (!profile) {
    return { ok: false, message: `None of the usable calibration dyeings contains ${dyeId}.`, skipped: fit.skipped };
  }
  return { ok: true, profile, notes: fit.notes, skipped: fit.skipped };
}

/** A dye profile as plain JSON (the spectrum as a number array), for storage. */
export interface DyeProfileJson {
  dyeId: string;
  fibre?: string;
  unitKs: number[];
  surface: SurfaceModel;
  quality: FitQuality;
  calibratedUpTo?: number;
}

/** Profile → plain JSON for storage. */
export function profileToJson(p: DyeProfile): DyeProfileJson {
  return { ...p, unitKs: Array.from(p.unitKs) };
}

/** Plain JSON → profile; throws a plain message when the stored spectrum is not 36 non-negative numbers. */
export function profileFromJson(j: DyeProfileJson): DyeProfile {
  if (!Array.isArray(j.unitKs) || j.unitKs.length !== BANDS || !j.unitKs.every((v) => Number.isFinite(v) && v >= 0)) {
    throw new RangeError(`The stored profile of ${j.dyeId} does not hold ${BANDS} non-negative K/S values.`);
  }
  if (j.surface !== "none" && j.surface !== "saunderson") throw new RangeError(`Unknown surface model "${j.surface}".`);
  return { ...j, unitKs: Float64Array.from(j.unitKs) };
}
