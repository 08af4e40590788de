"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { DyeDto } from "@/lib/library/dyes";
import type { DyeInput, DyePatch } from "@/lib/schemas/library";
import { libraryKeys } from "./use-library-keys";

// The studio's dyes: the whole (small) list, filtered and sorted in the browser.
export type { DyeDto };

export function useDyes(studioId: string, opts: { archived?: boolean } = {}) {
  const archived = opts.archived ?? false;
  return useQuery({
    queryKey: libraryKeys.dyes(studioId, archived),
    queryFn: () => api<DyeDto[]>(`/api/studios/${studioId}/dyes${archived ? "?archived=true" : ""}`),
  });
}

export function useCreateDye(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: DyeInput) => api<DyeDto>(`/api/studios/${studioId}/dyes`, { method: "POST", body: input }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Saves changes with the version the form was opened at; a stale version comes back as a 409 message. */
export function useUpdateDye(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: DyePatch }) =>
      api<DyeDto>(`/api/studios/${studioId}/dyes/${id}`, { method: "PATCH", body: patch }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Archives (owner only): hidden from lists and pickers, kept for the trials that used it. */
export function useArchiveDye(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>(`/api/studios/${studioId}/dyes/${id}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}
