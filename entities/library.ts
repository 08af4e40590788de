import { EntitySchema, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { Studio } from "./studio";

// The studio's libraries: yarn bases, dyes and stock solutions.

export const FIBRES = [
  "wool", "superwash wool", "merino", "nylon", "silk", "mohair", "alpaca", "cashmere", "yak",
  "cotton", "linen", "viscose", "bamboo", "acrylic", "polyester", "other",
] as const;
export type Fibre = (typeof FIBRES)[number];
export interface FibrePart {
  fibre: Fibre;
  pct: number;
}

export const WEIGHT_CLASSES = ["lace", "fingering", "sport", "dk", "worsted", "aran", "bulky", "other"] as const;
export type WeightClass = (typeof WEIGHT_CLASSES)[number];

export interface YarnBase extends Base {
  studio: Ref<Studio>;
  name: string;
  fibres: FibrePart[];
  superwash: boolean & Opt;
  weightClass: WeightClass;
  metresPer100g?: number | null;
  notes: string & Opt;
  archived: boolean & Opt;
  version: number & Opt;
}

export const YarnBaseSchema = new EntitySchema<YarnBase>({
  name: "YarnBase",
  tableName: "yarn_bases",
  indexes: [{ properties: ["studio"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    name: { type: "string", length: 120 },
    fibres: { type: "json" },
    superwash: { type: "boolean", default: false },
    weightClass: { type: "string", length: 16 },
    metresPer100g: { type: "double", nullable: true },
    notes: { type: "text", default: "" },
    archived: { type: "boolean", default: false },
    version: { type: "integer", version: true },
  },
});

export const DYE_CLASSES = ["acid", "food", "reactive", "other"] as const;
export type DyeClass = (typeof DYE_CLASSES)[number];

export interface Dye extends Base {
  studio: Ref<Studio>;
  name: string;
  dyeClass: DyeClass;
  form: "powder" | "liquid";
  colourIndexName?: string | null;
  sdsUrl?: string | null;
  /** A swatch colour for lists, sRGB hex, from the maker's card or the studio's own reading. */
  displayHex?: string | null;
  notes: string & Opt;
  archived: boolean & Opt;
  version: number & Opt;
}

export const DyeSchema = new EntitySchema<Dye>({
  name: "Dye",
  tableName: "dyes",
  indexes: [{ properties: ["studio"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    name: { type: "string", length: 120 },
    dyeClass: { type: "string", length: 16 },
    form: { type: "string", length: 8 },
    colourIndexName: { type: "string", length: 60, nullable: true },
    sdsUrl: { type: "string", length: 500, nullable: true },
    displayHex: { type: "string", length: 7, nullable: true },
    notes: { type: "text", default: "" },
    archived: { type: "boolean", default: false },
    version: { type: "integer", version: true },
  },
});

export interface StockSolution extends Base {
  studio: Ref<Studio>;
  dye: Ref<Dye>;
  /** Grams of dye per 100 ml (to volume) or per 100 g of water (in water). */
  concentrationPct: number;
  definition: "to-volume" | "in-water";
  volumeMl: number;
  /** YYYY-MM-DD. */
  mixedOn: string;
  powderLot: string & Opt;
  notes: string & Opt;
  archived: boolean & Opt;
  version: number & Opt;
}

export const StockSolutionSchema = new EntitySchema<StockSolution>({
  name: "StockSolution",
  tableName: "stock_solutions",
  indexes: [{ properties: ["studio"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    dye: { kind: "m:1", entity: "Dye", ref: true, deleteRule: "cascade" },
    concentrationPct: { type: "double" },
    definition: { type: "string", length: 10 },
    volumeMl: { type: "double" },
    mixedOn: { type: "date" },
    powderLot: { type: "string", length: 60, default: "" },
    notes: { type: "text", default: "" },
    archived: { type: "boolean", default: false },
    version: { type: "integer", version: true },
  },
});
