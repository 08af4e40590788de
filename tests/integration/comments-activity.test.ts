// Notifications, following and the activity feed: who is told about a comment, the unread count
// and marking read, following and unfollowing, follower notices from recordActivity, and the
// feed's order, filters and pages.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { ColourwaySchema } from "@/entities/colourway";
import { getEm, getOrm } from "@/lib/db";
import { recordActivity } from "@/lib/activity";
import * as commentsRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/route";
import * as notificationsRoute from "@/app/api/studios/[studioId]/notifications/route";
import * as countRoute from "@/app/api/studios/[studioId]/notifications/count/route";
import * as readRoute from "@/app/api/studios/[studioId]/notifications/read/route";
import * as activityRoute from "@/app/api/studios/[studioId]/activity/route";
import * as followsRoute from "@/app/api/studios/[studioId]/follows/route";
import * as followRoute from "@/app/api/studios/[studioId]/follows/[targetType]/[targetId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { doc, makeTrial, mention, text } from "../support/comments";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "comments-activity";
let owner: Person, dyer: Person, guest: Person, outsider: Person;
let studio: StudioFixture;
let trial: { id: string };

beforeAll(async () => {
  [owner, dyer, guest, outsider] = await Promise.all(["owner", "dyer", "guest", "outsider"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Pebble Wharf Dyers", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  await makeStudio("Another Place", [[outsider, "owner"]]);
  trial = await makeTrial(studio.id, owner, "Heather over indigo");
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const sp = () => ({ studioId: studio.id });
const comment = (body: unknown, trialId = trial.id) => call(commentsRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { body } });
const notifications = async (who: Person, query = "") => {
  actAs(who);
  const req = new Request(`http://127.0.0.1/api/x${query}`);
  const res = await notificationsRoute.GET(req, { params: Promise.resolve(sp()) });
  return { status: res.status, json: await res.json() };
};
const activity = async (query = "") => {
  const res = await activityRoute.GET(new Request(`http://127.0.0.1/api/x${query}`), { params: Promise.resolve(sp()) });
  return { status: res.status, json: await res.json() };
};
const followParams = (trialId = trial.id) => ({ studioId: studio.id, targetType: "trial", targetId: trialId });

describe("notifications", () => {
  it("tell the mentioned member and the trial's author, each once, and never the writer", async () => {
    const before = (await notifications(owner)).json.unread;
    actAs(dyer);
    expect((await comment(doc(mention(guest), text(" and "), mention(owner), text(" – thoughts?")))).status).toBe(201);
    const g = await notifications(guest);
    expect(g.json.items[0].kind).toBe("mention");
    expect(g.json.items[0].summary).toBe(`${dyer.name} mentioned you on “Heather over indigo”`);
    expect(g.json.items[0].trialId).toBe(trial.id);
    expect(g.json.items[0].actor).toEqual({ id: dyer.id, name: dyer.name });
    // The owner is both author and mentioned: one notification, as a mention.
    const o = await notifications(owner);
    expect(o.json.unread).toBe(before + 1);
    expect(o.json.items[0].kind).toBe("mention");
    expect((await notifications(dyer)).json.items).toHaveLength(0);
  });

  it("count, mark one read, mark all read", async () => {
    actAs(dyer);
    await comment(doc(mention(guest), text(" one")));
    await comment(doc(mention(guest), text(" two")));
    actAs(guest);
    const count = await call(countRoute.GET, "GET", sp());
    expect(count.json.unread).toBeGreaterThanOrEqual(2);
    const list = await notifications(guest, "?unread=1");
    const first = list.json.items[0].id;
    const one = await call(readRoute.POST, "POST", sp(), { body: { ids: [first] } });
    expect(one.json.unread).toBe(count.json.unread - 1);
    const all = await call(readRoute.POST, "POST", sp(), { body: {} });
    expect(all.json.unread).toBe(0);
    expect((await notifications(guest, "?unread=1")).json.items).toHaveLength(0);
    expect((await notifications(guest)).json.items.every((n: { readAt: string | null }) => n.readAt !== null)).toBe(true);
  });

  it("someone else's notification ids mark nothing of theirs", async () => {
    actAs(guest);
    await comment(doc(mention(dyer), text(" for the dyer")));
    const theirs = (await notifications(dyer, "?unread=1")).json.items[0].id;
    actAs(guest);
    await call(readRoute.POST, "POST", sp(), { body: { ids: [theirs] } });
    expect((await notifications(dyer, "?unread=1")).json.items.map((n: { id: string }) => n.id)).toContain(theirs);
  });

  it("a member of another studio sees nothing (404)", async () => {
    expect((await notifications(outsider)).status).toBe(404);
    actAs(outsider);
    expect((await activity()).status).toBe(404);
    expect((await call(followRoute.PUT, "PUT", followParams())).status).toBe(404);
  });
});

describe("following", () => {
  it("a follower hears about new comments; after unfollowing, no more", async () => {
    const t = await makeTrial(studio.id, owner, "Rust over straw");
    actAs(guest);
    const f = await call(followRoute.PUT, "PUT", followParams(t.id));
    expect(f.json).toEqual({ targetType: "trial", targetId: t.id, following: true, followers: 1 });
    // Following twice is still one follow.
    expect((await call(followRoute.PUT, "PUT", followParams(t.id))).json.followers).toBe(1);
    const mine = await call(followsRoute.GET, "GET", sp());
    expect(mine.json.some((x: { targetId: string; title: string }) => x.targetId === t.id && x.title === "Rust over straw")).toBe(true);

    actAs(dyer);
    await comment(doc(text("second bath was too hot")), t.id);
    const n = (await notifications(guest)).json.items[0];
    expect([n.kind, n.trialId]).toEqual(["comment-on-followed", t.id]);

    actAs(guest);
    const off = await call(followRoute.DELETE, "DELETE", followParams(t.id));
    expect(off.json.following).toBe(false);
    const countBefore = (await notifications(guest)).json.items.length;
    actAs(dyer);
    await comment(doc(text("rinsed clear")), t.id);
    expect((await notifications(guest)).json.items.length).toBe(countBefore);
  });

  it("writing a comment follows the trial, so the writer hears replies", async () => {
    const t = await makeTrial(studio.id, owner, "Moss dip");
    actAs(guest);
    await comment(doc(text("lovely break")), t.id);
    expect((await call(followRoute.GET, "GET", followParams(t.id))).json.following).toBe(true);
    actAs(dyer);
    await comment(doc(text("thanks!")), t.id);
    const n = (await notifications(guest)).json.items[0];
    expect([n.kind, n.summary]).toEqual(["comment-on-followed", `${dyer.name} commented on “Moss dip”`]);
  });

  it("followers get a notice of activity on the trial from recordActivity, the actor does not", async () => {
    const t = await makeTrial(studio.id, owner, "Ochre steam");
    actAs(guest);
    await call(followRoute.PUT, "PUT", followParams(t.id));
    const em = await getEm();
    await recordActivity(em, { studio: studio.id, actor: dyer.id, kind: "layer.added", trialId: t.id, summary: "added layer 2 (immersion) to “Ochre steam”" });
    await em.flush();
    const n = (await notifications(guest)).json.items[0];
    expect([n.kind, n.summary]).toEqual(["followed-activity", `${dyer.name} added layer 2 (immersion) to “Ochre steam”`]);
    expect((await notifications(dyer)).json.items.some((x: { summary: string }) => x.summary.includes("Ochre steam"))).toBe(false);
  });

  it("a colourway can be followed; a new lot on it notifies its followers", async () => {
    const t = await makeTrial(studio.id, dyer, "Harbour grey");
    const em = await getEm();
    const cw = em.create(ColourwaySchema, {
      studio: studio.id,
      name: "Harbour Fog",
      targetL: 60,
      targetA: -2,
      targetB: -4,
      sourceTrial: t.id,
      recipe: {},
      proposedBy: dyer.id,
    });
    await em.flush();
    actAs(owner);
    const f = await call(followRoute.PUT, "PUT", { studioId: studio.id, targetType: "colourway", targetId: cw.id });
    expect(f.json).toEqual({ targetType: "colourway", targetId: cw.id, following: true, followers: 1 });
    const mine = await call(followsRoute.GET, "GET", sp());
    expect(mine.json.some((x: { targetId: string; title: string }) => x.targetId === cw.id && x.title === "Harbour Fog")).toBe(true);
    await recordActivity(em, { studio: studio.id, actor: dyer.id, kind: "lot.added", colourwayId: cw.id, summary: "added lot 3 to “Harbour Fog”" });
    await em.flush();
    const n = (await notifications(owner)).json.items[0];
    expect([n.kind, n.summary]).toEqual(["followed-activity", `${dyer.name} added lot 3 to “Harbour Fog”`]);
  });

  it("refuses unknown targets: another studio's trial or a made-up kind (404)", async () => {
    const foreign = await makeTrial((await makeStudio("Not Ours", [[outsider, "owner"]])).id, outsider, "Theirs");
    actAs(dyer);
    expect((await call(followRoute.PUT, "PUT", followParams(foreign.id))).status).toBe(404);
    expect((await call(followRoute.PUT, "PUT", { studioId: studio.id, targetType: "dye", targetId: trial.id })).status).toBe(404);
  });
});

describe("activity feed", () => {
  it("is newest first, filters by kind and by actor, and pages with a cursor", async () => {
    const t = await makeTrial(studio.id, dyer, "Feed trial");
    const em = await getEm();
    await recordActivity(em, { studio: studio.id, actor: dyer.id, kind: "trial.created", trialId: t.id, summary: "started “Feed trial”" });
    await em.flush();
    actAs(guest);
    await comment(doc(text("feed one")), t.id);
    actAs(owner);
    await comment(doc(text("feed two")), t.id);

    actAs(guest);
    const all = await activity(`?trialId=${t.id}`);
    expect(all.json.items.map((e: { kind: string; actor: { id: string } }) => [e.kind, e.actor.id])).toEqual([
      ["comment.added", owner.id],
      ["comment.added", guest.id],
      ["trial.created", dyer.id],
    ]);
    expect(all.json.items[0].summary).toBe("commented on “Feed trial”: feed two");

    const comments = await activity(`?trialId=${t.id}&kind=comment.added`);
    expect(comments.json.items).toHaveLength(2);
    const byGuest = await activity(`?trialId=${t.id}&actorId=${guest.id}`);
    expect(byGuest.json.items.map((e: { summary: string }) => e.summary)).toEqual(["commented on “Feed trial”: feed one"]);

    const p1 = await activity(`?trialId=${t.id}&limit=2`);
    expect(p1.json.items).toHaveLength(2);
    expect(p1.json.nextCursor).toEqual(expect.any(String));
    const p2 = await activity(`?trialId=${t.id}&limit=2&cursor=${p1.json.nextCursor}`);
    expect(p2.json.items.map((e: { kind: string }) => e.kind)).toEqual(["trial.created"]);
    expect(p2.json.nextCursor).toBeNull();
  });

  it("refuses an unknown kind or a broken cursor (422)", async () => {
    actAs(guest);
    expect((await activity("?kind=trial.deleted")).status).toBe(422);
    const bad = await activity("?cursor=bm90LWEtY3Vyc29y");
    expect(bad.status).toBe(422);
    expect(bad.json.error).toMatch(/start from the first page/);
  });
});
