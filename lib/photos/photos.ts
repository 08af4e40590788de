import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { LayerSchema, PhotoSchema, TrialSchema, type Photo, type Studio } from "@/entities";
import { badRequest, HttpError, notFound } from "@/lib/errors";
import { deleteObject, getObject, headObject, presignPut, putObject } from "@/lib/storage";
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

/** Records a pending photo and returns a short-lived URL the browser PUTs the file to. */
export async function startUpload(em: EntityManager, studio: Studio, user: SessionUser, input: UploadInput) {
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
 * Checks what arrived in the bucket and writes the variants. Anything wrong removes the upload
 * and the record, so nothing half-written stays behind.
 */
export async function confirmUpload(em: EntityManager, studio: Studio, photoId: string): Promise<PhotoDto> {
  const photo = await findPhoto(em, studio, photoId);
  if (photo.status === "ready") return photoDto(photo, studio.id);
  const discard = async () => {
    await deleteObject(photo.uploadKey).catch(() => undefined);
    await em.removeAndFlush(photo);
  };
  const head = await headObject(photo.uploadKey);
  if (!head) throw badRequest("The photo has not arrived yet. Upload it again.");
  if (head.size > MAX_PHOTO_BYTES) {
    await discard();
    throw new HttpError(413, "Photos can be at most 25 MB. Take it again at a lower resolution or share a smaller copy.");
  }
  const bytes = await getObject(photo.uploadKey);
  if (!bytes) throw badRequest("The photo has not arrived yet. Upload it again.");
  let v;
  try {
    v = await makeVariants(bytes);
  } catch (e) {
    await discard();
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
    await em.flush();
  } catch (e) {
    await Promise.all(Object.values(keys).map((k) => deleteObject(k).catch(() => undefined)));
    throw e;
  }
  // The upload may carry EXIF GPS; only the cleaned variants are kept.
  await deleteObject(photo.uploadKey).catch(() => undefined);
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
  const keys = [photo.uploadKey, photo.masterKey, photo.webKey, photo.thumbKey].filter(Boolean) as string[];
  await em.removeAndFlush(photo);
  await Promise.all(keys.map((k) => deleteObject(k).catch(() => undefined)));
}

/** Removes uploads that were never confirmed, older than `maxAgeMs` (default a day). */
export async function sweepPendingUploads(em: EntityManager, maxAgeMs = 86_400_000): Promise<number> {
  const stale = await em.find(PhotoSchema, { status: "pending", createdAt: { $lt: new Date(Date.now() - maxAgeMs) } });
  for (const p of stale) await deleteObject(p.uploadKey).catch(() => undefined);
  if (stale.length) await em.remove(stale).flush();
  return stale.length;
}
