// Notification mail through the outbox and the SMTP fake: a burst of comments inside the batch
// window leaves as one mail per recipient, a failed send is retried after its back-off, people
// who turned mail off get none, and the signed unsubscribe link turns mail off without sign-in.
import { createServer } from "node:net";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { MailOutboxSchema, NotificationSchema } from "@/entities/comment";
import { UserSchema } from "@/entities/user";
import { getEm, getOrm } from "@/lib/db";
import { env } from "@/lib/env";
import { smtpOptions } from "@/lib/mail";
import { backoffSeconds, flushOutbox } from "@/lib/outbox";
import * as commentsRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/route";
import * as commentRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/[commentId]/route";
import * as unsubscribeRoute from "@/app/api/unsubscribe/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { doc, makeTrial, mention, text } from "../support/comments";
import { linksIn, listMessages, waitForMessage } from "../support/mail";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "comments-mail";
const WINDOW_MS = env.MAIL_BATCH_SECONDS * 1000;
const later = (ms: number) => new Date(Date.now() + ms);

interface Cast {
  owner: Person;
  dyer: Person;
  guest: Person;
  studio: StudioFixture;
  trial: { id: string };
}

/** A fresh studio per test, so one test's mail never lands in another's count. */
async function cast(name: string): Promise<Cast> {
  const [owner, dyer, guest] = await Promise.all(["owner", "dyer", "guest"].map((n) => makeUser(TAG, n)));
  const studio = await makeStudio(name, [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  const trial = await makeTrial(studio.id, owner, `${name} trial`);
  return { owner, dyer, guest, studio, trial };
}

const comment = (c: Cast, body: unknown) => call(commentsRoute.POST, "POST", { studioId: c.studio.id, trialId: c.trial.id }, { body: { body } });

/** A port nothing listens on: open one, note it, close it. */
async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

beforeAll(() => {
  // The window must be long enough for "within the window" to mean something in these tests.
  expect(env.MAIL_BATCH_SECONDS).toBeGreaterThanOrEqual(10);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("batching", () => {
  it("n comments within the window reach each recipient as one mail", async () => {
    const c = await cast("Brine Street Dyeworks");
    actAs(c.dyer);
    const notes = ["the madder broke pink at the tips", "second dip looks even", "third: try less vinegar"];
    for (const n of notes) expect((await comment(c, doc(mention(c.guest), text(` ${n}`)))).status).toBe(201);

    // Inside the window nothing leaves.
    await flushOutbox();
    expect(await listMessages(c.guest.email)).toHaveLength(0);

    // Other tests may have left older mail queued in this database: a round sends the oldest first
    // (up to its batch limit), so flush until this studio's batch has gone too.
    for (let round = 0; round < 50; round++) {
      const r = await flushOutbox({ now: later(WINDOW_MS + 1000) });
      if ((await listMessages(c.guest.email)).length > 0 || (r.messages === 0 && r.failed === 0)) break;
    }
    // The fake stores a message just after accepting it: wait for it, then count.
    await waitForMessage(c.guest.email, { timeoutMs: 10_000 });
    const toGuest = await listMessages(c.guest.email);
    expect(toGuest).toHaveLength(1);
    const m = toGuest[0];
    expect(m.subject).toBe(`${c.dyer.name} mentioned you on “Brine Street Dyeworks trial” (and 2 more)`);
    for (const n of notes) expect(m.text).toContain(n);
    expect(m.text).toMatch(/3 things happened/);
    expect(m.html).toContain("Stop these mails");
    // The trial's author (not mentioned) gets their own single mail with the three comments.
    const toOwner = await listMessages(c.owner.email);
    expect(toOwner).toHaveLength(1);
    expect(toOwner[0].subject).toMatch(/commented on your trial/);
    // The writer hears nothing about their own words.
    expect(await listMessages(c.dyer.email)).toHaveLength(0);

    // A comment after the batch left opens a new batch: a second mail, later.
    expect((await comment(c, doc(mention(c.guest), text(" one more")))).status).toBe(201);
    await flushOutbox({ now: later(WINDOW_MS + 1000) });
    const after = await listMessages(c.guest.email);
    expect(after).toHaveLength(2);
    expect(after[1].subject).toBe(`${c.dyer.name} mentioned you on “Brine Street Dyeworks trial”`);
  });

  it("the mail's link leads to the comment on the trial page", async () => {
    const c = await cast("Weir Lane Yarns");
    actAs(c.dyer);
    const res = await comment(c, doc(mention(c.guest), text(" look at this")));
    await flushOutbox({ now: later(WINDOW_MS + 1000) });
    const [m] = await listMessages(c.guest.email);
    const links = linksIn(m);
    const base = env.APP_URL.replace(/\/$/, "");
    expect(links).toContain(`${base}/s/${c.studio.id}/trials/${c.trial.id}#comment-${res.json.id}`);
    expect(links.some((l) => l.startsWith(`${base}/api/unsubscribe?token=`))).toBe(true);
  });
});

describe("retry", () => {
  it("a send that fails against a closed port is retried after its back-off", async () => {
    const c = await cast("Millrace Colour");
    actAs(c.dyer);
    expect((await comment(c, doc(mention(c.guest), text(" retry me")))).status).toBe(201);
    const port = await closedPort();
    const broken = nodemailer.createTransport(smtpOptions(`smtp://127.0.0.1:${port}`));
    const t1 = later(WINDOW_MS + 1000);
    const first = await flushOutbox({ now: t1, send: (mail) => broken.sendMail({ from: env.MAIL_FROM, ...mail }) });
    expect(first.failed).toBeGreaterThanOrEqual(1);
    expect(await listMessages(c.guest.email)).toHaveLength(0);

    const em = await getEm();
    const guestUser = await em.findOneOrFail(UserSchema, { id: c.guest.id });
    const [row] = await em.find(MailOutboxSchema, { user: guestUser });
    expect(row.attempts).toBe(1);
    expect(row.sentAt).toBeNull();
    expect(row.lastError).toMatch(/ECONNREFUSED/);
    expect(row.sendAfter.getTime()).toBe(t1.getTime() + backoffSeconds(1) * 1000);

    // Back on the real transport, but before the back-off ends: still waiting.
    await flushOutbox({ now: new Date(t1.getTime() + (backoffSeconds(1) - 5) * 1000) });
    expect(await listMessages(c.guest.email)).toHaveLength(0);
    // After it: sent, once.
    await flushOutbox({ now: new Date(t1.getTime() + (backoffSeconds(1) + 1) * 1000) });
    await flushOutbox({ now: new Date(t1.getTime() + (backoffSeconds(1) + 60) * 1000) });
    const got = await listMessages(c.guest.email);
    expect(got).toHaveLength(1);
    expect(got[0].text).toContain("retry me");
    const sent = await em.fork().findOneOrFail(MailOutboxSchema, { id: row.id });
    expect(sent.sentAt).not.toBeNull();
  });

  it("back-off doubles from 30 s and stops growing at an hour", () => {
    expect([1, 2, 3, 4].map(backoffSeconds)).toEqual([30, 60, 120, 240]);
    expect(backoffSeconds(20)).toBe(3600);
  });
});

describe("mail settings and unsubscribe", () => {
  it("someone with mail off gets the notification in the app but no mail", async () => {
    const c = await cast("Ferry Road Fibre");
    const em = await getEm();
    await em.nativeUpdate(UserSchema, { id: c.guest.id }, { mailEnabled: false });
    actAs(c.dyer);
    expect((await comment(c, doc(mention(c.guest), text(" quiet please")))).status).toBe(201);
    expect(await em.count(NotificationSchema, { user: c.guest.id, kind: "mention" })).toBe(1);
    expect(await em.count(MailOutboxSchema, { user: c.guest.id })).toBe(0);
  });

  it("the unsubscribe link asks first, then turns mail off without sign-in", async () => {
    const c = await cast("Harbour Skein Co");
    actAs(c.dyer);
    await comment(c, doc(mention(c.guest), text(" hello")));
    await flushOutbox({ now: later(WINDOW_MS + 1000) });
    const [m] = await listMessages(c.guest.email);
    const link = linksIn(m).find((l) => l.includes("/api/unsubscribe?token="))!;
    actAs(null);

    const ask = await unsubscribeRoute.GET(new Request(link));
    expect(ask.status).toBe(200);
    expect(await ask.text()).toContain('<form method="post" action="/api/unsubscribe">');
    const em = await getEm();
    expect((await em.fork().findOneOrFail(UserSchema, { id: c.guest.id })).mailEnabled).toBe(true);

    const token = new URL(link).searchParams.get("token")!;
    const done = await unsubscribeRoute.POST(
      new Request("http://127.0.0.1/api/unsubscribe", {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded" },
        body: new URLSearchParams({ token }).toString(),
      }),
    );
    expect(done.status).toBe(200);
    expect(await done.text()).toContain("Mail is off");
    expect((await em.fork().findOneOrFail(UserSchema, { id: c.guest.id })).mailEnabled).toBe(false);

    // From now on: notifications yes, mail no.
    actAs(c.dyer);
    await comment(c, doc(mention(c.guest), text(" after unsubscribing")));
    await flushOutbox({ now: later(WINDOW_MS + 1000) });
    expect(await listMessages(c.guest.email)).toHaveLength(1);
  });

  it("a changed token is refused and changes nothing", async () => {
    const c = await cast("Salt Path Studio");
    const good = (await import("@/lib/notifications")).unsubscribeToken(c.guest.id);
    const forged = `${c.owner.id}.${good.split(".")[1]}`;
    const res = await unsubscribeRoute.POST(new Request(`http://127.0.0.1/api/unsubscribe?token=${encodeURIComponent(forged)}`, { method: "POST" }));
    expect(res.status).toBe(400);
    const em = await getEm();
    expect((await em.findOneOrFail(UserSchema, { id: c.owner.id })).mailEnabled).toBe(true);
  });

  it("mail queued for a comment that is then removed is not sent", async () => {
    const c = await cast("Tannery Yard Yarn");
    actAs(c.dyer);
    const res = await comment(c, doc(mention(c.guest), text(" oops, wrong trial")));
    const em = await getEm();
    expect(await em.count(MailOutboxSchema, { user: c.guest.id, sentAt: null })).toBe(1);
    const del = await call(commentRoute.DELETE, "DELETE", { studioId: c.studio.id, trialId: c.trial.id, commentId: res.json.id });
    expect(del.status).toBe(204);
    expect(await em.count(MailOutboxSchema, { user: c.guest.id, sentAt: null })).toBe(0);
    expect(await em.count(NotificationSchema, { user: c.guest.id })).toBe(0);
    await flushOutbox({ now: later(WINDOW_MS + 1000) });
    expect(await listMessages(c.guest.email)).toHaveLength(0);
  });
});
