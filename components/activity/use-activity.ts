"use client";

import { useInfiniteQuery, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";

// The studio's activity feed and the caller's notifications, through the API.

// The feed entry as the API sends it (a type only: nothing of the server module reaches the browser).
import type { ActivityDto } from "@/lib/activity";
export type { ActivityDto };

export interface NotificationDto {
  id: string;
  kind: string;
  summary: string;
  actor: { id: string; name: string } | null;
  trialId: string | null;
  commentId: string | null;
  colourwayId: string | null;
  createdAt: string;
  readAt: string | null;
}

interface Page<T> {
  items: T[];
  nextCursor: string | null;
}

export interface ActivityFilters {
  kind?: string;
  actorId?: string;
}

export const activityKeys = {
  feed: (studioId: string, f: ActivityFilters) => ["studios", studioId, "activity", f] as const,
  notifications: (studioId: string) => ["studios", studioId, "notifications"] as const,
  list: (studioId: string) => ["studios", studioId, "notifications", "list"] as const,
  count: (studioId: string) => ["studios", studioId, "notifications", "count"] as const,
};

const qs = (o: Record<string, string | undefined>) => {
  const p = new URLSearchParams(Object.entries(o).filter((e): e is [string, string] => Boolean(e[1])));
  const s = p.toString();
  return s ? `?${s}` : "";
};

export function useActivity(studioId: string, f: ActivityFilters) {
  return useInfiniteQuery({
    queryKey: activityKeys.feed(studioId, f),
    queryFn: ({ pageParam }) =>
      api<Page<ActivityDto>>(`/api/studios/${studioId}/activity${qs({ kind: f.kind, actorId: f.actorId, cursor: pageParam ?? undefined, limit: "25" })}`),
    initialPageParam: null as string | null,
    getNextPageParam: (last) => last.nextCursor,
    refetchInterval: 60_000,
  });
}

export function useNotifications(studioId: string) {
  return useInfiniteQuery({
    queryKey: activityKeys.list(studioId),
    queryFn: ({ pageParam }) =>
      api<Page<NotificationDto> & { unread: number }>(`/api/studios/${studioId}/notifications${qs({ cursor: pageParam ?? undefined, limit: "10" })}`),
    initialPageParam: null as string | null,
    getNextPageParam: (last) => last.nextCursor,
    refetchInterval: 60_000,
  });
}

export function useUnreadCount(studioId: string | null) {
  return useQuery({
    queryKey: activityKeys.count(studioId ?? "none"),
    queryFn: () => api<{ unread: number }>(`/api/studios/${studioId}/notifications/count`),
    enabled: Boolean(studioId),
    refetchInterval: 60_000,
  });
}

export function useMarkRead(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (ids?: string[]) => api<{ unread: number }>(`/api/studios/${studioId}/notifications/read`, { method: "POST", body: ids ? { ids } : {} }),
    onSuccess: ({ unread }) => qc.setQueryData(activityKeys.count(studioId), { unread }),
    onSettled: () => qc.invalidateQueries({ queryKey: activityKeys.notifications(studioId) }),
  });
}

/**
 * Where an event or notification leads: a colourway's page for colourway and lot events, the
 * photo for photos and readings, the members for someone joining; otherwise the trial, at the
 * comment or layer when there is one.
 */
export function hrefFor(
  studioId: string,
  x: { kind?: string; trialId: string | null; commentId: string | null; layerId?: string | null; colourwayId?: string | null; subjectId?: string | null },
): string | null {
  const s = `/s/${studioId}`;
  if (x.colourwayId) return `${s}/colourways/${x.colourwayId}`;
  if (x.kind === "member.joined") return `${s}/members`;
  if (!x.trialId) return null;
  const trial = `${s}/trials/${x.trialId}`;
  if ((x.kind === "photo.added" || x.kind === "reading.added") && x.subjectId) return `${trial}/photos/${x.subjectId}`;
  if (x.commentId) return `${trial}#comment-${x.commentId}`;
  return x.layerId ? `${trial}#layer-${x.layerId}` : trial;
}
