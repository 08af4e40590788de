"use client";

import { useId, useState } from "react";
import { formatAmount, parseAmount } from "@/colour/units";
import { inputClass } from "@/components/ui/field";

// A volume typed the way the dyer measures it ("500", "500 ml", "1 l", "2 cups"), kept in ml.

/** Millilitres from what was typed; a bare number is millilitres. */
export function readVolume(text: string): { ml: number } | { error: string } {
  const t = text.trim();
  if (!t) return { error: "Enter the volume." };
  if (/^\d+([.,]\d+)?$/.test(t)) return { ml: Number(t.replace(",", ".")) };
  try {
    const a = parseAmount(t);
    if (a.ml === undefined) return { error: "Give a volume (ml, l, cups, fl oz), not a weight or a percentage." };
    return { ml: Math.round(a.ml * 10) / 10 };
  } catch (e) {
    return { error: e instanceof Error ? e.message : "Could not read that volume." };
  }
}

export function VolumeField({
  label,
  value,
  onChange,
  error,
  unitSystem,
}: {
  label: string;
  value: number | undefined;
  onChange: (ml: number) => void;
  error?: string;
  unitSystem: "metric" | "us";
}) {
  const id = useId();
  const [text, setText] = useState(value !== undefined && Number.isFinite(value) ? `${value} ml` : "");
  const [readError, setReadError] = useState("");
  const shown = readError || error;
  const ok = !readError && value !== undefined && Number.isFinite(value) && value > 0;
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <input
        id={id}
        className={inputClass}
        value={text}
        autoComplete="off"
        placeholder={unitSystem === "us" ? "e.g. 2 cups or 500 ml" : "e.g. 500 ml or 1 l"}
        aria-invalid={shown ? true : undefined}
        aria-describedby={`${id}-note`}
        onChange={(e) => {
          setText(e.target.value);
          const r = readVolume(e.target.value);
          if ("ml" in r) {
            setReadError("");
            onChange(r.ml);
          } else {
            setReadError(e.target.value.trim() ? r.error : "");
            onChange(Number.NaN);
          }
        }}
      />
      <p id={`${id}-note`} className={`text-sm ${shown ? "text-danger" : "text-ink-faint"}`} role={shown ? "alert" : undefined}>
        {shown ? shown : ok ? `= ${formatAmount(value, unitSystem)}` : "A plain number is millilitres."}
      </p>
    </div>
  );
}
