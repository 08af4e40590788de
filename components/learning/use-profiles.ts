"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { ProfileDto, RefitResult } from "@/lib/learning/profiles";

export type { ProfileDto, RefitResult };

export const profileKeys = { list: (studioId: string) => ["studios", studioId, "profiles"] as const };

/** The studio's dye profiles, every fibre class. */
export function useProfiles(studioId: string) {
  return useQuery({ queryKey: profileKeys.list(studioId), queryFn: () => api<ProfileDto[]>(`/api/studios/${studioId}/profiles`) });
}

/** Fits every profile again from the studio's dyeings. */
export function useRefitProfiles(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<RefitResult[]>(`/api/studios/${studioId}/profiles/refit`, { method: "POST" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: profileKeys.list(studioId) }),
  });
}
