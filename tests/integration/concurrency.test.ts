// Writes that arrive at the same time, through the real route handlers against Postgres:
// two people saving the same trial or colourway from the same version (exactly one wins, the other
// gets a 409 it can read, nothing of the loser is stored), and bursts of 100 lots or comments
// (every one stored, every count derived from them exact, the shared connection pool saturated).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialRoute from "@/app/api/studios/[studioId]/trials/[trialId]/route";
import * as commentsRoute from "@/app/api/studios/[studioId]/trials/[trialId]/comments/route";
import * as colourwaysRoute from "@/app/api/studios/[studioId]/colourways/route";
import * as colourwayRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/route";
import * as lotsRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/lots/route";
import * as countRoute from "@/app/api/studios/[studioId]/notifications/count/route";
import * as followRoute from "@/app/api/studios/[studioId]/follows/[targetType]/[targetId]/route";
import * as profilesRoute from "@/app/api/studios/[studioId]/profiles/route";
import * as refitRoute from "@/app/api/studios/[studioId]/profiles/refit/route";
import { SYNTHETIC_BASES, syntheticDyeing } from "@/colour/spectral/synthetic-dyeings";
import { LayerSchema } from "@/entities";
import { getEm, getOrm } from "@/lib/db";
import { actAs, runAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call, type CallResult } from "../support/route";
import { makeReading } from "../support/readings";
import { doc, text } from "../support/comments";
import { dosDye, makeBase, makeDye, makeTrial } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "concurrency";
let owner: Person, dyer: Person, guest: Person, helper: Person;
let studio: StudioFixture;
let baseId: string;

beforeAll(async () => {
  [owner, dyer, guest, helper] = await Promise.all(["owner", "dyer", "guest", "helper"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Parallel Vats", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"], [helper, "dyer"]]);
  baseId = await makeBase(studio.id, "Race base");
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const sql = async <T = Record<string, unknown>>(q: string, params: unknown[] = []) =>
  (await getEm()).getConnection().execute<T[]>(q, params);
const countOf = async (q: string, params: unknown[]) => Number((await sql<{ n: string }>(q, params))[0].n);

/** The ORM's connection pool (tarn, under knex): how many connections are in use right now. */
async function pool() {
  const orm = await getOrm();
  const knex = orm.em.getConnection().getKnex() as unknown as {
    client: { pool: { numUsed(): number; numPendingAcquires(): number; max: number } };
  };
  return knex.client.pool;
}

/** Runs `burst` while sampling the pool; returns its results and the most connections used at once. */
async function sampled<T>(burst: () => Promise<T>): Promise<{ result: T; peakUsed: number; peakWaiting: number; max: number }> {
  const p = await pool();
  let peakUsed = 0;
  let peakWaiting = 0;
  const timer = setInterval(() => {
    peakUsed = Math.max(peakUsed, p.numUsed());
    peakWaiting = Math.max(peakWaiting, p.numPendingAcquires());
  }, 2);
  try {
    return { result: await burst(), peakUsed, peakWaiting, max: p.max };
  } finally {
    clearInterval(timer);
  }
}

/**
 * Forces the worst interleaving: another transaction holds the row, both requests read the same
 * version and queue on their UPDATE, then the row is let go and both updates run one after the
 * other. Without the version check in the UPDATE the second would overwrite the first.
 */
async function raceOnLockedRow(table: "trials" | "colourways", id: string, requests: () => Promise<CallResult>[]) {
  const em = await getEm();
  let release!: () => void;
  const gate = new Promise<void>((r) => (release = r));
  let held!: () => void;
  const isHeld = new Promise<void>((r) => (held = r));
  const holder = em.transactional(async (tx) => {
    await tx.execute(`select id from ${table} where id = ? for update`, [id]);
    held();
    await gate;
  });
  await isHeld;
  let running: Promise<CallResult[]> | undefined;
  try {
    running = Promise.all(requests());
    // Both requests are inside Postgres, waiting for the row lock on their UPDATE.
    const deadline = Date.now() + 15_000;
    for (;;) {
      const waiting = await countOf(
        `select count(*) as n from pg_stat_activity
          where datname = current_database() and wait_event_type = 'Lock' and query ilike ?`,
        [`update "${table}"%`],
      );
      if (waiting >= 2) break;
      if (Date.now() > deadline) throw new Error(`expected 2 updates of ${table} waiting on the row lock, saw ${waiting}`);
      await new Promise((r) => setTimeout(r, 10));
    }
  } finally {
    release();
    await holder;
  }
  return running;
}

function oneWinner(results: CallResult[]) {
  const ok = results.filter((r) => r.status >= 200 && r.status < 300);
  const refused = results.filter((r) => r.status === 409);
  expect(ok).toHaveLength(1);
  expect(refused).toHaveLength(results.length - 1);
  for (const r of refused) expect(r.json.error).toMatch(/Reload/);
  return { winner: ok[0], loser: refused[0] };
}

describe("two people save the same trial from the same version", () => {
  const tp = (trialId: string) => ({ studioId: studio.id, trialId });

  it("both updates reach the database together: one is stored, the other gets 409 and changes nothing", async () => {
    const trialId = await makeTrial(studio.id, { title: "Shared vat", authorId: owner.id, baseId, fibreWeightG: 100, tags: ["start"] });
    actAs(owner);
    const start = (await call(trialRoute.GET, "GET", tp(trialId))).json;
    const results = await raceOnLockedRow("trials", trialId, () => [
      runAs(owner, () => call(trialRoute.PATCH, "PATCH", tp(trialId), { body: { version: start.version, title: "Owner's title", fibreWeightG: 110 } })),
      runAs(dyer, () => call(trialRoute.PATCH, "PATCH", tp(trialId), { body: { version: start.version, title: "Dyer's title", tags: ["dyer"] } })),
    ]);
    const { winner, loser } = oneWinner(results);
    expect(loser.json.error).toBe("Someone else saved this while you were editing. Reload to see their changes, then apply yours again.");
    const stored = (await call(trialRoute.GET, "GET", tp(trialId))).json;
    expect(stored.version).toBe(start.version + 1);
    expect(stored.title).toBe(winner.json.title);
    if (stored.title === "Owner's title") {
      expect([stored.fibreWeightG, stored.tags]).toEqual([110, ["start"]]);
    } else {
      expect([stored.fibreWeightG, stored.tags]).toEqual([100, ["dyer"]]);
    }
  });

  it("without forcing the order, twenty rounds of two parallel saves each end with one 200 and one 409", async () => {
    const trialId = await makeTrial(studio.id, { title: "Round 0", authorId: owner.id });
    actAs(owner);
    let version = (await call(trialRoute.GET, "GET", tp(trialId))).json.version;
    for (let round = 1; round <= 20; round++) {
      const results = await Promise.all(
        [owner, dyer].map((who) =>
          runAs(who, () => call(trialRoute.PATCH, "PATCH", tp(trialId), { body: { version, title: `Round ${round} by ${who.name}` } })),
        ),
      );
      const { winner } = oneWinner(results);
      const stored = (await call(trialRoute.GET, "GET", tp(trialId))).json;
      expect(stored.version).toBe(version + 1);
      expect(stored.title).toBe(winner.json.title);
      version = stored.version;
    }
  });
});

describe("two people save the same colourway from the same version", () => {
  let colourwayId: string;
  let version: number;
  let lotTrialId: string;
  let passReading: string, failReading: string;
  const target = { L: 52, a: 18, b: 30 };
  const cp = () => ({ studioId: studio.id, colourwayId });

  beforeAll(async () => {
    const source = await makeTrial(studio.id, { title: "Apricot source", authorId: dyer.id, baseId, fibreWeightG: 100 });
    const readingId = await makeReading(studio.id, source, dyer.id, target);
    actAs(dyer);
    const res = await call(colourwaysRoute.POST, "POST", { studioId: studio.id }, { body: { trialId: source, readingId, name: "Apricot" } });
    expect(res.status).toBe(201);
    colourwayId = res.json.id;
    version = res.json.version;
    lotTrialId = await makeTrial(studio.id, { title: "Apricot lots", authorId: dyer.id, baseId, fibreWeightG: 500 });
    passReading = await makeReading(studio.id, lotTrialId, dyer.id, { ...target, L: target.L + 0.5 });
    failReading = await makeReading(studio.id, lotTrialId, dyer.id, { L: target.L + 8, a: target.a * 0.6, b: target.b * 0.6 });
  });

  it("both updates reach the database together: one name is stored, the other gets 409", async () => {
    const results = await raceOnLockedRow("colourways", colourwayId, () => [
      runAs(owner, () => call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, name: "Apricot (owner)", description: "owner's note" } })),
      runAs(dyer, () => call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, name: "Apricot (dyer)" } })),
    ]);
    const { winner } = oneWinner(results);
    actAs(guest);
    const stored = (await call(colourwayRoute.GET, "GET", cp())).json;
    expect(stored.version).toBe(version + 1);
    expect(stored.name).toBe(winner.json.name);
    expect(stored.description).toBe(stored.name === "Apricot (owner)" ? "owner's note" : "");
    version = stored.version;
  });

  it("without forcing the order, ten rounds of two parallel saves each end with one 200 and one 409", async () => {
    for (let round = 1; round <= 10; round++) {
      const results = await Promise.all(
        [owner, dyer].map((who) => runAs(who, () => call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, description: `${round} ${who.name}` } }))),
      );
      const { winner } = oneWinner(results);
      expect(winner.json.version).toBe(version + 1);
      version = winner.json.version;
    }
  });

  it("100 lots recorded at once: 100 stored, passing lots counted exactly, the pool fully used", async () => {
    const reading = (i: number) => (i % 3 === 0 ? passReading : i % 3 === 1 ? failReading : null);
    const { result, peakUsed, max } = await sampled(() =>
      Promise.all(
        Array.from({ length: 100 }, (_, i) =>
          runAs(i % 2 ? owner : dyer, () =>
            call(lotsRoute.POST, "POST", cp(), {
              body: { trialId: lotTrialId, code: `AP-${String(i).padStart(3, "0")}`, skeins: 5, fibreWeightG: 500, readingId: reading(i) },
            }),
          ),
        ),
      ),
    );
    expect(result.map((r) => r.status)).toEqual(Array(100).fill(201));
    // The requests really overlapped: every pooled connection was busy at some moment.
    expect(peakUsed).toBe(max);

    const expectedPass = Array.from({ length: 100 }, (_, i) => i).filter((i) => i % 3 === 0).length; // 34
    const expectedFail = Array.from({ length: 100 }, (_, i) => i).filter((i) => i % 3 === 1).length; // 33
    expect(await countOf("select count(*) as n from dye_lots where colourway_id = ?", [colourwayId])).toBe(100);
    actAs(guest);
    const cw = (await call(colourwayRoute.GET, "GET", cp())).json;
    expect(cw.lots).toHaveLength(100);
    expect(new Set(cw.lots.map((l: { code: string }) => l.code)).size).toBe(100);
    expect(cw.passingLots).toBe(expectedPass);
    expect(cw.lots.filter((l: { pass: boolean | null }) => l.pass === false)).toHaveLength(expectedFail);
    expect(cw.lots.filter((l: { pass: boolean | null }) => l.pass === null)).toHaveLength(100 - expectedPass - expectedFail);
    // Recording lots does not touch the colourway's version, so an open edit form stays valid.
    expect(cw.version).toBe(version);
    // Each lot recorded exactly one event with it.
    expect(await countOf("select count(*) as n from activity_events where colourway_id = ? and kind = 'lot.added'", [colourwayId])).toBe(100);
    actAs(owner);
    const repeatable = await call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, status: "repeatable" } });
    expect(repeatable.status).toBe(200);
    expect(repeatable.json).toMatchObject({ status: "repeatable", passingLots: expectedPass });
    expect(await countOf("select count(*) as n from activity_events where colourway_id = ? and kind = 'colourway.repeatable'", [colourwayId])).toBe(1);
    version = repeatable.json.version;
  });

  it("two saves marking it repeatable at once: one is stored with its event, the refused one leaves no event", async () => {
    actAs(owner);
    const back = await call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, status: "candidate" } });
    expect(back.status).toBe(200);
    version = back.json.version;
    const events = () => countOf("select count(*) as n from activity_events where colourway_id = ? and kind = 'colourway.repeatable'", [colourwayId]);
    expect(await events()).toBe(1);
    // Both pass the version check and record their event before the row lock lets them write.
    const results = await raceOnLockedRow("colourways", colourwayId, () => [
      runAs(owner, () => call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, status: "repeatable" } })),
      runAs(owner, () => call(colourwayRoute.PATCH, "PATCH", cp(), { body: { version, status: "repeatable", description: "from the other tab" } })),
    ]);
    oneWinner(results);
    expect(await events()).toBe(2);
  });
});

describe("100 comments on one trial at once", () => {
  it("stores all 100; notifications, unread counts, activity and queued mail are exact", async () => {
    const trialId = await makeTrial(studio.id, { title: "Busy thread", authorId: owner.id });
    const fp = { studioId: studio.id, targetType: "trial", targetId: trialId };
    for (const who of [dyer, guest]) {
      actAs(who);
      expect((await call(followRoute.PUT, "PUT", fp)).status).toBe(200);
    }
    const outboxBefore = await countOf("select count(*) as n from mail_outbox where user_id = ? and sent_at is null", [owner.id]);

    // 50 from the dyer and 50 from the guest, interleaved, all in flight together.
    const writers = Array.from({ length: 100 }, (_, i) => (i % 2 ? guest : dyer));
    const { result, peakUsed, max } = await sampled(() =>
      Promise.all(
        writers.map((who, i) =>
          runAs(who, () => call(commentsRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { body: doc(text(`note ${i}`)) } })),
        ),
      ),
    );
    expect(result.map((r) => r.status)).toEqual(Array(100).fill(201));
    expect(peakUsed).toBe(max);

    actAs(owner);
    const thread = await call(commentsRoute.GET, "GET", { studioId: studio.id, trialId });
    expect(thread.json).toHaveLength(100);
    expect(new Set(thread.json.map((c: { id: string }) => c.id)).size).toBe(100);
    expect(await countOf("select count(*) as n from comments where trial_id = ?", [trialId])).toBe(100);
    expect(await countOf("select count(*) as n from activity_events where trial_id = ? and kind = 'comment.added'", [trialId])).toBe(100);

    // Each comment tells the trial's author and the other follower; never its writer.
    const kinds = await sql<{ user_id: string; kind: string; n: string }>(
      "select user_id, kind, count(*) as n from notifications where trial_id = ? group by user_id, kind order by kind, user_id",
      [trialId],
    );
    expect(Object.fromEntries(kinds.map((k) => [`${k.user_id}:${k.kind}`, Number(k.n)]))).toEqual({
      [`${owner.id}:comment-on-own`]: 100,
      [`${dyer.id}:comment-on-followed`]: 50,
      [`${guest.id}:comment-on-followed`]: 50,
    });
    const unread = async (who: Person) => runAs(who, async () => (await call(countRoute.GET, "GET", { studioId: studio.id })).json.unread);
    expect([await unread(owner), await unread(dyer), await unread(guest)]).toEqual([100, 50, 50]);
    expect(await countOf("select count(*) as n from mail_outbox where user_id = ? and sent_at is null", [owner.id])).toBe(outboxBefore + 100);
    // Auto-follow on writing met 100 times; still exactly one follow each.
    expect(await countOf("select count(*) as n from follows where target_id = ?", [trialId])).toBe(2);
  });

  it("a member's first comments, sent in parallel, all land and make exactly one follow", async () => {
    const trialId = await makeTrial(studio.id, { title: "First words", authorId: owner.id });
    const results = await Promise.all(
      Array.from({ length: 30 }, (_, i) =>
        runAs(helper, () => call(commentsRoute.POST, "POST", { studioId: studio.id, trialId }, { body: { body: doc(text(`hello ${i}`)) } })),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(Array(30).fill(201));
    expect(await countOf("select count(*) as n from comments where trial_id = ?", [trialId])).toBe(30);
    expect(await countOf("select count(*) as n from follows where target_id = ? and user_id = ?", [trialId, helper.id])).toBe(1);
    expect(await countOf("select count(*) as n from notifications where trial_id = ? and user_id = ?", [trialId, owner.id])).toBe(30);
  });
});

describe("dye profiles refitted by two people at once", () => {
  it("every refit counts: three parallel refits leave each profile at model version 3, none refused", async () => {
    const lab = await makeStudio("Parallel Lab", [[owner, "owner"], [dyer, "dyer"]]);
    const wool = await makeBase(lab.id, "Lab wool", { fibres: [{ fibre: "wool", pct: 100 }] });
    const dyeIds = { turquoise: await makeDye(lab.id, "Lab turquoise"), magenta: await makeDye(lab.id, "Lab magenta") };
    for (const [key, dyeId] of Object.entries(dyeIds)) {
      for (const dos of [0.25, 1, 3]) {
        const d = syntheticDyeing(SYNTHETIC_BASES.white, [{ dyeId: key, dosPct: dos }]);
        const trialId = await makeTrial(lab.id, { title: `${key} ${dos}`, authorId: dyer.id, baseId: wool, layers: [{ method: "immersion", dyes: [dosDye(dyeId, dos)] }] });
        const layer = await (await getEm()).findOneOrFail(LayerSchema, { trial: trialId });
        await makeReading(lab.id, trialId, dyer.id, d.base);
        await makeReading(lab.id, trialId, dyer.id, d.result, { layerId: layer.id });
      }
    }
    const results = await Promise.all([owner, dyer, owner].map((who) => runAs(who, () => call(refitRoute.POST, "POST", { studioId: lab.id }))));
    expect(results.map((r) => r.status)).toEqual([200, 200, 200]);
    actAs(dyer);
    const profiles = (await call(profilesRoute.GET, "GET", { studioId: lab.id })).json;
    expect(profiles.map((p: { modelVersion: number }) => p.modelVersion)).toEqual([3, 3]);
  });
});
