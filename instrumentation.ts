// Next calls register() once when a server process starts. In the Node runtime (not the edge,
// not while building) it starts the periodic mail-outbox flush and the sweep of abandoned photo uploads.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startOutboxTimer } = await import("./lib/outbox");
  startOutboxTimer();
  const { startSweepTimer } = await import("./lib/photos/sweep-timer");
  startSweepTimer();
}
