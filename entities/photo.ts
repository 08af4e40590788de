import { EntitySchema, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { Studio } from "./studio";
import type { Layer, Trial } from "./trial";
import type { User } from "./user";

// Swatch photos, the studio's reference cards, and readings (calibrated colours measured on a photo).

export const PHOTO_KINDS = ["base", "after-layer", "final", "before-wash", "after-wash"] as const;
export type PhotoKind = (typeof PHOTO_KINDS)[number];

export interface Photo extends Base {
  studio: Ref<Studio>;
  trial: Ref<Trial>;
  /** The layer the photo documents (kind "after-layer"). */
  layer?: Ref<Layer> | null;
  kind: PhotoKind;
  uploadedBy: Ref<User>;
  /** "pending" until the server has checked the upload and written its variants. */
  status: "pending" | "ready";
  /** Object key the browser uploads to; removed after confirmation. */
  uploadKey: string;
  /** Oriented, metadata-free full-size JPEG that readings are taken from. */
  masterKey?: string | null;
  webKey?: string | null;
  thumbKey?: string | null;
  width?: number | null;
  height?: number | null;
  bytes?: number | null;
  originalType?: string | null;
  confirmedAt?: Date | null;
}

export const PhotoSchema = new EntitySchema<Photo>({
  name: "Photo",
  tableName: "photos",
  indexes: [{ properties: ["trial"] }, { properties: ["status", "createdAt"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    trial: { kind: "m:1", entity: "Trial", ref: true, deleteRule: "cascade" },
    layer: { kind: "m:1", entity: "Layer", ref: true, nullable: true, deleteRule: "set null" },
    kind: { type: "string", length: 12 },
    uploadedBy: { kind: "m:1", entity: "User", ref: true },
    status: { type: "string", length: 8 },
    uploadKey: { type: "string", length: 200 },
    masterKey: { type: "string", length: 200, nullable: true },
    webKey: { type: "string", length: 200, nullable: true },
    thumbKey: { type: "string", length: 200, nullable: true },
    width: { type: "integer", nullable: true },
    height: { type: "integer", nullable: true },
    bytes: { type: "integer", nullable: true },
    originalType: { type: "string", length: 40, nullable: true },
    confirmedAt: { type: "datetime", nullable: true },
  },
});

export interface CardPatchValue {
  name: string;
  L: number;
  a: number;
  b: number;
}

export interface ReferenceCard extends Base {
  studio: Ref<Studio>;
  name: string;
  rows: number;
  cols: number;
  /** Row by row from the top-left; rows × cols entries of known CIELAB D65. */
  patches: CardPatchValue[];
  /** Whether the values were measured on the printed card (else nominal: readings are indicative). */
  measured: boolean & Opt;
  notes: string & Opt;
  updatedAt: Date & Opt;
  version: number & Opt;
}

export const ReferenceCardSchema = new EntitySchema<ReferenceCard>({
  name: "ReferenceCard",
  tableName: "reference_cards",
  indexes: [{ properties: ["studio"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    name: { type: "string", length: 120 },
    rows: { type: "integer" },
    cols: { type: "integer" },
    patches: { type: "json" },
    measured: { type: "boolean", default: false },
    notes: { type: "text", default: "" },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
    version: { type: "integer", version: true },
  },
});

export interface ReadingCalibration {
  model: string;
  looMeanDe00: number;
  looMaxDe00: number;
  quality: "good" | "usable" | "retake";
  reasons: string[];
}

export interface Reading extends Base {
  studio: Ref<Studio>;
  trial: Ref<Trial>;
  layer?: Ref<Layer> | null;
  photo: Ref<Photo>;
  card?: Ref<ReferenceCard> | null;
  /** The card's version whose values calibrated this reading (readings are recomputed when it changes). */
  cardVersion?: number | null;
  /** Version of the reading method in colour/ that produced the numbers. */
  modelVersion: number;
  label: string & Opt;
  /** Card corners and swatch region in the master image's pixels. */
  corners?: { x: number; y: number }[] | null;
  region: { x: number; y: number; width: number; height: number };
  L: number;
  a: number;
  b: number;
  palette: { L: number; a: number; b: number; share: number }[];
  calibration?: ReadingCalibration | null;
  createdBy: Ref<User>;
  updatedAt: Date & Opt;
}

export const ReadingSchema = new EntitySchema<Reading>({
  name: "Reading",
  tableName: "readings",
  indexes: [{ properties: ["trial"] }, { properties: ["photo"] }, { properties: ["studio", "L", "a", "b"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    trial: { kind: "m:1", entity: "Trial", ref: true, deleteRule: "cascade" },
    layer: { kind: "m:1", entity: "Layer", ref: true, nullable: true, deleteRule: "set null" },
    photo: { kind: "m:1", entity: "Photo", ref: true, deleteRule: "cascade" },
    card: { kind: "m:1", entity: "ReferenceCard", ref: true, nullable: true, deleteRule: "set null" },
    cardVersion: { type: "integer", nullable: true },
    modelVersion: { type: "integer" },
    label: { type: "string", length: 80, default: "" },
    corners: { type: "json", nullable: true },
    region: { type: "json" },
    L: { type: "double", fieldName: "l" },
    a: { type: "double", fieldName: "a" },
    b: { type: "double", fieldName: "b" },
    palette: { type: "json" },
    calibration: { type: "json", nullable: true },
    createdBy: { kind: "m:1", entity: "User", ref: true },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
  },
});

export type { User };
