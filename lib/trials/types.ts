// The trial API's JSON shapes (see the contract in the trials issue). Types only, so client hooks
// can import them without pulling in server code.
import type { AmountUnit, LayerMethod, TrialStatus } from "@/lib/schemas/trial";

export interface LayerDyeDto {
  dyeId: string;
  stockId: string | null;
  /** Depth of shade, % on the weight of fibre: the canonical amount. */
  dosPct: number;
  /** What the dyer typed. */
  entered: { value: number; unit: AmountUnit };
  dyeName: string;
  dyeClass: "acid" | "food" | "reactive" | "other" | null;
  dyeForm: "powder" | "liquid" | null;
  displayHex: string | null;
  sdsUrl: string | null;
  stockPct: number | null;
  stockDefinition: "to-volume" | "in-water" | null;
  stockMixedOn: string | null;
  /** Grams of dye for this trial's fibre weight. */
  grams: number;
  /** Millilitres of the chosen stock, or null for powder. */
  stockMl: number | null;
}

/** Safety cautions that apply to a layer; the page words them and links the dyes' safety sheets. */
export type CautionKey = "powder" | "acid" | "steam" | "microwave" | "disposal";

export interface LayerDto {
  id: string;
  position: number;
  version: number;
  method: LayerMethod;
  dyes: LayerDyeDto[];
  acid: { kind: "vinegar" | "citric" | "none"; amount: number | null; ph: number | null };
  waterL: number | null;
  /** N of the liquor ratio 1:N, from the water and the trial's fibre weight. */
  liquorRatio: number | null;
  temperatureC: number | null;
  minutes: number | null;
  setting: { method: "simmer" | "steam" | "microwave" | "none"; minutes: number | null };
  rinseNote: string;
  bled: boolean | null;
  coverage: number | null;
  gradient: { sections: number; depths: number[] } | null;
  observations: string;
  cautions: CautionKey[];
}

export type WarningKind = "fibre-dye" | "superwash-boil" | "stock-age" | "nonlinear" | "missing-dye";

/** Something in the recipe a dyer would want to know before dyeing; never blocks a save. */
export interface TrialWarning {
  /** Stable per context, for "dismiss once". */
  key: string;
  kind: WarningKind;
  layerId: string | null;
  message: string;
}

export interface TrialDto {
  id: string;
  title: string;
  status: TrialStatus;
  tags: string[];
  fibreWeightG: number;
  notes: Record<string, unknown> | null;
  createdAt: string;
  updatedAt: string;
  version: number;
  copiedFromId: string | null;
  author: { id: string; name: string };
  base: {
    id: string;
    name: string;
    fibres: { fibre: string; pct: number }[];
    superwash: boolean;
    weightClass: string;
  } | null;
  layers: LayerDto[];
  warnings: TrialWarning[];
}

export interface TrialSummaryDto {
  id: string;
  title: string;
  status: TrialStatus;
  tags: string[];
  fibreWeightG: number;
  createdAt: string;
  updatedAt: string;
  version: number;
  author: { id: string; name: string };
  base: { id: string; name: string } | null;
  layerCount: number;
  methods: LayerMethod[];
  /** Each dye used, once, in layer order. */
  dyes: { dyeId: string; name: string; displayHex: string | null }[];
}

export interface TrialPage {
  items: TrialSummaryDto[];
  total: number;
  page: number;
  pageSize: number;
}

/** What the list's filters can choose from. */
export interface TrialFacets {
  bases: { id: string; name: string }[];
  dyes: { id: string; name: string; displayHex: string | null }[];
  tags: string[];
  authors: { id: string; name: string }[];
}
