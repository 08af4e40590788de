"use client";

import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useSyncExternalStore } from "react";
import { useCan } from "@/components/studio/studio-context";
import { BasesPanel } from "./bases-panel";
import { DyesPanel } from "./dyes-panel";
import { StocksPanel } from "./stocks-panel";

// The studio's libraries on one page, one tab each; the tab lives in the URL (?tab=dyes) so a
// link or a reload lands on the same list.

const TABS = [
  { id: "bases", label: "Bases", Panel: BasesPanel },
  { id: "dyes", label: "Dyes", Panel: DyesPanel },
  { id: "stocks", label: "Stock solutions", Panel: StocksPanel },
] as const;
type TabId = (typeof TABS)[number]["id"];

const noSubscribe = () => () => {};
/**
 * False on the server and while hydrating, true after. The device's kept query cache can be
 * restored before this page hydrates, so the lists wait for it: the first client render then
 * matches the server's HTML.
 */
function useHydrated(): boolean {
  return useSyncExternalStore(noSubscribe, () => true, () => false);
}

export function LibraryClient() {
  const params = useSearchParams();
  const router = useRouter();
  const pathname = usePathname();
  const canEdit = useCan("library.edit");
  const hydrated = useHydrated();
  const asked = params.get("tab");
  const tab: TabId = TABS.some((t) => t.id === asked) ? (asked as TabId) : "bases";
  const active = TABS.find((t) => t.id === tab)!;

  const select = (id: TabId) => router.replace(id === "bases" ? pathname : `${pathname}?tab=${id}`, { scroll: false });

  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-3xl">Library</h1>
        {!canEdit && <p className="mt-1 text-ink-soft">The studio&apos;s yarns, dyes and stock solutions, to read.</p>}
      </header>
      <div
        role="tablist"
        aria-label="Library sections"
        className="flex gap-1 overflow-x-auto border-b border-rule"
        onKeyDown={(e) => {
          // Arrow keys move between tabs, as screen-reader users expect of a tab list.
          if (e.key !== "ArrowRight" && e.key !== "ArrowLeft") return;
          const i = TABS.findIndex((t) => t.id === tab);
          const next = TABS[(i + (e.key === "ArrowRight" ? 1 : TABS.length - 1)) % TABS.length];
          select(next.id);
          document.getElementById(`library-tab-${next.id}`)?.focus();
        }}
      >
        {TABS.map((t) => (
          <button
            key={t.id}
            id={`library-tab-${t.id}`}
            type="button"
            role="tab"
            aria-selected={t.id === tab}
            aria-controls="library-panel"
            tabIndex={t.id === tab ? 0 : -1}
            onClick={() => select(t.id)}
            className={`-mb-px min-h-11 shrink-0 border-b-2 px-3 text-base whitespace-nowrap ${
              t.id === tab ? "border-accent font-medium text-accent" : "border-transparent text-ink-soft hover:text-ink"
            }`}
          >
            {t.label}
          </button>
        ))}
      </div>
      <section id="library-panel" role="tabpanel" aria-labelledby={`library-tab-${tab}`}>
        {hydrated ? <active.Panel /> : <p className="py-6 text-ink-faint">Loading the library…</p>}
      </section>
    </div>
  );
}
