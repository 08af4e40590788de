"use client";

import Link from "next/link";
import { useStudio } from "@/components/studio/studio-context";
import { buttonClass } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { Chip } from "./colour-bits";
import { useColourways, type ColourwayDto } from "./use-colourways";

export const STATUS_WORDS: Record<string, string> = { candidate: "Candidate", repeatable: "Repeatable", retired: "Retired" };

/** What a colourway still needs, in words: "1 of 2 passing lots". */
export function statusNeeds(c: Pick<ColourwayDto, "status" | "passingLots" | "lotsNeeded">): string {
  if (c.status === "retired") return "No longer dyed";
  if (c.status === "repeatable") return `${c.passingLots} passing lots`;
  return `${Math.min(c.passingLots, c.lotsNeeded)} of ${c.lotsNeeded} passing lots`;
}

/** The studio's colourways, newest change first, with links to the profiles and the colour search. */
export function ColourwaysClient() {
  const { studioId } = useStudio();
  const list = useColourways(studioId);
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <h1 className="text-3xl">Colourways</h1>
        <nav className="flex flex-wrap gap-2" aria-label="Colour tools">
          <Link href={`/s/${studioId}/find`} className={buttonClass("plain")}>
            Find by colour
          </Link>
          <Link href={`/s/${studioId}/profiles`} className={buttonClass("plain")}>
            Dye profiles
          </Link>
        </nav>
      </header>
      {list.error && <Notice tone="danger">{list.error.message}</Notice>}
      {list.data && list.data.length === 0 && (
        <EmptyState title="No colourways yet">Open a trial with a measured result and choose “Make this a colourway”.</EmptyState>
      )}
      <ul className="space-y-2">
        {list.data?.map((c) => (
          <li key={c.id}>
            <Link href={`/s/${studioId}/colourways/${c.id}`} className="flex min-h-11 items-center gap-3 rounded-lg border border-rule bg-sheet p-3 hover:bg-paper">
              <Chip lab={c.target} size="h-12 w-12" label={`Target colour of ${c.name}`} />
              <span className="min-w-0 flex-1">
                <span className="block truncate font-medium">{c.name}</span>
                <span className="block text-sm text-ink-soft">
                  {STATUS_WORDS[String(c.status)]} · {statusNeeds(c)}
                </span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}
