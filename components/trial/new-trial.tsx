"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError } from "@/components/api";
import { useBases } from "@/components/library/use-bases";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { useCreateTrial } from "@/components/trials/use-trials";
import { Button, buttonClass } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { LAYER_METHODS, type LayerMethod, METHOD_LABELS, trialInput } from "@/lib/schemas/trial";
import { num } from "./units";
import { Chips, Tiles } from "./wizard/choice";

/** A new trial on one screen: what it is, the base, the weighed fibre, and how the first layer goes on. */
export function NewTrial() {
  const { studioId } = useStudio();
  const canEdit = useCan("trial.edit");
  const router = useRouter();
  const bases = useBases(studioId);
  const create = useCreateTrial();
  const [title, setTitle] = useState("");
  const [baseId, setBaseId] = useState<string>("none");
  const [weight, setWeight] = useState("100");
  const [method, setMethod] = useState<LayerMethod | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  if (!canEdit) return <Notice>Your role in this studio lets you read trials, not start them.</Notice>;
  const serverFields = create.error instanceof ApiError ? create.error.fields : undefined;

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const parsed = trialInput.safeParse({
      title,
      baseId: baseId === "none" ? null : baseId,
      fibreWeightG: Number(weight.replace(",", ".")),
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setErrors({});
    create.mutate(
      { studioId, input: parsed.data },
      {
        onSuccess: (t) =>
          router.push(method ? `/s/${studioId}/trials/${t.id}/layers/new?method=${method}` : `/s/${studioId}/trials/${t.id}`),
      },
    );
  };

  return (
    <form onSubmit={submit} className="mx-auto max-w-xl space-y-5" noValidate>
      <Link href={`/s/${studioId}/trials`} className="inline-flex min-h-11 items-center text-accent">
        ← Trials
      </Link>
      <h1 className="text-3xl">New trial</h1>
      <Field
        label="What are you trying?"
        placeholder="e.g. Moss dip that breaks at the tips"
        value={title}
        onChange={(e) => setTitle(e.target.value)}
        error={errors.title ?? serverFields?.title}
        autoComplete="off"
      />
      <Chips
        label="Base"
        value={baseId}
        onPick={setBaseId}
        options={[...(bases.data ?? []).map((b) => ({ value: b.id, title: b.name })), { value: "none", title: "No base yet" }]}
      />
      {errors.baseId && <p className="text-sm text-danger">{errors.baseId}</p>}
      <div className="space-y-2">
        <Field
          label="Weighed dry fibre (g)"
          inputMode="decimal"
          value={weight}
          onChange={(e) => setWeight(e.target.value)}
          error={errors.fibreWeightG ?? serverFields?.fibreWeightG}
          hint="Weigh the dry skein: a “100 g” skein is often 95–105 g."
          className="max-w-48"
        />
        <Chips label="Common weights" hideLabel value={Number(weight)} onPick={(g) => setWeight(String(g))} options={[50, 100, 115, 150, 200].map((g) => ({ value: g, title: `${num(g)} g` }))} />
      </div>
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-soft">First layer (you can choose later)</legend>
        <Tiles label="First layer method" value={method} onPick={(m) => setMethod(m === method ? null : m)} options={LAYER_METHODS.map((m) => ({ value: m, title: METHOD_LABELS[m] }))} />
      </fieldset>
      {create.error && !serverFields && <Notice tone="danger">{create.error.message}</Notice>}
      {create.isPaused && <Notice tone="caution">Offline: the trial starts as soon as the connection returns.</Notice>}
      <div className="flex gap-2">
        <Button type="submit" className="flex-1 min-h-14 text-lg" disabled={create.isPending && !create.isPaused}>
          {method ? "Start and add the first layer" : "Start the trial"}
        </Button>
        <Link href={`/s/${studioId}/trials`} className={buttonClass("plain", "min-h-14")}>
          Cancel
        </Link>
      </div>
    </form>
  );
}
