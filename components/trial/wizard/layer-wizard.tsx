"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useRef, useState } from "react";
import { acidFor } from "@/colour/arithmetic";
import { useAccount } from "@/components/account/use-account";
import { useDyes } from "@/components/library/use-dyes";
import { useStocks } from "@/components/library/use-stocks";
import { applyPending, usePendingWrites } from "@/components/offline/pending-view";
import { newPendingId, useTrialWrites } from "@/components/offline/trial-writes";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { useTrial } from "@/components/trials/use-trials";
import { Button, buttonClass } from "@/components/ui/button";
import { Notice } from "@/components/ui/sheet";
import { type LayerMethod, LAYER_METHODS, METHOD_LABELS, layerInput } from "@/lib/schemas/trial";
import type { LayerDto } from "@/lib/trials/types";
import { TrialSkeleton } from "../trial-client";
import { PARTIAL_METHODS } from "../warnings";
import { LayerPrediction } from "@/components/learning/layer-prediction";
import { changedFields, draftFromLayer, emptyDraft, previewDye, previewLayer, toInput, withMethod, type Draft } from "./draft";
import { FinishStep } from "./finish-step";
import { DyesStep, HeatStep, MethodStep } from "./steps";

const STEP_TITLES = ["How the dye goes on", "Dyes and amounts", "Acid, water and heat", "Rinse and what you see"];

/** Which step holds a field that zod refused. */
function stepOf(path: PropertyKey[]): number {
  const k = String(path[0]);
  if (k === "method") return 1;
  if (k === "dyes") return 2;
  if (["acid", "waterL", "temperatureC", "minutes", "setting"].includes(k)) return 3;
  return 4;
}

/**
 * Adding (or changing) a layer in a few screens with big controls: the method, the dyes and their
 * amounts, acid/water/heat/setting (filled in from the layer before), then coverage, gradient,
 * rinse and observations. Saving never waits for the network: offline, the layer queues.
 */
export function LayerWizard({ trialId, layerId, initialMethod }: { trialId: string; layerId?: string; initialMethod?: string }) {
  const { studioId } = useStudio();
  const canEdit = useCan("trial.edit");
  const router = useRouter();
  const trialQ = useTrial(studioId, trialId);
  const account = useAccount();
  const dyesQ = useDyes(studioId);
  const stocksQ = useStocks(studioId);
  const pending = usePendingWrites(trialId);
  const writes = useTrialWrites(studioId, trialId);
  const [draft, setDraft] = useState<Draft | null>(null);
  const startsWithMethod = !layerId && !!initialMethod && (LAYER_METHODS as readonly string[]).includes(initialMethod);
  // A layer whose method was chosen on the new-trial page starts at the dyes.
  const [step, setStep] = useState(startsWithMethod ? 2 : 1);
  const [errors, setErrors] = useState<string[]>([]);
  // A dye picked with its amount typed counts as added when the dyer moves on (one tap fewer).
  const pendingDye = useRef<Omit<Draft["dyes"][number], "key"> | null>(null);
  // The same dye as state, so the prediction follows the amount as it is typed.
  const [typedDye, setTypedDye] = useState<Omit<Draft["dyes"][number], "key"> | null>(null);
  const onPendingDye = useCallback((d: Omit<Draft["dyes"][number], "key"> | null) => {
    pendingDye.current = d;
    setTypedDye(d);
  }, []);
  const tempUnit = account.data?.temperatureUnit ?? "C";
  const system = account.data?.unitSystem ?? "metric";
  const back = `/s/${studioId}/trials/${trialId}`;

  if (!canEdit) return <Notice tone="info">Your role in this studio lets you read trials, not change them.</Notice>;
  if (trialQ.isPending || account.isPending) return <TrialSkeleton />;
  if (!trialQ.data) return <Notice tone="danger">{trialQ.error?.message ?? "This trial could not be loaded."}</Notice>;

  const view = applyPending(trialQ.data, pending).trial;
  const editing: LayerDto | undefined = layerId ? view.layers.find((l) => l.id === layerId) : undefined;
  if (layerId && !editing) return <Notice tone="danger">This layer is no longer in the trial.</Notice>;
  const index = editing ? view.layers.indexOf(editing) : view.layers.length;
  const previous = index > 0 ? view.layers[index - 1] : null;
  const fibreG = view.fibreWeightG;
  const vinegar = acidFor(fibreG, { kind: "vinegar" }).amount;

  let d: Draft | null = draft;
  if (!d) {
    if (editing) d = draftFromLayer(editing, tempUnit);
    else if (startsWithMethod) {
      d = withMethod(emptyDraft(), initialMethod as LayerMethod, fibreG, previous, tempUnit, vinegar);
    } else d = emptyDraft();
  }
  const current: Draft = d;
  /** The draft with the dye still on the picker, when its amount is readable. */
  const withTyped = (): Draft => {
    const t = step === 2 ? pendingDye.current : null;
    return t ? { ...current, dyes: [...current.dyes, { ...t, key: `k${current.dyes.length}-${t.dyeId}` }] } : current;
  };
  const shownStep = step;
  const set = (p: Partial<Draft>) => setDraft({ ...current, ...p });
  const go = (n: number) => {
    const next = withTyped();
    pendingDye.current = null;
    setTypedDye(null);
    setDraft(next);
    setStep(n);
    setErrors([]);
    window.scrollTo({ top: 0 });
  };
  const needsFinish = current.method === "dip" || PARTIAL_METHODS.includes(current.method ?? "other");
  const ctx = { trial: view, draft: current, set, dyes: dyesQ.data ?? [], stocks: stocksQ.data ?? [], system, tempUnit, libraryLoading: dyesQ.isPending || stocksQ.isPending, onPendingDye };

  const save = () => {
    const final = withTyped();
    const parsed = layerInput.safeParse(toInput(final, tempUnit));
    if (!parsed.success) {
      setErrors(parsed.error.issues.map((i) => i.message));
      setStep(stepOf(parsed.error.issues[0].path));
      return;
    }
    const input = parsed.data;
    const name = `${view.title}: layer ${index + 1} (${METHOD_LABELS[input.method]})`;
    if (editing) {
      const server = trialQ.data.layers.find((l) => l.id === editing.id);
      const patch = changedFields(toInput(draftFromLayer(editing, tempUnit), tempUnit), input);
      if (Object.keys(patch).length > 0) {
        writes.patchLayer({
          label: `${name} changed`,
          layerId: editing.id,
          baseVersion: server?.version ?? editing.version,
          patch,
          preview: previewLayer(editing.id, index, editing.version, input, final, fibreG, ctx.dyes, ctx.stocks),
        });
      }
    } else {
      const id = newPendingId();
      writes.addLayer({ label: `${name} added`, input, preview: previewLayer(id, index, 0, input, final, fibreG, ctx.dyes, ctx.stocks) });
    }
    router.push(back);
  };

  return (
    <div className="mx-auto max-w-xl space-y-4">
      <div className="flex items-center justify-between gap-2">
        <Link href={back} className="inline-flex min-h-11 items-center text-accent">
          ← {view.title}
        </Link>
      </div>
      <header>
        <p className="tabular text-sm text-ink-soft">
          {editing ? "Changing" : "New"} layer {index + 1} · step {shownStep} of 4
        </p>
        <h1 className="text-2xl">{STEP_TITLES[shownStep - 1]}</h1>
        <div className="mt-2 grid grid-cols-4 gap-1" aria-hidden="true">
          {[1, 2, 3, 4].map((n) => (
            <span key={n} className={`h-1.5 rounded-full ${n <= shownStep ? "bg-accent" : "bg-rule"}`} />
          ))}
        </div>
      </header>
      {errors.length > 0 && (
        <Notice tone="danger">
          {errors.map((e) => (
            <p key={e}>{e}</p>
          ))}
        </Notice>
      )}
      {shownStep === 1 && (
        <MethodStep
          value={current.method}
          onPick={(m) => {
            const next = m === current.method ? current : withMethod(current, m, fibreG, previous, tempUnit, vinegar);
            setDraft(next);
            setStep(2);
          }}
        />
      )}
      {shownStep === 2 && <DyesStep {...ctx} />}
      {shownStep === 2 && current.method && (
        <LayerPrediction
          trialId={trialId}
          layerId={editing?.id}
          layer={{
            method: current.method,
            dyes: [...current.dyes, ...(typedDye ? [{ ...typedDye, key: "typed" }] : [])].map((x) => ({ dyeId: x.dyeId, dosPct: previewDye(x, fibreG, ctx.dyes, ctx.stocks).dosPct })),
            coverage: current.coverage,
            gradient: current.gradient,
          }}
          previousLayers={view.layers.slice(0, index)}
        />
      )}
      {shownStep === 3 && <HeatStep {...ctx} />}
      {shownStep === 4 && <FinishStep {...ctx} />}
      {previous && shownStep === 3 && !editing && (
        <p className="text-sm text-ink-soft">Filled in from layer {index} where it was the same kind of work; change anything that differs.</p>
      )}
      <nav className="flex flex-wrap gap-2 border-t border-rule pt-4" aria-label="Steps">
        {shownStep > 1 && (
          <Button variant="plain" onClick={() => go(shownStep - 1)}>
            Back
          </Button>
        )}
        {shownStep === 2 && (
          <Button className="ml-auto" onClick={() => go(3)}>
            Next: acid and heat
          </Button>
        )}
        {shownStep === 3 && !needsFinish && (
          <>
            <Button variant="plain" onClick={() => go(4)}>
              Rinse and notes
            </Button>
            <Button className="ml-auto" onClick={save}>
              Save layer
            </Button>
          </>
        )}
        {shownStep === 3 && needsFinish && (
          <Button className="ml-auto" onClick={() => go(4)}>
            Next: {current.method === "dip" ? "gradient" : "coverage"}
          </Button>
        )}
        {shownStep === 4 && (
          <Button className="ml-auto" onClick={save}>
            Save layer
          </Button>
        )}
        {shownStep === 1 && (
          <Link href={back} className={buttonClass("plain")}>
            Cancel
          </Link>
        )}
        {editing && shownStep < 3 && (
          <Button variant="quiet" className="ml-auto" onClick={save}>
            Save changes
          </Button>
        )}
      </nav>
    </div>
  );
}
