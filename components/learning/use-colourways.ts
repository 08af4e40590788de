"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { ColourwayDto, LotDto } from "@/lib/learning/colourways";
import type { LayerComparisonDto, LayerPredictionDto } from "@/lib/learning/predictions";
import type { RecipeCard } from "@/lib/learning/recipe";

export type { ColourwayDto, LotDto, LayerComparisonDto, LayerPredictionDto, RecipeCard };

export const colourwayKeys = {
  list: (s: string) => ["studios", s, "colourways"] as const,
  one: (s: string, id: string) => ["studios", s, "colourways", id] as const,
  recipe: (s: string, id: string, weight: number) => ["studios", s, "colourways", id, "recipe", weight] as const,
  comparison: (s: string, trialId: string) => ["studios", s, "trials", trialId, "comparison"] as const,
};

export function useColourways(studioId: string) {
  return useQuery({ queryKey: colourwayKeys.list(studioId), queryFn: () => api<ColourwayDto[]>(`/api/studios/${studioId}/colourways`) });
}

export function useColourway(studioId: string, id: string) {
  return useQuery({ queryKey: colourwayKeys.one(studioId, id), queryFn: () => api<ColourwayDto>(`/api/studios/${studioId}/colourways/${id}`) });
}

export function useRecipe(studioId: string, id: string, weight: number) {
  return useQuery({
    queryKey: colourwayKeys.recipe(studioId, id, weight),
    queryFn: () => api<RecipeCard>(`/api/studios/${studioId}/colourways/${id}/recipe?weight=${weight}`),
    enabled: weight > 0,
  });
}

export function useCreateColourway(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { trialId: string; readingId: string; name: string; description: string }) =>
      api<ColourwayDto>(`/api/studios/${studioId}/colourways`, { method: "POST", body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: colourwayKeys.list(studioId) }),
  });
}

/** Name, description or status; the server answers 403/409 with a plain message. */
export function usePatchColourway(studioId: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { version: number; name?: string; description?: string; status?: ColourwayDto["status"] }) =>
      api<ColourwayDto>(`/api/studios/${studioId}/colourways/${id}`, { method: "PATCH", body }),
    onSuccess: (c) => {
      qc.setQueryData(colourwayKeys.one(studioId, id), c);
      qc.invalidateQueries({ queryKey: colourwayKeys.list(studioId) });
    },
  });
}

export function useAddLot(studioId: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { trialId: string; code: string; skeins: number; fibreWeightG: number; readingId?: string | null }) =>
      api<ColourwayDto>(`/api/studios/${studioId}/colourways/${id}/lots`, { method: "POST", body }),
    onSuccess: (c) => {
      qc.setQueryData(colourwayKeys.one(studioId, id), c);
      qc.invalidateQueries({ queryKey: colourwayKeys.list(studioId) });
    },
  });
}

/** Per layer of a trial: the recorded prediction, the measured reading and the verdict. */
/**
 * Predicted against measured for a trial. `basis` names what the answer depends on (the layers with
 * their versions, the readings), so a saved layer or a new reading fetches it afresh.
 */
export function useComparison(studioId: string, trialId: string, basis = "") {
  return useQuery({
    queryKey: [...colourwayKeys.comparison(studioId, trialId), basis],
    placeholderData: (previous) => previous,
    queryFn: () => api<LayerComparisonDto[]>(`/api/studios/${studioId}/trials/${trialId}/comparison`),
  });
}

export function useRecordPrediction(studioId: string, trialId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (layerId: string) =>
      api<LayerPredictionDto>(`/api/studios/${studioId}/trials/${trialId}/layers/${layerId}/prediction`, { method: "POST" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: colourwayKeys.comparison(studioId, trialId) }),
  });
}
