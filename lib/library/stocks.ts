import "server-only";
import { ref } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type StockSolution, DyeSchema, StockSolutionSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import { badRequest } from "@/lib/errors";
import type { StockInput, StockListQuery, StockPatch } from "@/lib/schemas/library";
import { type DyeDto, dyeDto } from "./dyes";
import { assertId, checkVersion, notFound, sortRows } from "./common";

// The studio's stock solutions: a dye dissolved at a known strength, with the day it was mixed.

export interface StockDto {
  id: string;
  dye: Pick<DyeDto, "id" | "name" | "dyeClass" | "form" | "displayHex" | "sdsUrl" | "archived">;
  concentrationPct: number;
  definition: "to-volume" | "in-water";
  volumeMl: number;
  /** YYYY-MM-DD. */
  mixedOn: string;
  powderLot: string;
  notes: string;
  archived: boolean;
  version: number;
  createdAt: string;
  /** Whole days since mixing, counted in UTC on the day of the request. */
  ageDays: number;
  shelfLifeDays: number;
  pastShelfLife: boolean;
}

const DAY_MS = 86_400_000;

/** The stored date as YYYY-MM-DD, whichever way the driver hands it over. */
function isoDay(d: string | Date): string {
  return typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10);
}

/** Whole days between a mixing day and `now`, both taken as UTC calendar days. */
export function stockAgeDays(mixedOn: string, now: Date = new Date()): number {
  const mixed = Date.parse(`${mixedOn}T00:00:00Z`);
  const today = Date.parse(`${now.toISOString().slice(0, 10)}T00:00:00Z`);
  return Math.max(0, Math.round((today - mixed) / DAY_MS));
}

export function stockDto(s: StockSolution, shelfLifeDays: number, now: Date = new Date()): StockDto {
  const d = dyeDto(s.dye.getEntity());
  const mixedOn = isoDay(s.mixedOn);
  const ageDays = stockAgeDays(mixedOn, now);
  return {
    id: s.id,
    dye: { id: d.id, name: d.name, dyeClass: d.dyeClass, form: d.form, displayHex: d.displayHex, sdsUrl: d.sdsUrl, archived: d.archived },
    concentrationPct: s.concentrationPct,
    definition: s.definition,
    volumeMl: s.volumeMl,
    mixedOn,
    powderLot: s.powderLot,
    notes: s.notes,
    archived: s.archived,
    version: s.version,
    createdAt: s.createdAt.toISOString(),
    ageDays,
    shelfLifeDays,
    pastShelfLife: ageDays > shelfLifeDays,
  };
}

export async function listStocks(em: EntityManager, studio: Studio, query: StockListQuery): Promise<StockDto[]> {
  const rows = await em.find(
    StockSolutionSchema,
    {
      studio,
      archived: query.archived ?? false,
      ...(query.dyeId ? { dye: query.dyeId } : {}),
      ...(query.definition ? { definition: query.definition } : {}),
    },
    { populate: ["dye"] },
  );
  let dtos = rows.map((s) => stockDto(s, studio.stockShelfLifeDays));
  // Search and the age filter work on the dye's name and today's age: done here, not in SQL.
  const q = query.q?.toLowerCase();
  if (q) dtos = dtos.filter((s) => s.dye.name.toLowerCase().includes(q) || s.powderLot.toLowerCase().includes(q) || s.notes.toLowerCase().includes(q));
  if (query.pastShelfLife !== undefined) dtos = dtos.filter((s) => s.pastShelfLife === query.pastShelfLife);
  const tie = (s: StockDto) => `${s.dye.name} ${s.mixedOn}`;
  switch (query.sort ?? "mixedOn") {
    case "dye":
      return sortRows(dtos, (s) => s.dye.name, query.dir, (s) => s.mixedOn);
    case "concentration":
      return sortRows(dtos, (s) => s.concentrationPct, query.dir, tie);
    case "volume":
      return sortRows(dtos, (s) => s.volumeMl, query.dir, tie);
    default:
      // Newest first unless asked otherwise.
      return sortRows(dtos, (s) => s.mixedOn, query.dir ?? "desc", tie);
  }
}

export async function findStock(em: EntityManager, studio: Studio, id: string): Promise<StockSolution> {
  assertId(id, "This stock solution");
  const s = await em.findOne(StockSolutionSchema, { id, studio }, { populate: ["dye"] });
  if (!s) throw notFound("This stock solution");
  return s;
}

export async function getStock(em: EntityManager, studio: Studio, id: string): Promise<StockDto> {
  return stockDto(await findStock(em, studio, id), studio.stockShelfLifeDays);
}

/** A dye named in a body must be an active dye of this studio: otherwise a field message. */
async function dyeOfStudio(em: EntityManager, studio: Studio, dyeId: string) {
  const dye = await em.findOne(DyeSchema, { id: dyeId, studio, archived: false });
  if (!dye) throw badRequest("Check “dyeId”: choose a dye from this studio's library.", { dyeId: "Choose a dye from this studio's library." });
  return dye;
}

export async function createStock(em: EntityManager, studio: Studio, input: StockInput): Promise<StockDto> {
  const dye = await dyeOfStudio(em, studio, input.dyeId);
  const s = em.create(StockSolutionSchema, {
    studio,
    dye,
    concentrationPct: input.concentrationPct,
    definition: input.definition,
    volumeMl: input.volumeMl,
    mixedOn: input.mixedOn,
    powderLot: input.powderLot ?? "",
    notes: input.notes ?? "",
  });
  await em.flush();
  return stockDto(s, studio.stockShelfLifeDays);
}

export async function updateStock(em: EntityManager, studio: Studio, id: string, patch: StockPatch): Promise<StockDto> {
  const s = await findStock(em, studio, id);
  checkVersion(s, patch.version, "stock solution");
  const { version: _v, dyeId, ...changes } = patch;
  if (dyeId !== undefined && dyeId !== s.dye.id) s.dye = ref(await dyeOfStudio(em, studio, dyeId));
  em.assign(s, changes);
  await em.flush();
  return stockDto(s, studio.stockShelfLifeDays);
}

export async function archiveStock(em: EntityManager, studio: Studio, id: string): Promise<void> {
  const s = await findStock(em, studio, id);
  if (s.archived) return;
  s.archived = true;
  await em.flush();
}
