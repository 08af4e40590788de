"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";

// Comment threads and following, through the API.

export interface CommentDto {
  id: string;
  trialId: string;
  layerId: string | null;
  layerNumber: number | null;
  photoId: string | null;
  author: { id: string; name: string };
  html: string;
  body: unknown;
  mentions: { id: string; name: string }[];
  createdAt: string;
  editedAt: string | null;
  deletedAt: string | null;
  version: number;
  canEdit: boolean;
  canDelete: boolean;
}

export type FollowTarget = "trial" | "colourway";

export interface FollowStatus {
  targetType: FollowTarget;
  targetId: string;
  following: boolean;
  followers: number;
}

export const commentKeys = {
  thread: (studioId: string, trialId: string, scope: { layerId?: string; photoId?: string } = {}) =>
    ["studios", studioId, "trials", trialId, "comments", scope.layerId ?? scope.photoId ?? "all"] as const,
  allThreads: (studioId: string, trialId: string) => ["studios", studioId, "trials", trialId, "comments"] as const,
  follow: (studioId: string, targetId: string, targetType: FollowTarget = "trial") =>
    ["studios", studioId, "follows", targetType, targetId] as const,
};

const base = (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}/comments`;

/** The thread of a trial, or of one of its layers or photos. */
export function useComments(studioId: string, trialId: string, scope: { layerId?: string; photoId?: string } = {}) {
  const q = scope.layerId ? `?layerId=${scope.layerId}` : scope.photoId ? `?photoId=${scope.photoId}` : "";
  return useQuery({
    queryKey: commentKeys.thread(studioId, trialId, scope),
    queryFn: () => api<CommentDto[]>(`${base(studioId, trialId)}${q}`),
    refetchInterval: 60_000,
  });
}

function useInvalidateThreads(studioId: string, trialId: string) {
  const qc = useQueryClient();
  return () => {
    qc.invalidateQueries({ queryKey: commentKeys.allThreads(studioId, trialId) });
    qc.invalidateQueries({ queryKey: ["studios", studioId, "activity"] });
    qc.invalidateQueries({ queryKey: commentKeys.follow(studioId, trialId) });
  };
}

export function useAddComment(studioId: string, trialId: string) {
  const invalidate = useInvalidateThreads(studioId, trialId);
  return useMutation({
    mutationFn: (input: { body: unknown; layerId?: string | null; photoId?: string | null }) =>
      api<CommentDto>(base(studioId, trialId), { method: "POST", body: input }),
    onSuccess: invalidate,
  });
}

export function useEditComment(studioId: string, trialId: string) {
  const invalidate = useInvalidateThreads(studioId, trialId);
  return useMutation({
    mutationFn: ({ id, body, version }: { id: string; body: unknown; version: number }) =>
      api<CommentDto>(`${base(studioId, trialId)}/${id}`, { method: "PATCH", body: { body, version } }),
    onSettled: invalidate,
  });
}

export function useDeleteComment(studioId: string, trialId: string) {
  const invalidate = useInvalidateThreads(studioId, trialId);
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) =>
      api<void>(`${base(studioId, trialId)}/${id}?version=${version}`, { method: "DELETE" }),
    onSettled: invalidate,
  });
}

export function useFollow(studioId: string, targetType: FollowTarget, targetId: string) {
  return useQuery({
    queryKey: commentKeys.follow(studioId, targetId, targetType),
    queryFn: () => api<FollowStatus>(`/api/studios/${studioId}/follows/${targetType}/${targetId}`),
  });
}

export function useSetFollow(studioId: string, targetType: FollowTarget, targetId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (follow: boolean) =>
      api<FollowStatus>(`/api/studios/${studioId}/follows/${targetType}/${targetId}`, { method: follow ? "PUT" : "DELETE" }),
    onSuccess: (status) => qc.setQueryData(commentKeys.follow(studioId, targetId, targetType), status),
  });
}
