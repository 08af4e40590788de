"use client";

import Link from "next/link";
import { useEffect, useMemo, useRef, useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { timerLeftSec } from "@/lib/schemas/timer";
import { markRung, ringTimer, rungTimers } from "./alerts";
import { formatClock, useNow } from "./use-now";
import { type TimerDto, useTimerAction, useTimers } from "./use-timers";
import { useWakeLock } from "./wake-lock";

/** Rows shown before the rest fold away behind "n more": the bar must not eat the page. */
const FOLDED_ROWS = 2;

/**
 * The studio's running step timers, on every studio page: just above the bottom bar on a phone,
 * a card in the lower right corner on a wide screen. Rings once when a step's time is up.
 */
export function TimerBar() {
  const { studioId } = useStudio();
  const canUse = useCan("timer.use");
  const timers = useTimers(studioId);
  const items = useMemo(() => timers.data?.items ?? [], [timers.data]);
  const skew = timers.data?.skewMs ?? 0;
  const anyRunning = items.some((t) => t.state === "running");
  const now = useNow(anyRunning) + skew;
  const [rung, setRung] = useState<Set<string>>(() => new Set());
  const [open, setOpen] = useState(false);
  const action = useTimerAction(studioId);
  useWakeLock(anyRunning);

  useEffect(() => setRung(rungTimers()), []);

  // Ring for every running step that has reached zero and has not rung on this device.
  const ringing = useRef(rung);
  ringing.current = rung;
  useEffect(() => {
    const due = items.filter((t) => t.state === "running" && timerLeftSec(t, now) <= 0 && !ringing.current.has(t.id));
    if (due.length === 0) return;
    for (const t of due) ringTimer(t.label, t.trialTitle, t.id);
    const next = new Set(ringing.current);
    due.forEach((t) => next.add(t.id));
    // Forget timers that have left the list so the stored set stays small.
    const keep = new Set([...next].filter((id) => items.some((t) => t.id === id)));
    markRung(keep);
    setRung(keep);
  }, [items, now]);

  if (items.length === 0) return null;
  const sorted = [...items].sort((a, b) => timerLeftSec(a, now) - timerLeftSec(b, now));
  const shown = open ? sorted : sorted.slice(0, FOLDED_ROWS);
  const hidden = sorted.length - shown.length;

  return (
    <>
      {/* Keeps the end of the page clear of the bar on a phone. */}
      <div aria-hidden="true" className="md:hidden" style={{ height: `${shown.length * 3.5 + (hidden || open ? 2.75 : 0)}rem` }} />
      <section
        aria-label="Step timers"
        className="no-print fixed inset-x-0 bottom-[calc(3.5rem+env(safe-area-inset-bottom))] z-30 border-t border-rule-strong bg-sheet/95 shadow-[0_-2px_8px_rgba(36,32,28,0.08)] backdrop-blur md:inset-x-auto md:right-4 md:bottom-4 md:w-96 md:rounded-lg md:border"
      >
        <ul className="mx-auto max-w-xl divide-y divide-rule">
          {shown.map((t) => (
            <TimerRow
              key={t.id}
              timer={t}
              leftSec={timerLeftSec(t, now)}
              rang={rung.has(t.id)}
              canUse={canUse}
              busy={action.isPending && action.variables?.timer.id === t.id}
              href={`/s/${studioId}/trials/${t.trialId}`}
              onAction={(a) => {
                if (a === "cancel" && !confirm(`Stop “${t.label}” without finishing it?`)) return;
                action.mutate({ timer: t, action: a });
              }}
            />
          ))}
        </ul>
        {(hidden > 0 || open) && (
          <button
            type="button"
            onClick={() => setOpen(!open)}
            className="block min-h-11 w-full border-t border-rule text-sm text-accent"
            aria-expanded={open}
          >
            {open ? "Show fewer timers" : `${hidden} more ${hidden === 1 ? "timer" : "timers"}`}
          </button>
        )}
        {action.error && (
          <p role="alert" className="border-t border-rule px-4 py-2 text-sm text-danger">
            {action.error.message}
          </p>
        )}
      </section>
    </>
  );
}

function TimerRow({
  timer: t,
  leftSec,
  rang,
  canUse,
  busy,
  href,
  onAction,
}: {
  timer: TimerDto;
  leftSec: number;
  rang: boolean;
  canUse: boolean;
  busy: boolean;
  href: string;
  onAction: (a: "pause" | "resume" | "finish" | "cancel") => void;
}) {
  // Once a step has rung on this device it stays "time is up", even if a later clock check nudges it.
  const due = t.state === "running" && (leftSec <= 0 || rang);
  const iconBtn = "flex h-11 w-11 shrink-0 items-center justify-center rounded-md border text-lg disabled:opacity-50";
  return (
    <li className={`flex h-14 items-center gap-2 px-3 ${due ? "bg-caution-soft" : ""}`} data-timer-state={due ? "due" : t.state}>
      <Link href={href} className="flex min-h-11 min-w-0 flex-1 flex-col justify-center leading-tight">
        <span className="truncate font-medium">{t.label}</span>
        <span className="truncate text-xs text-ink-soft">{t.trialTitle}</span>
      </Link>
      <span
        className={`tabular shrink-0 text-right font-mono text-xl ${due ? "font-semibold text-caution" : t.state === "paused" ? "text-ink-faint" : ""}`}
        aria-live={due ? "assertive" : "off"}
        role="timer"
        aria-label={due ? `${t.label}: time is up` : `${t.label}: ${formatClock(leftSec)} left${t.state === "paused" ? ", paused" : ""}`}
      >
        {due ? (leftSec < -59 ? `+${formatClock(-leftSec)}` : "Time’s up") : formatClock(leftSec)}
      </span>
      {canUse && (
        <>
          {!due && (
            <button
              type="button"
              disabled={busy}
              className={`${iconBtn} border-rule-strong bg-sheet`}
              aria-label={t.state === "paused" ? `Resume ${t.label}` : `Pause ${t.label}`}
              onClick={() => onAction(t.state === "paused" ? "resume" : "pause")}
            >
              {t.state === "paused" ? "▶" : "❚❚"}
            </button>
          )}
          <button
            type="button"
            disabled={busy}
            className={`flex h-11 shrink-0 items-center justify-center rounded-md border px-3 font-medium disabled:opacity-50 ${
              due ? "border-accent bg-accent text-accent-ink" : "border-rule-strong bg-sheet text-ink"
            }`}
            aria-label={`Finish ${t.label}`}
            onClick={() => onAction("finish")}
          >
            Done
          </button>
          {!due && (
            <button
              type="button"
              disabled={busy}
              className={`${iconBtn} border-transparent text-ink-soft`}
              aria-label={`Cancel ${t.label}`}
              onClick={() => onAction("cancel")}
            >
              ×
            </button>
          )}
        </>
      )}
    </li>
  );
}
