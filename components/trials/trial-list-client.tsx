"use client";

import { useEffect, useRef, useState, useSyncExternalStore } from "react";
import { useAccount } from "@/components/account/use-account";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button, buttonClass } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { TrialListDialog } from "./trial-list-dialog";
import { ActiveFilters, TrialListFilters } from "./trial-list-filters";
import { NewTrialDialog } from "./trial-list-new";
import { TrialCard, TrialTableRow } from "./trial-list-row";
import { activeFilterCount, useTrialListParams } from "./use-trial-list-params";
import { exportHref, useTrialFacets, useTrials } from "./use-trials";

// The studio's trials: search, filters, sort and pages (all on the server), a CSV download of
// what is shown, and "New trial" within reach of the thumb on a phone.

const SORTS = [
  { value: "updated:desc", label: "Last changed" },
  { value: "created:desc", label: "Newest first" },
  { value: "created:asc", label: "Oldest first" },
  { value: "title:asc", label: "Title A–Z" },
  { value: "title:desc", label: "Title Z–A" },
];

const noop = () => () => {};

export function TrialListSkeleton() {
  return (
    <div className="space-y-4" aria-busy="true">
      <h1 className="text-3xl">Trials</h1>
      <div className="min-h-12 rounded-md border border-rule bg-sheet" />
      <p className="text-ink-soft">Loading the trials…</p>
    </div>
  );
}

export function TrialListClient() {
  const { studioId } = useStudio();
  const canEdit = useCan("trial.edit");
  const [params, set] = useTrialListParams();
  const list = useTrials(studioId, params);
  const facets = useTrialFacets(studioId);
  const account = useAccount();
  const unitSystem = account.data?.unitSystem ?? "metric";
  const [filtersOpen, setFiltersOpen] = useState(false);
  const [newOpen, setNewOpen] = useState(false);
  const [q, setQ] = useState(params.q ?? "");

  // Type, pause, search: the URL (and the query) follow the box a moment later. A change of the
  // URL from elsewhere (back button, "Clear all") comes back into the box.
  const pushed = useRef(params.q ?? "");
  useEffect(() => {
    const v = params.q ?? "";
    if (v !== pushed.current) {
      pushed.current = v;
      setQ(v);
    }
  }, [params.q]);
  useEffect(() => {
    const v = q.trim();
    if (v === pushed.current) return;
    const id = setTimeout(() => {
      pushed.current = v;
      set({ q: v || undefined });
    }, 300);
    return () => clearTimeout(id);
  }, [q, set]);

  const data = list.data;
  const page = data?.page ?? 1;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const filtered = activeFilterCount(params) > 0 || !!params.q;
  const sortValue = `${params.sort ?? "updated"}:${params.dir ?? (params.sort === "title" ? "asc" : "desc")}`;
  const href = (id: string) => `/s/${studioId}/trials/${id}`;
  // Lists come from the (possibly restored, offline) query cache, which the server never sees:
  // render them only once hydrated, so server and client HTML agree.
  const hydrated = useSyncExternalStore(noop, () => true, () => false);
  if (!hydrated) return <TrialListSkeleton />;

  return (
    <div className="space-y-4">
      <header className="flex items-end justify-between gap-3">
        <h1 className="text-3xl">Trials</h1>
        {canEdit && (
          <div className="hidden md:block">
            <Button onClick={() => setNewOpen(true)}>New trial</Button>
          </div>
        )}
      </header>

      <div className="flex gap-2">
        <label className="min-w-0 flex-1">
          <span className="sr-only">Search trials</span>
          <input
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="Search trials and dyes"
            className="block min-h-12 w-full rounded-md border border-rule-strong bg-sheet px-3 text-base text-ink placeholder:text-ink-faint focus:border-accent focus:outline-none"
          />
        </label>
        <Button variant="plain" className="min-h-12 md:hidden" onClick={() => setFiltersOpen(true)}>
          Filters{activeFilterCount(params) > 0 && <span className="tabular rounded-full bg-accent px-2 text-sm text-accent-ink">{activeFilterCount(params)}</span>}
        </Button>
      </div>

      <section aria-label="Filters" className="hidden rounded-lg border border-rule bg-sheet p-4 md:block">
        <TrialListFilters params={params} set={set} facets={facets.data} columns="grid-cols-4" />
      </section>
      <ActiveFilters params={params} set={set} facets={facets.data} />

      <div className="flex flex-wrap items-center justify-between gap-3 border-b border-rule pb-2">
        <p className="tabular text-ink-soft" aria-live="polite">
          {data ? `${data.total} ${data.total === 1 ? "trial" : "trials"}${filtered ? " found" : ""}` : "Loading…"}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-2 text-sm text-ink-soft">
            <span className="hidden sm:inline">Sort</span>
            <select
              aria-label="Sort trials"
              value={sortValue}
              onChange={(e) => {
                const [sort, dir] = e.target.value.split(":");
                set({ sort, dir });
              }}
              className="min-h-11 rounded-md border border-rule-strong bg-sheet px-2 text-base text-ink"
            >
              {SORTS.map((s) => (
                <option key={s.value} value={s.value}>
                  {s.label}
                </option>
              ))}
            </select>
          </label>
          <a href={exportHref(studioId, params)} download className={buttonClass("quiet", "px-2 text-sm")}>
            CSV
          </a>
        </div>
      </div>

      {list.error && <Notice tone="danger">{list.error.message}</Notice>}
      {data && data.items.length === 0 && !filtered && (
        <EmptyState title="No trials yet">
          {canEdit
            ? "Start one with “New trial”: name what you are trying, pick the base and weigh the dry fibre. Layers come next, at the pot."
            : "When the studio's dyers log trials, they appear here."}
        </EmptyState>
      )}
      {data && data.items.length === 0 && filtered && (
        <EmptyState title="No trials match">
          Try fewer words or remove a filter.
        </EmptyState>
      )}

      {data && data.items.length > 0 && (
        <>
          <ul className="space-y-3 md:hidden">
            {data.items.map((t) => (
              <TrialCard key={t.id} t={t} href={href(t.id)} unitSystem={unitSystem} />
            ))}
          </ul>
          <div className="hidden overflow-hidden rounded-lg border border-rule bg-sheet md:block">
            <table className="w-full text-left">
              <thead className="bg-paper/60 text-sm text-ink-soft">
                <tr>
                  <th className="py-2 pr-3 pl-4 font-medium">Trial</th>
                  <th className="py-2 pr-3 font-medium">Dyes and methods</th>
                  <th className="py-2 pr-3 font-medium">Base</th>
                  <th className="py-2 pr-3 font-medium">Dyer</th>
                  <th className="py-2 pr-3 font-medium">Changed</th>
                  <th className="py-2 pr-4 font-medium">Status</th>
                </tr>
              </thead>
              <tbody className={list.isPlaceholderData ? "opacity-60" : undefined}>
                {data.items.map((t) => (
                  <TrialTableRow key={t.id} t={t} href={href(t.id)} unitSystem={unitSystem} />
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}

      {data && pages > 1 && (
        <nav aria-label="Pages" className="flex items-center justify-between gap-3">
          <Button variant="plain" disabled={page <= 1} onClick={() => set({ page: String(page - 1) })}>
            Previous
          </Button>
          <p className="tabular text-ink-soft">
            Page {page} of {pages}
          </p>
          <Button variant="plain" disabled={page >= pages} onClick={() => set({ page: String(page + 1) })}>
            Next
          </Button>
        </nav>
      )}

      {canEdit && <div aria-hidden className="h-16 md:hidden" />}
      {canEdit && (
        <div className="fixed inset-x-0 bottom-[calc(3.5rem+env(safe-area-inset-bottom))] z-20 border-t border-rule bg-paper/95 px-4 py-2 backdrop-blur md:hidden">
          <Button className="w-full min-h-12" onClick={() => setNewOpen(true)}>
            New trial
          </Button>
        </div>
      )}

      <TrialListDialog
        open={filtersOpen}
        onClose={() => setFiltersOpen(false)}
        title="Filters"
        footer={
          <Button className="w-full" onClick={() => setFiltersOpen(false)}>
            {data ? `Show ${data.total} ${data.total === 1 ? "trial" : "trials"}` : "Show trials"}
          </Button>
        }
      >
        <TrialListFilters params={params} set={set} facets={facets.data} />
      </TrialListDialog>
      {canEdit && <NewTrialDialog studioId={studioId} open={newOpen} onClose={() => setNewOpen(false)} facets={facets.data} />}
    </div>
  );
}
