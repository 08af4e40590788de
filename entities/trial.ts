import { EntitySchema, type Collection, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { Dye, StockSolution, YarnBase } from "./library";
import type { Studio } from "./studio";
import type { User } from "./user";

// One experiment (a trial) and its ordered dye applications (layers), plus step timers.

export const TRIAL_STATUSES = ["planned", "in-progress", "done"] as const;
export type TrialStatus = (typeof TRIAL_STATUSES)[number];

export interface Trial extends Base {
  studio: Ref<Studio>;
  author: Ref<User>;
  title: string;
  base?: Ref<YarnBase> | null;
  /** Weighed dry fibre weight in grams. */
  fibreWeightG: number;
  status: TrialStatus & Opt;
  tags: string[] & Opt;
  /** Rich notes as the editor's JSON document; `notesText` is its plain text for search. */
  notes?: Record<string, unknown> | null;
  notesText: string & Opt;
  /** The trial this one was copied from ("same recipe, new base"). */
  copiedFrom?: Ref<Trial> | null;
  layers: Collection<Layer>;
  updatedAt: Date & Opt;
  version: number & Opt;
}

export const TrialSchema = new EntitySchema<Trial>({
  name: "Trial",
  tableName: "trials",
  // One index per sort order of the trial list (studio, sort key, id as the tie-break), so a page is
  // read in order from the index instead of sorting every trial of the studio.
  indexes: [
    { properties: ["studio", "createdAt", "id"] },
    { properties: ["studio", "updatedAt", "id"] },
    {
      name: "trials_studio_id_lower_title_id_index",
      expression: 'create index "trials_studio_id_lower_title_id_index" on "trials" ("studio_id", lower("title"), "id")',
    },
  ],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    author: { kind: "m:1", entity: "User", ref: true },
    title: { type: "string", length: 160 },
    base: { kind: "m:1", entity: "YarnBase", ref: true, nullable: true, deleteRule: "set null" },
    fibreWeightG: { type: "double" },
    status: { type: "string", length: 12, default: "planned" },
    tags: { type: "json", default: "[]" },
    notes: { type: "json", nullable: true },
    notesText: { type: "text", default: "" },
    copiedFrom: { kind: "m:1", entity: "Trial", ref: true, nullable: true, deleteRule: "set null" },
    layers: { kind: "1:m", entity: "Layer", mappedBy: "trial", orderBy: { position: "asc" } },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
    version: { type: "integer", version: true },
  },
});

export const LAYER_METHODS = ["immersion", "kettle", "dip", "hand-paint", "speckle", "dry", "other"] as const;
export type LayerMethod = (typeof LAYER_METHODS)[number];

/** One dye in a layer. `dosPct` is canonical; `entered` keeps what the dyer typed. */
export interface LayerDye {
  dyeId: string;
  stockId?: string | null;
  dosPct: number;
  entered: { value: number; unit: "dos" | "ml" | "g" | "tsp" | "tbsp" | "cup" | "floz" };
}

export interface LayerAcid {
  kind: "vinegar" | "citric" | "none";
  /** ml of white vinegar or g of citric acid. */
  amount?: number | null;
  ph?: number | null;
}

export interface LayerSetting {
  method: "simmer" | "steam" | "microwave" | "none";
  minutes?: number | null;
}

export interface LayerGradient {
  sections: number;
  /** Relative depth per section, 0–1, first section dipped first. */
  depths: number[];
}

export interface Layer extends Base {
  trial: Ref<Trial>;
  position: number;
  method: LayerMethod;
  dyes: LayerDye[] & Opt;
  acid: LayerAcid & Opt;
  waterL?: number | null;
  temperatureC?: number | null;
  minutes?: number | null;
  setting: LayerSetting & Opt;
  rinseNote: string & Opt;
  bled?: boolean | null;
  /** Estimated share of fibre the dye touched, 0–1, for partial methods. */
  coverage?: number | null;
  gradient?: LayerGradient | null;
  observations: string & Opt;
  updatedAt: Date & Opt;
  version: number & Opt;
}

export const LayerSchema = new EntitySchema<Layer>({
  name: "Layer",
  tableName: "layers",
  indexes: [{ properties: ["trial", "position"] }],
  properties: {
    ...baseProperties,
    trial: { kind: "m:1", entity: "Trial", ref: true, deleteRule: "cascade" },
    position: { type: "integer" },
    method: { type: "string", length: 12 },
    dyes: { type: "json", default: "[]" },
    acid: { type: "json", default: '{"kind":"vinegar"}' },
    waterL: { type: "double", nullable: true },
    temperatureC: { type: "double", nullable: true },
    minutes: { type: "double", nullable: true },
    setting: { type: "json", default: '{"method":"none"}' },
    rinseNote: { type: "text", default: "" },
    bled: { type: "boolean", nullable: true },
    coverage: { type: "double", nullable: true },
    gradient: { type: "json", nullable: true },
    observations: { type: "text", default: "" },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
    version: { type: "integer", version: true },
  },
});

export const TIMER_STATES = ["running", "paused", "done", "cancelled"] as const;
export type TimerState = (typeof TIMER_STATES)[number];

/**
 * A step timer (a 20-minute steam, a 5-minute rest). Kept on the server with its start time so it
 * survives reloads, locked screens and other devices: remaining = duration − elapsed − (now − runningSince).
 */
export interface StepTimer extends Base {
  studio: Ref<Studio>;
  trial: Ref<Trial>;
  layer?: Ref<Layer> | null;
  startedBy: Ref<User>;
  label: string;
  durationSec: number;
  /** Seconds counted before the current run (sum of earlier runs before pauses). */
  elapsedSec: number & Opt;
  runningSince?: Date | null;
  state: TimerState;
  finishedAt?: Date | null;
  version: number & Opt;
}

export const StepTimerSchema = new EntitySchema<StepTimer>({
  name: "StepTimer",
  tableName: "step_timers",
  indexes: [{ properties: ["studio", "state"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    trial: { kind: "m:1", entity: "Trial", ref: true, deleteRule: "cascade" },
    layer: { kind: "m:1", entity: "Layer", ref: true, nullable: true, deleteRule: "cascade" },
    startedBy: { kind: "m:1", entity: "User", ref: true },
    label: { type: "string", length: 80 },
    durationSec: { type: "integer" },
    elapsedSec: { type: "double", default: 0 },
    runningSince: { type: "datetime", nullable: true },
    state: { type: "string", length: 10 },
    finishedAt: { type: "datetime", nullable: true },
    version: { type: "integer", version: true },
  },
});

export type { Dye, StockSolution, YarnBase };
