// Colourways and dye lots through their routes: proposing from a trial's reading, judging lots at the
// studio's tolerance, the owner-only and lot-count rules for "repeatable", the scaled recipe card,
// and the colour search matching a brute-force scan.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as colourwaysRoute from "@/app/api/studios/[studioId]/colourways/route";
import * as colourwayRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/route";
import * as lotsRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/lots/route";
import * as recipeRoute from "@/app/api/studios/[studioId]/colourways/[colourwayId]/recipe/route";
import * as searchRoute from "@/app/api/studios/[studioId]/colour-search/route";
import { deltaE00, deltaECMC } from "@/colour";
import { getEm, getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeReading } from "../support/readings";
import { dosDye, makeBase, makeDye, makeStock, makeTrial } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "colourways";
let owner: Person, dyer: Person, guest: Person, stranger: Person;
let studio: StudioFixture, other: StudioFixture;
let trialId: string, readingId: string, lotTrialId: string;
const target = { L: 45, a: -20, b: -25 };

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Colourway Studio", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  other = await makeStudio("Colourway Elsewhere", [[stranger, "owner"]]);
  const baseId = await makeBase(studio.id, "Sock base");
  const dyeId = await makeDye(studio.id, "Harbour test teal");
  const stockId = await makeStock(studio.id, dyeId, { pct: 1 });
  trialId = await makeTrial(studio.id, {
    title: "Deep harbour",
    authorId: dyer.id,
    baseId,
    fibreWeightG: 100,
    layers: [{ method: "immersion", dyes: [{ ...dosDye(dyeId, 2), stockId }] }],
  });
  readingId = await makeReading(studio.id, trialId, dyer.id, target);
  lotTrialId = await makeTrial(studio.id, { title: "Lot run", authorId: dyer.id, baseId, fibreWeightG: 800 });
});

afterAll(async () => {
  await (await getOrm()).close();
});

describe("colourways and lots", () => {
  let id: string;
  let version: number;

  it("a dyer proposes a colourway from a trial's reading; a guest cannot", async () => {
    actAs(guest);
    expect((await call(colourwaysRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, readingId, name: "Harbour" } })).status).toBe(403);
    actAs(dyer);
    const bad = await call(colourwaysRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, readingId, name: "H" } });
    expect(bad.status).toBe(422);
    expect(bad.json.fields.name).toMatch(/at least 2/);
    const res = await call(colourwaysRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, readingId, name: "Harbour at dusk" } });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ status: "candidate", target, passingLots: 0, lotsNeeded: 2 });
    expect(res.json.recipe.layers).toHaveLength(1);
    id = res.json.id;
    version = res.json.version;
  });

  it("judges lots at the tolerance: CMC(2:1) ≤ 1.0 passes, with ΔE00 shown and the direction of a miss", async () => {
    actAs(dyer);
    // 0.9 CMC(2:1) units lighter than target passes; a lot far lighter and duller fails.
    const near = { L: target.L + 1.0, a: target.a, b: target.b };
    expect(deltaECMC(target, near)).toBeLessThan(1.0); // Clarke, McDonald & Rigg 1984: lightness weighted l = 2
    const far = { L: target.L + 6, a: target.a * 0.7, b: target.b * 0.7 };
    const r1 = await makeReading(studio.id, lotTrialId, dyer.id, near);
    const r2 = await makeReading(studio.id, lotTrialId, dyer.id, far);
    const r3 = await makeReading(studio.id, lotTrialId, dyer.id, { ...target, b: target.b + 0.4 });
    const add = (readingId: string, code: string) =>
      call(lotsRoute.POST, "POST", { studioId: studio.id, colourwayId: id }, { body: { trialId: lotTrialId, code, skeins: 8, fibreWeightG: 800, readingId } });
    const pass = await add(r1, "A");
    expect(pass.status).toBe(201);
    const lotA = pass.json.lots[0];
    expect(lotA.pass).toBe(true);
    expect(lotA.cmc21).toBeCloseTo(deltaECMC(target, near, 2, 1), 6);
    expect(lotA.de00).toBeCloseTo(deltaE00(target, near, { kL: 2 }), 6); // textile weighting, kL = 2
    const fail = await add(r2, "B");
    const lotB = fail.json.lots[1];
    expect(lotB.pass).toBe(false);
    expect(lotB.misses).toEqual(expect.arrayContaining(["lighter", "duller"]));
    const bad = await call(lotsRoute.POST, "POST", { studioId: studio.id, colourwayId: id }, { body: { trialId: lotTrialId, code: "", skeins: 0, fibreWeightG: -1 } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.json.fields).sort()).toEqual(["code", "fibreWeightG", "skeins"]);

    // Repeatable: refused for a dyer, refused below N passing lots, allowed for the owner at N.
    actAs(dyer);
    const byDyer = await call(colourwayRoute.PATCH, "PATCH", { studioId: studio.id, colourwayId: id }, { body: { version, status: "repeatable" } });
    expect(byDyer.status).toBe(403);
    actAs(owner);
    const early = await call(colourwayRoute.PATCH, "PATCH", { studioId: studio.id, colourwayId: id }, { body: { version, status: "repeatable" } });
    expect(early.status).toBe(409);
    expect(early.json.error).toMatch(/2 passing dye lots; this one has 1/);
    actAs(dyer);
    const third = await add(r3, "C");
    expect(third.json.passingLots).toBe(2);
    actAs(owner);
    const ok = await call(colourwayRoute.PATCH, "PATCH", { studioId: studio.id, colourwayId: id }, { body: { version, status: "repeatable" } });
    expect(ok.status).toBe(200);
    expect(ok.json.status).toBe("repeatable");
    const stale = await call(colourwayRoute.PATCH, "PATCH", { studioId: studio.id, colourwayId: id }, { body: { version, name: "Renamed" } });
    expect(stale.status).toBe(409);
  });

  it("scales the recipe card to 800 g with the colour module's arithmetic", async () => {
    actAs(guest);
    const res = await recipeRoute.GET(new Request("http://x/?weight=800"), { params: Promise.resolve({ studioId: studio.id, colourwayId: id }) });
    expect(res.status).toBe(200);
    const card = await res.json();
    expect(card.factor).toBe(8);
    // 800 g at 2 % DOS → 16 g of dye → 1600 ml of a 1 % stock (DOMAIN.md arithmetic, common practice).
    expect(card.layers[0].dyes[0].grams).toBeCloseTo(16, 9);
    expect(card.layers[0].dyes[0].stockMl).toBeCloseTo(1600, 9);
    const bad = await recipeRoute.GET(new Request("http://x/?weight=-5"), { params: Promise.resolve({ studioId: studio.id, colourwayId: id }) });
    expect(bad.status).toBe(422);
    actAs(stranger);
    const hidden = await recipeRoute.GET(new Request("http://x/?weight=800"), { params: Promise.resolve({ studioId: other.id, colourwayId: id }) });
    expect(hidden.status).toBe(404);
  });
});

describe("find by colour", () => {
  it("returns the same top 10 as a brute-force scan of the studio's readings", async () => {
    const em = await getEm();
    // 3 000 random readings spread over the CIELAB space, saturated colours included.
    let seed = 7;
    const rnd = () => ((seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32);
    const photo = await em.getConnection().execute<{ id: string }[]>(
      `insert into photos (id, created_at, studio_id, trial_id, kind, uploaded_by_id, status, upload_key)
       values (gen_random_uuid(), now(), ?, ?, 'final', ?, 'ready', 'test/none') returning id`,
      [studio.id, lotTrialId, dyer.id],
    );
    const values: unknown[] = [];
    const rows: string[] = [];
    for (let i = 0; i < 3000; i++) {
      rows.push("(gen_random_uuid(), now(), now(), ?, ?, ?, 1, '', '{}', ?, ?, ?, '[]', ?)");
      values.push(studio.id, lotTrialId, photo[0].id, rnd() * 100, rnd() * 200 - 100, rnd() * 200 - 100, dyer.id);
    }
    await em.getConnection().execute(
      `insert into readings (id, created_at, updated_at, studio_id, trial_id, photo_id, model_version, label, region, l, a, b, palette, created_by_id) values ${rows.join(",")}`,
      values,
    );
    const all = await em.getConnection().execute<{ id: string; l: number; a: number; b: number }[]>(
      "select id, l, a, b from readings where studio_id = ?",
      [studio.id],
    );
    actAs(guest);
    for (const q of [{ L: 50, a: 10, b: -10 }, { L: 30, a: 80, b: 60 }, { L: 90, a: -2, b: 3 }, target]) {
      const brute = all
        .map((r) => ({ id: r.id, d: deltaE00(q, { L: r.l, a: r.a, b: r.b }) }))
        .sort((x, y) => x.d - y.d || (x.id < y.id ? -1 : 1))
        .slice(0, 10);
      const res = await searchRoute.GET(new Request(`http://x/?L=${q.L}&a=${q.a}&b=${q.b}&limit=10`), { params: Promise.resolve({ studioId: studio.id }) });
      const body = await res.json();
      expect(body.readings.map((r: { id: string }) => r.id)).toEqual(brute.map((b) => b.id));
    }
    const byHex = await searchRoute.GET(new Request("http://x/?hex=%23336699"), { params: Promise.resolve({ studioId: studio.id }) });
    expect((await byHex.json()).readings).toHaveLength(10);
    const none = await searchRoute.GET(new Request("http://x/?limit=5"), { params: Promise.resolve({ studioId: studio.id }) });
    expect(none.status).toBe(422);
  });

  // Regression: with the 10th match between ~16 and ~57 ΔE00 the a*b* box had reached its cap while
  // its bound was still below the match, and the search never ended.
  it("finishes when even the nearest matches are far away (dark readings, a mid-grey target)", async () => {
    const sparse = await makeStudio("Colourways Sparse", [[dyer, "dyer"]]);
    const sparseTrial = await makeTrial(sparse.id, { title: "Dark run", authorId: dyer.id });
    const ids: string[] = [];
    for (let i = 0; i < 12; i++) ids.push(await makeReading(sparse.id, sparseTrial, dyer.id, { L: 5 + i, a: i - 6, b: 6 - i }));
    actAs(dyer);
    const pale = { L: 58, a: 0, b: 0 };
    const res = await searchRoute.GET(new Request(`http://x/?L=${pale.L}&a=${pale.a}&b=${pale.b}&limit=10`), { params: Promise.resolve({ studioId: sparse.id }) });
    const body = await res.json();
    expect(body.readings).toHaveLength(10);
    expect(body.readings[9].de00).toBeGreaterThan(17); // no finite a*b* radius settles it (colour-bound.ts)
    expect(body.readings[9].de00).toBeLessThan(57); // and the L* box does not span all of L*
    const em = await getEm();
    const all = await em.getConnection().execute<{ id: string; l: number; a: number; b: number }[]>("select id, l, a, b from readings where studio_id = ?", [sparse.id]);
    const brute = all.map((r) => ({ id: r.id, d: deltaE00(pale, { L: r.l, a: r.a, b: r.b }) })).sort((x, y) => x.d - y.d || (x.id < y.id ? -1 : 1));
    expect(body.readings.map((r: { id: string }) => r.id)).toEqual(brute.slice(0, 10).map((b) => b.id));
  });
});
