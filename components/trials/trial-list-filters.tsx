"use client";

import { Field, Select } from "@/components/ui/field";
import { LAYER_METHODS, METHOD_LABELS, STATUS_LABELS, TRIAL_STATUSES } from "@/lib/schemas/trial";
import type { TrialFacets } from "@/lib/trials/types";
import { FILTER_KEYS } from "./use-trial-list-params";
import type { TrialListParams } from "./use-trials";

// The list's filters as large controls: a grid beside the list on wide screens, the body of the
// filter sheet on a phone. Each change applies at once.

type Props = {
  params: TrialListParams;
  set: (patch: TrialListParams) => void;
  facets: TrialFacets | undefined;
  columns?: string;
};

export function TrialListFilters({ params, set, facets, columns = "grid-cols-1 sm:grid-cols-2" }: Props) {
  const pick = (key: keyof TrialListParams) => ({
    value: params[key] ?? "",
    onChange: (e: React.ChangeEvent<HTMLSelectElement | HTMLInputElement>) => set({ [key]: e.target.value || undefined }),
  });
  return (
    <div className={`grid gap-3 ${columns}`}>
      <Select label="Base" {...pick("baseId")}>
        <option value="">Any base</option>
        {facets?.bases.map((b) => (
          <option key={b.id} value={b.id}>
            {b.name}
          </option>
        ))}
      </Select>
      <Select label="Dye" {...pick("dyeId")}>
        <option value="">Any dye</option>
        {facets?.dyes.map((d) => (
          <option key={d.id} value={d.id}>
            {d.name}
          </option>
        ))}
      </Select>
      <Select label="Method" {...pick("method")}>
        <option value="">Any method</option>
        {LAYER_METHODS.map((m) => (
          <option key={m} value={m}>
            {METHOD_LABELS[m]}
          </option>
        ))}
      </Select>
      <Select label="Status" {...pick("status")}>
        <option value="">Any status</option>
        {TRIAL_STATUSES.map((s) => (
          <option key={s} value={s}>
            {STATUS_LABELS[s]}
          </option>
        ))}
      </Select>
      <Select label="Tag" {...pick("tag")}>
        <option value="">Any tag</option>
        {facets?.tags.map((t) => (
          <option key={t} value={t}>
            {t}
          </option>
        ))}
      </Select>
      <Select label="Dyer" {...pick("authorId")}>
        <option value="">Anyone</option>
        {facets?.authors.map((a) => (
          <option key={a.id} value={a.id}>
            {a.name}
          </option>
        ))}
      </Select>
      <Field label="Started on or after" type="date" {...pick("from")} max={params.to} />
      <Field label="Started on or before" type="date" {...pick("to")} min={params.from} />
    </div>
  );
}

/** The applied filters in words, each removable with one tap. */
export function ActiveFilters({ params, set, facets }: Omit<Props, "columns">) {
  const words: Record<(typeof FILTER_KEYS)[number], (v: string) => string> = {
    baseId: (v) => facets?.bases.find((b) => b.id === v)?.name ?? "A base",
    dyeId: (v) => facets?.dyes.find((d) => d.id === v)?.name ?? "A dye",
    method: (v) => METHOD_LABELS[v as keyof typeof METHOD_LABELS] ?? v,
    tag: (v) => `#${v}`,
    authorId: (v) => `by ${facets?.authors.find((a) => a.id === v)?.name ?? "someone"}`,
    status: (v) => STATUS_LABELS[v as keyof typeof STATUS_LABELS] ?? v,
    from: (v) => `from ${v}`,
    to: (v) => `until ${v}`,
  };
  const active = FILTER_KEYS.filter((k) => params[k]);
  if (active.length === 0) return null;
  return (
    <ul className="flex flex-wrap gap-2" aria-label="Filters in use">
      {active.map((k) => (
        <li key={k}>
          <button
            type="button"
            onClick={() => set({ [k]: undefined })}
            className="inline-flex min-h-11 items-center gap-2 rounded-full border border-rule-strong bg-sheet px-3 text-sm text-ink hover:bg-paper"
            aria-label={`Remove filter: ${words[k](params[k]!)}`}
          >
            {words[k](params[k]!)}
            <span aria-hidden className="text-lg leading-none text-ink-faint">
              ×
            </span>
          </button>
        </li>
      ))}
      {active.length > 1 && (
        <li>
          <button
            type="button"
            onClick={() => set(Object.fromEntries(FILTER_KEYS.map((k) => [k, undefined])))}
            className="inline-flex min-h-11 items-center px-2 text-sm text-accent underline underline-offset-4"
          >
            Clear all
          </button>
        </li>
      )}
    </ul>
  );
}
