"use client";

import { useMutationState } from "@tanstack/react-query";
import type { LayerDto, TrialDto } from "@/lib/trials/types";
import type { AddLayerVars, LayerVars, PatchLayerVars, PatchTrialVars, ReorderVars, WriteKind, WriteVars } from "./trial-writes";

// What the dyer sees while changes wait to be sent: the trial as the server last sent it, with
// every waiting change laid over it in order. Nothing is written into the cache until the server
// answers, so a refetch can never lose a waiting change and a refusal never leaves a false value.

export interface PendingWrite {
  mutationId: number;
  kind: WriteKind;
  vars: WriteVars;
  paused: boolean;
  submittedAt: number;
}

/** Every trial write not yet answered by the server, oldest first (optionally for one trial). */
export function usePendingWrites(trialId?: string): PendingWrite[] {
  const all = useMutationState({
    filters: { mutationKey: ["trial-write"], status: "pending" },
    select: (m) => ({
      mutationId: m.mutationId,
      kind: m.options.mutationKey?.[1] as WriteKind,
      vars: m.state.variables as WriteVars,
      paused: m.state.isPaused,
      submittedAt: m.state.submittedAt,
    }),
  });
  return all
    .filter((w) => w.vars && (!trialId || w.vars.trialId === trialId))
    .sort((a, b) => a.submittedAt - b.submittedAt || a.mutationId - b.mutationId);
}

function patchLayer(l: LayerDto, v: PatchLayerVars): LayerDto {
  const p = v.patch;
  const next: LayerDto = { ...l };
  if (p.method !== undefined) next.method = p.method;
  if (p.acid !== undefined) next.acid = { kind: p.acid.kind, amount: p.acid.amount ?? null, ph: p.acid.ph ?? null };
  if (p.waterL !== undefined) next.waterL = p.waterL;
  if (p.temperatureC !== undefined) next.temperatureC = p.temperatureC;
  if (p.minutes !== undefined) next.minutes = p.minutes;
  if (p.setting !== undefined) next.setting = { method: p.setting.method, minutes: p.setting.minutes ?? null };
  if (p.rinseNote !== undefined) next.rinseNote = p.rinseNote;
  if (p.bled !== undefined) next.bled = p.bled;
  if (p.coverage !== undefined) next.coverage = p.coverage;
  if (p.gradient !== undefined) next.gradient = p.gradient;
  if (p.observations !== undefined) next.observations = p.observations;
  return { ...next, ...v.preview };
}

/** The trial with waiting changes applied, and which parts are still waiting. */
export function applyPending(
  trial: TrialDto,
  writes: PendingWrite[],
): { trial: TrialDto; waitingLayers: Set<string>; trialWaiting: boolean } {
  let t: TrialDto = { ...trial, layers: [...trial.layers].sort((a, b) => a.position - b.position) };
  const waitingLayers = new Set<string>();
  let trialWaiting = false;
  for (const w of writes) {
    switch (w.kind) {
      case "patchTrial": {
        const v = w.vars as PatchTrialVars;
        const { baseId: _baseId, ...plain } = v.patch;
        t = { ...t, ...(plain as Partial<TrialDto>), ...v.preview };
        trialWaiting = true;
        break;
      }
      case "addLayer": {
        const v = w.vars as AddLayerVars;
        t = { ...t, layers: [...t.layers, v.preview] };
        waitingLayers.add(v.preview.id);
        break;
      }
      case "patchLayer": {
        const v = w.vars as PatchLayerVars;
        t = { ...t, layers: t.layers.map((l) => (l.id === v.layerId ? patchLayer(l, v) : l)) };
        waitingLayers.add(v.layerId);
        break;
      }
      case "deleteLayer": {
        const v = w.vars as LayerVars;
        t = { ...t, layers: t.layers.filter((l) => l.id !== v.layerId) };
        trialWaiting = true;
        break;
      }
      case "duplicateLayer": {
        const v = w.vars as LayerVars;
        const i = t.layers.findIndex((l) => l.id === v.layerId);
        if (i < 0 || !v.tempId) break;
        const layers = [...t.layers];
        layers.splice(i + 1, 0, { ...layers[i], id: v.tempId });
        t = { ...t, layers };
        waitingLayers.add(v.tempId);
        break;
      }
      case "reorderLayers": {
        const v = w.vars as ReorderVars;
        const rank = new Map(v.layerIds.map((id, i) => [id, i]));
        t = { ...t, layers: [...t.layers].sort((a, b) => (rank.get(a.id) ?? 999) - (rank.get(b.id) ?? 999)) };
        trialWaiting = true;
        break;
      }
    }
  }
  return { trial: { ...t, layers: t.layers.map((l, i) => ({ ...l, position: i })) }, waitingLayers, trialWaiting };
}
