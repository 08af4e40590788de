// The job queue (lib/jobs) on the test database: a job queued inside a transaction exists if and
// only if the transaction commits, and new mail queues its flush for the time it is due.
import { afterAll, describe, expect, it, vi } from "vitest";
import { MailOutboxSchema } from "@/entities/comment";
import { UserSchema } from "@/entities/user";
import { getEm, getOrm } from "@/lib/db";
import { enqueue, stopBoss } from "@/lib/jobs/boss";
import { enqueueMail } from "@/lib/outbox";
import * as commentsRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/route";
import { doc, makeTrial, mention, text } from "../support/comments";
import { makeStudio, makeUser } from "../support/fixtures";
import { drainQueue, queuedJobs } from "../support/jobs";
import { call } from "../support/route";
import { actAs } from "../support/session";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "jobs";

afterAll(async () => {
  await stopBoss();
  await (await getOrm()).close();
});

const recomputeJobsFor = async (cardId: string) =>
  (await queuedJobs("card-readings-recompute")).filter((j) => (j.data as { cardId: string }).cardId === cardId);

describe("jobs queued in a transaction", () => {
  it("are stored with a commit and dropped with a rollback", async () => {
    const kept = crypto.randomUUID();
    const dropped = crypto.randomUUID();
    const em = await getEm();
    await em.transactional(async (tx) => {
      await enqueue(tx, "card-readings-recompute", { cardId: kept });
    });
    await expect(
      em.transactional(async (tx) => {
        await enqueue(tx, "card-readings-recompute", { cardId: dropped });
        throw new Error("changed my mind");
      }),
    ).rejects.toThrow("changed my mind");
    expect(await recomputeJobsFor(kept)).toHaveLength(1);
    expect(await recomputeJobsFor(dropped)).toHaveLength(0);
    // The handler finds no such card and does nothing; the queue is left empty.
    const drained = await drainQueue("card-readings-recompute");
    expect(drained.ran).toContainEqual({ cardId: kept });
    expect(await recomputeJobsFor(kept)).toHaveLength(0);
  });

  it("a single mail queues a flush for its send time, with the row", async () => {
    const em = await getEm();
    const at = new Date(Date.now() + 3_600_000);
    const to = `single-${crypto.randomUUID().slice(0, 8)}@jobs.test`;
    await em.transactional(async (tx) => {
      await enqueueMail(tx, { to, subject: "Later", text: "Later.", sendAfter: at });
    });
    const wakes = (await queuedJobs("outbox-flush")).filter((j) => j.startAfter.getTime() === at.getTime());
    expect(wakes).toHaveLength(1);
    expect(await em.fork().count(MailOutboxSchema, { to, sentAt: null })).toBe(1);
  });
});

describe("notification mail", () => {
  it("queues one flush per batch, at the end of its window", async () => {
    const [dyer, guest] = await Promise.all(["dyer", "guest"].map((n) => makeUser(TAG, n)));
    const studio = await makeStudio("Kelpie Dye Shed", [
      [dyer, "dyer"],
      [guest, "guest"],
    ]);
    const trial = await makeTrial(studio.id, dyer, "Batch window trial");
    actAs(dyer);
    for (const word of ["one", "two", "three"]) {
      const res = await call(commentsRoute.POST, "POST", { studioId: studio.id, trialId: trial.id }, { body: { body: doc(mention(guest), text(` ${word}`)) } });
      expect(res.status).toBe(201);
    }
    const em = await getEm();
    const rows = await em.find(MailOutboxSchema, { user: await em.findOneOrFail(UserSchema, { id: guest.id }) });
    expect(rows).toHaveLength(3);
    const due = rows[0].sendAfter.getTime();
    expect(rows.every((r) => r.sendAfter.getTime() === due)).toBe(true);
    const wakes = (await queuedJobs("outbox-flush")).filter((j) => j.startAfter.getTime() === due);
    expect(wakes).toHaveLength(1);
  });
});
