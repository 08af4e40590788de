"use client";

import Link from "next/link";
import { OUNCE_G } from "@/colour/measures";
import { METHOD_LABELS, STATUS_LABELS, type TrialStatus } from "@/lib/schemas/trial";
import type { TrialSummaryDto } from "@/lib/trials/types";

// One trial in the list: a card on a phone, a table row on wider screens. The dyes' colours are
// the loudest thing in the row.

const STATUS_STYLE: Record<TrialStatus, string> = {
  planned: "border-rule-strong text-ink-soft",
  "in-progress": "border-accent/40 bg-accent-soft text-accent",
  done: "border-ok/30 bg-ok-soft text-ok",
};

export function StatusMark({ status }: { status: TrialStatus }) {
  return (
    <span className={`inline-flex shrink-0 items-center rounded-full border px-2 py-0.5 text-xs font-medium whitespace-nowrap ${STATUS_STYLE[status]}`}>
      {STATUS_LABELS[status]}
    </span>
  );
}

/** Colour chips of the dyes in a trial, in layer order, named for screen readers. */
export function DyeChips({ dyes, size = "md" }: { dyes: TrialSummaryDto["dyes"]; size?: "sm" | "md" }) {
  if (dyes.length === 0) return <span className="text-sm text-ink-faint">No dyes yet</span>;
  const box = size === "sm" ? "h-4 w-4" : "h-6 w-6";
  return (
    <ul className="flex flex-wrap items-center gap-1" aria-label={`Dyes: ${dyes.map((d) => d.name).join(", ")}`}>
      {dyes.map((d) => (
        <li
          key={d.dyeId}
          title={d.name}
          className={`${box} shrink-0 rounded-sm border border-ink/20`}
          style={
            d.displayHex
              ? { background: d.displayHex }
              : { background: "repeating-linear-gradient(45deg, var(--color-rule) 0 3px, var(--color-sheet) 3px 6px)" }
          }
        />
      ))}
    </ul>
  );
}

export function formatDay(iso: string): string {
  const d = new Date(iso);
  const sameYear = d.getFullYear() === new Date().getFullYear();
  return d.toLocaleDateString(undefined, { day: "numeric", month: "short", ...(sameYear ? {} : { year: "numeric" }) });
}

export function fibreText(g: number, unitSystem: "metric" | "us" = "metric"): string {
  const grams = `${Math.round(g * 10) / 10} g`;
  return unitSystem === "us" ? `${grams} (${(g / OUNCE_G).toFixed(1)} oz)` : grams;
}

const methodsText = (t: TrialSummaryDto) => t.methods.map((m) => METHOD_LABELS[m]).join(" · ");

export function TrialCard({ t, href, unitSystem }: { t: TrialSummaryDto; href: string; unitSystem: "metric" | "us" }) {
  return (
    <li>
      <Link href={href} className="block rounded-lg border border-rule bg-sheet p-4 active:bg-paper">
        <div className="flex items-start justify-between gap-3">
          <p className="min-w-0 font-serif text-lg leading-snug font-semibold">{t.title}</p>
          <StatusMark status={t.status} />
        </div>
        <div className="mt-2 flex items-center gap-3">
          <DyeChips dyes={t.dyes} />
          {t.methods.length > 0 && <span className="min-w-0 truncate text-sm text-ink-soft">{methodsText(t)}</span>}
        </div>
        <p className="tabular mt-2 text-sm text-ink-soft">
          {[t.base?.name ?? "No base", fibreText(t.fibreWeightG, unitSystem), t.author.name].join(" · ")}
        </p>
        <p className="tabular text-sm text-ink-faint">Changed {formatDay(t.updatedAt)}</p>
      </Link>
    </li>
  );
}

export function TrialTableRow({ t, href, unitSystem }: { t: TrialSummaryDto; href: string; unitSystem: "metric" | "us" }) {
  return (
    <tr className="border-t border-rule align-top hover:bg-paper/70">
      <td className="py-3 pr-3 pl-4">
        <Link href={href} className="font-medium text-ink underline-offset-4 hover:underline">
          {t.title}
        </Link>
        {t.tags.length > 0 && <p className="mt-0.5 text-sm text-ink-faint">{t.tags.map((x) => `#${x}`).join(" ")}</p>}
      </td>
      <td className="py-3 pr-3">
        <DyeChips dyes={t.dyes} />
        {t.methods.length > 0 && <p className="mt-1 text-sm text-ink-soft">{methodsText(t)}</p>}
      </td>
      <td className="tabular py-3 pr-3 text-sm">
        <p>{t.base?.name ?? <span className="text-ink-faint">No base</span>}</p>
        <p className="text-ink-soft">{fibreText(t.fibreWeightG, unitSystem)}</p>
      </td>
      <td className="py-3 pr-3 text-sm whitespace-nowrap text-ink-soft">{t.author.name}</td>
      <td className="tabular py-3 pr-3 text-sm whitespace-nowrap text-ink-soft">{formatDay(t.updatedAt)}</td>
      <td className="py-3 pr-4">
        <StatusMark status={t.status} />
      </td>
    </tr>
  );
}
