import "server-only";
import { randomUUID } from "node:crypto";
import { LockMode } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { DyeSchema, StockSolutionSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import { type Layer, type LayerDye, LayerSchema, type Trial } from "@/entities/trial";
import { layerWords, quoted, recordActivity } from "@/lib/activity";
import { isUuid } from "@/lib/auth/with-studio";
import { badRequest, conflict, notFound } from "@/lib/errors";
import { type LayerDyeInput, type LayerInput, type LayerPatch, MAX_DOS_PCT } from "@/lib/schemas/trial";
import { dosFromEntered } from "./amounts";
import { findTrial, getTrial } from "./trials";
import type { TrialDto } from "./types";

// A trial's layers: add, edit (optimistic locking on the layer's version), delete, duplicate and
// reorder. Positions are kept 0..n-1. A layer change moves the trial's updatedAt but not its
// version, so a queued edit of the trial's own fields is not refused because a layer changed.

/** Converts entered amounts to depth of shade, checking each dye and stock belongs to the studio. */
export async function resolveDyes(em: EntityManager, studio: Studio, inputs: LayerDyeInput[], fibreG: number): Promise<LayerDye[]> {
  const dyes = new Map((await em.find(DyeSchema, { id: { $in: inputs.map((d) => d.dyeId) }, studio })).map((d) => [d.id, d]));
  const stockIds = inputs.map((d) => d.stockId).filter((s): s is string => !!s);
  const stocks = new Map((await em.find(StockSolutionSchema, { id: { $in: stockIds }, studio })).map((s) => [s.id, s]));
  const fields: Record<string, string> = {};
  const out = inputs.map((d, i): LayerDye => {
    const dye = dyes.get(d.dyeId);
    if (!dye) fields[`dyes.${i}.dyeId`] = "Choose a dye from this studio's library.";
    const stock = d.stockId ? stocks.get(d.stockId) : undefined;
    if (d.stockId && !stock) fields[`dyes.${i}.stockId`] = "Choose a stock solution from this studio's library.";
    else if (stock && stock.dye.id !== d.dyeId) fields[`dyes.${i}.stockId`] = `That stock solution is of another dye, not ${dye?.name ?? "this one"}.`;
    const entered = { value: d.amount.value, unit: d.amount.unit };
    let dosPct = 0;
    if (!fields[`dyes.${i}.stockId`] && (entered.unit === "dos" || entered.unit === "g" || stock)) {
      dosPct = dosFromEntered(entered, fibreG, stock ?? null);
      if (dosPct > MAX_DOS_PCT) {
        fields[`dyes.${i}.amount.value`] =
          `That is ${Math.round(dosPct * 10) / 10} % depth of shade on ${fibreG} g, over the ${MAX_DOS_PCT} % limit: check the unit and the fibre weight.`;
      }
    }
    return { dyeId: d.dyeId, stockId: d.stockId ?? null, dosPct, entered };
  });
  const first = Object.entries(fields)[0];
  if (first) throw badRequest(`Check “${first[0]}”: ${first[1]}`, fields);
  return out;
}

async function findLayer(em: EntityManager, trial: Trial, layerId: string): Promise<Layer> {
  if (!isUuid(layerId)) throw notFound("This layer");
  const layer = await em.findOne(LayerSchema, { id: layerId, trial });
  if (!layer) throw notFound("This layer");
  return layer;
}

/** Holds the trial's row until the transaction ends, so layer changes to one trial queue up. */
async function lockTrialRow(em: EntityManager, trial: Trial): Promise<void> {
  await em.getConnection().execute("select id from trials where id = ? for update", [trial.id], "all", em.getTransactionContext());
}

/** Moves the trial's updatedAt without touching its version (see the note at the top). */
async function touch(em: EntityManager, trial: Trial): Promise<void> {
  await em.getConnection().execute("update trials set updated_at = ? where id = ?", [new Date(), trial.id], "run", em.getTransactionContext());
}

/** Writes positions 0..n-1 in the given order, without bumping the layers' versions. */
async function writePositions(em: EntityManager, ids: string[]): Promise<void> {
  if (ids.length === 0) return;
  const values = ids.map(() => "(?::uuid, ?::int)").join(", ");
  await em.getConnection().execute(
    `update layers set position = v.pos from (values ${values}) as v(id, pos) where layers.id = v.id`,
    ids.flatMap((id, i) => [id, i]),
    "run",
    em.getTransactionContext(),
  );
}

function fromInput(input: LayerInput | LayerPatch, dyes: LayerDye[] | undefined): Partial<Layer> {
  const out: Partial<Layer> = {};
  if (input.method !== undefined) out.method = input.method;
  if (dyes !== undefined) out.dyes = dyes;
  if (input.acid !== undefined) out.acid = { kind: input.acid.kind, amount: input.acid.amount ?? null, ph: input.acid.ph ?? null };
  if (input.waterL !== undefined) out.waterL = input.waterL;
  if (input.temperatureC !== undefined) out.temperatureC = input.temperatureC;
  if (input.minutes !== undefined) out.minutes = input.minutes;
  if (input.setting !== undefined) out.setting = { method: input.setting.method, minutes: input.setting.minutes ?? null };
  if (input.rinseNote !== undefined) out.rinseNote = input.rinseNote;
  if (input.bled !== undefined) out.bled = input.bled;
  if (input.coverage !== undefined) out.coverage = input.coverage;
  if (input.gradient !== undefined) out.gradient = input.gradient;
  if (input.observations !== undefined) out.observations = input.observations;
  return out;
}

export async function addLayer(em: EntityManager, studio: Studio, actorId: string, trialId: string, input: LayerInput): Promise<TrialDto> {
  await em.transactional(async (tx) => {
    const trial = await findTrial(tx, studio, trialId);
    await lockTrialRow(tx, trial);
    const dyes = await resolveDyes(tx, studio, input.dyes ?? [], trial.fibreWeightG);
    const count = await tx.count(LayerSchema, { trial });
    const layer = tx.create(LayerSchema, {
      id: randomUUID(),
      trial,
      position: count,
      method: input.method,
      dyes: [],
      acid: { kind: "vinegar" },
      setting: { method: "none" },
      rinseNote: "",
      observations: "",
      ...fromInput(input, dyes),
    });
    await recordActivity(tx, {
      studio,
      actor: actorId,
      kind: "layer.added",
      summary: `added ${layerWords(count, layer.method)} to ${quoted(trial.title)}`,
      trialId: trial.id,
      layerId: layer.id,
    });
    await tx.flush();
    await touch(tx, trial);
  });
  return getTrial(em, studio, trialId);
}

export async function updateLayer(em: EntityManager, studio: Studio, trialId: string, layerId: string, patch: LayerPatch): Promise<TrialDto> {
  await em.transactional(async (tx) => {
    const trial = await findTrial(tx, studio, trialId);
    const layer = await findLayer(tx, trial, layerId);
    await tx.lock(layer, LockMode.OPTIMISTIC, patch.version);
    const dyes = patch.dyes !== undefined ? await resolveDyes(tx, studio, patch.dyes, trial.fibreWeightG) : undefined;
    tx.assign(layer, fromInput(patch, dyes));
    await tx.flush();
    await touch(tx, trial);
  });
  return getTrial(em, studio, trialId);
}

export async function deleteLayer(em: EntityManager, studio: Studio, trialId: string, layerId: string): Promise<TrialDto> {
  await em.transactional(async (tx) => {
    const trial = await findTrial(tx, studio, trialId);
    await lockTrialRow(tx, trial);
    const layer = await findLayer(tx, trial, layerId);
    await tx.nativeDelete(LayerSchema, { id: layer.id });
    const rest = await tx.find(LayerSchema, { trial, id: { $ne: layer.id } }, { orderBy: { position: "asc", createdAt: "asc" } });
    await writePositions(tx, rest.map((l) => l.id));
    await touch(tx, trial);
  });
  return getTrial(em, studio, trialId);
}

/** A copy of the layer placed right after it; the later layers move down one. */
export async function duplicateLayer(em: EntityManager, studio: Studio, actorId: string, trialId: string, layerId: string): Promise<TrialDto> {
  await em.transactional(async (tx) => {
    const trial = await findTrial(tx, studio, trialId);
    await lockTrialRow(tx, trial);
    const source = await findLayer(tx, trial, layerId);
    const all = await tx.find(LayerSchema, { trial }, { orderBy: { position: "asc", createdAt: "asc" } });
    const copy = tx.create(LayerSchema, {
      id: randomUUID(),
      trial,
      position: all.length,
      method: source.method,
      dyes: source.dyes.map((d) => ({ ...d, entered: { ...d.entered } })),
      acid: { ...source.acid },
      waterL: source.waterL ?? null,
      temperatureC: source.temperatureC ?? null,
      minutes: source.minutes ?? null,
      setting: { ...source.setting },
      rinseNote: source.rinseNote,
      bled: source.bled ?? null,
      coverage: source.coverage ?? null,
      gradient: source.gradient ? { ...source.gradient, depths: [...source.gradient.depths] } : null,
      observations: source.observations,
    });
    const ids = all.map((l) => l.id);
    const at = ids.indexOf(source.id) + 1;
    ids.splice(at, 0, copy.id);
    await recordActivity(tx, {
      studio,
      actor: actorId,
      kind: "layer.added",
      summary: `added ${layerWords(at, copy.method)} to ${quoted(trial.title)}, a copy of layer ${at}`,
      trialId: trial.id,
      layerId: copy.id,
    });
    await tx.flush();
    await writePositions(tx, ids);
    await touch(tx, trial);
  });
  return getTrial(em, studio, trialId);
}

/** Puts the layers in the given order; the list must name every layer of the trial exactly once. */
export async function reorderLayers(em: EntityManager, studio: Studio, trialId: string, layerIds: string[]): Promise<TrialDto> {
  await em.transactional(async (tx) => {
    const trial = await findTrial(tx, studio, trialId);
    await lockTrialRow(tx, trial);
    const current = await tx.find(LayerSchema, { trial }, { fields: ["id"] });
    const known = new Set(current.map((l) => l.id));
    if (layerIds.length !== known.size || layerIds.some((id) => !known.has(id))) {
      throw conflict("The layers changed while you were reordering them. Reload the trial and move them again.");
    }
    await writePositions(tx, layerIds);
    await touch(tx, trial);
  });
  return getTrial(em, studio, trialId);
}
