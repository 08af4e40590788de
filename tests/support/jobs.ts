// Runs queued background jobs inside a test, the way the worker would: takes every job of a
// queue that is due (or all, with `all`), runs its handler, and marks it done or failed.
import { getBoss } from "@/lib/jobs/boss";
import { runJob } from "@/lib/jobs/handlers";
import type { JobData, QueueName } from "@/lib/jobs/queues";

export interface Drained<Q extends QueueName> {
  ran: JobData[Q][];
  failed: unknown[];
}

export async function drainQueue<Q extends QueueName>(queue: Q, opts: { all?: boolean } = {}): Promise<Drained<Q>> {
  const boss = await getBoss("producer");
  const out: Drained<Q> = { ran: [], failed: [] };
  for (;;) {
    const jobs = await boss.fetch<JobData[Q]>(queue, { batchSize: 20, ignoreStartAfter: opts.all === true });
    if (!jobs.length) return out;
    for (const job of jobs) {
      try {
        await runJob(queue, job.data);
        await boss.complete(queue, job.id);
        out.ran.push(job.data);
      } catch (e) {
        await boss.fail(queue, job.id, { message: String(e) });
        out.failed.push(e);
      }
    }
  }
}

/** Jobs of a queue that wait to run (created or waiting for a retry). */
export async function queuedJobs(queue: QueueName): Promise<{ data: unknown; startAfter: Date }[]> {
  const boss = await getBoss("producer");
  const { rows } = await boss.getDb().executeSql(
    "select data, start_after from pgboss.job where name = $1 and state in ('created', 'retry') order by start_after",
    [queue],
  );
  return rows.map((r: { data: unknown; start_after: Date }) => ({ data: r.data, startAfter: r.start_after }));
}
