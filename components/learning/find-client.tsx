"use client";

import Link from "next/link";
import { useState } from "react";
import { hexToLab, labToHex } from "@/colour/spaces";
import type { Lab } from "@/colour/types";
import { useStudio } from "@/components/studio/studio-context";
import { Field } from "@/components/ui/field";
import { Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { Chip, labText } from "./colour-bits";
import { useColourSearch, type ColourMatch } from "./use-colour-search";

const round1 = (n: number) => Math.round(n * 10) / 10;

/** Pick a colour (picker or L*a*b*) and see the studio's nearest readings and colourways in ΔE00. */
export function FindClient() {
  const { studioId } = useStudio();
  const [lab, setLab] = useState<Lab>(() => {
    const l = hexToLab("#6a8caf");
    return { L: round1(l.L), a: round1(l.a), b: round1(l.b) };
  });
  const q = useColourSearch(studioId, lab);
  const setPart = (k: keyof Lab, v: string) => {
    const n = Number(v);
    if (v !== "" && Number.isFinite(n)) setLab({ ...lab, [k]: n });
  };
  const href = (m: ColourMatch) => (m.kind === "colourway" ? `/s/${studioId}/colourways/${m.id}` : `/s/${studioId}/trials/${m.trialId}`);
  const list = (title: string, items: ColourMatch[] | undefined) => (
    <Sheet>
      <SectionTitle>{title}</SectionTitle>
      {items?.length === 0 && <p className="text-ink-soft">Nothing in this studio yet.</p>}
      <ul className="divide-y divide-rule">
        {items?.map((m) => (
          <li key={m.id}>
            <Link href={href(m)} className="flex min-h-11 items-center gap-3 py-2 hover:bg-paper">
              <Chip lab={m.lab} size="h-10 w-10" label={`Colour of ${m.title}`} />
              <span className="min-w-0 flex-1">
                <span className="block truncate">{m.title}</span>
                <span className="tabular block font-mono text-xs text-ink-soft">{labText(m.lab)}</span>
              </span>
              <span className="tabular text-sm">ΔE00 {m.de00.toFixed(1)}</span>
            </Link>
          </li>
        ))}
      </ul>
    </Sheet>
  );
  return (
    <div className="space-y-4">
      <Link href={`/s/${studioId}/colourways`} className="inline-flex min-h-11 items-center text-accent">
        ← Colourways
      </Link>
      <h1 className="text-3xl">Find by colour</h1>
      <Sheet>
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1 text-sm font-medium text-ink-soft">
            Colour
            <input
              type="color"
              aria-label="Pick a colour"
              className="h-11 w-20 cursor-pointer rounded-md border border-rule-strong bg-sheet"
              value={labToHex(lab)}
              onChange={(e) => {
                const l = hexToLab(e.target.value);
                setLab({ L: round1(l.L), a: round1(l.a), b: round1(l.b) });
              }}
            />
          </label>
          {(["L", "a", "b"] as const).map((k) => (
            <Field key={k} label={`${k}*`} type="number" step="0.1" inputMode="decimal" className="w-24" value={lab[k]} onChange={(e) => setPart(k, e.target.value)} />
          ))}
        </div>
      </Sheet>
      {q.error && <Notice tone="danger">{q.error.message}</Notice>}
      {list("Nearest colourways", q.data?.colourways)}
      {list("Nearest readings", q.data?.readings)}
    </div>
  );
}
