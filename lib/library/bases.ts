import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type FibrePart, type WeightClass, type YarnBase, YarnBaseSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import type { BaseInput, BaseListQuery, BasePatch } from "@/lib/schemas/library";
import { WEIGHT_CLASS_OPTIONS } from "@/lib/schemas/library";
import { assertId, assertNameFree, checkVersion, containsPattern, notFound, sortRows } from "./common";

// The studio's yarn bases: what a trial is dyed on.

export interface BaseDto {
  id: string;
  name: string;
  fibres: FibrePart[];
  superwash: boolean;
  weightClass: WeightClass;
  metresPer100g: number | null;
  notes: string;
  archived: boolean;
  version: number;
  createdAt: string;
}

export function baseDto(b: YarnBase): BaseDto {
  return {
    id: b.id,
    name: b.name,
    fibres: b.fibres.map((f) => ({ fibre: f.fibre, pct: f.pct })),
    superwash: b.superwash,
    weightClass: b.weightClass,
    metresPer100g: b.metresPer100g ?? null,
    notes: b.notes,
    archived: b.archived,
    version: b.version,
    createdAt: b.createdAt.toISOString(),
  };
}

/** Largest share first, so "75 % merino, 25 % nylon" reads the way a label does. */
function orderFibres(fibres: FibrePart[]): FibrePart[] {
  return [...fibres].sort((a, b) => b.pct - a.pct);
}

export async function listBases(em: EntityManager, studio: Studio, query: BaseListQuery): Promise<BaseDto[]> {
  const rows = await em.find(YarnBaseSchema, {
    studio,
    archived: query.archived ?? false,
    ...(query.superwash !== undefined ? { superwash: query.superwash } : {}),
    ...(query.weightClass ? { weightClass: query.weightClass } : {}),
    ...(query.q ? { $or: [{ name: { $ilike: containsPattern(query.q) } }, { notes: { $ilike: containsPattern(query.q) } }] } : {}),
  });
  // Fibres live in a JSON column and a studio has tens of bases: filter them here.
  const fibre = query.fibre;
  const kept = fibre ? rows.filter((b) => b.fibres.some((f) => f.fibre === fibre && f.pct > 0)) : rows;
  const dtos = kept.map(baseDto);
  const byName = (b: BaseDto) => b.name;
  switch (query.sort ?? "name") {
    case "weightClass":
      return sortRows(dtos, (b) => WEIGHT_CLASS_OPTIONS.indexOf(b.weightClass), query.dir, byName);
    case "metres":
      return sortRows(dtos, (b) => b.metresPer100g, query.dir, byName);
    case "created":
      return sortRows(dtos, (b) => b.createdAt, query.dir ?? "desc", byName);
    default:
      return sortRows(dtos, byName, query.dir);
  }
}

export async function findBase(em: EntityManager, studio: Studio, id: string): Promise<YarnBase> {
  assertId(id, "This base");
  const b = await em.findOne(YarnBaseSchema, { id, studio });
  if (!b) throw notFound("This base");
  return b;
}

export async function getBase(em: EntityManager, studio: Studio, id: string): Promise<BaseDto> {
  return baseDto(await findBase(em, studio, id));
}

export async function createBase(em: EntityManager, studio: Studio, input: BaseInput): Promise<BaseDto> {
  await assertNameFree(em, YarnBaseSchema, studio, input.name, "base");
  const b = em.create(YarnBaseSchema, {
    studio,
    name: input.name,
    fibres: orderFibres(input.fibres),
    superwash: input.superwash ?? false,
    weightClass: input.weightClass,
    metresPer100g: input.metresPer100g ?? null,
    notes: input.notes ?? "",
  });
  await em.flush();
  return baseDto(b);
}

export async function updateBase(em: EntityManager, studio: Studio, id: string, patch: BasePatch): Promise<BaseDto> {
  const b = await findBase(em, studio, id);
  checkVersion(b, patch.version, "base");
  const { version: _v, ...changes } = patch;
  if (changes.name !== undefined && changes.name.toLowerCase() !== b.name.toLowerCase()) {
    await assertNameFree(em, YarnBaseSchema, studio, changes.name, "base", b.id);
  }
  if (changes.fibres) changes.fibres = orderFibres(changes.fibres);
  em.assign(b, changes);
  await em.flush();
  return baseDto(b);
}

/** Archiving hides a base from lists and pickers; trials dyed on it keep it. */
export async function archiveBase(em: EntityManager, studio: Studio, id: string): Promise<void> {
  const b = await findBase(em, studio, id);
  if (b.archived) return;
  b.archived = true;
  await em.flush();
}
