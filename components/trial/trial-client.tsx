"use client";

import Link from "next/link";
import { useAccount } from "@/components/account/use-account";
import { applyPending, usePendingWrites } from "@/components/offline/pending-view";
import { newPendingId, useTrialWrites } from "@/components/offline/trial-writes";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { useTrial } from "@/components/trials/use-trials";
import { buttonClass } from "@/components/ui/button";
import { EmptyState, Notice, SectionTitle } from "@/components/ui/sheet";
import { Warnings } from "./cautions";
import { CopyTrial } from "./copy-trial";
import { LayerCard } from "./layer-card";
import { TrialHeader } from "./trial-header";
import { TrialNotes } from "./trial-notes";
import { firstCautions, warningsFor } from "./warnings";

export function TrialSkeleton() {
  return (
    <div className="mx-auto max-w-2xl animate-pulse space-y-4" aria-busy="true" aria-label="Loading the trial">
      <div className="h-9 w-3/4 rounded bg-rule" />
      <div className="h-5 w-1/2 rounded bg-rule" />
      <div className="h-48 rounded-lg bg-rule/60" />
      <div className="h-48 rounded-lg bg-rule/60" />
    </div>
  );
}

/** One trial, read top to bottom like the dye session it records. */
export function TrialClient({ trialId }: { trialId: string }) {
  const { studioId } = useStudio();
  const canEdit = useCan("trial.edit");
  const canTime = useCan("timer.use");
  const query = useTrial(studioId, trialId);
  const account = useAccount();
  const pending = usePendingWrites(trialId);
  const writes = useTrialWrites(studioId, trialId);
  const system = account.data?.unitSystem ?? "metric";
  const tempUnit = account.data?.temperatureUnit ?? "C";

  if (query.isPending) return <TrialSkeleton />;
  if (query.isError || !query.data) {
    return (
      <div className="mx-auto max-w-2xl space-y-3">
        <Notice tone="danger">{query.error?.message ?? "This trial could not be loaded."}</Notice>
        <Link className={buttonClass("plain")} href={`/s/${studioId}/trials`}>
          Back to the trials
        </Link>
      </div>
    );
  }
  const { trial, waitingLayers, trialWaiting } = applyPending(query.data, pending);
  const layers = trial.layers;
  const cautions = firstCautions(layers);
  const ids = layers.map((l) => l.id);

  return (
    <div className="mx-auto max-w-2xl space-y-5">
      <nav aria-label="Breadcrumb">
        <Link href={`/s/${studioId}/trials`} className="inline-flex min-h-11 items-center text-accent">
          ← Trials
        </Link>
      </nav>
      <TrialHeader
        trial={trial}
        studioId={studioId}
        canEdit={canEdit}
        waiting={trialWaiting}
        onPatch={(patch, label, preview) => writes.patchTrial({ label: `${trial.title}: ${label}`, baseVersion: query.data.version, patch, preview })}
      />
      <Warnings items={warningsFor(trial, null)} />

      <section aria-labelledby="layers-title" className="space-y-4">
        <h2 id="layers-title" className="sr-only">
          Layers
        </h2>
        {layers.length === 0 && (
          <EmptyState title="No layers yet">
            {canEdit ? "Add the first layer: how the dye goes on, which dyes and how much." : "Nothing has been dyed in this trial yet."}
          </EmptyState>
        )}
        {layers.map((l, i) => (
          <LayerCard
            key={l.id}
            layer={l}
            index={i}
            count={layers.length}
            trialId={trialId}
            studioId={studioId}
            fibreG={trial.fibreWeightG}
            system={system}
            tempUnit={tempUnit}
            canEdit={canEdit}
            canTime={canTime}
            waiting={waitingLayers.has(l.id)}
            warnings={warningsFor(trial, l.id)}
            cautions={cautions.get(l.id) ?? []}
            actions={{
              onMove: (dir) => {
                const next = [...ids];
                [next[i], next[i + dir]] = [next[i + dir], next[i]];
                writes.reorderLayers({ label: `${trial.title}: layer ${i + 1} moved ${dir < 0 ? "up" : "down"}`, layerIds: next });
              },
              onDuplicate: () => writes.duplicateLayer({ label: `${trial.title}: copy of layer ${i + 1}`, layerId: l.id, tempId: newPendingId() }),
              onDelete: () => writes.deleteLayer({ label: `${trial.title}: layer ${i + 1} deleted`, layerId: l.id }),
              onObservations: (text) =>
                writes.patchLayer({
                  label: `${trial.title}: layer ${i + 1} observations`,
                  layerId: l.id,
                  baseVersion: query.data.layers.find((x) => x.id === l.id)?.version ?? l.version,
                  patch: { observations: text },
                }),
            }}
          />
        ))}
        {canEdit && (
          <Link href={`/s/${studioId}/trials/${trialId}/layers/new`} className={buttonClass("primary", "w-full min-h-14 text-lg")}>
            + Add a layer
          </Link>
        )}
      </section>

      <section aria-labelledby="notes-title">
        <SectionTitle>
          <span id="notes-title">Notes</span>
        </SectionTitle>
        <TrialNotes
          notes={trial.notes}
          canEdit={canEdit}
          onSave={(doc) => writes.patchTrial({ label: `${trial.title}: notes`, baseVersion: query.data.version, patch: { notes: doc as never } })}
        />
      </section>

      {canEdit && <CopyTrial trial={trial} studioId={studioId} />}
    </div>
  );
}
