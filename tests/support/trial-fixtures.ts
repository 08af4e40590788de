// Library records (bases, dyes, stock solutions) and trials for the trial tests, written straight
// through the ORM so the tests of the trial routes do not depend on the library routes.
import type { FibrePart, WeightClass } from "@/entities/library";
import { DyeSchema, StockSolutionSchema, YarnBaseSchema } from "@/entities/library";
import { type LayerDye, LayerSchema, type TrialStatus, TrialSchema } from "@/entities/trial";
import { getEm } from "@/lib/db";

export async function makeBase(
  studioId: string,
  name: string,
  opts: { fibres?: FibrePart[]; superwash?: boolean; weightClass?: WeightClass } = {},
): Promise<string> {
  const em = await getEm();
  const b = em.create(YarnBaseSchema, {
    studio: studioId,
    name,
    fibres: opts.fibres ?? [{ fibre: "wool", pct: 100 }],
    superwash: opts.superwash ?? false,
    weightClass: opts.weightClass ?? "fingering",
  });
  await em.flush();
  return b.id;
}

export async function makeDye(
  studioId: string,
  name: string,
  opts: { dyeClass?: "acid" | "food" | "reactive" | "other"; displayHex?: string; form?: "powder" | "liquid" } = {},
): Promise<string> {
  const em = await getEm();
  const d = em.create(DyeSchema, {
    studio: studioId,
    name,
    dyeClass: opts.dyeClass ?? "acid",
    form: opts.form ?? "powder",
    displayHex: opts.displayHex ?? null,
  });
  await em.flush();
  return d.id;
}

export async function makeStock(
  studioId: string,
  dyeId: string,
  opts: { pct?: number; definition?: "to-volume" | "in-water"; mixedOn?: string } = {},
): Promise<string> {
  const em = await getEm();
  const s = em.create(StockSolutionSchema, {
    studio: studioId,
    dye: dyeId,
    concentrationPct: opts.pct ?? 1,
    definition: opts.definition ?? "to-volume",
    volumeMl: 500,
    mixedOn: opts.mixedOn ?? new Date().toISOString().slice(0, 10),
  });
  await em.flush();
  return s.id;
}

export interface TrialSeed {
  title: string;
  authorId: string;
  baseId?: string | null;
  fibreWeightG?: number;
  status?: TrialStatus;
  tags?: string[];
  notesText?: string;
  createdAt?: Date;
  updatedAt?: Date;
  layers?: { method: "immersion" | "kettle" | "dip" | "hand-paint" | "speckle" | "dry" | "other"; dyes?: LayerDye[] }[];
}

/** A trial written directly, with given dates (for sort and date-filter tests). */
export async function makeTrial(studioId: string, t: TrialSeed): Promise<string> {
  const em = await getEm();
  const trial = em.create(TrialSchema, {
    studio: studioId,
    author: t.authorId,
    title: t.title,
    base: t.baseId ?? null,
    fibreWeightG: t.fibreWeightG ?? 100,
    status: t.status ?? "planned",
    tags: t.tags ?? [],
    notes: t.notesText ? { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: t.notesText }] }] } : null,
    notesText: t.notesText ?? "",
  });
  (t.layers ?? []).forEach((l, i) => em.create(LayerSchema, { trial, position: i, method: l.method, dyes: l.dyes ?? [] }));
  await em.flush();
  // Dates set afterwards: the entity's onCreate/onUpdate hooks would overwrite them.
  if (t.createdAt || t.updatedAt) {
    await em.getConnection().execute("update trials set created_at = ?, updated_at = ? where id = ?", [
      t.createdAt ?? trial.createdAt,
      t.updatedAt ?? t.createdAt ?? trial.updatedAt,
      trial.id,
    ]);
  }
  return trial.id;
}

/** A dye entry as stored on a layer, at a depth of shade. */
export function dosDye(dyeId: string, dosPct: number): LayerDye {
  return { dyeId, stockId: null, dosPct, entered: { value: dosPct, unit: "dos" } };
}
