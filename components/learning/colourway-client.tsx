"use client";

import Link from "next/link";
import { useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button, buttonClass } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { PaletteBar, Swatch } from "@/components/ui/swatch";
import { AddLotForm } from "./add-lot-form";
import { hexOf } from "./colour-bits";
import { STATUS_WORDS, statusNeeds } from "./colourways-client";
import { LotsTable } from "./lots-table";
import { useColourway, usePatchColourway } from "./use-colourways";

/** One colourway: its target, what it needs to become repeatable, its lots and its recipe card. */
export function ColourwayClient({ colourwayId }: { colourwayId: string }) {
  const { studioId } = useStudio();
  const canApprove = useCan("colourway.approve");
  const canPropose = useCan("colourway.propose");
  const q = useColourway(studioId, colourwayId);
  const patch = usePatchColourway(studioId, colourwayId);
  const [weight, setWeight] = useState("800");
  if (q.error) return <Notice tone="danger">{q.error.message}</Notice>;
  if (!q.data) return <p className="text-ink-soft">Loading…</p>;
  const c = q.data;
  const setStatus = (status: "repeatable" | "retired") => patch.mutate({ version: c.version, status });

  return (
    <div className="space-y-4">
      <Link href={`/s/${studioId}/colourways`} className="inline-flex min-h-11 items-center text-accent">
        ← Colourways
      </Link>
      <header>
        <h1 className="text-3xl">{c.name}</h1>
        <p className="text-ink-soft" data-testid="colourway-status">
          {STATUS_WORDS[String(c.status)]} · {statusNeeds(c)}
        </p>
        {c.description && <p className="mt-2">{c.description}</p>}
      </header>
      <Sheet>
        <Swatch hex={hexOf(c.target)} lab={c.target} size="lg" label="Target colour" />
        {c.targetPalette.length > 1 && (
          <div className="mt-3">
            <PaletteBar palette={c.targetPalette.map((p) => ({ hex: hexOf(p.lab), share: p.share }))} />
          </div>
        )}
        <p className="mt-3 flex flex-wrap items-center gap-x-2 text-sm text-ink-soft">
          <span>Proposed by {c.proposedBy}</span>
          <Link className="inline-flex min-h-11 items-center text-accent underline underline-offset-4" href={`/s/${studioId}/trials/${c.sourceTrialId}`}>
            Open the trial it came from
          </Link>
        </p>
        {canApprove && (
          <div className="mt-3 flex flex-wrap gap-2">
            {c.status === "candidate" && <Button onClick={() => setStatus("repeatable")} disabled={patch.isPending}>Mark repeatable</Button>}
            {c.status !== "retired" && (
              <Button variant="danger" onClick={() => setStatus("retired")} disabled={patch.isPending}>
                Retire
              </Button>
            )}
          </div>
        )}
        {patch.error && <Notice tone="caution" className="mt-3">{patch.error.message}</Notice>}
      </Sheet>
      <Sheet>
        <SectionTitle>Dye lots</SectionTitle>
        <p className="mb-2 text-sm text-ink-soft">A lot passes within ΔE CMC(2:1) of the studio tolerance of the target; ΔE00 is shown beside it.</p>
        <LotsTable lots={c.lots} />
        {canPropose && c.status !== "retired" && (
          <div className="mt-4 border-t border-rule pt-4">
            <AddLotForm studioId={studioId} colourwayId={c.id} />
          </div>
        )}
      </Sheet>
      <Sheet>
        <SectionTitle>Recipe card</SectionTitle>
        <form className="flex items-end gap-2" action={`/s/${studioId}/colourways/${c.id}/recipe`}>
          <Field label="Fibre weight of the lot (g)" name="weight" type="number" inputMode="decimal" min={1} value={weight} onChange={(e) => setWeight(e.target.value)} className="flex-1" />
          <Link className={buttonClass("primary")} href={`/s/${studioId}/colourways/${c.id}/recipe?weight=${encodeURIComponent(weight)}`}>
            Open recipe card
          </Link>
        </form>
      </Sheet>
    </div>
  );
}
