import type { DyeClass, FibrePart } from "@/entities/library";
import { fibreWarnings } from "@/lib/library/fibre-check";
import type { CautionKey, LayerDto, TrialDto, TrialWarning } from "@/lib/trials/types";

// Warnings for a layer being written (before the server has seen it) and the safety cautions a
// layer calls for. Saved trials carry the server's own warnings; the wizard works from the draft
// with the same rules so the dyer hears about a problem at the step where it arises.

export interface DraftWarning {
  key: string;
  message: string;
}

export interface DraftDye {
  dyeClass: DyeClass | null;
  name: string;
  stock?: { pastShelfLife: boolean; ageDays: number; shelfLifeDays: number; concentrationPct: number } | null;
}

/** Same thresholds as the server's trial warnings: a hold at ≥ 95 °C for > 45 min is a long boil [common practice, DOMAIN.md]. */
export const SUPERWASH_BOIL_C = 95;
export const SUPERWASH_MAX_MIN = 45;

/** Fibres this layer's dye classes will leave pale (from the library's fibre rules). */
/** A base's fibre list as the trial API sends it (fibre names as plain strings). */
type BaseFibres = { fibres: { fibre: string; pct: number }[]; superwash: boolean };

export function fibreDraftWarnings(base: BaseFibres | null, dyes: DraftDye[]): DraftWarning[] {
  if (!base) return [];
  const classes = [...new Set(dyes.map((d) => d.dyeClass).filter((c): c is DyeClass => !!c))];
  return classes.flatMap((cls) =>
    // The names come from the library's own fibre list; an unknown one is treated as "other".
    fibreWarnings(base.fibres as FibrePart[], cls, { superwash: base.superwash })
      .filter((w) => w.level === "warning")
      .map((w) => ({ key: `fibre:${cls}:${w.kind}`, message: w.message })),
  );
}

export function stockDraftWarnings(dyes: DraftDye[]): DraftWarning[] {
  return dyes
    .filter((d) => d.stock?.pastShelfLife)
    .map((d) => ({
      key: `stock:${d.name}`,
      message: `The ${d.stock!.concentrationPct} % stock of ${d.name} is ${d.stock!.ageDays} days old, past the studio's ${d.stock!.shelfLifeDays}-day shelf life: it may have weakened. A fresh jar makes a result you can repeat.`,
    }));
}

export function boilDraftWarning(
  base: BaseFibres | null,
  heat: { temperatureC: number | null; minutes: number | null; setting: { method: string; minutes: number | null } },
): DraftWarning[] {
  if (!base || !(base.superwash || base.fibres.some((f) => f.fibre === "superwash wool"))) return [];
  const hot = (heat.temperatureC ?? 0) >= SUPERWASH_BOIL_C && (heat.minutes ?? 0) > SUPERWASH_MAX_MIN;
  const simmer = heat.setting.method === "simmer" && (heat.setting.minutes ?? 0) > SUPERWASH_MAX_MIN;
  if (!hot && !simmer) return [];
  return [{ key: "superwash-boil", message: "This base is superwash: a long boil can leave it limp and fuzzy. Hold below a boil, and only as long as the bath needs to clear." }];
}

/** Partial methods whose amounts do not follow fibre weight in a straight line. */
export const PARTIAL_METHODS: readonly LayerDto["method"][] = ["kettle", "hand-paint", "speckle", "dry"];

/** Which safety cautions a draft layer calls for (the same rules as the server's layer cautions). */
export function draftCautions(d: {
  method: LayerDto["method"];
  powder: boolean;
  acid: "vinegar" | "citric" | "none";
  setting: "simmer" | "steam" | "microwave" | "none";
  hasDyes: boolean;
}): CautionKey[] {
  const out: CautionKey[] = [];
  if (d.powder || d.method === "speckle" || d.method === "dry") out.push("powder");
  if (d.acid !== "none") out.push("acid");
  if (d.setting === "steam") out.push("steam");
  if (d.setting === "microwave") out.push("microwave");
  if (d.hasDyes) out.push("disposal");
  return out;
}

/** The server's warnings for one layer, or those about the whole trial when layerId is null. */
export function warningsFor(trial: TrialDto, layerId: string | null): TrialWarning[] {
  return (trial.warnings ?? []).filter((w) => w.layerId === layerId);
}

/** Each caution once per trial: on the first layer that calls for it. */
export function firstCautions(layers: LayerDto[]): Map<string, CautionKey[]> {
  const seen = new Set<CautionKey>();
  const out = new Map<string, CautionKey[]>();
  for (const l of layers) {
    const fresh = (l.cautions ?? []).filter((c) => !seen.has(c));
    fresh.forEach((c) => seen.add(c));
    out.set(l.id, fresh);
  }
  return out;
}
