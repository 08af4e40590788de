import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { liquorRatio } from "@/colour/arithmetic";
import { type Dye, DyeSchema, type StockSolution, StockSolutionSchema, type YarnBase } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import type { Layer, LayerDye, Trial } from "@/entities/trial";
import { rowsById } from "@/lib/rows";
import { amountsFor } from "./amounts";
import type { CautionKey, LayerDto, LayerDyeDto, TrialDto } from "./types";
import { trialWarnings } from "./warnings";

// Entities → the plain JSON the API returns. Dyes and stocks live in jsonb on the layer, so the
// names, colours and strengths are looked up in the studio's library when the DTO is built.

export interface Library {
  dyes: Map<string, Dye>;
  stocks: Map<string, StockSolution>;
}

/** The studio's dyes and stocks named by these layer dyes (one plain query each, run together). */
export async function loadLibrary(em: EntityManager, studio: Studio | string, dyes: LayerDye[]): Promise<Library> {
  const studioId = typeof studio === "string" ? studio : studio.id;
  const [ds, ss] = await Promise.all([
    rowsById(em, DyeSchema, "dyes", dyes.map((d) => d.dyeId), studioId),
    rowsById(em, StockSolutionSchema, "stock_solutions", dyes.map((d) => d.stockId).filter((s): s is string => !!s), studioId),
  ]);
  return { dyes: new Map(ds.map((d) => [d.id, d])), stocks: new Map(ss.map((s) => [s.id, s])) };
}

export function isoDay(d: string | Date): string {
  return typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10);
}

function dyeDto(d: LayerDye, fibreG: number, lib: Library): LayerDyeDto {
  const dye = lib.dyes.get(d.dyeId);
  const stock = d.stockId ? (lib.stocks.get(d.stockId) ?? null) : null;
  const { grams, stockMl } = amountsFor(d.dosPct, fibreG, stock);
  return {
    dyeId: d.dyeId,
    stockId: d.stockId ?? null,
    dosPct: d.dosPct,
    entered: d.entered,
    dyeName: dye?.name ?? "Removed dye",
    dyeClass: dye?.dyeClass ?? null,
    dyeForm: dye?.form ?? null,
    displayHex: dye?.displayHex ?? null,
    sdsUrl: dye?.sdsUrl ?? null,
    stockPct: stock?.concentrationPct ?? null,
    stockDefinition: stock?.definition ?? null,
    stockMixedOn: stock ? isoDay(stock.mixedOn) : null,
    grams,
    stockMl,
  };
}

/** Where the usual safety cautions matter for this layer (DOMAIN.md, "Safety cautions to show"). */
export function layerCautions(layer: Layer, lib: Library): CautionKey[] {
  const out: CautionKey[] = [];
  const powder = layer.dyes.some((d) => !d.stockId && lib.dyes.get(d.dyeId)?.form !== "liquid");
  if (powder || layer.method === "speckle" || layer.method === "dry") out.push("powder");
  if (layer.acid.kind !== "none") out.push("acid");
  if (layer.setting.method === "steam") out.push("steam");
  if (layer.setting.method === "microwave") out.push("microwave");
  if (layer.dyes.length > 0) out.push("disposal");
  return out;
}

export function layerDto(layer: Layer, fibreG: number, lib: Library): LayerDto {
  return {
    id: layer.id,
    position: layer.position,
    version: layer.version,
    method: layer.method,
    dyes: layer.dyes.map((d) => dyeDto(d, fibreG, lib)),
    acid: { kind: layer.acid.kind, amount: layer.acid.amount ?? null, ph: layer.acid.ph ?? null },
    waterL: layer.waterL ?? null,
    liquorRatio: layer.waterL ? liquorRatio(layer.waterL, fibreG) : null,
    temperatureC: layer.temperatureC ?? null,
    minutes: layer.minutes ?? null,
    setting: { method: layer.setting.method, minutes: layer.setting.minutes ?? null },
    rinseNote: layer.rinseNote,
    bled: layer.bled ?? null,
    coverage: layer.coverage ?? null,
    gradient: layer.gradient ?? null,
    observations: layer.observations,
    cautions: layerCautions(layer, lib),
  };
}

export interface TrialParts {
  trial: Trial;
  layers: Layer[];
  base: YarnBase | null;
  authorName: string;
  lib: Library;
  shelfLifeDays: number;
  /** The fibre weight of the trial this one was copied from, when it still exists. */
  sourceFibreG: number | null;
}

export function trialDto(p: TrialParts): TrialDto {
  const { trial, layers, base, lib } = p;
  const sorted = [...layers].sort((a, b) => a.position - b.position);
  return {
    id: trial.id,
    title: trial.title,
    status: trial.status,
    tags: trial.tags,
    fibreWeightG: trial.fibreWeightG,
    notes: trial.notes ?? null,
    createdAt: trial.createdAt.toISOString(),
    updatedAt: trial.updatedAt.toISOString(),
    version: trial.version,
    copiedFromId: trial.copiedFrom?.id ?? null,
    author: { id: trial.author.id, name: p.authorName },
    base: base
      ? { id: base.id, name: base.name, fibres: base.fibres, superwash: base.superwash, weightClass: base.weightClass }
      : null,
    layers: sorted.map((l) => layerDto(l, trial.fibreWeightG, lib)),
    warnings: trialWarnings({ ...p, layers: sorted }),
  };
}
