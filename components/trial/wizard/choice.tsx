"use client";

// Big controls for gloved hands: tiles for one-of-many choices and a row of chips for short lists.

export function Tiles<T extends string>({
  label,
  options,
  value,
  onPick,
  columns = 2,
}: {
  label: string;
  options: { value: T; title: string; hint?: string }[];
  value: T | null;
  onPick: (v: T) => void;
  columns?: 2 | 3;
}) {
  return (
    <div role="radiogroup" aria-label={label} className={`grid gap-2 ${columns === 3 ? "grid-cols-3" : "grid-cols-2"}`}>
      {options.map((o) => (
        <button
          key={o.value}
          type="button"
          role="radio"
          aria-checked={value === o.value}
          onClick={() => onPick(o.value)}
          className={`flex min-h-20 flex-col items-start justify-center rounded-lg border-2 px-3 py-2 text-left ${
            value === o.value ? "border-accent bg-accent-soft" : "border-rule bg-sheet"
          }`}
        >
          <span className="text-lg font-semibold leading-tight">{o.title}</span>
          {o.hint && <span className="mt-0.5 text-sm leading-snug text-ink-soft">{o.hint}</span>}
        </button>
      ))}
    </div>
  );
}

export function Chips<T extends string | number>({
  label,
  options,
  value,
  onPick,
  hideLabel = false,
}: {
  label: string;
  options: { value: T; title: string }[];
  value: T | null;
  onPick: (v: T) => void;
  hideLabel?: boolean;
}) {
  return (
    <fieldset>
      <legend className={hideLabel ? "sr-only" : "mb-1 text-sm font-medium text-ink-soft"}>{label}</legend>
      <div role="radiogroup" aria-label={label} className="flex flex-wrap gap-2">
        {options.map((o) => (
          <button
            key={String(o.value)}
            type="button"
            role="radio"
            aria-checked={value === o.value}
            onClick={() => onPick(o.value)}
            className={`min-h-11 min-w-11 rounded-full border px-4 text-base ${
              value === o.value ? "border-accent bg-accent text-accent-ink" : "border-rule-strong bg-sheet text-ink"
            }`}
          >
            {o.title}
          </button>
        ))}
      </div>
    </fieldset>
  );
}

/** A number field sized for a thumb, with its unit written after it. */
export function NumberField({
  label,
  unit,
  value,
  onChange,
  hint,
  error,
  id,
}: {
  label: string;
  unit?: string;
  value: string;
  onChange: (v: string) => void;
  hint?: React.ReactNode;
  error?: string;
  id: string;
}) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <div className="flex items-center gap-2">
        <input
          id={id}
          inputMode="decimal"
          autoComplete="off"
          value={value}
          onChange={(e) => onChange(e.target.value)}
          aria-invalid={error ? true : undefined}
          className="tabular block min-h-12 w-32 rounded-md border border-rule-strong bg-sheet px-3 text-lg focus:border-accent focus:outline-none"
        />
        {unit && <span className="text-ink-soft">{unit}</span>}
      </div>
      {hint && !error && <div className="text-sm text-ink-soft">{hint}</div>}
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
}
