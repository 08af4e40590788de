import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import type { CalibrationDyeing, Lab } from "@/colour";
import { LayerSchema, ReadingSchema, TrialSchema, type Layer, type Reading, type Studio } from "@/entities";
import { fibreClassOf } from "./fibre-class";

/** Methods where the whole skein takes the dye evenly: only these teach a profile. */
const EVEN_METHODS = new Set(["immersion", "kettle"]);

export interface StudioDyeing extends CalibrationDyeing {
  fibreClass: string;
  trialId: string;
  layerId: string;
}

const labOf = (r: Reading): Lab => ({ L: r.L, a: r.a, b: r.b });

/**
 * The studio's own dyeings usable for fitting: a layer applied evenly over a measured colour (the
 * trial's base reading, or the reading of the layer before), with a reading of its result.
 */
export async function studioDyeings(em: EntityManager, studio: Studio): Promise<StudioDyeing[]> {
  const readings = await em.find(ReadingSchema, { studio }, { populate: ["photo"], orderBy: { createdAt: "asc" } });
  const baseOf = new Map<string, Reading>();
  const afterLayer = new Map<string, Reading>();
  for (const r of readings) {
    const kind = r.photo.getEntity().kind;
    if (kind === "base" && !baseOf.has(r.trial.id)) baseOf.set(r.trial.id, r);
    if (r.layer && kind === "after-layer") afterLayer.set(r.layer.id, r); // the latest reading of a layer wins
  }
  const trialIds = [...new Set([...afterLayer.values()].map((r) => r.trial.id))];
  if (!trialIds.length) return [];
  const trials = await em.find(TrialSchema, { id: { $in: trialIds }, studio }, { populate: ["base"] });
  const layers = await em.find(LayerSchema, { trial: { $in: trialIds } }, { orderBy: { position: "asc" } });
  const byTrial = new Map<string, Layer[]>();
  for (const l of layers) byTrial.set(l.trial.id, [...(byTrial.get(l.trial.id) ?? []), l]);
  const out: StudioDyeing[] = [];
  for (const t of trials) {
    const fibreClass = fibreClassOf(t.base?.getEntity().fibres);
    let before: Reading | undefined = baseOf.get(t.id);
    for (const l of byTrial.get(t.id) ?? []) {
      const after = afterLayer.get(l.id);
      const even = EVEN_METHODS.has(l.method) && !l.gradient && (l.coverage ?? 1) >= 0.999;
      if (before && after && even && l.dyes.length > 0) {
        out.push({
          fibreClass,
          trialId: t.id,
          layerId: l.id,
          base: labOf(before),
          dyes: l.dyes.map((d) => ({ dyeId: d.dyeId, dosPct: d.dosPct })),
          result: labOf(after),
        });
      }
      before = after; // a layer without a reading breaks the chain of measured bases
    }
  }
  return out;
}

