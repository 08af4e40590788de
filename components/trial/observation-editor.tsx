"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";

/** What the dyer saw, written straight on the layer card: one tap to open, one to keep. */
export function ObservationEditor({ text, canEdit, onSave }: { text: string; canEdit: boolean; onSave: (t: string) => void }) {
  const [draft, setDraft] = useState<string | null>(null);
  if (draft !== null) {
    return (
      <form
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (draft.trim() !== text.trim()) onSave(draft.trim());
          setDraft(null);
        }}
      >
        <label className="block text-sm font-medium text-ink-soft" htmlFor="obs">
          What you see
        </label>
        <textarea
          id="obs"
          autoFocus
          rows={3}
          maxLength={5000}
          value={draft}
          onChange={(e) => setDraft(e.target.value)}
          placeholder="e.g. blue broke out at the tips"
          className="block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-base"
        />
        <div className="flex gap-2">
          <Button type="submit">Keep note</Button>
          <Button variant="plain" onClick={() => setDraft(null)}>
            Cancel
          </Button>
        </div>
      </form>
    );
  }
  return (
    <div>
      {text && (
        <p className="whitespace-pre-line">
          <span className="text-sm text-ink-soft">Seen: </span>
          {text}
        </p>
      )}
      {canEdit && (
        <Button variant="quiet" className="-ml-4" onClick={() => setDraft(text)}>
          {text ? "Change what you saw" : "Write what you see"}
        </Button>
      )}
    </div>
  );
}
