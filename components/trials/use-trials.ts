"use client";

import { type QueryClient, keepPreviousData, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { CopyInput, LayerInput, LayerPatch, TrialInput, TrialPatch } from "@/lib/schemas/trial";
import type { TrialDto, TrialFacets, TrialPage } from "@/lib/trials/types";

// Trials from the client: the list (with its search and filters as URL parameters), one trial, and
// every write. Each write has a stable mutation key and self-contained variables (studio and trial
// ids included), so offline support can register defaults by key and replay a persisted write.

/** The list's parameters as they appear in the URL (all strings; empty ones are left out). */
export type TrialListParams = Partial<Record<"q" | "baseId" | "dyeId" | "method" | "tag" | "authorId" | "status" | "from" | "to" | "sort" | "dir" | "page" | "pageSize", string>>;

export const trialKeys = {
  all: (studioId: string) => ["studios", studioId, "trials"] as const,
  list: (studioId: string, params: TrialListParams) => ["studios", studioId, "trials", "list", params] as const,
  facets: (studioId: string) => ["studios", studioId, "trials", "facets"] as const,
  /** The same key as components/offline/trial-writes.ts uses for one trial. */
  detail: (studioId: string, trialId: string) => ["studios", studioId, "trials", trialId] as const,
};

export const trialMutationKeys = {
  create: ["trial", "create"],
  update: ["trial", "update"],
  remove: ["trial", "delete"],
  copy: ["trial", "copy"],
  addLayer: ["trial", "layer-add"],
  updateLayer: ["trial", "layer-update"],
  deleteLayer: ["trial", "layer-delete"],
  duplicateLayer: ["trial", "layer-duplicate"],
  reorderLayers: ["trial", "layer-order"],
} as const;

export function searchString(params: TrialListParams): string {
  const sp = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v) sp.set(k, v);
  return sp.toString();
}

const base = (studioId: string) => `/api/studios/${studioId}/trials`;

export function useTrials(studioId: string, params: TrialListParams) {
  return useQuery({
    queryKey: trialKeys.list(studioId, params),
    queryFn: () => api<TrialPage>(`${base(studioId)}?${searchString(params)}`),
    placeholderData: keepPreviousData,
  });
}

export function useTrialFacets(studioId: string) {
  return useQuery({ queryKey: trialKeys.facets(studioId), queryFn: () => api<TrialFacets>(`${base(studioId)}/facets`), staleTime: 60_000 });
}

export function useTrial(studioId: string, trialId: string) {
  return useQuery({ queryKey: trialKeys.detail(studioId, trialId), queryFn: () => api<TrialDto>(`${base(studioId)}/${trialId}`) });
}

/** The CSV download address for the list's current filters (page and size left out). */
export function exportHref(studioId: string, params: TrialListParams): string {
  const { page: _p, pageSize: _s, ...filters } = params;
  const qs = searchString(filters);
  return `${base(studioId)}/export${qs ? `?${qs}` : ""}`;
}

// ---- writes: variables carry everything needed to send them again after a reload ----

export interface TrialRef {
  studioId: string;
  trialId: string;
}
export type CreateTrialVars = { studioId: string; input: TrialInput };
export type UpdateTrialVars = TrialRef & { patch: TrialPatch };
export type CopyTrialVars = TrialRef & { input: CopyInput };
export type AddLayerVars = TrialRef & { input: LayerInput };
export type UpdateLayerVars = TrialRef & { layerId: string; patch: LayerPatch };
export type LayerRefVars = TrialRef & { layerId: string };
export type ReorderLayersVars = TrialRef & { layerIds: string[] };

/** The functions behind each mutation key (for setMutationDefaults when replaying offline writes). */
export const trialMutationFns = {
  create: (v: CreateTrialVars) => api<TrialDto>(base(v.studioId), { method: "POST", body: v.input }),
  update: (v: UpdateTrialVars) => api<TrialDto>(`${base(v.studioId)}/${v.trialId}`, { method: "PATCH", body: v.patch }),
  remove: (v: TrialRef) => api<void>(`${base(v.studioId)}/${v.trialId}`, { method: "DELETE" }),
  copy: (v: CopyTrialVars) => api<TrialDto>(`${base(v.studioId)}/${v.trialId}/copy`, { method: "POST", body: v.input }),
  addLayer: (v: AddLayerVars) => api<TrialDto>(`${base(v.studioId)}/${v.trialId}/layers`, { method: "POST", body: v.input }),
  updateLayer: (v: UpdateLayerVars) =>
    api<TrialDto>(`${base(v.studioId)}/${v.trialId}/layers/${v.layerId}`, { method: "PATCH", body: v.patch }),
  deleteLayer: (v: LayerRefVars) => api<TrialDto>(`${base(v.studioId)}/${v.trialId}/layers/${v.layerId}`, { method: "DELETE" }),
  duplicateLayer: (v: LayerRefVars) =>
    api<TrialDto>(`${base(v.studioId)}/${v.trialId}/layers/${v.layerId}/duplicate`, { method: "POST" }),
  reorderLayers: (v: ReorderLayersVars) =>
    api<TrialDto>(`${base(v.studioId)}/${v.trialId}/layer-order`, { method: "PUT", body: { layerIds: v.layerIds } }),
};

/** After a write: the answer becomes the cached trial; the lists and filter choices are refetched. */
function settle(qc: QueryClient, studioId: string, trial: TrialDto) {
  qc.setQueryData(trialKeys.detail(studioId, trial.id), trial);
  void qc.invalidateQueries({ queryKey: ["studios", studioId, "trials", "list"] });
  void qc.invalidateQueries({ queryKey: trialKeys.facets(studioId) });
}

function useTrialMutation<V extends { studioId: string; trialId?: string }>(key: readonly string[], fn: (v: V) => Promise<TrialDto>) {
  const qc = useQueryClient();
  return useMutation<TrialDto, Error, V>({
    mutationKey: key,
    mutationFn: fn,
    onSuccess: (t, v) => settle(qc, v.studioId, t),
    // A refusal (409 after someone else's save, 422) reloads the trial so the page shows what is saved.
    onError: (_e, v) => {
      if (v.trialId) void qc.invalidateQueries({ queryKey: trialKeys.detail(v.studioId, v.trialId) });
    },
  });
}

export const useCreateTrial = () => useTrialMutation<CreateTrialVars>(trialMutationKeys.create, trialMutationFns.create);
export const useUpdateTrial = () => useTrialMutation<UpdateTrialVars>(trialMutationKeys.update, trialMutationFns.update);
export const useCopyTrial = () => useTrialMutation<CopyTrialVars>(trialMutationKeys.copy, trialMutationFns.copy);
export const useAddLayer = () => useTrialMutation<AddLayerVars>(trialMutationKeys.addLayer, trialMutationFns.addLayer);
export const useUpdateLayer = () => useTrialMutation<UpdateLayerVars>(trialMutationKeys.updateLayer, trialMutationFns.updateLayer);
export const useDeleteLayer = () => useTrialMutation<LayerRefVars>(trialMutationKeys.deleteLayer, trialMutationFns.deleteLayer);
export const useDuplicateLayer = () => useTrialMutation<LayerRefVars>(trialMutationKeys.duplicateLayer, trialMutationFns.duplicateLayer);
export const useReorderLayers = () => useTrialMutation<ReorderLayersVars>(trialMutationKeys.reorderLayers, trialMutationFns.reorderLayers);

export function useDeleteTrial() {
  const qc = useQueryClient();
  return useMutation<void, Error, TrialRef>({
    mutationKey: trialMutationKeys.remove,
    mutationFn: trialMutationFns.remove,
    onSuccess: (_r, v) => {
      qc.removeQueries({ queryKey: trialKeys.detail(v.studioId, v.trialId), exact: true });
      void qc.invalidateQueries({ queryKey: ["studios", v.studioId, "trials", "list"] });
    },
  });
}
