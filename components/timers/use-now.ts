"use client";

import { useEffect, useState } from "react";

/**
 * This device's clock, re-read a few times a second while `active`. Countdowns are worked out
 * from it and the server's start time on every render, never by counting ticks, so a page that
 * slept behind a locked screen shows the right time the moment it wakes.
 */
export function useNow(active: boolean, everyMs = 500): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!active) return;
    setNow(Date.now());
    const id = setInterval(() => setNow(Date.now()), everyMs);
    const wake = () => setNow(Date.now());
    document.addEventListener("visibilitychange", wake);
    return () => {
      clearInterval(id);
      document.removeEventListener("visibilitychange", wake);
    };
  }, [active, everyMs]);
  return now;
}

/** 1234 s → "20:34"; 4000 s → "1:06:40". Whole seconds, rounded up while counting down. */
export function formatClock(sec: number): string {
  const s = Math.max(0, Math.ceil(sec));
  const h = Math.floor(s / 3600), m = Math.floor((s % 3600) / 60), r = s % 60;
  const mm = h ? String(m).padStart(2, "0") : String(m);
  return `${h ? `${h}:` : ""}${mm}:${String(r).padStart(2, "0")}`;
}
