import "server-only";
import { getEm } from "@/lib/db";
import { sweepPendingUploads } from "./photos";

const timer = globalThis as unknown as { __undertoneSweepTimer?: ReturnType<typeof setInterval> };

/** Once an hour, removes uploads that were started but never confirmed for a day. */
export function startSweepTimer(everyMs = 3_600_000): void {
  if (timer.__undertoneSweepTimer) return;
  timer.__undertoneSweepTimer = setInterval(async () => {
    try {
      await sweepPendingUploads(await getEm());
    } catch (e) {
      console.error("photo sweep failed", e);
    }
  }, everyMs);
  timer.__undertoneSweepTimer.unref?.();
}
