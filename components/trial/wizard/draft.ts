import { dyeGrams, liquorRatio, stockMl } from "@/colour/arithmetic";
import type { DyeDto } from "@/components/library/use-dyes";
import type { StockDto } from "@/components/library/use-stocks";
import type { AmountUnit, LayerInput, LayerMethod } from "@/lib/schemas/trial";
import type { LayerDto, LayerDyeDto } from "@/lib/trials/types";
import { type TempUnit, dosOf, fromCelsius, toCelsius } from "../units";
import { draftCautions } from "../warnings";

// A layer while it is being written: text fields as typed (so "1 1/2" survives until it is read),
// with the defaults a dyer would otherwise type again, and the conversions to what the API takes
// and to how the layer will look on the trial page while it waits to be sent.

export interface DraftDye {
  key: string;
  dyeId: string;
  stockId: string | null;
  value: number;
  unit: AmountUnit;
}

export interface Draft {
  method: LayerMethod | null;
  dyes: DraftDye[];
  acidKind: "vinegar" | "citric" | "none";
  acidAmount: string;
  ph: string;
  waterL: string;
  temperature: string;
  minutes: string;
  setting: "simmer" | "steam" | "microwave" | "none";
  settingMinutes: string;
  coverage: number | null;
  gradient: { sections: number; depths: number[] } | null;
  rinseNote: string;
  bled: boolean | null;
  observations: string;
}

const BATH: readonly LayerMethod[] = ["immersion", "kettle", "dip"];
const family = (m: LayerMethod) => (BATH.includes(m) ? "bath" : m === "other" ? "other" : "surface");

/**
 * Starting values per method [common practice, DOMAIN.md "Methods"]: immersion at 1:30 and 90 °C
 * for 30 min; kettle with little water; a dip in four sections; painted, speckled and dry-applied
 * yarn steamed for 20–30 min, with a rough coverage.
 */
const METHOD_DEFAULTS: Record<LayerMethod, { ratio: number | null; tempC: number | null; minutes: number | null; setting: Draft["setting"]; settingMin: number | null; coverage: number | null }> = {
  immersion: { ratio: 30, tempC: 90, minutes: 30, setting: "none", settingMin: null, coverage: null },
  kettle: { ratio: 10, tempC: 90, minutes: 30, setting: "none", settingMin: null, coverage: null },
  dip: { ratio: 30, tempC: 85, minutes: 30, setting: "none", settingMin: null, coverage: null },
  "hand-paint": { ratio: null, tempC: null, minutes: null, setting: "steam", settingMin: 30, coverage: 1 },
  speckle: { ratio: null, tempC: null, minutes: null, setting: "steam", settingMin: 20, coverage: 0.15 },
  dry: { ratio: null, tempC: null, minutes: null, setting: "steam", settingMin: 20, coverage: 0.4 },
  other: { ratio: null, tempC: null, minutes: null, setting: "none", settingMin: null, coverage: null },
};
/** A first dip: deepest where it went in first [our own starting shape]. */
export const DEFAULT_GRADIENT = { sections: 4, depths: [1, 0.65, 0.35, 0.1] };

const str = (n: number | null | undefined) => (n === null || n === undefined ? "" : String(Math.round(n * 100) / 100));
export const numberOf = (s: string): number | null => {
  const t = s.trim().replace(",", ".");
  if (!t) return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : NaN;
};

export function emptyDraft(): Draft {
  return {
    method: null, dyes: [], acidKind: "vinegar", acidAmount: "", ph: "", waterL: "", temperature: "", minutes: "",
    setting: "none", settingMinutes: "", coverage: null, gradient: null, rinseNote: "", bled: null, observations: "",
  };
}

/**
 * Fills heat, water, acid and setting for a method: from the previous layer when it was the same
 * kind of work (a bath after a bath), else the method's usual values. The acid always follows the
 * previous layer: it is the studio's habit, not the method's.
 */
export function withMethod(d: Draft, method: LayerMethod, fibreG: number, previous: LayerDto | null, tempUnit: TempUnit, suggestedVinegarMl: number): Draft {
  const m = METHOD_DEFAULTS[method];
  const same = previous && family(previous.method) === family(method);
  const next: Draft = { ...d, method };
  next.acidKind = previous?.acid.kind ?? "vinegar";
  next.acidAmount = previous ? str(previous.acid.amount) : str(Math.round(suggestedVinegarMl));
  const ratio = same && previous?.liquorRatio ? previous.liquorRatio : m.ratio;
  next.waterL = ratio ? str((fibreG / 1000) * ratio) : "";
  const tempC = same ? (previous?.temperatureC ?? null) : m.tempC;
  next.temperature = tempC === null ? "" : str(fromCelsius(tempC, tempUnit));
  next.minutes = str(same ? previous?.minutes : m.minutes);
  next.setting = same && previous ? previous.setting.method : m.setting;
  next.settingMinutes = str(same && previous ? previous.setting.minutes : m.settingMin);
  next.coverage = m.coverage;
  next.gradient = method === "dip" ? (d.gradient ?? DEFAULT_GRADIENT) : null;
  return next;
}

export function draftFromLayer(l: LayerDto, tempUnit: TempUnit): Draft {
  return {
    method: l.method,
    dyes: l.dyes.map((x, i) => ({ key: `d${i}`, dyeId: x.dyeId, stockId: x.stockId, value: x.entered.value, unit: x.entered.unit })),
    acidKind: l.acid.kind,
    acidAmount: str(l.acid.amount),
    ph: str(l.acid.ph),
    waterL: str(l.waterL),
    temperature: l.temperatureC === null ? "" : str(fromCelsius(l.temperatureC, tempUnit)),
    minutes: str(l.minutes),
    setting: l.setting.method,
    settingMinutes: str(l.setting.minutes),
    coverage: l.coverage,
    gradient: l.gradient,
    rinseNote: l.rinseNote,
    bled: l.bled,
    observations: l.observations,
  };
}

const orNull = (s: string) => numberOf(s);

/** The draft as the API's layer input (temperatures in °C). Invalid numbers stay NaN for zod to name. */
export function toInput(d: Draft, tempUnit: TempUnit): LayerInput {
  const t = orNull(d.temperature);
  return {
    method: d.method ?? "other",
    dyes: d.dyes.map((x) => ({ dyeId: x.dyeId, stockId: x.stockId, amount: { value: x.value, unit: x.unit } })),
    acid: { kind: d.acidKind, amount: d.acidKind === "none" ? null : orNull(d.acidAmount), ph: orNull(d.ph) },
    waterL: orNull(d.waterL),
    temperatureC: t === null || Number.isNaN(t) ? t : toCelsius(t, tempUnit),
    minutes: orNull(d.minutes),
    setting: { method: d.setting, minutes: d.setting === "none" ? null : orNull(d.settingMinutes) },
    rinseNote: d.rinseNote,
    bled: d.bled,
    coverage: d.coverage,
    gradient: d.method === "dip" ? d.gradient : null,
    observations: d.observations,
  };
}

/** Only the parts of `next` that differ from `prev` (for an edit: the waiting list stays short). */
export function changedFields(prev: LayerInput, next: LayerInput): Partial<LayerInput> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(next)) {
    if (JSON.stringify(v) !== JSON.stringify((prev as Record<string, unknown>)[k])) out[k] = v;
  }
  return out as Partial<LayerInput>;
}

/** How a dye line will read on the trial page, worked out here until the server answers. */
export function previewDye(x: DraftDye, fibreG: number, dyes: DyeDto[], stocks: StockDto[]): LayerDyeDto {
  const dye = dyes.find((d) => d.id === x.dyeId);
  const stock = x.stockId ? stocks.find((s) => s.id === x.stockId) : undefined;
  const ref = stock ? { pct: stock.concentrationPct, definition: stock.definition } : null;
  const dosPct = dosOf(x.value, x.unit, fibreG, ref) ?? 0;
  return {
    dyeId: x.dyeId,
    stockId: x.stockId,
    dosPct,
    entered: { value: x.value, unit: x.unit },
    dyeName: dye?.name ?? "Dye",
    dyeClass: dye?.dyeClass ?? null,
    dyeForm: dye?.form ?? null,
    displayHex: dye?.displayHex ?? null,
    sdsUrl: dye?.sdsUrl ?? null,
    stockPct: stock?.concentrationPct ?? null,
    stockDefinition: stock?.definition ?? null,
    stockMixedOn: stock?.mixedOn ?? null,
    grams: fibreG > 0 ? dyeGrams(fibreG, dosPct) : 0,
    stockMl: ref && fibreG > 0 ? stockMl(fibreG, dosPct, ref.pct, ref.definition) : null,
  };
}

/** The whole layer as it will look while waiting to be sent. */
export function previewLayer(id: string, position: number, version: number, input: LayerInput, d: Draft, fibreG: number, dyes: DyeDto[], stocks: StockDto[]): LayerDto {
  const lineDyes = d.dyes.map((x) => previewDye(x, fibreG, dyes, stocks));
  const waterL = input.waterL ?? null;
  return {
    id,
    position,
    version,
    method: input.method,
    dyes: lineDyes,
    acid: { kind: input.acid?.kind ?? "vinegar", amount: input.acid?.amount ?? null, ph: input.acid?.ph ?? null },
    waterL,
    liquorRatio: waterL && fibreG > 0 ? liquorRatio(waterL, fibreG) : null,
    temperatureC: input.temperatureC ?? null,
    minutes: input.minutes ?? null,
    setting: { method: input.setting?.method ?? "none", minutes: input.setting?.minutes ?? null },
    rinseNote: input.rinseNote ?? "",
    bled: input.bled ?? null,
    coverage: input.coverage ?? null,
    gradient: input.gradient ?? null,
    observations: input.observations ?? "",
    cautions: draftCautions({
      method: input.method,
      powder: lineDyes.some((x) => !x.stockId && x.dyeForm !== "liquid"),
      acid: input.acid?.kind ?? "vinegar",
      setting: input.setting?.method ?? "none",
      hasDyes: lineDyes.length > 0,
    }),
  };
}
