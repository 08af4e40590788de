import "server-only";
import { ReferenceCardSchema } from "@/entities";
import { getEm } from "@/lib/db";
import { flushOutbox } from "@/lib/outbox";
import { sweepPendingUploads } from "@/lib/photos/photos";
import { recomputeCardReadings } from "@/lib/photos/readings";
import { deleteObject } from "@/lib/storage";
import { enqueue } from "./boss";
import type { JobData, QueueName } from "./queues";

// What each queue's job does. A handler that throws is retried by pg-boss with its queue's
// back-off; every handler is safe to run twice (a retry after a lost acknowledgement).

type Handlers = { [Q in QueueName]: (data: JobData[Q]) => Promise<unknown> };

export const handlers: Handlers = {
  /** Sends due mail. Failed sends wait in the outbox with their own back-off; a wake-up is queued for the earliest. */
  async "outbox-flush"() {
    const r = await flushOutbox();
    if (r.messages || r.failed) console.log(`outbox: sent ${r.messages} mail(s), ${r.failed} failed`);
    if (r.nextAttemptAt) await enqueue(null, "outbox-flush", {}, { startAfter: r.nextAttemptAt });
    return r;
  },

  async "photo-uploads-sweep"() {
    const removed = await sweepPendingUploads(await getEm());
    if (removed) console.log(`photos: swept ${removed} abandoned upload(s)`);
    return { removed };
  },

  /** Throws while the store is unreachable, so the job comes back later. */
  async "photo-objects-delete"({ keys }) {
    for (const key of keys) await deleteObject(key);
    return { deleted: keys.length };
  },

  async "card-readings-recompute"({ cardId }) {
    const em = await getEm();
    const card = await em.findOne(ReferenceCardSchema, { id: cardId });
    if (!card) return { recomputed: 0 };
    return { recomputed: await recomputeCardReadings(em, card) };
  },
};

/** Runs one job's handler by queue name (the worker, and tests that drain a queue). */
export function runJob<Q extends QueueName>(queue: Q, data: JobData[Q]): Promise<unknown> {
  return (handlers[queue] as (d: JobData[Q]) => Promise<unknown>)(data);
}
