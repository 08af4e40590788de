"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { type DyeMethod, scaleRecipe } from "@/colour/arithmetic";
import { useBases } from "@/components/library/use-bases";
import { useCopyTrial } from "@/components/trials/use-trials";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import type { TrialDto } from "@/lib/trials/types";
import { PARTIAL_METHODS } from "./warnings";

/** "Same recipe, new base": a new trial with these layers, on another base or weight. */
export function CopyTrial({ trial, studioId }: { trial: TrialDto; studioId: string }) {
  const router = useRouter();
  const bases = useBases(studioId);
  const copy = useCopyTrial();
  const [open, setOpen] = useState(false);
  const [title, setTitle] = useState(`${trial.title} — again`);
  const [baseId, setBaseId] = useState(trial.base?.id ?? "");
  const [weight, setWeight] = useState(String(trial.fibreWeightG));
  const grams = Number(weight.replace(",", "."));
  const partial = trial.layers.find((l) => PARTIAL_METHODS.includes(l.method));
  const scaleNote =
    partial && grams > 0 && grams !== trial.fibreWeightG
      ? // The four partial layer methods carry the same names as the colour module's methods.
        scaleRecipe([], trial.fibreWeightG, grams, partial.method as DyeMethod).warning
      : undefined;

  if (!open) {
    return (
      <Button variant="plain" className="w-full" onClick={() => setOpen(true)}>
        Same recipe, new base
      </Button>
    );
  }
  return (
    <form
      className="space-y-3 rounded-lg border border-rule bg-paper p-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (!(grams > 0)) return;
        copy.mutate(
          { studioId, trialId: trial.id, input: { title: title.trim() || undefined, baseId: baseId || null, fibreWeightG: grams } },
          { onSuccess: (t) => router.push(`/s/${studioId}/trials/${t.id}`) },
        );
      }}
    >
      <h2 className="text-xl">Same recipe, new base</h2>
      <p className="text-sm text-ink-soft">Every layer is copied; amounts are kept as depth of shade and worked out again for the new weight.</p>
      <Field label="Title" value={title} onChange={(e) => setTitle(e.target.value)} />
      <Select label="Base" value={baseId} onChange={(e) => setBaseId(e.target.value)}>
        <option value="">No base</option>
        {bases.data?.map((b) => (
          <option key={b.id} value={b.id}>
            {b.name}
          </option>
        ))}
      </Select>
      <Field label="Weighed dry fibre (g)" inputMode="decimal" value={weight} onChange={(e) => setWeight(e.target.value)} />
      {scaleNote && <Notice tone="caution">{scaleNote}</Notice>}
      {copy.error && <Notice tone="danger">{copy.error.message}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" disabled={copy.isPending}>
          {copy.isPaused ? "Waiting for the connection…" : "Start the new trial"}
        </Button>
        <Button variant="plain" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
