// The background jobs, by queue: what each does lives in handlers.ts. Retries are pg-boss's own
// (retryDelay seconds, doubled per attempt with jitter when retryBackoff is set). A queue with
// a cron runs on that schedule in whichever worker process holds the schedule first.

export interface QueueSpec {
  name: string;
  /** pg-boss queue policy: "singleton" lets at most one job per singletonKey run at a time. */
  policy?: "standard" | "singleton";
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
  expireInSeconds: number;
  /** Five-field cron (UTC), when the queue also runs on a schedule. */
  cron?: string;
}

export const QUEUES = {
  /**
   * Sends due outbox mail. Woken for each new batch at its send time, and every minute as a
   * safety net. Not a singleton: flushes may overlap (the rows are locked while sent), so a
   * worker that dies mid-flush holds up only its own job until it expires.
   */
  outboxFlush: {
    name: "outbox-flush",
    retryLimit: 5,
    retryDelay: 15,
    retryBackoff: true,
    expireInSeconds: 120,
    cron: "* * * * *",
  },
  /** Removes uploads that were started but never confirmed. */
  uploadsSweep: {
    name: "photo-uploads-sweep",
    retryLimit: 2,
    retryDelay: 300,
    retryBackoff: false,
    expireInSeconds: 900,
    cron: "17 * * * *",
  },
  /** Deletes bucket objects that could not be deleted when their photo went (store down). */
  objectsDelete: {
    name: "photo-objects-delete",
    retryLimit: 12,
    retryDelay: 30,
    retryBackoff: true,
    expireInSeconds: 300,
  },
  /**
   * Measures a card's readings again after its values changed (one job at a time per card; one
   * held by a worker that died is given up after its expiry and retried).
   */
  readingsRecompute: {
    name: "card-readings-recompute",
    policy: "singleton",
    retryLimit: 5,
    retryDelay: 20,
    retryBackoff: true,
    expireInSeconds: 300,
  },
} as const satisfies Record<string, QueueSpec>;

export type QueueName = (typeof QUEUES)[keyof typeof QUEUES]["name"];

export interface JobData {
  "outbox-flush": Record<string, never>;
  "photo-uploads-sweep": Record<string, never>;
  "photo-objects-delete": { keys: string[] };
  "card-readings-recompute": { cardId: string };
}
