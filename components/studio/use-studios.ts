"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";

export interface StudioDto {
  id: string;
  name: string;
  role: "owner" | "dyer" | "guest";
  lotTolerance: number;
  lotsForRepeatable: number;
  stockShelfLifeDays: number;
}

export const studioKeys = {
  all: ["studios"] as const,
  one: (id: string) => ["studios", id] as const,
};

export function useStudios() {
  return useQuery({ queryKey: studioKeys.all, queryFn: () => api<StudioDto[]>("/api/studios") });
}

export function useCreateStudio() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string }) => api<StudioDto>("/api/studios", { method: "POST", body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: studioKeys.all }),
  });
}

export function useStudioDetails(id: string) {
  return useQuery({ queryKey: studioKeys.one(id), queryFn: () => api<StudioDto>(`/api/studios/${id}`) });
}

export function useUpdateStudio(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<Omit<StudioDto, "id" | "role">>) =>
      api<StudioDto>(`/api/studios/${id}`, { method: "PATCH", body: input }),
    onSuccess: (s) => {
      qc.setQueryData(studioKeys.one(id), s);
      void qc.invalidateQueries({ queryKey: studioKeys.all });
    },
  });
}
