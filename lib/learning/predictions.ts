import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { compareVerdict, predictLayer, profileMap, toModelLayer, type Lab, type LayerBase, type Prediction } from "@/colour";
import {
  DyeProfileSchema,
  DyeSchema,
  LayerPredictionSchema,
  LayerSchema,
  ReadingSchema,
  TrialSchema,
  type LayerPrediction,
  type Reading,
  type Studio,
} from "@/entities";
import { layerWords, quoted, recordActivity } from "@/lib/activity";
import { isUuid } from "@/lib/auth/with-studio";
import { badRequest, conflict, HttpError, notFound } from "@/lib/errors";
import type { SessionUser } from "@/lib/auth/session";
import { fibreClassOf } from "./fibre-class";

const labOf = (x: { L: number; a: number; b: number }): Lab => ({ L: x.L, a: x.a, b: x.b });

export interface LayerPredictionDto {
  layerId: string;
  lab: Lab;
  palette: { lab: Lab; share: number }[];
  gradient: Lab[] | null;
  basedOn: string;
  profileVersions: Record<string, number>;
  createdAt: string;
}

function predictionDto(p: LayerPrediction): LayerPredictionDto {
  return {
    layerId: p.layer.id,
    lab: labOf(p),
    palette: p.palette.map((e) => ({ lab: labOf(e), share: e.share })),
    gradient: p.gradient?.map(labOf) ?? null,
    basedOn: p.basedOn,
    profileVersions: p.profileVersions,
    createdAt: p.createdAt.toISOString(),
  };
}

/** Readings of a trial: its first base reading, and the latest reading of each layer. */
async function trialReadings(em: EntityManager, studio: Studio, trialId: string) {
  const list = await em.find(ReadingSchema, { studio, trial: trialId }, { populate: ["photo"], orderBy: { createdAt: "asc" } });
  let base: Reading | undefined;
  const byLayer = new Map<string, Reading>();
  for (const r of list) {
    const kind = r.photo.getEntity().kind;
    if (kind === "base") base ??= r;
    if (kind === "after-layer" && r.layer) byLayer.set(r.layer.id, r);
  }
  return { base, byLayer };
}

/**
 * Predicts a layer over the latest measured colour before it (the trial's base reading or the
 * reading of an earlier layer), chaining predictions through unmeasured layers in between, and
 * records what was predicted with the profile versions used. With `asked`, a person asked for it
 * (the prediction route) and the studio's feed shows it; the ones the server records on its own
 * when a layer is saved or measured stay out of the feed.
 */
export async function recordPrediction(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  trialId: string,
  layerId: string,
  options: { asked?: boolean } = {},
): Promise<LayerPredictionDto> {
  const trial = await em.findOne(TrialSchema, { id: trialId, studio }, { populate: ["base"] });
  if (!trial) throw notFound("This trial");
  const layers = await em.find(LayerSchema, { trial }, { orderBy: { position: "asc" } });
  const k = layers.findIndex((l) => l.id === layerId);
  if (k < 0) throw notFound("This layer");
  const fibreClass = fibreClassOf(trial.base?.getEntity().fibres);
  const records = await em.find(DyeProfileSchema, { studio, fibreClass });
  const profiles = profileMap(records.map((r) => ({ dyeId: r.dye.id, profile: r.profile as never })));
  const { base, byLayer } = await trialReadings(em, studio, trialId);

  let start = -1;
  let state: LayerBase | undefined = base ? labOf(base) : undefined;
  let basedOn = base ? `reading:${base.id}` : "";
  for (let j = k - 1; j >= 0; j--) {
    const r = byLayer.get(layers[j].id);
    if (r) {
      start = j;
      state = labOf(r);
      basedOn = `reading:${r.id}`;
      break;
    }
  }
  if (!state) throw badRequest("Measure the undyed base first (a photo of the base with a reading): predictions start from it.");
  const versions: Record<string, number> = {};
  let prediction: Prediction | undefined;
  for (let j = start + 1; j <= k; j++) {
    const planned = toModelLayer(layers[j], profiles);
    if (!planned.ok) {
      const dyes = await em.find(DyeSchema, { studio, id: { $in: planned.missing } });
      const names = dyes.map((d) => d.name).join(", ") || "its dyes";
      throw badRequest(`No profile yet for ${names} on ${fibreClass}: dye and measure a calibration sample first.`);
    }
    prediction = predictLayer(state, planned.layer);
    state = prediction;
    if (j < k) basedOn = `prediction:${layers[j].id}`;
    for (const r of records) if (layers[j].dyes.some((d) => d.dyeId === r.dye.id)) versions[r.dye.id] = r.modelVersion;
  }
  const p = prediction!;
  const rec = em.create(LayerPredictionSchema, {
    id: randomUUID(),
    studio,
    layer: layers[k],
    profileVersions: versions,
    ...p.lab,
    palette: p.palette.map((e) => ({ ...e.lab, share: e.share })),
    gradient: p.gradient ?? null,
    basedOn,
    createdBy: user.id,
  });
  if (options.asked) {
    await recordActivity(em, {
      studio,
      actor: user.id,
      kind: "prediction.made",
      summary: `predicted the colour of ${layerWords(k, layers[k].method)} of ${quoted(trial.title)}`,
      trialId: trial.id,
      layerId: layers[k].id,
      subjectId: rec.id,
    });
  }
  await em.flush();
  return predictionDto(rec);
}

/** A person asks for a layer's prediction; refused once the layer is measured and predicted. */
export async function requestPrediction(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  trialId: string,
  layerId: string,
): Promise<LayerPredictionDto> {
  if (!isUuid(trialId) || !isUuid(layerId)) throw notFound("This layer");
  const measured = await em.count(ReadingSchema, { studio, layer: layerId, photo: { kind: "after-layer" } });
  const predicted = await em.count(LayerPredictionSchema, { studio, layer: layerId });
  if (measured && predicted) {
    throw conflict("This layer is measured, so its prediction stays as it was made before the result was known.");
  }
  return recordPrediction(em, studio, user, trialId, layerId, { asked: true });
}

export interface LayerComparisonDto {
  layerId: string;
  prediction: LayerPredictionDto | null;
  measured: { readingId: string; lab: Lab } | null;
  verdict: ReturnType<typeof compareVerdict> | null;
}

/** For each layer of a trial: the latest recorded prediction, the measured reading and the verdict. */
export async function compareTrial(em: EntityManager, studio: Studio, trialId: string): Promise<LayerComparisonDto[]> {
  const trial = await em.findOne(TrialSchema, { id: trialId, studio });
  if (!trial) throw notFound("This trial");
  const layers = await em.find(LayerSchema, { trial }, { orderBy: { position: "asc" } });
  const preds = await em.find(LayerPredictionSchema, { layer: { $in: layers.map((l) => l.id) } }, { orderBy: { createdAt: "asc" } });
  const latest = new Map<string, LayerPrediction>();
  for (const p of preds) latest.set(p.layer.id, p);
  const { byLayer } = await trialReadings(em, studio, trialId);
  return layers.map((l) => {
    const p = latest.get(l.id);
    const r = byLayer.get(l.id);
    return {
      layerId: l.id,
      prediction: p ? predictionDto(p) : null,
      measured: r ? { readingId: r.id, lab: labOf(r) } : null,
      verdict: p && r ? compareVerdict(labOf(p), labOf(r)) : null,
    };
  });
}

/**
 * Records a layer's prediction when none is recorded yet (or, with `refresh`, records a fresh one
 * while the layer is still unmeasured), so the trial keeps what the model said before the dyer
 * measured the result. Quietly does nothing when no prediction can be made (no base reading, a
 * dye without a profile): the page says why when the dyer asks.
 */
export async function ensurePrediction(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  trialId: string,
  layerId: string,
  options: { refresh?: boolean } = {},
): Promise<LayerPredictionDto | null> {
  const measured = (await em.count(ReadingSchema, { studio, layer: layerId, photo: { kind: "after-layer" } })) > 0;
  const recorded = (await em.count(LayerPredictionSchema, { studio, layer: layerId })) > 0;
  if (recorded && (measured || !options.refresh)) return null;
  try {
    return await recordPrediction(em, studio, user, trialId, layerId);
  } catch (e) {
    if (e instanceof HttpError && e.status === 422) return null;
    throw e;
  }
}
