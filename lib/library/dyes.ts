import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Dye, type DyeClass, DyeSchema, StockSolutionSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import type { DyeInput, DyeListQuery, DyePatch } from "@/lib/schemas/library";
import { DYE_CLASS_OPTIONS } from "@/lib/schemas/library";
import { assertId, assertNameFree, checkVersion, containsPattern, notFound, sortRows } from "./common";

// The studio's dyes: powders and liquids with their class and safety sheet.

export interface DyeDto {
  id: string;
  name: string;
  dyeClass: DyeClass;
  form: "powder" | "liquid";
  colourIndexName: string | null;
  sdsUrl: string | null;
  displayHex: string | null;
  notes: string;
  archived: boolean;
  version: number;
  createdAt: string;
}

export function dyeDto(d: Dye): DyeDto {
  return {
    id: d.id,
    name: d.name,
    dyeClass: d.dyeClass,
    form: d.form,
    colourIndexName: d.colourIndexName ?? null,
    sdsUrl: d.sdsUrl ?? null,
    displayHex: d.displayHex ?? null,
    notes: d.notes,
    archived: d.archived,
    version: d.version,
    createdAt: d.createdAt.toISOString(),
  };
}

export async function listDyes(em: EntityManager, studio: Studio, query: DyeListQuery): Promise<DyeDto[]> {
  const like = query.q ? containsPattern(query.q) : null;
  const rows = await em.find(DyeSchema, {
    studio,
    archived: query.archived ?? false,
    ...(query.dyeClass ? { dyeClass: query.dyeClass } : {}),
    ...(query.form ? { form: query.form } : {}),
    ...(like ? { $or: [{ name: { $ilike: like } }, { colourIndexName: { $ilike: like } }, { notes: { $ilike: like } }] } : {}),
  });
  const dtos = rows.map(dyeDto);
  const byName = (d: DyeDto) => d.name;
  switch (query.sort ?? "name") {
    case "dyeClass":
      return sortRows(dtos, (d) => DYE_CLASS_OPTIONS.indexOf(d.dyeClass), query.dir, byName);
    case "created":
      return sortRows(dtos, (d) => d.createdAt, query.dir ?? "desc", byName);
    default:
      return sortRows(dtos, byName, query.dir);
  }
}

export async function findDye(em: EntityManager, studio: Studio, id: string): Promise<Dye> {
  assertId(id, "This dye");
  const d = await em.findOne(DyeSchema, { id, studio });
  if (!d) throw notFound("This dye");
  return d;
}

export async function getDye(em: EntityManager, studio: Studio, id: string): Promise<DyeDto> {
  return dyeDto(await findDye(em, studio, id));
}

export async function createDye(em: EntityManager, studio: Studio, input: DyeInput): Promise<DyeDto> {
  await assertNameFree(em, DyeSchema, studio, input.name, "dye");
  const d = em.create(DyeSchema, {
    studio,
    name: input.name,
    dyeClass: input.dyeClass,
    form: input.form,
    colourIndexName: input.colourIndexName ?? null,
    sdsUrl: input.sdsUrl ?? null,
    displayHex: input.displayHex ?? null,
    notes: input.notes ?? "",
  });
  await em.flush();
  return dyeDto(d);
}

export async function updateDye(em: EntityManager, studio: Studio, id: string, patch: DyePatch): Promise<DyeDto> {
  const d = await findDye(em, studio, id);
  checkVersion(d, patch.version, "dye");
  const { version: _v, ...changes } = patch;
  if (changes.name !== undefined && changes.name.toLowerCase() !== d.name.toLowerCase()) {
    await assertNameFree(em, DyeSchema, studio, changes.name, "dye", d.id);
  }
  em.assign(d, changes);
  await em.flush();
  return dyeDto(d);
}

/** Archiving a dye archives its stock solutions with it; trials that used them keep them. */
export async function archiveDye(em: EntityManager, studio: Studio, id: string): Promise<void> {
  await em.transactional(async (tx) => {
    const d = await findDye(tx, studio, id);
    if (d.archived) return;
    d.archived = true;
    const stocks = await tx.find(StockSolutionSchema, { studio, dye: d, archived: false });
    for (const s of stocks) s.archived = true;
    await tx.flush();
  });
}
