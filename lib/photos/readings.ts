import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { labToSrgb, type Lab, type RawImage } from "@/colour";
import {
  PhotoSchema,
  ReadingSchema,
  ReferenceCardSchema,
  type Photo,
  type Reading,
  type ReferenceCard,
  type Studio,
} from "@/entities";
import { countWords, layerWords, quoted, recordActivity } from "@/lib/activity";
import { badRequest, notFound } from "@/lib/errors";
import { getObject } from "@/lib/storage";
import type { ReadingInput } from "@/lib/schemas/photo";
import type { SessionUser } from "@/lib/auth/session";
import { calibrate, calibrationSummary, decodeRaw, measure } from "./measure";

/** Bumped whenever the reading method in colour/ changes what it reports. */
export const READING_MODEL_VERSION = 1;

export interface ReadingDto {
  id: string;
  photoId: string;
  trialId: string;
  layerId: string | null;
  photoKind: Photo["kind"];
  label: string;
  lab: Lab;
  hex: string;
  inGamut: boolean;
  palette: { lab: Lab; hex: string; share: number }[];
  calibration: Reading["calibration"];
  cardId: string | null;
  cardVersion: number | null;
  modelVersion: number;
  region: Reading["region"];
  /** The card's values changed since this reading; a job is measuring it again. */
  remeasuring: boolean;
  createdAt: string;
}

const hexOf = (lab: Lab) => {
  const { rgb, inGamut } = labToSrgb(lab);
  return { hex: "#" + rgb.map((c) => Math.round(c).toString(16).padStart(2, "0")).join(""), inGamut };
};

export function readingDto(r: Reading, photoKind: Photo["kind"]): ReadingDto {
  const lab = { L: r.L, a: r.a, b: r.b };
  const { hex, inGamut } = hexOf(lab);
  return {
    id: r.id,
    photoId: r.photo.id,
    trialId: r.trial.id,
    layerId: r.layer?.id ?? null,
    photoKind,
    label: r.label,
    lab,
    hex,
    inGamut,
    palette: r.palette.map((p) => ({ lab: { L: p.L, a: p.a, b: p.b }, hex: hexOf(p).hex, share: p.share })),
    calibration: r.calibration ?? null,
    cardId: r.card?.id ?? null,
    cardVersion: r.cardVersion ?? null,
    modelVersion: r.modelVersion,
    region: r.region,
    remeasuring: Boolean(r.card?.isInitialized() && r.cardVersion !== r.card.getEntity().version),
    createdAt: r.createdAt.toISOString(),
  };
}

async function loadMaster(photo: Photo): Promise<RawImage> {
  if (photo.status !== "ready" || !photo.masterKey) throw badRequest("This photo is still being processed. Try again in a moment.");
  const bytes = await getObject(photo.masterKey);
  if (!bytes) throw notFound("This photo");
  return decodeRaw(bytes);
}

/** Reads one or more swatch areas of a photo, calibrated by the studio card marked in it. */
export async function createReadings(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  photoId: string,
  input: ReadingInput,
): Promise<ReadingDto[]> {
  const photo = await em.findOne(PhotoSchema, { id: photoId, studio });
  if (!photo) throw notFound("This photo");
  const card = input.cardId ? await em.findOne(ReferenceCardSchema, { id: input.cardId, studio }) : null;
  if (input.cardId && !card) throw notFound("This reference card");
  if (card && !input.corners) throw badRequest("Mark the four corners of the card's patch area.", { corners: "Mark all four corners." });
  const image = await loadMaster(photo);
  const calibration = card && input.corners ? calibrate(image, card, input.corners) : null;
  const readings = input.regions.map(({ label, rect }) => {
    const s = measure(image, rect, calibration);
    return em.create(ReadingSchema, {
      studio,
      trial: photo.trial,
      layer: photo.layer ?? null,
      photo,
      card,
      cardVersion: card?.version ?? null,
      modelVersion: READING_MODEL_VERSION,
      label,
      corners: input.corners ?? null,
      region: rect,
      L: s.lab.L,
      a: s.lab.a,
      b: s.lab.b,
      palette: s.palette.map((p) => ({ ...p.lab, share: p.share })),
      calibration: calibrationSummary(calibration),
      createdBy: user.id,
    });
  });
  // One event for the whole request, however many areas were read.
  await em.populate(photo, ["trial", "layer"]);
  const layer = photo.kind === "after-layer" ? photo.layer?.getEntity() : undefined;
  const from = layer ? `the photo after ${layerWords(layer.position, layer.method)} of` : "a photo of";
  await recordActivity(em, {
    studio,
    actor: user.id,
    kind: "reading.added",
    summary: `read ${countWords(readings.length, "colour", "colours")} from ${from} ${quoted(photo.trial.getEntity().title)}`,
    trialId: photo.trial.id,
    layerId: photo.layer?.id ?? null,
    subjectId: photo.id,
  });
  await em.flush();
  return readings.map((r) => readingDto(r, photo.kind));
}

export async function listReadings(em: EntityManager, studio: Studio, trialId: string): Promise<ReadingDto[]> {
  const list = await em.find(ReadingSchema, { studio, trial: trialId }, { populate: ["photo", "card"], orderBy: { createdAt: "asc" } });
  return list.map((r) => readingDto(r, r.photo.getEntity().kind));
}

export async function deleteReading(em: EntityManager, studio: Studio, readingId: string): Promise<void> {
  const r = await em.findOne(ReadingSchema, { id: readingId, studio });
  if (!r) throw notFound("This reading");
  await em.removeAndFlush(r);
}

/** How many of the card's readings were calibrated with other values than its current ones. */
export function countStaleReadings(em: EntityManager, card: ReferenceCard): Promise<number> {
  return em.count(ReadingSchema, { card, cardVersion: { $ne: card.version } });
}

/**
 * Re-measures every reading calibrated by a card after its values changed (the
 * "card-readings-recompute" job). Returns how many.
 */
export async function recomputeCardReadings(em: EntityManager, card: ReferenceCard): Promise<number> {
  const list = await em.find(ReadingSchema, { card, cardVersion: { $ne: card.version } }, { populate: ["photo"] });
  const byPhoto = new Map<string, Reading[]>();
  for (const r of list) byPhoto.set(r.photo.id, [...(byPhoto.get(r.photo.id) ?? []), r]);
  for (const group of byPhoto.values()) {
    const image = await loadMaster(group[0].photo.getEntity());
    for (const r of group) {
      const calibration = r.corners ? calibrate(image, card, r.corners) : null;
      const s = measure(image, r.region, calibration);
      em.assign(r, {
        L: s.lab.L,
        a: s.lab.a,
        b: s.lab.b,
        palette: s.palette.map((p) => ({ ...p.lab, share: p.share })),
        calibration: calibrationSummary(calibration),
        cardVersion: card.version,
        modelVersion: READING_MODEL_VERSION,
      });
    }
  }
  await em.flush();
  return list.length;
}
