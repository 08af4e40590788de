import "server-only";
import type { Knex } from "@mikro-orm/knex";
import type { EntityManager } from "@mikro-orm/postgresql";
import PgBoss from "pg-boss";
import { env } from "@/lib/env";
import { type JobData, type QueueName, QUEUES } from "./queues";

// pg-boss keeps its jobs in the app's own database (schema "pgboss", created and upgraded by
// pg-boss itself on start, outside MikroORM's migrations). A process has up to two instances:
// the producer (every process that enqueues) and the worker (processes that run jobs:
// `npm run worker`, or the web server itself unless UNDERTONE_WORKER=off).

export const BOSS_SCHEMA = "pgboss";

type Role = "producer" | "worker";
const cache = globalThis as unknown as { __undertoneBoss?: Partial<Record<Role, Promise<PgBoss>>> };

function options(role: Role): PgBoss.ConstructorOptions {
  return {
    connectionString: env.DATABASE_URL,
    schema: BOSS_SCHEMA,
    application_name: `undertone-${role}`,
    max: role === "worker" ? 4 : 2,
    // Maintenance (expiry, archiving) and cron run in workers only.
    supervise: role === "worker",
    schedule: role === "worker",
    migrate: true,
  };
}

async function create(role: Role): Promise<PgBoss> {
  const boss = new PgBoss(options(role));
  // Without a listener an error event would end the process; a database restart emits some.
  boss.on("error", (e) => console.error(`jobs (${role}):`, e instanceof Error ? e.message : e));
  await boss.start();
  for (const q of Object.values(QUEUES)) {
    const { name, cron: _cron, ...opts } = q as typeof q & { cron?: string };
    await boss.createQueue(name, { name, ...opts });
    // Keeps an existing queue's settings in step with QUEUES.
    await boss.updateQueue(name, { name, ...opts });
  }
  return boss;
}

/** The started pg-boss instance of this process for `role`, created once. */
export function getBoss(role: Role = "producer"): Promise<PgBoss> {
  const c = (cache.__undertoneBoss ??= {});
  c[role] ??= create(role).catch((e) => {
    c[role] = undefined;
    throw e;
  });
  return c[role]!;
}

/** Stops this process's instances (workers finish their current jobs first, up to `timeoutMs`). */
export async function stopBoss(timeoutMs = 10_000): Promise<void> {
  const c = cache.__undertoneBoss ?? {};
  cache.__undertoneBoss = {};
  await Promise.all(
    Object.values(c).map(async (p) => {
      const boss = await p?.catch(() => undefined);
      await boss?.stop({ graceful: true, timeout: timeoutMs, wait: true });
    }),
  );
}

/**
 * pg-boss's SQL run on the caller's open transaction, so a job is stored if and only if the
 * transaction commits. pg-boss writes $1-style placeholders; knex binds `?`.
 */
function onTransaction(trx: Knex.Transaction): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[] = []) {
      if (text.includes("?")) throw new Error("jobs: this pg-boss statement cannot be bound through knex");
      const bound: unknown[] = [];
      const sql = text.replace(/\$(\d+)/g, (_, n: string) => {
        const v = values[Number(n) - 1];
        bound.push(v === undefined ? null : v !== null && typeof v === "object" && !(v instanceof Date) ? JSON.stringify(v) : v);
        return "?";
      });
      const res = (await trx.raw(sql, bound as Knex.RawBinding[])) as { rows: unknown[] };
      return { rows: res.rows };
    },
  };
}

export interface EnqueueOptions {
  startAfter?: Date;
  singletonKey?: string;
}

/**
 * Stores a job. Inside a transaction of `em` the job commits or rolls back with it; otherwise
 * it is stored at once through pg-boss's own connection. Returns the job id (null when a
 * singleton rule dropped it as a duplicate).
 */
export async function enqueue<Q extends QueueName>(
  em: EntityManager | null,
  queue: Q,
  data: JobData[Q],
  opts: EnqueueOptions = {},
): Promise<string | null> {
  const boss = await getBoss("producer");
  const trx = em?.isInTransaction() ? em.getTransactionContext<Knex.Transaction>() : undefined;
  return boss.send(queue, data as object, { ...opts, ...(trx ? { db: onTransaction(trx) } : {}) });
}
