// npm run worker: runs the background jobs (lib/jobs) without the web server, against
// DATABASE_URL. Start the web server with UNDERTONE_WORKER=off when this runs beside it; any
// number of workers may run at once. Stops on SIGTERM/SIGINT after the running jobs finish.
export {};
process.env.UNDERTONE_WORKER = "on";
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

const { startWorker, stopWorker } = await import("../lib/jobs/worker");
const { getOrm } = await import("../lib/db");

const poll = process.env.WORKER_POLL_SECONDS ? Number(process.env.WORKER_POLL_SECONDS) : undefined;
for (;;) {
  try {
    await startWorker({ pollingIntervalSeconds: poll });
    break;
  } catch (e) {
    console.error(`worker: cannot start yet (${e instanceof Error ? e.message : e}); retrying in 5 s`);
    await new Promise((r) => setTimeout(r, 5000));
  }
}
console.log(`worker: running jobs (pid ${process.pid})`);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`worker: ${signal}, finishing running jobs`);
  await stopWorker(20_000);
  await (await getOrm()).close().catch(() => undefined);
  process.exit(0);
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));
