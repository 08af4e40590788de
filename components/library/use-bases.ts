"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { BaseDto } from "@/lib/library/bases";
import type { BaseInput, BasePatch } from "@/lib/schemas/library";
import { libraryKeys } from "./use-library-keys";

// The studio's bases: the whole (small) list, filtered and sorted in the browser.
export type { BaseDto };

export function useBases(studioId: string, opts: { archived?: boolean } = {}) {
  const archived = opts.archived ?? false;
  return useQuery({
    queryKey: libraryKeys.bases(studioId, archived),
    queryFn: () => api<BaseDto[]>(`/api/studios/${studioId}/bases${archived ? "?archived=true" : ""}`),
  });
}

export function useCreateBase(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: BaseInput) => api<BaseDto>(`/api/studios/${studioId}/bases`, { method: "POST", body: input }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Saves changes with the version the form was opened at; a stale version comes back as a 409 message. */
export function useUpdateBase(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: BasePatch }) =>
      api<BaseDto>(`/api/studios/${studioId}/bases/${id}`, { method: "PATCH", body: patch }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Archives (owner only): hidden from lists and pickers, kept for the trials that used it. */
export function useArchiveBase(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>(`/api/studios/${studioId}/bases/${id}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}
