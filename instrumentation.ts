// Next calls register() once when a server process starts. In the Node runtime (not the edge,
// not while building) it runs the background jobs (lib/jobs: mail outbox, upload sweep, photo
// clean-up, reading re-computation) in this process, unless UNDERTONE_WORKER=off says a
// separate `npm run worker` does. Jobs live in Postgres, so either way nothing is lost on restart.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  if (process.env.UNDERTONE_WORKER === "off") return;
  const { startWorkerWhenReady } = await import("./lib/jobs/worker");
  startWorkerWhenReady();
}
