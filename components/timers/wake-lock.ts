"use client";

import { useEffect } from "react";

type Sentinel = { release: () => Promise<void>; released?: boolean };
type WakeLockNav = Navigator & { wakeLock?: { request: (type: "screen") => Promise<Sentinel> } };

/**
 * Keeps the screen on while `active` (a timer is running), where the browser allows it. A lock is
 * dropped whenever the page is hidden, so it is asked for again on coming back.
 */
export function useWakeLock(active: boolean): void {
  useEffect(() => {
    const nav = navigator as WakeLockNav;
    if (!active || !nav.wakeLock) return;
    let lock: Sentinel | null = null;
    let stopped = false;
    const acquire = async () => {
      if (document.visibilityState !== "visible" || (lock && !lock.released)) return;
      try {
        const l = await nav.wakeLock!.request("screen");
        if (stopped) void l.release();
        else lock = l;
      } catch {
        /* refused (battery saver, no permission): the timer still rings */
      }
    };
    void acquire();
    document.addEventListener("visibilitychange", acquire);
    return () => {
      stopped = true;
      document.removeEventListener("visibilitychange", acquire);
      void lock?.release().catch(() => undefined);
    };
  }, [active]);
}
