"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { StockDto } from "@/lib/library/stocks";
import type { StockInput, StockPatch } from "@/lib/schemas/library";
import { libraryKeys } from "./use-library-keys";

// The studio's stock solutions: the whole (small) list, filtered and sorted in the browser.
export type { StockDto };

export function useStocks(studioId: string, opts: { archived?: boolean } = {}) {
  const archived = opts.archived ?? false;
  return useQuery({
    queryKey: libraryKeys.stocks(studioId, archived),
    queryFn: () => api<StockDto[]>(`/api/studios/${studioId}/stocks${archived ? "?archived=true" : ""}`),
  });
}

export function useCreateStock(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: StockInput) => api<StockDto>(`/api/studios/${studioId}/stocks`, { method: "POST", body: input }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Saves changes with the version the form was opened at; a stale version comes back as a 409 message. */
export function useUpdateStock(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: StockPatch }) =>
      api<StockDto>(`/api/studios/${studioId}/stocks/${id}`, { method: "PATCH", body: patch }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}

/** Archives (owner only): hidden from lists and pickers, kept for the trials that used it. */
export function useArchiveStock(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>(`/api/studios/${studioId}/stocks/${id}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.all(studioId) }),
  });
}
