"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { useStudio } from "@/components/studio/studio-context";
import { primeAlerts } from "./alerts";
import type { TimerPreset } from "./presets";
import { useStartTimer } from "./use-timers";

export { presetsFor } from "./presets";

/** Start buttons for a layer's step timers: the setting step in one tap, others one tap further. */
export function TimerStart({
  trialId,
  layerId,
  presets,
}: {
  trialId: string;
  layerId: string;
  presets: TimerPreset[];
}) {
  const { studioId } = useStudio();
  const start = useStartTimer(studioId);
  const [more, setMore] = useState(false);
  const [custom, setCustom] = useState({ label: "", minutes: "" });
  const go = (label: string, minutes: number) => {
    primeAlerts();
    start.mutate({ trialId, layerId, label, durationSec: Math.round(minutes * 60) }, { onSuccess: () => setMore(false) });
  };
  const [first, ...rest] = presets;
  const customMinutes = Number(custom.minutes.replace(",", "."));
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2">
        {first && (
          <Button variant="plain" disabled={start.isPending} onClick={() => go(first.label, first.minutes)}>
            <svg aria-hidden="true" viewBox="0 0 24 24" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round">
              <circle cx="12" cy="13" r="8" />
              <path d="M12 9v4l2.5 2.5M9.5 2.5h5M12 2.5V5" />
            </svg>{" "}
            {first.label} {first.minutes} min
          </Button>
        )}
        <Button variant="quiet" aria-expanded={more} onClick={() => setMore(!more)}>
          {more ? "Fewer timers" : "Other timer"}
        </Button>
      </div>
      {more && (
        <div className="space-y-2 rounded-md border border-rule bg-paper p-3">
          <div className="flex flex-wrap gap-2">
            {rest.map((p) => (
              <Button key={p.label} variant="plain" disabled={start.isPending} onClick={() => go(p.label, p.minutes)}>
                {p.label} {p.minutes} min
              </Button>
            ))}
          </div>
          <form
            className="flex items-end gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (customMinutes > 0) go(custom.label.trim() || "Step", customMinutes);
            }}
          >
            <label className="min-w-0 flex-1 text-sm text-ink-soft">
              Step
              <input
                className="mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-sheet px-3 text-base text-ink"
                value={custom.label}
                placeholder="Cool down"
                onChange={(e) => setCustom({ ...custom, label: e.target.value })}
              />
            </label>
            <label className="w-20 text-sm text-ink-soft">
              Minutes
              <input
                className="tabular mt-1 block min-h-11 w-full rounded-md border border-rule-strong bg-sheet px-3 text-base text-ink"
                inputMode="decimal"
                value={custom.minutes}
                onChange={(e) => setCustom({ ...custom, minutes: e.target.value })}
              />
            </label>
            <Button type="submit" disabled={!(customMinutes > 0) || start.isPending}>
              Start
            </Button>
          </form>
        </div>
      )}
      {start.error && (
        <p role="alert" className="text-sm text-danger">
          {start.error.message}
        </p>
      )}
    </div>
  );
}
