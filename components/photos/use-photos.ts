"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, ApiError } from "@/components/api";
import type { Lab } from "@/colour/types";

export type PhotoKind = "base" | "after-layer" | "final" | "before-wash" | "after-wash";

export interface PhotoDto {
  id: string;
  trialId: string;
  layerId: string | null;
  kind: PhotoKind;
  status: "pending" | "ready";
  width: number | null;
  height: number | null;
  createdAt: string;
  urls: { thumb: string; web: string; master: string };
}

export interface ReadingDto {
  id: string;
  photoId: string;
  trialId: string;
  layerId: string | null;
  photoKind: PhotoKind;
  label: string;
  lab: Lab;
  hex: string;
  inGamut: boolean;
  palette: { lab: Lab; hex: string; share: number }[];
  calibration: { model: string; looMeanDe00: number; looMaxDe00: number; quality: "good" | "usable" | "retake"; reasons: string[] } | null;
  cardId: string | null;
  cardVersion: number | null;
  modelVersion: number;
  /** The card changed since; the server is measuring this reading again. */
  remeasuring: boolean;
  createdAt: string;
}

export interface CardDto {
  id: string;
  name: string;
  rows: number;
  cols: number;
  patches: { name: string; L: number; a: number; b: number }[];
  measured: boolean;
  notes: string;
  version: number;
  updatedAt: string;
}

export const photoKeys = {
  trial: (studioId: string, trialId: string) => ["studios", studioId, "trials", trialId, "photos"] as const,
  cards: (studioId: string) => ["studios", studioId, "cards"] as const,
};

export function useTrialPhotos(studioId: string, trialId: string) {
  return useQuery({
    queryKey: photoKeys.trial(studioId, trialId),
    queryFn: () => api<{ photos: PhotoDto[]; readings: ReadingDto[] }>(`/api/studios/${studioId}/trials/${trialId}/photos`),
    // Readings being measured again after a card change come back within seconds; look again until they have.
    refetchInterval: (q) => (q.state.data?.readings.some((r) => r.remeasuring) ? 3000 : false),
  });
}

export function useCards(studioId: string) {
  return useQuery({ queryKey: photoKeys.cards(studioId), queryFn: () => api<CardDto[]>(`/api/studios/${studioId}/cards`) });
}

export function useSaveCard(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (card: Omit<CardDto, "id" | "updatedAt" | "version"> & { id?: string; version?: number }) =>
      card.id
        ? api<CardDto & { recomputing: number }>(`/api/studios/${studioId}/cards/${card.id}`, { method: "PUT", body: card })
        : api<CardDto & { recomputing?: number }>(`/api/studios/${studioId}/cards`, { method: "POST", body: card }),
    // Readings of every trial may be measured again: refresh them all.
    onSuccess: () => qc.invalidateQueries({ queryKey: ["studios", studioId] }),
  });
}

export function useCreateReadings(studioId: string, trialId: string, photoId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { cardId: string | null; corners: { x: number; y: number }[] | null; regions: { label: string; rect: { x: number; y: number; width: number; height: number } }[] }) =>
      api<ReadingDto[]>(`/api/studios/${studioId}/photos/${photoId}/readings`, { method: "POST", body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: photoKeys.trial(studioId, trialId) }),
  });
}

export function useDeletePhoto(studioId: string, trialId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (photoId: string) => api<void>(`/api/studios/${studioId}/photos/${photoId}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: photoKeys.trial(studioId, trialId) }),
  });
}

/** PUTs a file to a presigned URL, reporting progress (fetch cannot report upload progress). */
function putWithProgress(url: string, file: File, contentType: string, onProgress: (share: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    xhr.setRequestHeader("content-type", contentType);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => (xhr.status < 300 ? resolve() : reject(new ApiError(xhr.status, "The photo store refused the upload. Try again.")));
    xhr.onerror = () => reject(new ApiError(0, "The upload stopped (no connection?). Try again."));
    xhr.send(file);
  });
}

/** Browsers report HEIC files with an empty type on some systems; judge by the name then. */
export function contentTypeOf(file: File): string {
  if (file.type) return file.type;
  return /\.hei[cf]$/i.test(file.name) ? "image/heic" : "application/octet-stream";
}

/** The three steps of an upload: ask for a URL, send the bytes to the bucket, let the server check them. */
export async function uploadPhoto(
  studioId: string,
  input: { trialId: string; layerId: string | null; kind: PhotoKind; file: File },
  onProgress: (share: number) => void,
): Promise<PhotoDto> {
  const contentType = contentTypeOf(input.file);
  const start = await api<{ photo: PhotoDto; uploadUrl: string }>(`/api/studios/${studioId}/photos`, {
    method: "POST",
    body: { trialId: input.trialId, layerId: input.layerId, kind: input.kind, contentType, bytes: input.file.size },
  });
  await putWithProgress(start.uploadUrl, input.file, contentType, onProgress);
  return api<PhotoDto>(`/api/studios/${studioId}/photos/${start.photo.id}/confirm`, { method: "POST" });
}
