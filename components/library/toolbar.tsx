"use client";

import { useId } from "react";
import { inputClass } from "@/components/ui/field";

// The row of search and filter controls above each library list. Wraps on a phone.

export function Toolbar({ children }: { children: React.ReactNode }) {
  return <div className="mb-3 flex flex-wrap items-end gap-3">{children}</div>;
}

export function SearchBox({ value, onChange, label, placeholder }: { value: string; onChange: (v: string) => void; label: string; placeholder: string }) {
  const id = useId();
  return (
    <div className="min-w-0 flex-[2_1_14rem]">
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
