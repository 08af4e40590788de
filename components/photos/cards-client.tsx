"use client";

import Papa from "papaparse";
import Link from "next/link";
import { useState } from "react";
import { labToHex } from "@/colour/spaces";
import { DEMO_CARD } from "@/colour/synthetic/card";
import { ApiError } from "@/components/api";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button, buttonClass } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { EmptyState, Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { useCards, useSaveCard, type CardDto } from "./use-photos";

type Draft = Omit<CardDto, "id" | "updatedAt" | "version"> & { id?: string; version?: number };

const demoDraft = (): Draft => ({
  name: "Studio card",
  rows: DEMO_CARD.rows,
  cols: DEMO_CARD.cols,
  patches: DEMO_CARD.patches.map((p) => ({ name: p.name, ...p.lab })),
  measured: false,
  notes: "",
});

/** Reads "name,L,a,b" rows (a header row is optional) into patch values. */
function parseCsv(text: string): Draft["patches"] {
  const rows = Papa.parse<string[]>(text.trim(), { skipEmptyLines: true }).data;
  const body = rows.length && isNaN(Number(rows[0][1])) ? rows.slice(1) : rows;
  return body.map((r, i) => {
    const [name, L, a, b] = r.length >= 4 ? r : ["", ...r];
    const n = [L, a, b].map(Number);
    if (n.some((v) => !Number.isFinite(v))) throw new Error(`Row ${i + 1} needs three numbers: L*, a*, b*.`);
    return { name: name?.trim() ?? "", L: n[0], a: n[1], b: n[2] };
  });
}

function CardEditor({ draft, onDone }: { draft: Draft; onDone: (recomputing?: number) => void }) {
  const { studioId } = useStudio();
  const save = useSaveCard(studioId);
  const [d, setD] = useState(draft);
  const [csvError, setCsvError] = useState<string>();
  const fields = save.error instanceof ApiError ? save.error.fields : undefined;
  const setPatch = (i: number, k: "L" | "a" | "b", v: string) =>
    setD({ ...d, patches: d.patches.map((p, j) => (j === i ? { ...p, [k]: Number(v) } : p)) });

  return (
    <Sheet className="space-y-4">
      <SectionTitle>{d.id ? `Edit ${draft.name}` : "New reference card"}</SectionTitle>
      <Field label="Name" value={d.name} onChange={(e) => setD({ ...d, name: e.target.value })} error={fields?.name} />
      <div className="grid grid-cols-2 gap-3">
        <Field label="Rows" type="number" inputMode="numeric" value={d.rows} onChange={(e) => setD({ ...d, rows: Number(e.target.value) })} />
        <Field label="Columns" type="number" inputMode="numeric" value={d.cols} onChange={(e) => setD({ ...d, cols: Number(e.target.value) })} />
      </div>
      <label className="flex min-h-11 items-center gap-3">
        <input type="checkbox" className="h-6 w-6" checked={d.measured} onChange={(e) => setD({ ...d, measured: e.target.checked })} />
        These values were measured on our printed card
      </label>
      <div>
        <label className={buttonClass("plain")}>
          Import values from CSV (name, L*, a*, b*)
          <input
            type="file"
            accept=".csv,text/csv"
            className="sr-only"
            onChange={async (e) => {
              const f = e.target.files?.[0];
              if (!f) return;
              try {
                setD({ ...d, patches: parseCsv(await f.text()) });
                setCsvError(undefined);
              } catch (err) {
                setCsvError((err as Error).message);
              }
            }}
          />
        </label>
        {csvError && <Notice tone="danger" className="mt-2">{csvError}</Notice>}
      </div>
      {fields?.patches && <Notice tone="danger">{fields.patches}</Notice>}
      <ol className="grid gap-2 sm:grid-cols-2">
        {d.patches.map((p, i) => (
          <li key={i} className="flex items-center gap-2">
            <span className="h-9 w-9 shrink-0 rounded border border-rule-strong" style={{ background: labToHex(p) }} aria-hidden="true" />
            <span className="w-20 truncate text-sm">{p.name || `#${i + 1}`}</span>
            {(["L", "a", "b"] as const).map((k) => (
              <input
                key={k}
                aria-label={`${p.name || `Patch ${i + 1}`} ${k}*`}
                type="number"
                step="0.1"
                inputMode="decimal"
                value={p[k]}
                onChange={(e) => setPatch(i, k, e.target.value)}
                className="tabular min-h-11 w-16 rounded border border-rule-strong bg-sheet px-1 text-right"
              />
            ))}
          </li>
        ))}
      </ol>
      {save.error && !fields && <Notice tone="danger">{save.error.message}</Notice>}
      <div className="flex gap-3">
        <Button onClick={() => save.mutate(d, { onSuccess: (saved) => onDone(saved.recomputing) })} disabled={save.isPending}>
          Save the card
        </Button>
        <Button variant="quiet" onClick={() => onDone()}>
          Cancel
        </Button>
      </div>
      <p className="text-sm text-ink-soft">Saving new values measures the photos read with this card again.</p>
    </Sheet>
  );
}

export function CardsClient() {
  const { studioId } = useStudio();
  const canEdit = useCan("card.edit");
  const cards = useCards(studioId);
  const [editing, setEditing] = useState<Draft | null>(null);
  const [remeasuring, setRemeasuring] = useState(0);
  return (
    <div className="space-y-5">
      <h1 className="text-3xl">Reference cards</h1>
      <p className="text-ink-soft">
        A card of known colours in every swatch photo lets Undertone correct the camera and the light.
      </p>
      {editing ? (
        <CardEditor
          draft={editing}
          onDone={(n) => {
            setRemeasuring(n ?? 0);
            setEditing(null);
          }}
        />
      ) : (
        <>
          {remeasuring > 0 && (
            <Notice tone="info">
              Saved. {remeasuring === 1 ? "1 reading is" : `${remeasuring} readings are`} being measured again with the new
              values; trial pages show them updated in a few seconds.
            </Notice>
          )}
          {cards.data?.length === 0 && (
            <EmptyState title="No card yet">Start from the demo layout, print it, measure it, and type in the values.</EmptyState>
          )}
          {cards.data?.map((c) => (
            <Sheet key={c.id}>
              <SectionTitle
                action={
                  <Link href={`/s/${studioId}/cards/${c.id}/print`} className="text-accent underline underline-offset-4">
                    Print
                  </Link>
                }
              >
                {c.name}
              </SectionTitle>
              <div className="grid gap-1" style={{ gridTemplateColumns: `repeat(${c.cols}, minmax(0, 1fr))` }}>
                {c.patches.map((p, i) => (
                  <div key={i} className="aspect-square rounded-sm" style={{ background: labToHex(p) }} title={`${p.name}: L* ${p.L} a* ${p.a} b* ${p.b}`} />
                ))}
              </div>
              <p className="mt-2 text-sm text-ink-soft">
                {c.rows} × {c.cols} patches · {c.measured ? "measured values" : "nominal values: readings are indicative until the printed card is measured"}
              </p>
              {canEdit && (
                <Button variant="plain" className="mt-3" onClick={() => setEditing({ ...c })}>
                  Edit values
                </Button>
              )}
            </Sheet>
          ))}
          {canEdit && <Button onClick={() => setEditing(demoDraft())}>New card from the demo layout</Button>}
        </>
      )}
    </div>
  );
}
