// What each feature writes to the studio's activity feed, driven through its route: starting and
// copying trials, adding and duplicating layers, confirming photos, reading colours, proposing
// colourways, logging lots, marking a colourway repeatable and joining by invitation. Each event is
// read back from GET /api/studios/:id/activity (kind, actor, summary, links); a refused request
// records nothing; another studio sees none of it; followers hear about a layer added by someone else.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import sharp from "sharp";
import * as activityRoute from "@/app/api/studios/[studioId]/activity/route";
import * as notificationsRoute from "@/app/api/studios/[studioId]/notifications/route";
import * as followRoute from "@/app/api/studios/[studioId]/follows/[targetType]/[targetId]/route";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as copyRoute from "@/app/api/studios/[studioId]/trials/[trialId]/copy/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import * as duplicateRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/duplicate/route";
import * as uploadsRoute from "@/app/api/studios/[studioId]/photos/route";
import * as confirmRoute from "@/app/api/studios/[studioId]/photos/[photoId]/confirm/route";
import * as readingsRoute from "@/app/api/studios/[studioId]/photos/[photoId]/readings/route";
import * as colourwaysRoute from "@/app/api/studios/[studioId]/colourways/route";
import * as colourwayRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/route";
import * as lotsRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/lots/route";
import * as invitationRoute from "@/app/api/invitations/[token]/route";
import type { ActivityDto } from "@/lib/activity";
import { getOrm } from "@/lib/db";
import { stopBoss } from "@/lib/jobs/boss";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeInvitation, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeReading } from "../support/readings";
import { makeTrial } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "activity-events";
let owner: Person, dyer: Person, guest: Person, outsider: Person;
let studio: StudioFixture, elsewhere: StudioFixture;

type Event = ActivityDto;

/** The studio's feed as `who` sees it, newest first. */
async function feed(who: Person, query = "", studioId = studio.id): Promise<Event[]> {
  actAs(who);
  const res = await activityRoute.GET(new Request(`http://127.0.0.1/api/x?limit=100${query}`), { params: Promise.resolve({ studioId }) });
  expect(res.status).toBe(200);
  return (await res.json()).items;
}

/** Runs `fn` and returns the events it added to the studio's feed (newest first). */
async function eventsOf(fn: () => Promise<unknown>): Promise<Event[]> {
  const before = new Set((await feed(owner)).map((e) => e.id));
  await fn();
  return (await feed(owner)).filter((e) => !before.has(e.id));
}

const sp = () => ({ studioId: studio.id });
const actor = (p: Person) => ({ id: p.id, name: p.name });

beforeAll(async () => {
  [owner, dyer, guest, outsider] = await Promise.all(["owner", "dyer", "guest", "outsider"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Saltmarsh Skeins", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  elsewhere = await makeStudio("Far Hill Wools", [[outsider, "owner"]]);
});

afterAll(async () => {
  actAs(null);
  await stopBoss();
  await (await getOrm()).close();
});

describe("trials", () => {
  it("starting a trial records trial.created by its author, linked to the trial", async () => {
    const events = await eventsOf(async () => {
      actAs(dyer);
      const res = await call(trialsRoute.POST, "POST", sp(), { body: { title: "Sea glass over-dye", fibreWeightG: 100 } });
      expect(res.status).toBe(201);
    });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ kind: "trial.created", actor: actor(dyer), summary: "started “Sea glass over-dye”", layerId: null });
    const list = await feed(guest, `&kind=trial.created`);
    expect(list[0].trialId).toEqual(expect.any(String));
    expect(list[0].id).toBe(events[0].id);
  });

  it("copying a trial records trial.copied, linked to the copy, with the original as its subject", async () => {
    const source = await makeTrial(studio.id, { title: "Kelp green", authorId: owner.id, layers: [{ method: "immersion" }] });
    let copyId = "";
    const events = await eventsOf(async () => {
      actAs(dyer);
      const res = await call(copyRoute.POST, "POST", { studioId: studio.id, trialId: source }, { body: { title: "Kelp green on sock" } });
      expect(res.status).toBe(201);
      copyId = res.json.id;
    });
    expect(events).toEqual([
      expect.objectContaining({
        kind: "trial.copied",
        actor: actor(dyer),
        summary: "started “Kelp green on sock” from the recipe of “Kelp green”",
        trialId: copyId,
        subjectId: source,
      }),
    ]);
  });

  it("a refused trial (422) or copy (404) records nothing", async () => {
    const events = await eventsOf(async () => {
      actAs(dyer);
      expect((await call(trialsRoute.POST, "POST", sp(), { body: { title: "", fibreWeightG: 100 } })).status).toBe(422);
      expect((await call(trialsRoute.POST, "POST", sp(), { body: { title: "No weight" } })).status).toBe(422);
      const foreign = await makeTrial(elsewhere.id, { title: "Not ours", authorId: outsider.id });
      expect((await call(copyRoute.POST, "POST", { studioId: studio.id, trialId: foreign }, { body: {} })).status).toBe(404);
    });
    expect(events).toEqual([]);
  });
});

describe("layers", () => {
  it("adding a layer records layer.added with its number and method, linked to the layer", async () => {
    const trialId = await makeTrial(studio.id, { title: "Estuary mud", authorId: owner.id, layers: [{ method: "immersion" }] });
    let layerId = "";
    const events = await eventsOf(async () => {
      actAs(dyer);
      const res = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "dip" } });
      expect(res.status).toBe(201);
      layerId = res.json.layers.at(-1).id;
    });
    expect(events).toEqual([
      expect.objectContaining({ kind: "layer.added", actor: actor(dyer), summary: "added layer 2 (dip) to “Estuary mud”", trialId, layerId }),
    ]);
  });

  it("duplicating a layer records layer.added for the copy, placed after its source", async () => {
    const trialId = await makeTrial(studio.id, { title: "Rock pool", authorId: owner.id, layers: [{ method: "speckle" }, { method: "immersion" }] });
    let layers: { id: string; method: string }[] = [];
    const events = await eventsOf(async () => {
      actAs(owner);
      const first = (await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "other" } })).json.layers;
      const res = await call(duplicateRoute.POST, "POST", { studioId: studio.id, trialId, layerId: first[0].id });
      expect(res.status).toBe(201);
      layers = res.json.layers;
    });
    expect(layers.map((l) => l.method)).toEqual(["speckle", "speckle", "immersion", "other"]);
    expect(events.map((e) => [e.kind, e.summary, e.layerId])).toEqual([
      ["layer.added", "added layer 2 (speckle) to “Rock pool”, a copy of layer 1", layers[1].id],
      ["layer.added", "added layer 3 to “Rock pool”", layers[3].id],
    ]);
  });

  it("a follower of the trial hears about a layer someone else added; the one who added it does not", async () => {
    const trialId = await makeTrial(studio.id, { title: "Heron grey", authorId: owner.id });
    actAs(guest);
    expect((await call(followRoute.PUT, "PUT", { studioId: studio.id, targetType: "trial", targetId: trialId })).status).toBe(200);
    actAs(dyer);
    expect((await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "kettle" } })).status).toBe(201);
    const notices = async (who: Person) => {
      actAs(who);
      const res = await notificationsRoute.GET(new Request("http://127.0.0.1/api/x"), { params: Promise.resolve(sp()) });
      return (await res.json()).items as { kind: string; summary: string; trialId: string | null }[];
    };
    expect((await notices(guest))[0]).toMatchObject({
      kind: "followed-activity",
      summary: `${dyer.name} added layer 1 (kettle) to “Heron grey”`,
      trialId,
    });
    expect((await notices(dyer)).some((n) => n.summary.includes("Heron grey"))).toBe(false);
  });

  it("a refused layer (422, or 404 for another studio's trial) records nothing", async () => {
    const trialId = await makeTrial(studio.id, { title: "Untouched", authorId: owner.id });
    const foreign = await makeTrial(elsewhere.id, { title: "Theirs", authorId: outsider.id });
    const events = await eventsOf(async () => {
      actAs(dyer);
      expect((await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "boiling" } })).status).toBe(422);
      expect((await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "dip", waterL: -1 } })).status).toBe(422);
      expect((await call(layersRoute.POST, "POST", { studioId: studio.id, trialId: foreign }, { body: { method: "dip" } })).status).toBe(404);
    });
    expect(events).toEqual([]);
  });
});

describe("photos and readings", () => {
  let trialId: string;
  let layerId: string;

  beforeAll(async () => {
    trialId = await makeTrial(studio.id, { title: "Lichen yellow", authorId: owner.id, layers: [{ method: "immersion" }, { method: "dip" }] });
    actAs(owner);
    layerId = (await call(layersRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { method: "speckle" } })).json.layers[1].id;
  });

  async function start(kind: string, layer?: string) {
    const jpeg = await sharp({ create: { width: 320, height: 240, channels: 3, background: "#c9b64a" } }).jpeg().toBuffer();
    const res = await call(uploadsRoute.POST, "POST", sp(), { body: { trialId, kind, layerId: layer, contentType: "image/jpeg", bytes: jpeg.length } });
    expect(res.status).toBe(201);
    const put = await fetch(res.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(jpeg) });
    expect(put.ok).toBe(true);
    return res.json.photo.id as string;
  }

  it("a photo is in the feed once its upload is confirmed, not when it starts", async () => {
    actAs(dyer);
    let photoId = "";
    const started = await eventsOf(async () => {
      actAs(dyer);
      photoId = await start("after-layer", layerId);
    });
    expect(started).toEqual([]);
    const confirmed = await eventsOf(async () => {
      actAs(dyer);
      expect((await call(confirmRoute.POST, "POST", { studioId: studio.id, photoId })).status).toBe(200);
      // Confirming again changes nothing and records nothing more.
      expect((await call(confirmRoute.POST, "POST", { studioId: studio.id, photoId })).status).toBe(200);
    });
    expect(confirmed).toEqual([
      expect.objectContaining({
        kind: "photo.added",
        actor: actor(dyer),
        summary: "added a photo after layer 2 (dip) to “Lichen yellow”",
        trialId,
        layerId,
        subjectId: photoId,
      }),
    ]);
  });

  it("reading several colours from a photo is one reading.added event; a refused reading records none", async () => {
    actAs(dyer);
    const photoId = await start("base");
    expect((await call(confirmRoute.POST, "POST", { studioId: studio.id, photoId })).status).toBe(200);
    const refused = await eventsOf(async () => {
      actAs(dyer);
      expect((await call(readingsRoute.POST, "POST", { studioId: studio.id, photoId }, { body: { regions: [] } })).status).toBe(422);
    });
    expect(refused).toEqual([]);
    const read = await eventsOf(async () => {
      actAs(owner);
      const rect = (x: number) => ({ x, y: 20, width: 60, height: 60 });
      const res = await call(readingsRoute.POST, "POST", { studioId: studio.id, photoId }, {
        body: { regions: [{ label: "left", rect: rect(20) }, { label: "middle", rect: rect(120) }, { label: "right", rect: rect(220) }] },
      });
      expect(res.status).toBe(201);
      expect(res.json).toHaveLength(3);
    });
    expect(read).toEqual([
      expect.objectContaining({
        kind: "reading.added",
        actor: actor(owner),
        summary: "read 3 colours from a photo of “Lichen yellow”",
        trialId,
        layerId: null,
        subjectId: photoId,
      }),
    ]);
  });
});

describe("colourways and lots", () => {
  const target = { L: 58, a: -6, b: 12 };
  let sourceId: string, lotTrialId: string, readingId: string;
  let colourwayId: string;

  beforeAll(async () => {
    sourceId = await makeTrial(studio.id, { title: "Harbour fog trial", authorId: dyer.id });
    readingId = await makeReading(studio.id, sourceId, dyer.id, target);
    lotTrialId = await makeTrial(studio.id, { title: "Harbour fog, lot dyeing", authorId: dyer.id, fibreWeightG: 500 });
  });

  it("proposing a colourway records colourway.created, linked to it and its trial", async () => {
    const events = await eventsOf(async () => {
      actAs(dyer);
      const res = await call(colourwaysRoute.POST, "POST", sp(), { body: { trialId: sourceId, readingId, name: "Harbour Fog" } });
      expect(res.status).toBe(201);
      colourwayId = res.json.id;
    });
    expect(events).toEqual([
      expect.objectContaining({
        kind: "colourway.created",
        actor: actor(dyer),
        summary: "proposed the colourway “Harbour Fog” from “Harbour fog trial”",
        trialId: sourceId,
        colourwayId,
      }),
    ]);
  });

  it("each lot records lot.added with its code and whether it passed; a refused lot records nothing", async () => {
    const near = await makeReading(studio.id, lotTrialId, dyer.id, { ...target, L: target.L + 0.3 });
    const far = await makeReading(studio.id, lotTrialId, dyer.id, { L: target.L + 9, a: target.a, b: target.b });
    const lot = (code: string, reading: string | null) =>
      call(lotsRoute.POST, "POST", { studioId: studio.id, colourwayId }, { body: { trialId: lotTrialId, code, skeins: 6, fibreWeightG: 600, readingId: reading } });
    const events = await eventsOf(async () => {
      actAs(dyer);
      expect((await lot("L-12", near)).status).toBe(201);
      expect((await lot("L-13", far)).status).toBe(201);
      expect((await lot("L-14", null)).status).toBe(201);
      expect((await lot("", near)).status).toBe(422);
    });
    expect(events.map((e) => [e.kind, e.summary, e.colourwayId, e.trialId, e.actor?.id])).toEqual([
      ["lot.added", "logged lot L-14 of “Harbour Fog” — not measured yet", colourwayId, lotTrialId, dyer.id],
      ["lot.added", "logged lot L-13 of “Harbour Fog” — failed (lighter)", colourwayId, lotTrialId, dyer.id],
      ["lot.added", "logged lot L-12 of “Harbour Fog” — passed", colourwayId, lotTrialId, dyer.id],
    ]);
    expect(new Set(events.map((e) => e.subjectId)).size).toBe(3);
  });

  it("marking the colourway repeatable records colourway.repeatable; a refused or other edit records nothing", async () => {
    actAs(owner);
    const current = (await call(colourwayRoute.GET, "GET", { studioId: studio.id, colourwayId })).json;
    const patch = (body: object) => call(colourwayRoute.PATCH, "PATCH", { studioId: studio.id, colourwayId }, { body });
    const refused = await eventsOf(async () => {
      actAs(dyer);
      expect((await patch({ version: current.version, status: "repeatable" })).status).toBe(403);
      actAs(owner);
      expect((await patch({ version: current.version + 5, status: "repeatable" })).status).toBe(409);
      const renamed = await patch({ version: current.version, description: "Grey-green of a foggy harbour." });
      expect(renamed.status).toBe(200);
      current.version = renamed.json.version;
    });
    expect(refused).toEqual([]);
    // One passing lot so far; the studio needs two.
    actAs(dyer);
    const near = await makeReading(studio.id, lotTrialId, dyer.id, { ...target, b: target.b + 0.2 });
    await call(lotsRoute.POST, "POST", { studioId: studio.id, colourwayId }, { body: { trialId: lotTrialId, code: "L-15", skeins: 6, fibreWeightG: 600, readingId: near } });
    const events = await eventsOf(async () => {
      actAs(owner);
      expect((await patch({ version: current.version, status: "repeatable" })).status).toBe(200);
    });
    expect(events).toEqual([
      expect.objectContaining({
        kind: "colourway.repeatable",
        actor: actor(owner),
        summary: "marked “Harbour Fog” repeatable, after 2 passing lots",
        colourwayId,
        trialId: sourceId,
      }),
    ]);
  });
});

describe("joining by invitation", () => {
  it("accepting records member.joined by the new member, with role and inviter; a refused acceptance records nothing", async () => {
    const newcomer = await makeUser(TAG, "newcomer", { name: "Wren" });
    const inv = await makeInvitation(studio.id, owner, newcomer.email, "dyer");
    const wrongPerson = await eventsOf(async () => {
      actAs(dyer);
      expect((await call(invitationRoute.POST, "POST", { token: inv.token })).status).toBe(403);
    });
    expect(wrongPerson).toEqual([]);
    const joined = await eventsOf(async () => {
      actAs(newcomer);
      const res = await call(invitationRoute.POST, "POST", { token: inv.token });
      expect(res.status).toBe(200);
      expect(res.json).toEqual({ studioId: studio.id });
    });
    expect(joined).toEqual([
      expect.objectContaining({
        kind: "member.joined",
        actor: { id: newcomer.id, name: "Wren" },
        summary: `joined the studio as a dyer, invited by ${owner.name}`,
        trialId: null,
        subjectId: expect.any(String),
      }),
    ]);
    // The new member reads the feed like everyone else.
    expect((await feed(newcomer, "&kind=member.joined"))[0].id).toBe(joined[0].id);
  });
});

describe("another studio", () => {
  it("sees none of these events: our feed is 404 to its members, and its own feed has none of ours", async () => {
    const ours = new Set((await feed(owner)).map((e) => e.id));
    expect(ours.size).toBeGreaterThan(10);
    actAs(outsider);
    const res = await activityRoute.GET(new Request("http://127.0.0.1/api/x"), { params: Promise.resolve(sp()) });
    expect(res.status).toBe(404);
    expect((await call(trialsRoute.POST, "POST", { studioId: elsewhere.id }, { body: { title: "Far hill heather", fibreWeightG: 100 } })).status).toBe(201);
    const theirs = await feed(outsider, "", elsewhere.id);
    expect(theirs.map((e) => [e.kind, e.actor?.id, e.summary])).toEqual([["trial.created", outsider.id, "started “Far hill heather”"]]);
    expect(theirs.some((e) => ours.has(e.id))).toBe(false);
  });
});
