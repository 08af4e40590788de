"use client";

import { useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { TrialDto } from "@/lib/trials/types";
import {
  type AddLayerVars,
  type LayerVars,
  type PatchLayerVars,
  type PatchTrialVars,
  type ReorderVars,
  newPendingId,
  resolveLayerId,
  trialKey,
  useTrialWrites,
} from "./trial-writes";
import { type Unsent, dismissUnsent } from "./unsent";

/**
 * Sends a refused change again on top of what the server has now: the dyer has seen the other
 * person's values beside their own and chosen to keep theirs.
 */
export function useReapply(studioId: string, trialId: string) {
  const qc = useQueryClient();
  const writes = useTrialWrites(studioId, trialId);
  return async (u: Unsent): Promise<void> => {
    const t = await qc.fetchQuery({
      queryKey: trialKey(studioId, trialId),
      queryFn: () => api<TrialDto>(`/api/studios/${studioId}/trials/${trialId}`),
      staleTime: 0,
    });
    const label = u.vars.label;
    switch (u.kind) {
      case "patchTrial": {
        const v = u.vars as PatchTrialVars;
        writes.patchTrial({ label, baseVersion: t.version, patch: v.patch, preview: v.preview });
        break;
      }
      case "patchLayer": {
        const v = u.vars as PatchLayerVars;
        const layer = t.layers.find((l) => l.id === resolveLayerId(v.layerId));
        if (!layer) throw new Error("That layer has been deleted since, so the change has nowhere to go. Add it as a new layer instead.");
        writes.patchLayer({ label, layerId: layer.id, baseVersion: layer.version, patch: v.patch, preview: v.preview });
        break;
      }
      case "addLayer": {
        const v = u.vars as AddLayerVars;
        writes.addLayer({ label, input: v.input, preview: { ...v.preview, id: newPendingId(), position: t.layers.length } });
        break;
      }
      case "deleteLayer":
      case "duplicateLayer": {
        const v = u.vars as LayerVars;
        const id = resolveLayerId(v.layerId);
        if (!t.layers.some((l) => l.id === id)) throw new Error("That layer is no longer in the trial.");
        if (u.kind === "deleteLayer") writes.deleteLayer({ label, layerId: id });
        else writes.duplicateLayer({ label, layerId: id, tempId: newPendingId() });
        break;
      }
      default:
        throw new Error("This change cannot be sent again from here: make it again on its page.");
      case "reorderLayers": {
        const v = u.vars as ReorderVars;
        const wanted = v.layerIds.map(resolveLayerId).filter((id) => t.layers.some((l) => l.id === id));
        const rest = t.layers.map((l) => l.id).filter((id) => !wanted.includes(id));
        writes.reorderLayers({ label, layerIds: [...wanted, ...rest] });
        break;
      }
    }
    dismissUnsent(u.id);
  };
}
