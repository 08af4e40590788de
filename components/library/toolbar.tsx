"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";

// Search and filter controls above each library list. On a phone the filters fold away behind
// one button (showing how many are set), so the list starts near the top of the screen.

export function Toolbar({ search, active, children }: { search: React.ReactNode; active: number; children: React.ReactNode }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  return (
    <div className="mb-3 space-y-3 lg:flex lg:flex-wrap lg:items-end lg:gap-3 lg:space-y-0">
      <div className="flex items-end gap-2 lg:flex-[2_1_14rem]">
        {search}
        <Button variant="plain" className="shrink-0 lg:hidden" aria-expanded={open} aria-controls={id} onClick={() => setOpen(!open)}>
          Filters{active > 0 ? ` · ${active}` : ""}
        </Button>
      </div>
      <div id={id} className={`${open ? "flex" : "hidden"} flex-wrap items-end gap-3 lg:contents`}>
        {children}
      </div>
    </div>
  );
}

export function SearchBox({ value, onChange, label, placeholder }: { value: string; onChange: (v: string) => void; label: string; placeholder: string }) {
  const id = useId();
  return (
    <div className="min-w-0 flex-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <input id={id} type="search" className={inputClass} value={value} placeholder={placeholder} onChange={(e) => onChange(e.target.value)} />
    </div>
  );
}

export function FilterSelect({
  label,
  value,
  onChange,
  options,
  allLabel = "All",
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  options: { value: string; label: string }[];
  allLabel?: string;
}) {
  const id = useId();
  return (
    <div className="min-w-0 flex-[1_1_9rem]">
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <select id={id} className={inputClass} value={value} onChange={(e) => onChange(e.target.value)}>
        <option value="">{allLabel}</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** Column filters in tanstack's shape, from a record of non-empty values. */
export function toColumnFilters(values: Record<string, string>): { id: string; value: string }[] {
  return Object.entries(values)
    .filter(([, v]) => v !== "")
    .map(([id, value]) => ({ id, value }));
}
