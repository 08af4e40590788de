"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { StudioDto } from "@/lib/studios";
import { libraryKeys } from "./use-library-keys";

// The studio's stock-solution shelf life (days), read by everyone and changed by the owner.

export function useStudioSettings(studioId: string) {
  return useQuery({ queryKey: libraryKeys.studio(studioId), queryFn: () => api<StudioDto>(`/api/studios/${studioId}`) });
}

export function useSetShelfLife(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (days: number) => api<StudioDto>(`/api/studios/${studioId}`, { method: "PATCH", body: { stockShelfLifeDays: days } }),
    onSuccess: (s) => qc.setQueryData(libraryKeys.studio(studioId), s),
    // Every stock's age warning depends on it.
    onSettled: () => qc.invalidateQueries({ queryKey: libraryKeys.stocks(studioId).slice(0, 4) }),
  });
}
