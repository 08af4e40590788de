"use client";

import { useQuery } from "@tanstack/react-query";
import { api } from "@/components/api";
import type { Lab } from "@/colour/types";
import type { ColourMatch } from "@/lib/learning/colour-search";

export type { ColourMatch };

/** The studio's readings and colourways nearest a colour in ΔE00. */
export function useColourSearch(studioId: string, target: Lab | null) {
  const q = target ? `L=${target.L.toFixed(2)}&a=${target.a.toFixed(2)}&b=${target.b.toFixed(2)}` : "";
  return useQuery({
    queryKey: ["studios", studioId, "colour-search", q],
    queryFn: () => api<{ target: Lab; readings: ColourMatch[]; colourways: ColourMatch[] }>(`/api/studios/${studioId}/colour-search?${q}`),
    enabled: !!target,
    placeholderData: (prev) => prev,
  });
}
