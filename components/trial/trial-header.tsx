"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { useBases } from "@/components/library/use-bases";
import { STATUS_LABELS, TRIAL_STATUSES, type TrialPatch, type TrialStatus } from "@/lib/schemas/trial";
import type { TrialDto } from "@/lib/trials/types";
import { num } from "./units";

type Patch = Omit<TrialPatch, "version">;

function fibreWords(b: NonNullable<TrialDto["base"]>): string {
  return b.fibres.map((f) => `${num(f.pct)} % ${f.fibre}`).join(", ") + (b.superwash ? " · superwash" : "");
}

/** Title, base, weighed fibre, status and tags: the top of the page, as at the top of a recipe card. */
export function TrialHeader({
  trial,
  studioId,
  canEdit,
  waiting,
  onPatch,
}: {
  trial: TrialDto;
  studioId: string;
  canEdit: boolean;
  waiting: boolean;
  onPatch: (patch: Patch, label: string, preview?: Partial<TrialDto>) => void;
}) {
  const [editing, setEditing] = useState(false);
  return (
    <header className="space-y-3">
      <div>
        <h1 className="text-3xl leading-tight">{trial.title}</h1>
        <p className="mt-1 text-ink-soft">
          {trial.base ? (
            <>
              <span className="font-medium text-ink">{trial.base.name}</span> — {fibreWords(trial.base)}
            </>
          ) : (
            "No base chosen"
          )}
        </p>
        <p className="tabular text-ink-soft">
          <span className="font-medium text-ink">{num(trial.fibreWeightG, 4)} g</span> weighed dry · by {trial.author.name}
          {waiting && <span className="ml-2 rounded-full border border-caution/40 bg-caution-soft px-2 py-0.5 text-xs text-caution">Changes waiting</span>}
        </p>
      </div>
      {canEdit ? (
        <div role="radiogroup" aria-label="Status" className="grid grid-cols-3 gap-1 rounded-lg border border-rule bg-paper p-1">
          {TRIAL_STATUSES.map((s: TrialStatus) => (
            <button
              key={s}
              type="button"
              role="radio"
              aria-checked={trial.status === s}
              onClick={() => trial.status !== s && onPatch({ status: s }, `Status: ${STATUS_LABELS[s]}`)}
              className={`min-h-11 rounded-md text-sm font-medium ${trial.status === s ? "bg-accent text-accent-ink" : "text-ink-soft"}`}
            >
              {STATUS_LABELS[s]}
            </button>
          ))}
        </div>
      ) : (
        <p>
          <span className="rounded-full border border-rule-strong px-3 py-1 text-sm">{STATUS_LABELS[trial.status]}</span>
        </p>
      )}
      {trial.tags.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Tags">
          {trial.tags.map((t) => (
            <li key={t} className="rounded-full bg-accent-soft px-3 py-1 text-sm text-accent">
              {t}
            </li>
          ))}
        </ul>
      )}
      {canEdit &&
        (editing ? (
          <DetailsForm
            trial={trial}
            studioId={studioId}
            onCancel={() => setEditing(false)}
            onSave={(patch, preview) => {
              onPatch(patch, "Trial details", preview);
              setEditing(false);
            }}
          />
        ) : (
          <Button variant="plain" onClick={() => setEditing(true)}>
            Edit title, base, weight or tags
          </Button>
        ))}
    </header>
  );
}

function DetailsForm({
  trial,
  studioId,
  onSave,
  onCancel,
}: {
  trial: TrialDto;
  studioId: string;
  onSave: (patch: Patch, preview: Partial<TrialDto>) => void;
  onCancel: () => void;
}) {
  const bases = useBases(studioId);
  const [title, setTitle] = useState(trial.title);
  const [baseId, setBaseId] = useState(trial.base?.id ?? "");
  const [weight, setWeight] = useState(String(trial.fibreWeightG));
  const [tags, setTags] = useState(trial.tags.join(", "));
  const grams = Number(weight.replace(",", "."));
  const weightError = grams > 0 && grams <= 20_000 ? undefined : "Enter the dry fibre weight in grams, e.g. 100.";
  const titleError = title.trim() ? undefined : "Give the trial a title.";
  return (
    <form
      className="space-y-3 rounded-lg border border-rule bg-paper p-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (weightError || titleError) return;
        const patch: Patch = {};
        const preview: Partial<TrialDto> = {};
        if (title.trim() !== trial.title) patch.title = title.trim();
        if (grams !== trial.fibreWeightG) patch.fibreWeightG = grams;
        const tagList = [...new Set(tags.split(",").map((t) => t.trim()).filter(Boolean))];
        if (tagList.join("|") !== trial.tags.join("|")) patch.tags = tagList;
        if (baseId !== (trial.base?.id ?? "")) {
          patch.baseId = baseId || null;
          const b = bases.data?.find((x) => x.id === baseId);
          preview.base = b ? { id: b.id, name: b.name, fibres: b.fibres, superwash: b.superwash, weightClass: b.weightClass } : null;
        }
        if (Object.keys(patch).length) onSave(patch, preview);
        else onCancel();
      }}
    >
      <Field label="Title" value={title} onChange={(e) => setTitle(e.target.value)} error={titleError} />
      <Select label="Base" value={baseId} onChange={(e) => setBaseId(e.target.value)}>
        <option value="">No base</option>
        {bases.data?.map((b) => (
          <option key={b.id} value={b.id}>
            {b.name}
          </option>
        ))}
      </Select>
      <Field label="Weighed dry fibre (g)" inputMode="decimal" value={weight} onChange={(e) => setWeight(e.target.value)} error={weightError} />
      <Field label="Tags" hint="Separate with commas, e.g. speckle, autumn" value={tags} onChange={(e) => setTags(e.target.value)} />
      <div className="flex gap-2">
        <Button type="submit">Save details</Button>
        <Button variant="plain" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
