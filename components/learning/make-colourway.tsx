"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import type { ReadingDto } from "@/components/photos/use-photos";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { Chip } from "./colour-bits";
import { useCreateColourway } from "./use-colourways";

const KIND: Record<string, string> = { base: "base", "after-layer": "after a layer", final: "final", "before-wash": "before washing", "after-wash": "after washing" };

/** Proposes the trial's result as a colourway: a name and which reading is the target colour. */
export function MakeColourway({ trialId, readings }: { trialId: string; readings: ReadingDto[] }) {
  const { studioId } = useStudio();
  const canPropose = useCan("colourway.propose");
  const router = useRouter();
  const create = useCreateColourway(studioId);
  const [open, setOpen] = useState(false);
  const usable = readings.filter((r) => r.photoKind !== "base");
  const [readingId, setReadingId] = useState("");
  const [name, setName] = useState("");
  const [description, setDescription] = useState("");
  if (!canPropose || !usable.length) return null;
  const chosen = readingId || usable[usable.length - 1].id;
  const reading = usable.find((r) => r.id === chosen);

  if (!open) {
    return (
      <Button variant="plain" className="mt-4" onClick={() => setOpen(true)}>
        Make this a colourway
      </Button>
    );
  }
  return (
    <form
      className="mt-4 space-y-3 border-t border-rule pt-4"
      aria-label="New colourway"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate(
          { trialId, readingId: chosen, name, description },
          { onSuccess: (c) => router.push(`/s/${studioId}/colourways/${c.id}`) },
        );
      }}
    >
      <Field label="Colourway name" value={name} onChange={(e) => setName(e.target.value)} required minLength={2} maxLength={120} />
      <Field label="Description (optional)" value={description} onChange={(e) => setDescription(e.target.value)} maxLength={2000} />
      <div className="flex items-end gap-3">
        <Select label="Target colour (a reading)" value={chosen} onChange={(e) => setReadingId(e.target.value)} className="flex-1">
          {usable.map((r) => (
            <option key={r.id} value={r.id}>
              {r.label || KIND[r.photoKind]} · {r.hex}
            </option>
          ))}
        </Select>
        {reading && <Chip hex={reading.hex} size="h-11 w-11" label="Target colour" />}
      </div>
      {create.error && <Notice tone="danger">{create.error.message}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" disabled={create.isPending}>
          Propose colourway
        </Button>
        <Button variant="quiet" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
