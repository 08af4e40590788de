"use client";

import { localStore, useLocalStore } from "@/components/offline/local-store";
import type { CautionKey, LayerDyeDto, TrialWarning } from "@/lib/trials/types";

// Cautions and warnings where they matter, each shown once in its context and put away with one
// tap (remembered on this device). None of them ever stops a save.

const dismissed = localStore<string[]>("undertone.cautions.dismissed", []);
const NONE: string[] = [];

export function useDismissed(): (key: string) => boolean {
  const keys = useLocalStore(dismissed, NONE);
  return (key) => keys.includes(key);
}

export function dismiss(key: string): void {
  dismissed.set((all) => (all.includes(key) ? all : [...all, key].slice(-500)));
}

export function restoreDismissed(prefix: string): void {
  dismissed.set((all) => all.filter((k) => !k.startsWith(prefix)));
}

const CAUTION_TEXT: Record<CautionKey, { title: string; body: string }> = {
  powder: {
    title: "Dye powder",
    body: "fine powder can sensitise lungs and skin, whatever the dye. Wet it before stirring or wear a dust-rated mask, and keep gloves on; speckling and dry rubbing raise the most dust.",
  },
  acid: { title: "Acid bath", body: "vent the vinegar steam, and lift hot pots with both hands and both mitts." },
  steam: { title: "Steaming", body: "open lids and wrapped packets away from your face; let packets cool before unwrapping." },
  microwave: { title: "Microwave", body: "one kept for dyeing only, short bursts with rests, never left running alone." },
  disposal: {
    title: "Afterwards",
    body: "a small clear bath usually goes down the drain with plenty of water, unless a septic tank or local rules say otherwise. Dye tools never go back to food use; label stock jars and keep them from children and pets.",
  },
};

/** The line every caution ends with. */
export const FIRST_PRIORITY =
  "The dye's safety data sheet, your local rules and licensed practice come first; these notes only remind you.";

function SafetySheets({ dyes }: { dyes: Pick<LayerDyeDto, "dyeId" | "dyeName" | "sdsUrl">[] }) {
  const unique = [...new Map(dyes.map((d) => [d.dyeId, d])).values()];
  if (unique.length === 0) return null;
  const withSheet = unique.filter((d) => d.sdsUrl);
  const without = unique.filter((d) => !d.sdsUrl);
  return (
    <p className="mt-1">
      {withSheet.length > 0 && <span>Safety sheets: </span>}
      {withSheet.map((d, i) => (
        <span key={d.dyeId}>
          {i > 0 && ", "}
          <a href={d.sdsUrl!} target="_blank" rel="noreferrer" className="inline-flex min-h-11 items-center underline">
            {d.dyeName}
          </a>
        </span>
      ))}
      {without.length > 0 && (
        <span className="text-ink-soft">
          {withSheet.length > 0 ? " · " : ""}No sheet linked for {without.map((d) => d.dyeName).join(", ")} — add it in the library.
        </span>
      )}
    </p>
  );
}

function Card({ tone, title, children, onDismiss }: { tone: "caution" | "safety"; title: string; children: React.ReactNode; onDismiss: () => void }) {
  return (
    <aside
      role="note"
      aria-label={title}
      className={`rounded-md border px-3 pt-2 pb-1 text-sm ${tone === "caution" ? "border-caution/40 bg-caution-soft" : "border-rule-strong bg-paper"}`}
    >
      <p className="font-semibold">
        <span aria-hidden="true">{tone === "caution" ? "⚠ " : "◆ "}</span>
        {title}
      </p>
      <div className="text-ink">{children}</div>
      <div className="flex justify-end">
        <button type="button" className="min-h-11 px-2 text-sm font-medium text-accent" onClick={onDismiss}>
          Got it
        </button>
      </div>
    </aside>
  );
}

/** Safety cautions for one layer, in one card (each kind only where it first applies in the trial). */
export function SafetyCautions({
  context,
  kinds,
  dyes,
}: {
  /** Where this is shown, e.g. the trial id: dismissing hides it there. */
  context: string;
  kinds: CautionKey[];
  dyes: Pick<LayerDyeDto, "dyeId" | "dyeName" | "sdsUrl">[];
}) {
  const isDismissed = useDismissed();
  const shown = kinds.filter((k) => !isDismissed(`${context}:${k}`));
  if (shown.length === 0) return null;
  return (
    <Card tone="safety" title="Safety" onDismiss={() => shown.forEach((k) => dismiss(`${context}:${k}`))}>
      <ul className="space-y-1">
        {shown.map((k) => (
          <li key={k}>
            <strong className="font-semibold">{CAUTION_TEXT[k].title}:</strong> {CAUTION_TEXT[k].body}
          </li>
        ))}
      </ul>
      {shown.some((k) => k === "powder" || k === "disposal") && <SafetySheets dyes={dyes} />}
      <p className="mt-1 text-ink-soft">{FIRST_PRIORITY}</p>
    </Card>
  );
}

/** Recipe warnings (fibre and dye class, superwash and heat, old stock, scaling): dismissible, never blocking. */
export function Warnings({ items }: { items: Pick<TrialWarning, "key" | "message">[] }) {
  const isDismissed = useDismissed();
  const shown = items.filter((w) => !isDismissed(`warning:${w.key}`));
  if (shown.length === 0) return null;
  return (
    <div className="space-y-2">
      {shown.map((w) => (
        <Card key={w.key} tone="caution" title="Worth knowing" onDismiss={() => dismiss(`warning:${w.key}`)}>
          <p>{w.message}</p>
        </Card>
      ))}
    </div>
  );
}
