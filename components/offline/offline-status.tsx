"use client";

import { onlineManager } from "@tanstack/react-query";
import Link from "next/link";
import { useState, useSyncExternalStore } from "react";
import { Button } from "@/components/ui/button";
import { useOtherPendingWrites } from "./other-writes";
import { usePendingWrites } from "./pending-view";
import { useReapply } from "./reapply";
import { type Unsent, dismissUnsent, unsentValues, useUnsent } from "./unsent";

export function useOnline(): boolean {
  return useSyncExternalStore(onlineManager.subscribe.bind(onlineManager), () => onlineManager.isOnline(), () => true);
}

/**
 * The connection and the changes it has not carried yet, at the top of every studio page:
 * "Offline" with the promise that changes are kept, "Waiting to send: N changes" with the list,
 * and any change the server refused, with its values kept to apply again.
 */
export function OfflineStatus() {
  const online = useOnline();
  const mine = usePendingWrites();
  const others = useOtherPendingWrites();
  const pending = [...mine.map((w) => ({ mutationId: w.mutationId, label: w.vars.label })), ...others];
  const unsent = useUnsent();
  const [open, setOpen] = useState(false);
  if (online && pending.length === 0 && unsent.length === 0) return null;
  return (
    <div className="no-print sticky top-0 z-20 space-y-px" aria-live="polite">
      {!online && (
        <p className="bg-ink px-4 py-2 text-center text-sm text-paper" role="status">
          Offline — your changes are kept on this device and sent when the connection returns.
        </p>
      )}
      {pending.length > 0 && (
        <div className="border-b border-rule bg-caution-soft">
          <button
            type="button"
            className="mx-auto flex min-h-11 w-full max-w-6xl items-center justify-between gap-3 px-4 text-left text-sm"
            aria-expanded={open}
            onClick={() => setOpen(!open)}
          >
            <span>
              <strong className="font-semibold">Waiting to send: {pending.length}</strong>{" "}
              {pending.length === 1 ? "change" : "changes"}
              {online ? " — sending…" : ""}
            </span>
            <span className="text-accent">{open ? "Hide" : "Show"}</span>
          </button>
          {open && (
            <ol className="mx-auto max-w-6xl list-decimal space-y-1 px-4 pb-3 pl-9 text-sm">
              {pending.map((w) => (
                <li key={w.mutationId}>{w.label}</li>
              ))}
            </ol>
          )}
        </div>
      )}
      {unsent.map((u) => (
        <UnsentNotice key={u.id} u={u} />
      ))}
    </div>
  );
}

function UnsentNotice({ u }: { u: Unsent }) {
  const reapply = useReapply(u.vars.studioId, u.vars.trialId);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const conflict = u.status === 409;
  return (
    <section className="border-b border-danger/30 bg-danger-soft" aria-label="A change that was not saved">
      <div className="mx-auto max-w-6xl space-y-2 px-4 py-3 text-sm">
        <p className="font-semibold text-danger">
          {conflict ? "Not saved — someone else changed this first" : "Not saved — the server refused this change"}
        </p>
        <p>
          {u.vars.trialId ? (
            <Link className="underline" href={`/s/${u.vars.studioId}/trials/${u.vars.trialId}`}>
              {u.vars.label}
            </Link>
          ) : (
            u.vars.label
          )}
          {": "}
          {u.message}
        </p>
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 rounded-md bg-sheet px-3 py-2">
          {unsentValues(u).map((v) => (
            <div key={v.label} className="contents">
              <dt className="text-ink-soft">{v.label}</dt>
              <dd className="tabular break-words">{v.value}</dd>
            </div>
          ))}
        </dl>
        {error && <p className="text-danger">{error}</p>}
        <div className="flex flex-wrap gap-2">
          {!u.kind.startsWith("list:") && (
          <Button
            disabled={busy}
            onClick={async () => {
              setBusy(true);
              setError(null);
              try {
                await reapply(u);
              } catch (e) {
                setError(e instanceof Error ? e.message : String(e));
              } finally {
                setBusy(false);
              }
            }}
          >
            {conflict ? "Apply my values again" : "Try again"}
          </Button>
          )}
          <Button variant="plain" onClick={() => dismissUnsent(u.id)}>
            Let it go
          </Button>
        </div>
      </div>
    </section>
  );
}
