// Faults, against services of this file's own (a temporary PostgreSQL cluster, an object-store
// fake and a mail fake on other ports; the shared ones are never touched), with the job worker
// running in this process as it does in the web server:
//   Postgres restarted under load → requests answer 503 with a message (no hang, no 500), and
//     the same process serves again once it is back, without a restart;
//   the object store down → starting or confirming an upload answers 503 and leaves no photo
//     record; the objects are cleaned up by a job once the store is back;
//   the SMTP server down → the mail waits in the outbox and leaves once, when it is back.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

// Before any app module reads its settings (vi.hoisted runs ahead of the imports).
const ports = vi.hoisted(() => {
  const p = { pg: 54339, s3: 4579, smtp: 2535, mailHttp: 2590 };
  const set: Record<string, string> = {
    DATABASE_URL: `postgres://postgres@127.0.0.1:${p.pg}/undertone_faults`,
    S3_ENDPOINT: `http://127.0.0.1:${p.s3}`,
    SMTP_URL: `smtp://127.0.0.1:${p.smtp}`,
    MAIL_FAKE_URL: `http://127.0.0.1:${p.mailHttp}`,
    MAIL_RETRY_SECONDS: "1",
  };
  const saved = Object.fromEntries(Object.keys(set).map((k) => [k, process.env[k]]));
  Object.assign(process.env, set);
  // A worker process reused from another file must not hand this file its connections.
  const g = globalThis as Record<string, unknown>;
  for (const k of ["__undertoneOrm", "__undertoneS3", "__undertoneMail", "__undertoneBoss", "__undertoneWorker"]) delete g[k];
  return { ...p, saved };
});

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

import { MailOutboxSchema, PhotoSchema } from "@/entities";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as uploadsRoute from "@/app/api/studios/[studioId]/photos/route";
import * as confirmRoute from "@/app/api/studios/[studioId]/photos/[photoId]/confirm/route";
import * as invitationsRoute from "@/app/api/studios/[studioId]/invitations/route";
import { getEm, getOrm } from "@/lib/db";
import { DATABASE_UNAVAILABLE, STORE_UNAVAILABLE } from "@/lib/errors";
import { startWorker, stopWorker } from "@/lib/jobs/worker";
import { flushOutbox } from "@/lib/outbox";
import { headObject } from "@/lib/storage";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { drainQueue } from "../support/jobs";
import { listMessages } from "../support/mail";
import { type CallResult, call } from "../support/route";
import { actAs } from "../support/session";
import { makeTrial } from "../support/comments";
import { type ThrowawayFake, type ThrowawayPostgres, migrate, throwawayMail, throwawayPostgres, throwawayS3, waitFor } from "../support/throwaway";

const TAG = "faults";
let pg: ThrowawayPostgres, s3: ThrowawayFake, mail: ThrowawayFake;
let owner: Person, studio: StudioFixture, trialId: string;

beforeAll(async () => {
  pg = await throwawayPostgres(ports.pg);
  pg.createDatabase("undertone_faults");
  s3 = throwawayS3(ports.s3);
  mail = throwawayMail(ports.smtp, ports.mailHttp);
  await Promise.all([s3.start(), mail.start()]);
  migrate(process.env.DATABASE_URL!);
  owner = await makeUser(TAG, "owner");
  studio = await makeStudio("Faultline Dye Works", [[owner, "owner"]]);
  trialId = (await makeTrial(studio.id, owner, "Faults trial")).id;
  await startWorker({ pollingIntervalSeconds: 0.5 });
}, 120_000);

afterAll(async () => {
  await stopWorker(5_000).catch(() => undefined);
  await (await getOrm()).close().catch(() => undefined);
  await Promise.all([s3?.destroy(), mail?.destroy()]);
  pg?.destroy();
  const g = globalThis as Record<string, unknown>;
  for (const k of ["__undertoneOrm", "__undertoneS3", "__undertoneMail", "__undertoneBoss", "__undertoneWorker"]) delete g[k];
  for (const [k, v] of Object.entries(ports.saved)) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
}, 60_000);

/** A route call that may not hang: a request still open after `ms` fails the test. */
async function bounded(run: () => Promise<CallResult>, ms = 15_000): Promise<CallResult & { ms: number }> {
  const t0 = Date.now();
  let timer: ReturnType<typeof setTimeout> | undefined;
  const hang = new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`request still open after ${ms} ms`)), ms)));
  try {
    return { ...(await Promise.race([run(), hang])), ms: Date.now() - t0 };
  } finally {
    clearTimeout(timer);
  }
}

const listTrials = () => call(trialsRoute.GET, "GET", { studioId: studio.id });
const createTrial = (title: string) => call(trialsRoute.POST, "POST", { studioId: studio.id }, { body: { title, fibreWeightG: 100 } });

describe("Postgres restarted under load", () => {
  it("answers 503 with a message while it is away and serves again from the same process", async () => {
    actAs(owner);
    const orm = await getOrm();
    expect((await listTrials()).status).toBe(200);

    // Four clients reading and writing in a loop while the server stops for two seconds.
    const results: (CallResult & { ms: number })[] = [];
    let running = true;
    const client = async (n: number) => {
      for (let i = 0; running; i++) {
        results.push(await bounded(() => (i % 2 ? createTrial(`Load ${n}.${i}`) : listTrials())));
        await new Promise((r) => setTimeout(r, 20));
      }
    };
    const clients = [0, 1, 2, 3].map(client);
    await new Promise((r) => setTimeout(r, 700));
    await pg.stop();
    await new Promise((r) => setTimeout(r, 2_000));
    await pg.start();
    await new Promise((r) => setTimeout(r, 1_500));
    running = false;
    await Promise.all(clients);

    const statuses = results.map((r) => r.status);
    const failed = results.filter((r) => r.status === 503);
    console.log(
      `faults: ${results.length} requests during a Postgres restart: ${statuses.filter((s) => s < 300).length} ok, ${failed.length} × 503, slowest ${Math.max(...results.map((r) => r.ms))} ms`,
    );
    expect(new Set(statuses.filter((s) => s >= 300))).toEqual(new Set([503]));
    expect(failed.length).toBeGreaterThan(0);
    for (const r of failed) expect(r.json.error).toBe(DATABASE_UNAVAILABLE);
    // Served again at the end of the load, by the same ORM (no re-initialisation).
    expect(statuses.slice(-4).every((s) => s < 300)).toBe(true);
    expect(await getOrm()).toBe(orm);
    const after = await listTrials();
    expect(after.status).toBe(200);
  }, 60_000);

  it("answers 503 quickly while the database is down, then recovers", async () => {
    actAs(owner);
    await pg.stop();
    try {
      const down = await bounded(() => createTrial("While down"), 10_000);
      expect(down.status).toBe(503);
      expect(down.json.error).toBe(DATABASE_UNAVAILABLE);
      expect(down.ms).toBeLessThan(5_000);
    } finally {
      await pg.start();
    }
    const up = await createTrial("After the restart");
    expect(up.status).toBe(201);
  }, 30_000);
});

async function photoRows(): Promise<number> {
  return (await getEm()).count(PhotoSchema, { trial: trialId });
}

const startUpload = () =>
  call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "final", contentType: "image/png", bytes: 64 } });

describe("object store down", () => {
  it("refuses to start an upload, leaving no record", async () => {
    actAs(owner);
    const before = await photoRows();
    await s3.stop();
    try {
      const res = await bounded(startUpload, 20_000);
      expect(res.status).toBe(503);
      expect(res.json.error).toBe(STORE_UNAVAILABLE);
      expect(await photoRows()).toBe(before);
    } finally {
      await s3.start();
    }
    expect((await startUpload()).status).toBe(201);
  }, 60_000);

  it("fails a confirm with a message, removes the record, and cleans the bucket once the store is back", async () => {
    actAs(owner);
    const start = await startUpload();
    expect(start.status).toBe(201);
    const put = await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/png" }, body: "not yet a photo" });
    expect(put.ok).toBe(true);
    const photoId: string = start.json.photo.id;
    const uploadKey = `studios/${studio.id}/uploads/${photoId}`;

    await s3.stop();
    try {
      const res = await bounded(() => call(confirmRoute.POST, "POST", { studioId: studio.id, photoId }), 20_000);
      expect(res.status).toBe(503);
      expect(res.json.error).toBe(STORE_UNAVAILABLE);
      expect(await (await getEm()).count(PhotoSchema, { id: photoId })).toBe(0);
    } finally {
      await s3.start();
    }
    // The upload outlived the outage; the clean-up job removes it (run here now rather than
    // after its back-off, which a retry after a failed attempt would wait out).
    await waitFor("upload removed by the clean-up job", async () => {
      await drainQueue("photo-objects-delete", { all: true });
      return (await headObject(uploadKey)) === null;
    });
  }, 60_000);
});

describe("SMTP server down", () => {
  it("keeps the mail in the outbox and sends it once when the server is back", async () => {
    actAs(owner);
    const to = `invitee-${Date.now()}@faults.test`;
    await mail.stop();
    let rowId: string;
    try {
      const res = await call(invitationsRoute.POST, "POST", { studioId: studio.id }, { body: { email: to, role: "guest" } });
      expect(res.status).toBe(201);
      // The worker tries, fails, and leaves the row waiting with its error and back-off.
      const em = await getEm();
      await waitFor("a failed attempt", async () => ((await em.fork().findOne(MailOutboxSchema, { to }))?.attempts ?? 0) >= 1);
      const row = await em.fork().findOneOrFail(MailOutboxSchema, { to });
      expect(row.sentAt).toBeNull();
      expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
      rowId = row.id;
    } finally {
      await mail.start();
    }
    // Back: the retry the worker queued for the back-off sends it.
    await waitFor("the mail delivered", async () => (await listMessages(to)).length > 0, 30_000);
    // More flushes, two at once, and the worker still polling: no second copy.
    await Promise.all([flushOutbox({ all: true }), flushOutbox({ all: true })]);
    await new Promise((r) => setTimeout(r, 2_000));
    const got = await listMessages(to);
    expect(got).toHaveLength(1);
    expect(got[0].subject).toMatch(/invited you to Faultline Dye Works/);
    const sent = await (await getEm()).findOneOrFail(MailOutboxSchema, { id: rowId! });
    expect(sent.sentAt).not.toBeNull();
  }, 60_000);
});
