"use client";

import { type QueryClient, useMutationState } from "@tanstack/react-query";
import { ApiError } from "@/components/api";
import { trialKeys, trialMutationFns, trialMutationKeys } from "@/components/trials/use-trials";
import type { TrialDto } from "@/lib/trials/types";
import { recordUnsent } from "./unsent";

// The trial list's own writes (start a trial, copy one, …) from components/trials/use-trials.ts:
// registered by key here too, so one made offline also survives a reload and is listed as waiting.

type Kind = keyof typeof trialMutationKeys;

const WORDS: Record<Kind, string> = {
  create: "Start a new trial",
  update: "Change a trial",
  remove: "Delete a trial",
  copy: "Copy a trial",
  addLayer: "Add a layer",
  updateLayer: "Change a layer",
  deleteLayer: "Delete a layer",
  duplicateLayer: "Duplicate a layer",
  reorderLayers: "Reorder layers",
};

const retry = (count: number, e: unknown) => e instanceof ApiError && e.status === 0 && count < 1000;
const retryDelay = (n: number) => Math.min(1000 * 2 ** n, 30_000);

function kindOf(key: readonly unknown[] | undefined): Kind | undefined {
  return (Object.keys(trialMutationKeys) as Kind[]).find((k) => trialMutationKeys[k][1] === key?.[1]);
}

function describe(kind: Kind, v: Record<string, unknown>): string {
  const input = (v.input ?? v.patch) as { title?: string } | undefined;
  return input?.title ? `${WORDS[kind]}: “${input.title}”` : WORDS[kind];
}

export function registerOtherTrialWrites(qc: QueryClient): void {
  for (const kind of Object.keys(trialMutationKeys) as Kind[]) {
    qc.setMutationDefaults(trialMutationKeys[kind], {
      mutationFn: trialMutationFns[kind] as (v: unknown) => Promise<unknown>,
      retry,
      retryDelay,
      onSuccess: (t: unknown, v: unknown) => {
        const vars = v as { studioId: string };
        const trial = t as TrialDto | undefined;
        if (trial?.id) qc.setQueryData(trialKeys.detail(vars.studioId, trial.id), trial);
        void qc.invalidateQueries({ queryKey: trialKeys.all(vars.studioId), refetchType: "none" });
      },
      onError: (e: unknown, v: unknown) => {
        const vars = v as { studioId: string; trialId?: string };
        recordUnsent(`list:${kind}`, { ...vars, trialId: vars.trialId ?? "", label: describe(kind, vars) } as never, e instanceof Error ? e : new Error(String(e)));
      },
    });
  }
}

/** The list's writes still waiting, as lines for the "waiting to send" list. */
export function useOtherPendingWrites(): { mutationId: number; label: string }[] {
  return useMutationState({
    filters: { mutationKey: ["trial"], status: "pending" },
    select: (m) => {
      const kind = kindOf(m.options.mutationKey);
      return { mutationId: m.mutationId, label: kind ? describe(kind, (m.state.variables ?? {}) as Record<string, unknown>) : "A change" };
    },
  });
}
