import { EntitySchema, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { Dye } from "./library";
import type { Reading } from "./photo";
import type { Studio } from "./studio";
import type { Layer, Trial } from "./trial";
import type { User } from "./user";

// The learning loop: dye profiles fitted from the studio's own dyeings, what was predicted for a
// layer, colourways with their targets and recipes, and the dye lots judged against them.

export interface DyeProfileRecord extends Base {
  studio: Ref<Studio>;
  dye: Ref<Dye>;
  /** Fibre class the dyeings were made on (see lib/profiles: e.g. "wool", "wool-nylon", "silk"). */
  fibreClass: string;
  /** colour/spectral DyeProfileJson: unit K/S per 1 % DOS, 36 bands. */
  profile: Record<string, unknown>;
  nDyeings: number;
  meanDe00: number;
  maxDe00: number;
  /** Increases with every refit, so a prediction can say which profile version it used. */
  modelVersion: number & Opt;
  fittedAt: Date;
}

export const DyeProfileSchema = new EntitySchema<DyeProfileRecord>({
  name: "DyeProfileRecord",
  tableName: "dye_profiles",
  uniques: [{ properties: ["studio", "dye", "fibreClass"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    dye: { kind: "m:1", entity: "Dye", ref: true, deleteRule: "cascade" },
    fibreClass: { type: "string", length: 24 },
    profile: { type: "json" },
    nDyeings: { type: "integer" },
    meanDe00: { type: "double" },
    maxDe00: { type: "double" },
    modelVersion: { type: "integer", default: 1 },
    fittedAt: { type: "datetime" },
  },
});

/** What the model predicted for a layer when it was planned, kept to compare with the reading. */
export interface LayerPrediction extends Base {
  studio: Ref<Studio>;
  layer: Ref<Layer>;
  /** Profile versions used, by dye id. */
  profileVersions: Record<string, number>;
  L: number;
  a: number;
  b: number;
  palette: { L: number; a: number; b: number; share: number }[];
  gradient?: { L: number; a: number; b: number }[] | null;
  /** What the prediction started from: "reading:<id>" or "prediction:<layer id>". */
  basedOn: string;
  createdBy: Ref<User>;
}

export const LayerPredictionSchema = new EntitySchema<LayerPrediction>({
  name: "LayerPrediction",
  tableName: "layer_predictions",
  indexes: [{ properties: ["layer", "createdAt"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    layer: { kind: "m:1", entity: "Layer", ref: true, deleteRule: "cascade" },
    profileVersions: { type: "json" },
    L: { type: "double", fieldName: "l" },
    a: { type: "double", fieldName: "a" },
    b: { type: "double", fieldName: "b" },
    palette: { type: "json" },
    gradient: { type: "json", nullable: true },
    basedOn: { type: "string", length: 80 },
    createdBy: { kind: "m:1", entity: "User", ref: true },
  },
});

export const COLOURWAY_STATUSES = ["candidate", "repeatable", "retired"] as const;
export type ColourwayStatus = (typeof COLOURWAY_STATUSES)[number];

export interface Colourway extends Base {
  studio: Ref<Studio>;
  name: string;
  description: string & Opt;
  status: ColourwayStatus & Opt;
  targetL: number;
  targetA: number;
  targetB: number;
  targetPalette: { L: number; a: number; b: number; share: number }[] & Opt;
  sourceTrial: Ref<Trial>;
  sourceReading?: Ref<Reading> | null;
  /** Snapshot of the source trial's recipe: fibre weight and layers, as the trial DTO had them. */
  recipe: Record<string, unknown>;
  proposedBy: Ref<User>;
  approvedBy?: Ref<User> | null;
  approvedAt?: Date | null;
  updatedAt: Date & Opt;
  version: number & Opt;
}

export const ColourwaySchema = new EntitySchema<Colourway>({
  name: "Colourway",
  tableName: "colourways",
  indexes: [{ properties: ["studio", "status"] }, { properties: ["studio", "targetL", "targetA", "targetB"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    name: { type: "string", length: 120 },
    description: { type: "text", default: "" },
    status: { type: "string", length: 12, default: "candidate" },
    targetL: { type: "double", fieldName: "target_l" },
    targetA: { type: "double", fieldName: "target_a" },
    targetB: { type: "double", fieldName: "target_b" },
    targetPalette: { type: "json", default: "[]" },
    sourceTrial: { kind: "m:1", entity: "Trial", ref: true },
    sourceReading: { kind: "m:1", entity: "Reading", ref: true, nullable: true, deleteRule: "set null" },
    recipe: { type: "json" },
    proposedBy: { kind: "m:1", entity: "User", ref: true },
    approvedBy: { kind: "m:1", entity: "User", ref: true, nullable: true },
    approvedAt: { type: "datetime", nullable: true },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
    version: { type: "integer", version: true },
  },
});

export interface DyeLot extends Base {
  studio: Ref<Studio>;
  colourway: Ref<Colourway>;
  trial: Ref<Trial>;
  code: string;
  skeins: number;
  fibreWeightG: number;
  reading?: Ref<Reading> | null;
  /** The lot's measured colour (copied from its reading) and its judgement against the target. */
  L?: number | null;
  a?: number | null;
  b?: number | null;
  de00?: number | null;
  cmc21?: number | null;
  pass?: boolean | null;
  misses: string[] & Opt;
  tolerance: number;
  notes: string & Opt;
  createdBy: Ref<User>;
}

export const DyeLotSchema = new EntitySchema<DyeLot>({
  name: "DyeLot",
  tableName: "dye_lots",
  indexes: [{ properties: ["colourway"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    colourway: { kind: "m:1", entity: "Colourway", ref: true, deleteRule: "cascade" },
    trial: { kind: "m:1", entity: "Trial", ref: true },
    code: { type: "string", length: 40 },
    skeins: { type: "integer" },
    fibreWeightG: { type: "double" },
    reading: { kind: "m:1", entity: "Reading", ref: true, nullable: true, deleteRule: "set null" },
    L: { type: "double", fieldName: "l", nullable: true },
    a: { type: "double", fieldName: "a", nullable: true },
    b: { type: "double", fieldName: "b", nullable: true },
    de00: { type: "double", nullable: true },
    cmc21: { type: "double", nullable: true },
    pass: { type: "boolean", nullable: true },
    misses: { type: "json", default: "[]" },
    tolerance: { type: "double" },
    notes: { type: "text", default: "" },
    createdBy: { kind: "m:1", entity: "User", ref: true },
  },
});
