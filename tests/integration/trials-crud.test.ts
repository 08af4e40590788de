// Trials through their routes: create, read, edit with optimistic locking, delete, copy; bad input
// answers 422 with a message per field; stale versions 409.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as trialRoute from "@/app/api/studios/[studioId]/trials/[trialId]/route";
import * as copyRoute from "@/app/api/studios/[studioId]/trials/[trialId]/copy/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import { getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeBase, makeDye, makeStock } from "../support/trial-fixtures";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-crud";
let owner: Person;
let dyer: Person;
let studio: StudioFixture;
let other: StudioFixture;
let baseId: string;
let otherBaseId: string;
let superwashId: string;
let dyeId: string;
let stockId: string;

beforeAll(async () => {
  const otherOwner = await makeUser(TAG, "neighbour");
  [owner, dyer] = await Promise.all([makeUser(TAG, "owner"), makeUser(TAG, "dyer", { name: "Dyer Dee" })]);
  studio = await makeStudio("Crud Studio", [[owner, "owner"], [dyer, "dyer"]]);
  other = await makeStudio("Other Crud Studio", [[otherOwner, "owner"]]);
  baseId = await makeBase(studio.id, "Plain Wool DK", { fibres: [{ fibre: "wool", pct: 100 }], weightClass: "dk" });
  superwashId = await makeBase(studio.id, "Sock 75/25", { fibres: [{ fibre: "superwash wool", pct: 75 }, { fibre: "nylon", pct: 25 }], superwash: true });
  otherBaseId = await makeBase(other.id, "Neighbour Base");
  dyeId = await makeDye(studio.id, "Crud Teal", { displayHex: "#1f7a7a" });
  stockId = await makeStock(studio.id, dyeId, { pct: 1 });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const sp = () => ({ studioId: studio.id });
const tp = (trialId: string) => ({ studioId: studio.id, trialId });

async function create(body: object = {}) {
  actAs(dyer);
  const res = await call(trialsRoute.POST, "POST", sp(), { body: { title: "Teal on wool", fibreWeightG: 100, ...body } });
  expect(res.status).toBe(201);
  return res.json;
}

describe("create and read", () => {
  it("creates a trial with the caller as author and reads it back", async () => {
    const t = await create({ baseId, tags: [" Teal ", "teal", "Tonal"], status: "in-progress" });
    expect(t.author).toEqual({ id: dyer.id, name: "Dyer Dee" });
    expect(t.base).toMatchObject({ id: baseId, name: "Plain Wool DK", superwash: false, weightClass: "dk" });
    expect(t.tags).toEqual(["teal", "tonal"]);
    expect(t.status).toBe("in-progress");
    expect(t.version).toBe(1);
    expect(t.layers).toEqual([]);
    actAs(owner);
    const got = await call(trialRoute.GET, "GET", tp(t.id));
    expect(got.status).toBe(200);
    expect(got.json.title).toBe("Teal on wool");
  });

  it("keeps rich notes and searches their text", async () => {
    const notes = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Bath cleared in 12 minutes" }] }] };
    const t = await create({ notes, title: "Notes trial" });
    expect(t.notes).toEqual(notes);
    const list = await call(trialsRoute.GET, "GET", sp());
    expect(list.status).toBe(200);
  });

  it("defaults the status to planned", async () => {
    expect((await create()).status).toBe("planned");
  });
});

describe("422 with a message per field", () => {
  const cases: [string, object, string, RegExp][] = [
    ["no title", { title: "  " }, "title", /Give the trial a title/],
    ["long title", { title: "x".repeat(161) }, "title", /under 160/],
    ["fibre weight as text", { fibreWeightG: "100" }, "fibreWeightG", /dry fibre weight in grams, e\.g\. 100/],
    ["zero fibre weight", { fibreWeightG: 0 }, "fibreWeightG", /more than zero/],
    ["huge fibre weight", { fibreWeightG: 50_000 }, "fibreWeightG", /at most 20 000 g/],
    ["unknown status", { status: "cooking" }, "status", /planned, in progress or done/],
    ["tags not a list", { tags: "teal" }, "tags", /list of short words/],
    ["long tag", { tags: ["x".repeat(41)] }, "tags.0", /under 40 characters/],
    ["base not an id", { baseId: "wool" }, "baseId", /Choose a base/],
    ["notes not a document", { notes: { type: "html" } }, "notes.type", /notes editor/],
  ];
  it.each(cases)("POST: %s", async (_n, body, field, message) => {
    actAs(dyer);
    const res = await call(trialsRoute.POST, "POST", sp(), { body: { title: "Fine", fibreWeightG: 100, ...body } });
    expect(res.status).toBe(422);
    expect(res.json.fields[field]).toMatch(message);
  });

  it("POST: a base from another studio", async () => {
    actAs(dyer);
    const res = await call(trialsRoute.POST, "POST", sp(), { body: { title: "Fine", fibreWeightG: 100, baseId: otherBaseId } });
    expect(res.status).toBe(422);
    expect(res.json.fields.baseId).toMatch(/this studio's library/);
  });

  it("PATCH without a version", async () => {
    const t = await create();
    const res = await call(trialRoute.PATCH, "PATCH", tp(t.id), { body: { title: "New" } });
    expect(res.status).toBe(422);
    expect(res.json.fields.version).toMatch(/Reload the trial/);
  });

  it("GET list: bad page and a reversed date range", async () => {
    actAs(dyer);
    const req = (qs: string) => trialsRoute.GET(new Request(`http://127.0.0.1/x?${qs}`), { params: Promise.resolve(sp()) });
    const a = await req("page=0");
    expect(a.status).toBe(422);
    expect((await a.json()).fields.page).toMatch(/Pages start at 1/);
    const b = await req("from=2026-05-02&to=2026-05-01");
    expect(b.status).toBe(422);
    expect((await b.json()).fields.to).toMatch(/end date comes before/);
    const c = await req("status=boiling");
    expect(c.status).toBe(422);
    const d = await req("pageSize=500");
    expect((await d.json()).fields.pageSize).toMatch(/at most 100/);
  });
});

describe("optimistic locking", () => {
  it("a PATCH with the current version saves and moves the version on; the stale one gets 409", async () => {
    const t = await create();
    actAs(dyer);
    const first = await call(trialRoute.PATCH, "PATCH", tp(t.id), { body: { version: t.version, title: "Teal, second go", fibreWeightG: 104 } });
    expect(first.status).toBe(200);
    expect(first.json.title).toBe("Teal, second go");
    expect(first.json.fibreWeightG).toBe(104);
    expect(first.json.version).toBe(t.version + 1);
    actAs(owner);
    const stale = await call(trialRoute.PATCH, "PATCH", tp(t.id), { body: { version: t.version, title: "Overwrite" } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone else saved this/);
    const now = await call(trialRoute.GET, "GET", tp(t.id));
    expect(now.json.title).toBe("Teal, second go");
  });

  it("clears the base with null and changes status and notes", async () => {
    const t = await create({ baseId });
    const res = await call(trialRoute.PATCH, "PATCH", tp(t.id), {
      body: { version: t.version, baseId: null, status: "done", notes: { type: "doc", content: [] } },
    });
    expect(res.status).toBe(200);
    expect(res.json.base).toBeNull();
    expect(res.json.status).toBe("done");
  });
});

describe("delete", () => {
  it("the owner deletes; the dyer may not", async () => {
    const t = await create();
    actAs(dyer);
    expect((await call(trialRoute.DELETE, "DELETE", tp(t.id))).status).toBe(403);
    actAs(owner);
    expect((await call(trialRoute.DELETE, "DELETE", tp(t.id))).status).toBe(204);
    expect((await call(trialRoute.GET, "GET", tp(t.id))).status).toBe(404);
  });
});

describe("copy: same recipe, new base", () => {
  it("copies the layers at the same depth of shade onto a new base and fibre weight", async () => {
    const t = await create({ baseId, tags: ["teal"] });
    actAs(dyer);
    const withLayer = await call(layersRoute.POST, "POST", tp(t.id), {
      body: {
        method: "immersion",
        dyes: [{ dyeId, stockId, amount: { value: 100, unit: "ml" } }],
        acid: { kind: "vinegar", amount: 52, ph: 4.6 },
        waterL: 4,
        temperatureC: 90,
        minutes: 40,
        observations: "Cleared nicely",
        rinseNote: "Ran clear",
        bled: false,
      },
    });
    expect(withLayer.status).toBe(201);
    const res = await call(copyRoute.POST, "POST", tp(t.id), { body: { baseId: superwashId, fibreWeightG: 200 } });
    expect(res.status).toBe(201);
    const c = res.json;
    expect(c.id).not.toBe(t.id);
    expect(c.copiedFromId).toBe(t.id);
    expect(c.title).toBe("Teal on wool (copy)");
    expect(c.base.id).toBe(superwashId);
    expect(c.fibreWeightG).toBe(200);
    expect(c.status).toBe("planned");
    expect(c.tags).toEqual(["teal"]);
    expect(c.layers).toHaveLength(1);
    const [l] = c.layers;
    // 100 ml of 1 % stock on 100 g is 1 % DOS; on 200 g the same 1 % is 200 ml (DOMAIN.md check values, common practice).
    expect(l.dyes[0].dosPct).toBeCloseTo(1, 12);
    expect(l.dyes[0].stockMl).toBeCloseTo(200, 9);
    expect(l.dyes[0].entered).toEqual({ value: expect.closeTo(200, 9), unit: "ml" });
    // Water and acid follow the fibre weight (the liquor ratio 1:40 stays).
    expect(l.waterL).toBeCloseTo(8, 12);
    expect(l.liquorRatio).toBeCloseTo(40, 9);
    expect(l.acid).toEqual({ kind: "vinegar", amount: expect.closeTo(104, 9), ph: null });
    // Results stay with the original.
    expect(l.observations).toBe("");
    expect(l.rinseNote).toBe("");
    expect(l.bled).toBeNull();
    expect(l.temperatureC).toBe(90);
  });

  it("keeps the base and weight when none are given, and takes a new title", async () => {
    const t = await create({ baseId });
    const res = await call(copyRoute.POST, "POST", tp(t.id), { body: { title: "Teal again" } });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ title: "Teal again", fibreWeightG: 100, base: { id: baseId } });
  });

  it("422 when the scaled water or acid would leave a layer's range, and nothing is stored", async () => {
    const t = await create();
    actAs(dyer);
    const withLayer = await call(layersRoute.POST, "POST", tp(t.id), { body: { method: "immersion", acid: { kind: "vinegar", amount: 30 }, waterL: 5 } });
    expect(withLayer.status).toBe(201);
    // 100 g → 20 kg scales 5 L of water to 1 000 L, past the 500 L a layer takes.
    const big = await call(copyRoute.POST, "POST", tp(t.id), { body: { fibreWeightG: 20_000 } });
    expect(big.status).toBe(422);
    expect(big.json.fields.fibreWeightG).toMatch(/^At 20000 g, layer 1 would be out of range\. Enter the water in litres/);
    // A weight so small the water rounds to nothing.
    const tiny = await call(copyRoute.POST, "POST", tp(t.id), { body: { fibreWeightG: 5e-324 } });
    expect(tiny.status).toBe(422);
    const list = await call(trialsRoute.GET, "GET", { studioId: studio.id });
    expect(list.json.items.filter((x: { copiedFromId?: string }) => x.copiedFromId === t.id)).toEqual([]);
  });

  it("422 for a bad fibre weight, 404 for another studio's trial", async () => {
    const t = await create();
    const bad = await call(copyRoute.POST, "POST", tp(t.id), { body: { fibreWeightG: -5 } });
    expect(bad.status).toBe(422);
    expect(bad.json.fields.fibreWeightG).toMatch(/more than zero/);
    const res = await call(copyRoute.POST, "POST", { studioId: other.id, trialId: t.id }, { body: {} });
    expect(res.status).toBe(404);
  });
});
