"use client";

import Link from "next/link";
import { useState } from "react";
import { TimeAgo } from "@/components/comments/time-ago";
import { useStudio } from "@/components/studio/studio-context";
import { useMembers } from "@/components/studio/use-members";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { EmptyState, Notice, SectionTitle } from "@/components/ui/sheet";
import { ACTIVITY_KIND_LABELS, ACTIVITY_KINDS } from "@/lib/schemas/activity";
import { type ActivityFilters, hrefFor, useActivity } from "./use-activity";

/** Everything that happened in the studio, newest first, filtered by kind and person. */
export function ActivityFeed() {
  const { studioId } = useStudio();
  const members = useMembers(studioId);
  const [filters, setFilters] = useState<ActivityFilters>({});
  const q = useActivity(studioId, filters);
  const items = q.data?.pages.flatMap((p) => p.items) ?? [];

  return (
    <section aria-labelledby="activity-title">
      <SectionTitle>
        <span id="activity-title">In the studio</span>
      </SectionTitle>
      <div className="mb-3 grid grid-cols-2 gap-3">
        <Select label="What" value={filters.kind ?? ""} onChange={(e) => setFilters((f) => ({ ...f, kind: e.target.value || undefined }))}>
          <option value="">Everything</option>
          {ACTIVITY_KINDS.map((k) => (
            <option key={k} value={k}>
              {ACTIVITY_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
        <Select label="Who" value={filters.actorId ?? ""} onChange={(e) => setFilters((f) => ({ ...f, actorId: e.target.value || undefined }))}>
          <option value="">Everyone</option>
          {(members.data ?? []).map((m) => (
            <option key={m.userId} value={m.userId}>
              {m.name}
            </option>
          ))}
        </Select>
      </div>
      {q.isError && <Notice tone="danger">Could not load the activity. {q.error.message}</Notice>}
      {q.isPending && <p className="py-3 text-ink-soft">Loading…</p>}
      {q.isSuccess && items.length === 0 && (
        <EmptyState title={filters.kind || filters.actorId ? "Nothing matches" : "Nothing has happened yet"}>
          {filters.kind || filters.actorId ? "Try everything, or everyone." : "New trials, layers, readings, colourways, lots and comments appear here."}
        </EmptyState>
      )}
      {items.length > 0 && (
        <ol className="divide-y divide-rule" aria-label="Activity">
          {items.map((e) => {
            const href = hrefFor(studioId, e);
            const text = (
              <span className="line-clamp-3">
                <span className="font-medium text-ink">{e.actor?.name ?? "Someone"}</span> <span className="text-ink-soft">{e.summary}</span>
              </span>
            );
            return (
              <li key={e.id} className="py-2">
                {href ? (
                  <Link href={href} className="-mx-2 block min-h-11 rounded-md px-2 py-1 hover:bg-sheet">
                    {text}
                    <TimeAgo iso={e.createdAt} className="block text-sm text-ink-faint" />
                  </Link>
                ) : (
                  <div className="py-1">
                    {text}
                    <TimeAgo iso={e.createdAt} className="block text-sm text-ink-faint" />
                  </div>
                )}
              </li>
            );
          })}
        </ol>
      )}
      {q.hasNextPage && (
        <Button variant="plain" className="mt-2 w-full" onClick={() => q.fetchNextPage()} disabled={q.isFetchingNextPage}>
          {q.isFetchingNextPage ? "Loading…" : "Show older"}
        </Button>
      )}
    </section>
  );
}
