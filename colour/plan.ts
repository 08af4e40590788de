// From a dye recipe as the trial records it to the spectral model's layer, shared by the server
// (recorded predictions) and the browser (live predictions while planning).
import { profileFromJson, type DyeProfile, type DyeProfileJson } from "./spectral/profile";
import type { Layer as ModelLayer } from "./spectral/predict";

/** The parts of a planned layer the model uses. */
export interface PlannedLayer {
  method: string;
  dyes: { dyeId: string; dosPct: number }[];
  coverage?: number | null;
  gradient?: { sections: number; depths: number[] } | null;
  /** Share of the dye that reaches the fibre, 0–1 (1 = exhausted bath, the default). */
  uptake?: number | null;
}

/** Methods where only part of the fibre takes dye, so coverage applies. */
export const PARTIAL_METHODS = new Set(["speckle", "hand-paint", "dry"]);

/** A layer ready for `predictLayer`, or the dyes that have no profile on this fibre class. */
export function toModelLayer(
  layer: PlannedLayer,
  profiles: ReadonlyMap<string, DyeProfile>,
): { ok: true; layer: ModelLayer } | { ok: false; missing: string[] } {
  const missing = layer.dyes.filter((d) => !profiles.has(d.dyeId)).map((d) => d.dyeId);
  if (missing.length || layer.dyes.length === 0) return { ok: false, missing };
  return {
    ok: true,
    layer: {
      dyes: layer.dyes.filter((d) => d.dosPct > 0).map((d) => ({ profile: profiles.get(d.dyeId)!, dosPct: d.dosPct })),
      uptake: layer.uptake ?? 1,
      coverage: PARTIAL_METHODS.has(layer.method) ? (layer.coverage ?? 1) : 1,
      gradient: layer.method === "dip" && layer.gradient && layer.gradient.depths.length ? layer.gradient : undefined,
    },
  };
}

/** Stored profiles (JSON) → a lookup by dye id. */
export function profileMap(list: readonly { dyeId: string; profile: DyeProfileJson }[]): Map<string, DyeProfile> {
  return new Map(list.map((p) => [p.dyeId, profileFromJson(p.profile)]));
}
