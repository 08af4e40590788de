"use client";

import { type QueryClient, useMutation } from "@tanstack/react-query";
import { ApiError, api } from "@/components/api";
import type { LayerInput, LayerPatch, TrialPatch } from "@/lib/schemas/trial";
import type { LayerDto, TrialDto } from "@/lib/trials/types";
import { localStore } from "./local-store";
import { recordUnsent } from "./unsent";

// Every edit of a trial that may be made at the dye table goes through here: each has a mutation
// key whose function is registered once with setMutationDefaults, so an edit queued offline is
// persisted with the cache and sent after a reload. Edits of one trial run one after another
// (a mutation scope per trial), in the order they were made.

export const trialKey = (studioId: string, trialId: string) => ["studios", studioId, "trials", trialId] as const;

export const writeKeys = {
  patchTrial: ["trial-write", "patchTrial"],
  addLayer: ["trial-write", "addLayer"],
  patchLayer: ["trial-write", "patchLayer"],
  deleteLayer: ["trial-write", "deleteLayer"],
  duplicateLayer: ["trial-write", "duplicateLayer"],
  reorderLayers: ["trial-write", "reorderLayers"],
} as const;
export type WriteKind = keyof typeof writeKeys;

interface Common {
  studioId: string;
  trialId: string;
  /** What the change is, in words, for the "waiting to send" list. */
  label: string;
}
export interface PatchTrialVars extends Common {
  baseVersion: number;
  patch: Omit<TrialPatch, "version">;
  /** Fields to show while waiting (e.g. the chosen base's name). */
  preview?: Partial<TrialDto>;
}
export interface AddLayerVars extends Common {
  input: LayerInput;
  /** The layer as it will look, under a temporary id. */
  preview: LayerDto;
}
export interface PatchLayerVars extends Common {
  layerId: string;
  baseVersion: number;
  patch: Omit<LayerPatch, "version">;
  preview?: Partial<LayerDto>;
}
export interface LayerVars extends Common {
  layerId: string;
  /** For a duplicate: the temporary id the copy shows under until it is saved. */
  tempId?: string;
}
export interface ReorderVars extends Common {
  layerIds: string[];
}
export type WriteVars = PatchTrialVars | AddLayerVars | PatchLayerVars | LayerVars | ReorderVars;

export const PENDING_PREFIX = "pending-";
export const isPendingId = (id: string) => id.startsWith(PENDING_PREFIX);
export const newPendingId = () => `${PENDING_PREFIX}${Math.random().toString(36).slice(2, 10)}`;

/**
 * Versions this device moved forward itself: entity id → version sent → version the server gave
 * back. An edit made before an earlier edit of ours was answered carries the old version; it is
 * sent with ours instead, and any other change in between still answers 409.
 */
const chains = localStore<Record<string, Record<string, number>>>("undertone.offline.versions", {});
/** Temporary layer ids → the ids the server gave them. */
const savedIds = localStore<Record<string, string>>("undertone.offline.ids", {});

export function resolveVersion(entityId: string, base: number): number {
  const chain = chains.get()[entityId] ?? {};
  let v = base;
  for (let i = 0; i < 1000 && chain[v] !== undefined; i++) v = chain[v];
  return v;
}

/** Notes that this device moved an entity from `sent` to `got` with its own successful write. */
export function recordVersion(entityId: string, sent: number, got: number): void {
  if (got === sent) return;
  chains.set((all) => {
    const next = { ...all, [entityId]: { ...all[entityId], [sent]: got } };
    const ids = Object.keys(next);
    // Keep the store small: the oldest entities go first.
    return ids.length > 300 ? Object.fromEntries(ids.slice(-300).map((id) => [id, next[id]])) : next;
  });
}

/** The server's id for a layer shown under a temporary id (the same id when already saved). */
export const resolveLayerId = (id: string) => (isPendingId(id) ? (savedIds.get()[id] ?? id) : id);
const realId = resolveLayerId;

export function forgetOfflineState(): void {
  chains.set({});
  savedIds.set({});
}

const trialPath = (v: Common) => `/api/studios/${v.studioId}/trials/${v.trialId}`;
const layerOf = (t: TrialDto, id: string): LayerDto | undefined => t.layers.find((l) => l.id === id);

function notSentYet(): never {
  throw new ApiError(409, "This layer has not reached the server yet, so the change could not be made. Try it again now.");
}

/** Sends one kind of write; returns the trial as the server now has it. */
const send: Record<WriteKind, (v: never) => Promise<TrialDto>> = {
  patchTrial: async (v: PatchTrialVars) => {
    const version = resolveVersion(v.trialId, v.baseVersion);
    const t = await api<TrialDto>(trialPath(v), { method: "PATCH", body: { ...v.patch, version } });
    recordVersion(v.trialId, version, t.version);
    return t;
  },
  addLayer: async (v: AddLayerVars) => {
    const t = await api<TrialDto>(`${trialPath(v)}/layers`, { method: "POST", body: v.input });
    const added = [...t.layers].sort((a, b) => b.position - a.position)[0];
    if (added) savedIds.set((m) => ({ ...m, [v.preview.id]: added.id }));
    return t;
  },
  patchLayer: async (v: PatchLayerVars) => {
    const id = realId(v.layerId);
    if (isPendingId(id)) notSentYet();
    const version = resolveVersion(id, v.baseVersion);
    const t = await api<TrialDto>(`${trialPath(v)}/layers/${id}`, { method: "PATCH", body: { ...v.patch, version } });
    const l = layerOf(t, id);
    if (l) recordVersion(id, version, l.version);
    return t;
  },
  deleteLayer: async (v: LayerVars) => {
    const id = realId(v.layerId);
    if (isPendingId(id)) notSentYet();
    return api<TrialDto>(`${trialPath(v)}/layers/${id}`, { method: "DELETE" });
  },
  duplicateLayer: async (v: LayerVars) => {
    const id = realId(v.layerId);
    if (isPendingId(id)) notSentYet();
    const t = await api<TrialDto>(`${trialPath(v)}/layers/${id}/duplicate`, { method: "POST" });
    const source = layerOf(t, id);
    const copy = source && t.layers.find((l) => l.position === source.position + 1);
    if (copy && v.tempId) savedIds.set((m) => ({ ...m, [v.tempId!]: copy.id }));
    return t;
  },
  reorderLayers: async (v: ReorderVars) =>
    api<TrialDto>(`${trialPath(v)}/layer-order`, { method: "PUT", body: { layerIds: v.layerIds.map(realId) } }),
};

/** Keep retrying while the network fails (paused while offline); a server's answer is final. */
const retry = (count: number, e: unknown) => e instanceof ApiError && e.status === 0 && count < 1000;
const retryDelay = (n: number) => Math.min(1000 * 2 ** n, 30_000);

/** Registers every trial write's function and follow-up; call once per query client, before restoring. */
export function registerTrialWrites(qc: QueryClient): void {
  for (const kind of Object.keys(writeKeys) as WriteKind[]) {
    qc.setMutationDefaults(writeKeys[kind], {
      mutationFn: (v: unknown) => send[kind](v as never),
      retry,
      retryDelay,
      onSuccess: (t: unknown, v: unknown) => {
        const vars = v as Common;
        qc.setQueryData(trialKey(vars.studioId, vars.trialId), t as TrialDto);
        void qc.invalidateQueries({ queryKey: ["studios", vars.studioId, "trials"], exact: false, refetchType: "none" });
      },
      onError: (e: unknown, v: unknown) => {
        const vars = v as WriteVars;
        recordUnsent(kind, vars, e instanceof Error ? e : new Error(String(e)));
        void qc.invalidateQueries({ queryKey: trialKey(vars.studioId, vars.trialId) });
      },
    });
  }
}

/** The write actions for one trial's page. Nothing here waits: offline, each change queues. */
export function useTrialWrites(studioId: string, trialId: string) {
  const scope = { id: `trial:${trialId}` };
  const m = {
    patchTrial: useMutation<TrialDto, Error, PatchTrialVars>({ mutationKey: writeKeys.patchTrial, scope }),
    addLayer: useMutation<TrialDto, Error, AddLayerVars>({ mutationKey: writeKeys.addLayer, scope }),
    patchLayer: useMutation<TrialDto, Error, PatchLayerVars>({ mutationKey: writeKeys.patchLayer, scope }),
    deleteLayer: useMutation<TrialDto, Error, LayerVars>({ mutationKey: writeKeys.deleteLayer, scope }),
    duplicateLayer: useMutation<TrialDto, Error, LayerVars>({ mutationKey: writeKeys.duplicateLayer, scope }),
    reorderLayers: useMutation<TrialDto, Error, ReorderVars>({ mutationKey: writeKeys.reorderLayers, scope }),
  };
  const ids = { studioId, trialId };
  return {
    patchTrial: (v: Omit<PatchTrialVars, "studioId" | "trialId">) => m.patchTrial.mutate({ ...ids, ...v }),
    addLayer: (v: Omit<AddLayerVars, "studioId" | "trialId">) => m.addLayer.mutate({ ...ids, ...v }),
    patchLayer: (v: Omit<PatchLayerVars, "studioId" | "trialId">) => m.patchLayer.mutate({ ...ids, ...v }),
    deleteLayer: (v: Omit<LayerVars, "studioId" | "trialId">) => m.deleteLayer.mutate({ ...ids, ...v }),
    duplicateLayer: (v: Omit<LayerVars, "studioId" | "trialId">) => m.duplicateLayer.mutate({ ...ids, ...v }),
    reorderLayers: (v: Omit<ReorderVars, "studioId" | "trialId">) => m.reorderLayers.mutate({ ...ids, ...v }),
  };
}
