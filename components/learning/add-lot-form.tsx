"use client";

import { useState } from "react";
import { useTrialPhotos } from "@/components/photos/use-photos";
import { useTrials } from "@/components/trials/use-trials";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { useAddLot } from "./use-colourways";

// No trial chosen yet: a well-formed id that matches no trial (the query fails quietly; no readings are listed).
const EMPTY = "00000000-0000-0000-0000-000000000000";

/** Records a dye lot: the trial that dyed it, skeins, weighed fibre and one of that trial's readings. */
export function AddLotForm({ studioId, colourwayId }: { studioId: string; colourwayId: string }) {
  const trials = useTrials(studioId, { sort: "updated", dir: "desc", pageSize: "50" });
  const [trialId, setTrialId] = useState("");
  const [readingId, setReadingId] = useState("");
  const [code, setCode] = useState("");
  const [skeins, setSkeins] = useState("1");
  const [weight, setWeight] = useState("100");
  const photos = useTrialPhotos(studioId, trialId || EMPTY);
  const add = useAddLot(studioId, colourwayId);
  const readings = trialId ? (photos.data?.readings ?? []).filter((r) => r.photoKind !== "base") : [];
  const chosenReading = readingId || readings[readings.length - 1]?.id || "";

  return (
    <form
      aria-label="New dye lot"
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        add.mutate(
          { trialId, code, skeins: Number(skeins), fibreWeightG: Number(weight), readingId: chosenReading || null },
          { onSuccess: () => { setCode(""); setReadingId(""); setTrialId(""); } },
        );
      }}
    >
      <Select label="Trial that dyed the lot" value={trialId} onChange={(e) => { setTrialId(e.target.value); setReadingId(""); }} required>
        <option value="">Choose a trial…</option>
        {trials.data?.items.map((t) => (
          <option key={t.id} value={t.id}>
            {t.title}
          </option>
        ))}
      </Select>
      {trialId && (
        <Select label="Reading of the lot" value={chosenReading} onChange={(e) => setReadingId(e.target.value)}>
          {readings.length === 0 && <option value="">No reading yet (judge it later)</option>}
          {readings.map((r) => (
            <option key={r.id} value={r.id}>
              {r.label || r.photoKind} · {r.hex}
            </option>
          ))}
        </Select>
      )}
      <div className="grid grid-cols-3 gap-2">
        <Field label="Lot code" value={code} onChange={(e) => setCode(e.target.value)} required maxLength={40} placeholder="2026-12-A" />
        <Field label="Skeins" type="number" inputMode="numeric" min={1} max={500} value={skeins} onChange={(e) => setSkeins(e.target.value)} required />
        <Field label="Fibre (g)" type="number" inputMode="decimal" min={1} value={weight} onChange={(e) => setWeight(e.target.value)} required />
      </div>
      {add.error && <Notice tone="danger">{add.error.message}</Notice>}
      <Button type="submit" disabled={add.isPending || !trialId}>
        Add lot
      </Button>
    </form>
  );
}
