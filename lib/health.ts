import "server-only";
import { checkBucket } from "./storage";
import { checkMail } from "./mail";

// Readiness of the three services the app needs. Each check is bounded in time so a hung
// service shows as failed instead of hanging the caller.
export type CheckResult = { ok: boolean; ms: number; error?: string };
export type Health = { ok: boolean; checks: { database: CheckResult; storage: CheckResult; mail: CheckResult } };

async function timed(run: () => Promise<unknown>, timeoutMs: number): Promise<CheckResult> {
  const start = performance.now();
  let timer: ReturnType<typeof setTimeout> | undefined;
  try {
    await Promise.race([
      run(),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs);
      }),
    ]);
    return { ok: true, ms: Math.round(performance.now() - start) };
  } catch (e) {
    const error = e instanceof Error ? e.message || e.name : String(e);
    return { ok: false, ms: Math.round(performance.now() - start), error };
  } finally {
    clearTimeout(timer);
  }
}

async function queryDatabase(): Promise<void> {
  const { getOrm } = await import("./db");
  await (await getOrm()).em.getConnection().execute("select 1");
}

/** Checks the database (by `database`, else `select 1` through the ORM), the bucket and SMTP. */
export async function checkHealth(
  opts: { database?: () => Promise<unknown>; timeoutMs?: number } = {},
): Promise<Health> {
  const timeoutMs = opts.timeoutMs ?? 5000;
  const [database, storage, mail] = await Promise.all([
    timed(opts.database ?? queryDatabase, timeoutMs),
    timed(checkBucket, timeoutMs),
    timed(checkMail, timeoutMs),
  ]);
  return { ok: database.ok && storage.ok && mail.ok, checks: { database, storage, mail } };
}
