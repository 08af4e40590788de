import "server-only";
import { randomUUID } from "node:crypto";
import { LockMode } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { LayerSchema, PhotoSchema, TrialSchema, type Photo, type Studio } from "@/entities";
import { layerWords, quoted, recordActivity } from "@/lib/activity";
import { badRequest, HttpError, notFound } from "@/lib/errors";
import { enqueue } from "@/lib/jobs/boss";
import { checkBucket, deleteObject, getObject, headObject, presignPut, putObject } from "@/lib/storage";
import { MAX_PHOTO_BYTES, type UploadInput } from "@/lib/schemas/photo";
import type { SessionUser } from "@/lib/auth/session";
import { makeVariants } from "./process";

export interface PhotoDto {
  id: string;
  trialId: string;
  layerId: string | null;
  kind: Photo["kind"];
  status: Photo["status"];
  width: number | null;
  height: number | null;
  createdAt: string;
  urls: { thumb: string; web: string; master: string };
}

export function photoDto(p: Photo, studioId: string): PhotoDto {
  const base = `/api/studios/${studioId}/photos/${p.id}/file`;
  return {
    id: p.id,
    trialId: p.trial.id,
    layerId: p.layer?.id ?? null,
    kind: p.kind,
    status: p.status,
    width: p.width ?? null,
    height: p.height ?? null,
    createdAt: p.createdAt.toISOString(),
    urls: { thumb: `${base}?v=thumb`, web: `${base}?v=web`, master: `${base}?v=master` },
  };
}

/** The keys a photo's objects live under, whether or not they were written. */
function objectKeys(p: Photo): string[] {
  const prefix = `studios/${p.studio.id}/photos/${p.id}`;
  return [p.uploadKey, `${prefix}/master.jpg`, `${prefix}/web.webp`, `${prefix}/thumb.webp`];
}

/**
 * Deletes objects now; whatever the store cannot delete now (it is down) is left to the
 * "photo-objects-delete" job, which retries until it can.
 */
async function removeObjects(keys: string[]): Promise<void> {
  const left: string[] = [];
  await Promise.all(keys.map((k) => deleteObject(k).catch(() => left.push(k))));
  if (left.length) await enqueue(null, "photo-objects-delete", { keys: left }).catch((e) => console.error("photos: cannot queue clean-up of", left, e));
}

/** Records a pending photo and returns a short-lived URL the browser PUTs the file to. */
export async function startUpload(em: EntityManager, studio: Studio, user: SessionUser, input: UploadInput) {
  // Presigning is local, so ask the store first: no record for an upload that cannot arrive.
  await checkBucket();
  const trial = await em.findOne(TrialSchema, { id: input.trialId, studio });
  if (!trial) throw notFound("This trial");
  const layer = input.layerId ? await em.findOne(LayerSchema, { id: input.layerId, trial }) : null;
  if (input.layerId && !layer) throw notFound("This layer");
  const id = randomUUID();
  const photo = em.create(PhotoSchema, {
    id,
    studio,
    trial,
    layer,
    kind: input.kind,
    uploadedBy: user.id,
    status: "pending",
    uploadKey: `studios/${studio.id}/uploads/${id}`,
  });
  await em.flush();
  const uploadUrl = await presignPut(photo.uploadKey, input.contentType, 15 * 60);
  return { photo: photoDto(photo, studio.id), uploadUrl, contentType: input.contentType };
}

async function findPhoto(em: EntityManager, studio: Studio, photoId: string): Promise<Photo> {
  const p = await em.findOne(PhotoSchema, { id: photoId, studio });
  if (!p) throw notFound("This photo");
  return p;
}

/**
 * Checks what arrived in the bucket and writes the variants. Anything wrong, the store going
 * away included, removes the record and the objects (later, by a job, when the store is down),
 * so nothing half-written stays behind; the person uploads again.
 *
 * The photo's row is locked while this runs: a phone on poor Wi-Fi may send the confirm again
 * before the first answer arrives, and the second waits for the first, then finds the photo
 * ready and answers the same, instead of writing the variants and the feed's event twice.
 */
export async function confirmUpload(em: EntityManager, studio: Studio, user: SessionUser, photoId: string): Promise<PhotoDto> {
  let discard = false;
  let uploadKey: string | null = null;
  try {
    const dto = await em.transactional(async (tx) => {
      const photo = await tx.findOne(PhotoSchema, { id: photoId, studio }, { lockMode: LockMode.PESSIMISTIC_WRITE });
      if (!photo) throw notFound("This photo");
      if (photo.status === "ready") return photoDto(photo, studio.id);
      uploadKey = photo.uploadKey;
      return await confirmStored(tx, studio, user, photo, () => {
        discard = true;
      });
    });
    // Only once the photo is stored as ready: the upload may carry EXIF GPS; the cleaned variants are kept.
    if (uploadKey) await deleteObject(uploadKey).catch(() => undefined);
    return dto;
  } catch (e) {
    // The store went away mid-way: nothing can be checked; start over once it is back.
    if (discard || (e instanceof HttpError && e.status === 503)) await discardUpload(em, studio, photoId).catch(() => undefined);
    throw e;
  }
}

/** Removes an upload that failed its checks: the record (unless another confirm made it ready meanwhile) and its objects. */
async function discardUpload(em: EntityManager, studio: Studio, photoId: string): Promise<void> {
  const fresh = em.fork();
  const photo = await fresh.findOne(PhotoSchema, { id: photoId, studio });
  if (!photo || photo.status === "ready") return;
  await fresh.removeAndFlush(photo);
  await removeObjects(objectKeys(photo));
}

/** What the photo shows, for the feed: `a photo after layer 2`. */
function photoWords(p: Photo): string {
  const layer = p.layer?.getEntity();
  switch (p.kind) {
    case "base":
      return "a photo of the base yarn";
    case "after-layer":
      return layer ? `a photo after ${layerWords(layer.position, layer.method)}` : "a photo after a layer";
    case "final":
      return "a photo of the finished yarn";
    case "before-wash":
      return "a photo before washing";
    case "after-wash":
      return "a photo after washing";
  }
}

/** The checks and the variants, inside confirmUpload's transaction; `discard` asks for the upload to be removed once it has rolled back. */
async function confirmStored(em: EntityManager, studio: Studio, user: SessionUser, photo: Photo, discard: () => void): Promise<PhotoDto> {
  const head = await headObject(photo.uploadKey);
  if (!head) throw badRequest("The photo has not arrived yet. Upload it again.");
  if (head.size > MAX_PHOTO_BYTES) {
    discard();
    throw new HttpError(413, "Photos can be at most 25 MB. Take it again at a lower resolution or share a smaller copy.");
  }
  const bytes = await getObject(photo.uploadKey);
  if (!bytes) throw badRequest("The photo has not arrived yet. Upload it again.");
  let v;
  try {
    v = await makeVariants(bytes);
  } catch (e) {
    discard();
    throw e;
  }
  const prefix = `studios/${studio.id}/photos/${photo.id}`;
  const keys = { master: `${prefix}/master.jpg`, web: `${prefix}/web.webp`, thumb: `${prefix}/thumb.webp` };
  try {
    await putObject(keys.master, v.master, "image/jpeg");
    await putObject(keys.web, v.web, "image/webp");
    await putObject(keys.thumb, v.thumb, "image/webp");
    em.assign(photo, {
      status: "ready",
      masterKey: keys.master,
      webKey: keys.web,
      thumbKey: keys.thumb,
      width: v.width,
      height: v.height,
      bytes: head.size,
      originalType: v.originalType,
      confirmedAt: new Date(),
    });
    // Stored by the same flush as the photo turning ready: a failed confirm records nothing.
    await em.populate(photo, ["trial", "layer"]);
    await recordActivity(em, {
      studio,
      actor: user.id,
      kind: "photo.added",
      summary: `added ${photoWords(photo)} to ${quoted(photo.trial.getEntity().title)}`,
      trialId: photo.trial.id,
      layerId: photo.layer?.id ?? null,
      subjectId: photo.id,
    });
    await em.flush();
  } catch (e) {
    if (!(e instanceof HttpError && e.status === 503)) await Promise.all(Object.values(keys).map((k) => deleteObject(k).catch(() => undefined)));
    throw e;
  }
  return photoDto(photo, studio.id);
}

export async function listPhotos(em: EntityManager, studio: Studio, trialId: string): Promise<PhotoDto[]> {
  const list = await em.find(PhotoSchema, { studio, trial: trialId, status: "ready" }, { orderBy: { createdAt: "asc" } });
  return list.map((p) => photoDto(p, studio.id));
}

/** The bytes of one stored variant, for members of the photo's studio only. */
export async function photoFile(em: EntityManager, studio: Studio, photoId: string, variant: "thumb" | "web" | "master") {
  const photo = await findPhoto(em, studio, photoId);
  const key = { thumb: photo.thumbKey, web: photo.webKey, master: photo.masterKey }[variant];
  if (photo.status !== "ready" || !key) throw notFound("This photo");
  const body = await getObject(key);
  if (!body) throw notFound("This photo");
  return { body, contentType: variant === "master" ? "image/jpeg" : "image/webp" };
}

export async function deletePhoto(em: EntityManager, studio: Studio, photoId: string): Promise<void> {
  const photo = await findPhoto(em, studio, photoId);
  await em.removeAndFlush(photo);
  await removeObjects(objectKeys(photo));
}

/** Removes uploads that were never confirmed, older than `maxAgeMs` (default a day), with any objects they left. */
export async function sweepPendingUploads(em: EntityManager, maxAgeMs = 86_400_000): Promise<number> {
  const stale = await em.find(PhotoSchema, { status: "pending", createdAt: { $lt: new Date(Date.now() - maxAgeMs) } });
  if (!stale.length) return 0;
  await em.remove(stale).flush();
  await removeObjects(stale.flatMap(objectKeys));
  return stale.length;
}
