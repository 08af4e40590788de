"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo } from "react";
import { type TrialListParams, searchString } from "./use-trials";

// The list's search, filters, sort and page live in the URL, so a reload, the back button and a
// shared link all show the same list. The URL is changed with history.replaceState, which Next's
// router picks up for useSearchParams without asking the server for the page again.

export const FILTER_KEYS = ["baseId", "dyeId", "method", "tag", "authorId", "status", "from", "to"] as const;
const KEYS = ["q", ...FILTER_KEYS, "sort", "dir", "page", "pageSize"] as const;

export function useTrialListParams(): [TrialListParams, (patch: TrialListParams) => void] {
  const sp = useSearchParams();
  const pathname = usePathname();
  const params = useMemo(() => {
    const out: TrialListParams = {};
    for (const k of KEYS) {
      const v = sp.get(k);
      if (v) out[k] = v;
    }
    return out;
  }, [sp]);
  const set = useCallback(
    (patch: TrialListParams) => {
      const next: TrialListParams = { ...params, ...patch };
      // Any change but the page itself starts again from page 1.
      if (!("page" in patch)) delete next.page;
      const qs = searchString(next);
      window.history.replaceState(null, "", qs ? `${pathname}?${qs}` : pathname);
    },
    [params, pathname],
  );
  return [params, set];
}

export function activeFilterCount(p: TrialListParams): number {
  return FILTER_KEYS.filter((k) => p[k]).length;
}
