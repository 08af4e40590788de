import "server-only";
import { getBoss, stopBoss } from "./boss";
import { runJob } from "./handlers";
import { QUEUES } from "./queues";

// Runs every queue's jobs in this process: `npm run worker` (scripts/worker.ts), or the web
// server itself (instrumentation.ts) unless UNDERTONE_WORKER=off says a separate worker does.

const state = globalThis as unknown as { __undertoneWorker?: Promise<void> };

export interface WorkerOptions {
  /** Seconds between polls of each queue when it is idle (pg-boss's minimum is 0.5). */
  pollingIntervalSeconds?: number;
}

async function start(opts: WorkerOptions): Promise<void> {
  const boss = await getBoss("worker");
  const pollingIntervalSeconds = opts.pollingIntervalSeconds ?? 2;
  for (const q of Object.values(QUEUES)) {
    await boss.work(q.name, { pollingIntervalSeconds, batchSize: 1 }, async ([job]) => {
      await runJob(q.name, job.data as never);
    });
    if ("cron" in q) await boss.schedule(q.name, q.cron, {}, { tz: "UTC" });
  }
}

/** Starts the job handlers once per process. */
export function startWorker(opts: WorkerOptions = {}): Promise<void> {
  state.__undertoneWorker ??= start(opts).catch((e) => {
    state.__undertoneWorker = undefined;
    throw e;
  });
  return state.__undertoneWorker;
}

/** Stops taking jobs; running ones finish first (up to timeoutMs). */
export async function stopWorker(timeoutMs = 10_000): Promise<void> {
  state.__undertoneWorker = undefined;
  await stopBoss(timeoutMs);
}

/** Starts the handlers, trying again every `retryMs` while the database cannot be reached. */
export function startWorkerWhenReady(opts: WorkerOptions = {}, retryMs = 10_000): void {
  startWorker(opts).then(
    () => console.log("jobs: worker running in this process"),
    (e) => {
      console.error(`jobs: worker could not start (${e instanceof Error ? e.message : e}); trying again in ${retryMs / 1000} s`);
      setTimeout(() => startWorkerWhenReady(opts, retryMs), retryMs).unref?.();
    },
  );
}
