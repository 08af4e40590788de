"use client";

import { useState } from "react";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { useSetShelfLife, useStudioSettings } from "./use-shelf-life";

// The studio's shelf life for stock solutions: shown to all, changed by the owner.

export function ShelfLife({ studioId, canChange }: { studioId: string; canChange: boolean }) {
  const studio = useStudioSettings(studioId);
  const set = useSetShelfLife(studioId);
  const [editing, setEditing] = useState(false);
  const [days, setDays] = useState("");
  const current = studio.data?.stockShelfLifeDays;
  if (current === undefined) return null;

  if (!editing) {
    return (
      <p className="flex flex-wrap items-center gap-x-2 text-ink-soft">
        <span>
          Stock solutions get an age warning after <strong className="tabular text-ink">{current} days</strong>.
        </span>
        {canChange && (
          <Button
            variant="quiet"
            onClick={() => {
              setDays(String(current));
              setEditing(true);
            }}
          >
            Change
          </Button>
        )}
      </p>
    );
  }
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        set.mutate(Number(days), { onSuccess: () => setEditing(false) });
      }}
    >
      <div>
        <label htmlFor="shelf-life-days" className="block text-sm font-medium text-ink-soft">
          Shelf life (days)
        </label>
        <input id="shelf-life-days" type="number" inputMode="numeric" min={1} max={730} step={1} className={`${inputClass} w-28`} value={days} onChange={(e) => setDays(e.target.value)} />
      </div>
      <Button type="submit" disabled={set.isPending}>
        Save
      </Button>
      <Button variant="quiet" onClick={() => setEditing(false)}>
        Cancel
      </Button>
      {set.error && (
        <p role="alert" className="w-full text-sm text-danger">
          {(set.error instanceof ApiError && set.error.fields?.stockShelfLifeDays) || set.error.message}
        </p>
      )}
    </form>
  );
}
