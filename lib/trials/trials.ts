import "server-only";
import { randomUUID } from "node:crypto";
import { LockMode } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { StockSolutionSchema, YarnBaseSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import { type Layer, LayerSchema, type Trial, TrialSchema } from "@/entities/trial";
import { quoted, recordActivity } from "@/lib/activity";
import { isUuid } from "@/lib/auth/with-studio";
import { badRequest, notFound } from "@/lib/errors";
import { type CopyInput, layerDyeInput, layerInput, type TrialInput, type TrialPatch } from "@/lib/schemas/trial";
import { enteredFromDos } from "./amounts";
import { loadLibrary, trialDto } from "./dto";
import { notesText } from "./notes";
import type { TrialDto } from "./types";

// Trials: create, read, update with optimistic locking, delete, and copy ("same recipe, new base").
// Every lookup is scoped by the studio; another studio's trial is simply not found.

/** The trial, in this studio, or a 404. */
export async function findTrial(em: EntityManager, studio: Studio, trialId: string): Promise<Trial> {
  if (!isUuid(trialId)) throw notFound("This trial");
  const trial = await em.findOne(TrialSchema, { id: trialId, studio });
  if (!trial) throw notFound("This trial");
  return trial;
}

async function checkBase(em: EntityManager, studio: Studio, baseId: string | null | undefined): Promise<void> {
  if (!baseId) return;
  const base = await em.findOne(YarnBaseSchema, { id: baseId, studio });
  if (!base) throw badRequest("Check “baseId”: choose a base from this studio's library.", { baseId: "Choose a base from this studio's library." });
}

/** The full trial as the API returns it, read fresh. */
export async function getTrial(em: EntityManager, studio: Studio, trialId: string): Promise<TrialDto> {
  const fresh = em.fork();
  if (!isUuid(trialId)) throw notFound("This trial");
  // Three plain queries at once (lib/rows.ts): the trial with its author's name and the fibre
  // weight of the trial it was copied from, its base, and its layers; then the library. Rows of a
  // trial outside this studio are never read: every query is keyed by the trial in this studio.
  const conn = fresh.getConnection();
  const [trials, bases, layerRows] = await Promise.all([
    conn.execute<(Record<string, unknown> & { author_name: string; source_fibre_g: number | null })[]>(
      `select t.*, u.name as author_name, src.fibre_weight_g as source_fibre_g
         from trials t join users u on u.id = t.author_id left join trials src on src.id = t.copied_from_id
        where t.id = ? and t.studio_id = ?`,
      [trialId, studio.id],
    ),
    conn.execute<Record<string, unknown>[]>(
      "select b.* from trials t join yarn_bases b on b.id = t.base_id where t.id = ? and t.studio_id = ?",
      [trialId, studio.id],
    ),
    conn.execute<Record<string, unknown>[]>(
      "select l.* from layers l join trials t on t.id = l.trial_id where l.trial_id = ? and t.studio_id = ? order by l.position",
      [trialId, studio.id],
    ),
  ]);
  if (!trials[0]) throw notFound("This trial");
  const { author_name: authorName, source_fibre_g: sourceFibreG, ...row } = trials[0];
  const trial = fresh.map(TrialSchema, row);
  const layers = layerRows.map((r) => fresh.map(LayerSchema, r));
  const lib = await loadLibrary(fresh, studio.id, layers.flatMap((l) => l.dyes));
  return trialDto({
    trial,
    layers,
    base: bases[0] ? fresh.map(YarnBaseSchema, bases[0]) : null,
    authorName,
    lib,
    shelfLifeDays: studio.stockShelfLifeDays,
    sourceFibreG: sourceFibreG ?? null,
  });
}

export async function createTrial(em: EntityManager, studio: Studio, authorId: string, input: TrialInput): Promise<TrialDto> {
  await checkBase(em, studio, input.baseId);
  const trial = em.create(TrialSchema, {
    // The id is needed before the flush, for the activity event stored with it.
    id: randomUUID(),
    studio,
    author: authorId,
    title: input.title,
    base: input.baseId ?? null,
    fibreWeightG: input.fibreWeightG,
    status: input.status ?? "planned",
    tags: normaliseTags(input.tags ?? []),
    notes: input.notes ?? null,
    notesText: notesText(input.notes),
  });
  await recordActivity(em, { studio, actor: authorId, kind: "trial.created", summary: `started ${quoted(trial.title)}`, trialId: trial.id });
  await em.flush();
  return getTrial(em, studio, trial.id);
}

/** Tags: trimmed, lower-case, each once. */
function normaliseTags(tags: string[]): string[] {
  return [...new Set(tags.map((t) => t.trim().toLowerCase()).filter(Boolean))];
}

export async function updateTrial(em: EntityManager, studio: Studio, trialId: string, patch: TrialPatch): Promise<TrialDto> {
  const trial = await findTrial(em, studio, trialId);
  // A stale version answers 409 (OptimisticLockError); the flush checks it again in the database.
  await em.lock(trial, LockMode.OPTIMISTIC, patch.version);
  if (patch.baseId !== undefined) {
    await checkBase(em, studio, patch.baseId);
    trial.base = patch.baseId ? em.getReference(YarnBaseSchema, patch.baseId, { wrapped: true }) : null;
  }
  if (patch.title !== undefined) trial.title = patch.title;
  if (patch.fibreWeightG !== undefined) trial.fibreWeightG = patch.fibreWeightG;
  if (patch.status !== undefined) trial.status = patch.status;
  if (patch.tags !== undefined) trial.tags = normaliseTags(patch.tags);
  if (patch.notes !== undefined) {
    trial.notes = patch.notes;
    trial.notesText = notesText(patch.notes);
  }
  await em.flush();
  return getTrial(em, studio, trial.id);
}

export async function deleteTrial(em: EntityManager, studio: Studio, trialId: string): Promise<void> {
  const trial = await findTrial(em, studio, trialId);
  // Layers and timers go with it (database cascade).
  await em.nativeDelete(TrialSchema, { id: trial.id, studio });
}

/**
 * Copies a trial's recipe as the start of the next one: the layers' methods, dyes (at the same
 * depth of shade), acid, heat, timing and setting; water follows the liquor ratio to the new fibre
 * weight. Results (observations, rinse notes, bleeding) and notes stay with the original.
 */
export async function copyTrial(em: EntityManager, studio: Studio, authorId: string, trialId: string, input: CopyInput): Promise<TrialDto> {
  const id = await em.transactional(async (tx) => {
    const source = await findTrial(tx, studio, trialId);
    await checkBase(tx, studio, input.baseId);
    const layers = await tx.find(LayerSchema, { trial: source }, { orderBy: { position: "asc" } });
    const fibreG = input.fibreWeightG ?? source.fibreWeightG;
    const factor = fibreG / source.fibreWeightG;
    const stockIds = [...new Set(layers.flatMap((l) => l.dyes.map((d) => d.stockId)).filter((s): s is string => !!s))];
    const stocks = new Map((await tx.find(StockSolutionSchema, { id: { $in: stockIds }, studio })).map((s) => [s.id, s]));
    const copy = tx.create(TrialSchema, {
      id: randomUUID(),
      studio,
      author: authorId,
      title: input.title ?? `${source.title} (copy)`.slice(0, 160),
      base: input.baseId !== undefined ? input.baseId : (source.base?.id ?? null),
      fibreWeightG: fibreG,
      status: "planned",
      tags: [...source.tags],
      notes: null,
      notesText: "",
      copiedFrom: source,
    });
    const copied = layers.map((l, i) => copiedLayer(copy, l, i, fibreG, factor, stocks));
    copied.forEach(checkScaled);
    copied.forEach((l) => tx.create(LayerSchema, l));
    await recordActivity(tx, {
      studio,
      actor: authorId,
      kind: "trial.copied",
      summary: `started ${quoted(copy.title)} from the recipe of ${quoted(source.title)}`,
      trialId: copy.id,
      subjectId: source.id,
    });
    await tx.flush();
    return copy.id;
  });
  return getTrial(em, studio, id);
}

/**
 * Water, acid and measured amounts scale with the fibre weight; a copy at a very different weight
 * can leave the range a layer may hold (500 L of water, 10 000 of acid, 20 000 of an amount, and
 * more than nothing of water). Such a copy is refused rather than stored out of range.
 */
function checkScaled(l: ReturnType<typeof copiedLayer>): void {
  const where = `At ${formatGrams(l.trial.fibreWeightG)} g, layer ${l.position + 1}`;
  const layer = layerInput.safeParse({ method: l.method, acid: l.acid, waterL: l.waterL });
  const dye = l.dyes.map((d) => layerDyeInput.safeParse({ dyeId: d.dyeId, stockId: d.stockId, amount: d.entered })).find((r) => !r.success);
  const issue = (!layer.success && layer.error.issues[0]) || (dye && !dye.success && dye.error.issues[0]);
  if (issue) {
    const message = `${where} would be out of range. ${issue.message} Copy at a weight nearer the original.`;
    throw badRequest(message, { fibreWeightG: message });
  }
}

const formatGrams = (g: number) => (Math.abs(g) >= 0.01 ? String(Math.round(g * 100) / 100) : g.toExponential(2));

function copiedLayer(
  trial: Trial,
  l: Layer,
  position: number,
  fibreG: number,
  factor: number,
  stocks: Map<string, { concentrationPct: number; definition: "to-volume" | "in-water" }>,
) {
  return {
    trial,
    position,
    method: l.method,
    dyes: l.dyes.map((d) => ({
      ...d,
      entered: enteredFromDos(d.dosPct, d.entered.unit, fibreG, d.stockId ? (stocks.get(d.stockId) ?? null) : null),
    })),
    acid: { ...l.acid, amount: l.acid.amount != null ? l.acid.amount * factor : l.acid.amount, ph: null },
    waterL: l.waterL != null ? l.waterL * factor : null,
    temperatureC: l.temperatureC ?? null,
    minutes: l.minutes ?? null,
    setting: { ...l.setting },
    rinseNote: "",
    bled: null,
    coverage: l.coverage ?? null,
    gradient: l.gradient ? { sections: l.gradient.sections, depths: [...l.gradient.depths] } : null,
    observations: "",
  };
}
