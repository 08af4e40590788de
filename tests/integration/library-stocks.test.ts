// The stock-solution routes against the real database: validation, the dye reference, the age
// warning against the studio's shelf life, versions, roles, studio scoping and the list.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as studioRoute from "@/app/api/studios/[studioId]/route";
import * as stocksRoute from "@/app/api/studios/[studioId]/stocks/route";
import * as stockRoute from "@/app/api/studios/[studioId]/stocks/[stockId]/route";
import type { Dye } from "@/entities/library";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { daysAgo, makeDye, makeStock } from "../support/library";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "library-stocks";
let owner: Person;
let dyer: Person;
let guest: Person;
let stranger: Person;
let studio: StudioFixture;
let other: StudioFixture;
let teal: Dye;
let rose: Dye;
let retired: Dye;
let foreign: Dye;

const body = () => ({ dyeId: teal.id, concentrationPct: 1, definition: "to-volume", volumeMl: 500, mixedOn: daysAgo(3), powderLot: "L-7" });
const list = (query = "") => call(async (req, a) => stocksRoute.GET(new Request(`http://127.0.0.1/x${query}`, req), a), "GET", { studioId: studio.id });

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Stocks Studio", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  other = await makeStudio("Other Stocks Studio", [[stranger, "owner"]]);
  teal = await makeDye(studio.id, "Teal", { displayHex: "#1f6f78", sdsUrl: "https://example.com/teal.pdf" });
  rose = await makeDye(studio.id, "rose");
  retired = await makeDye(studio.id, "Retired", { archived: true });
  foreign = await makeDye(other.id, "Foreign");
  // The list fixtures: ages 10, 30, 61 and 200 days against the default 60-day shelf life.
  await makeStock(studio.id, teal.id, { concentrationPct: 1, volumeMl: 500, mixedOn: daysAgo(10), powderLot: "T-1" });
  await makeStock(studio.id, rose.id, { concentrationPct: 0.5, volumeMl: 250, mixedOn: daysAgo(30), definition: "in-water" });
  await makeStock(studio.id, teal.id, { concentrationPct: 2, volumeMl: 1000, mixedOn: daysAgo(61), notes: "cloudy" });
  await makeStock(studio.id, rose.id, { concentrationPct: 0.1, volumeMl: 100, mixedOn: daysAgo(200) });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("creating a stock solution", () => {
  it("a dyer mixes one: the dye comes back with it, and its age is counted in days", async () => {
    actAs(dyer);
    const res = await call(stocksRoute.POST, "POST", { studioId: studio.id }, { body: body() });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({
      concentrationPct: 1,
      definition: "to-volume",
      volumeMl: 500,
      mixedOn: daysAgo(3),
      powderLot: "L-7",
      ageDays: 3,
      shelfLifeDays: 60,
      pastShelfLife: false,
      version: 1,
      dye: { id: teal.id, name: "Teal", dyeClass: "acid", displayHex: "#1f6f78", sdsUrl: "https://example.com/teal.pdf" },
    });
  });
});

describe("invalid stock solutions → 422 with a message on the field", () => {
  const cases: [string, () => object, string, RegExp][] = [
    ["a negative volume", () => ({ volumeMl: -100 }), "volumeMl", /more than 0 ml/],
    ["a zero volume", () => ({ volumeMl: 0 }), "volumeMl", /more than 0 ml/],
    ["a volume as text", () => ({ volumeMl: "500 ml" }), "volumeMl", /Enter the volume in ml/],
    ["a zero concentration", () => ({ concentrationPct: 0 }), "concentrationPct", /more than 0 %/],
    ["a concentration of 40 %", () => ({ concentrationPct: 40 }), "concentrationPct", /Above 25 %/],
    ["an unknown definition", () => ({ definition: "by-weight" }), "definition", /made up to volume/],
    ["a date that is not a date", () => ({ mixedOn: "last Tuesday" }), "mixedOn", /as a date/],
    ["the 31st of February", () => ({ mixedOn: "2026-02-31" }), "mixedOn", /as a date/],
    ["a day in the future", () => ({ mixedOn: daysAgo(-5) }), "mixedOn", /cannot be in the future/],
    ["a dye id that is not an id", () => ({ dyeId: "teal" }), "dyeId", /Choose the dye/],
    ["another studio's dye", () => ({ dyeId: foreign.id }), "dyeId", /this studio's library/],
    ["an archived dye", () => ({ dyeId: retired.id }), "dyeId", /this studio's library/],
    ["a long powder lot", () => ({ powderLot: "x".repeat(61) }), "powderLot", /under 60/],
  ];
  it.each(cases)("%s", async (_n, change, field, message) => {
    actAs(owner);
    const res = await call(stocksRoute.POST, "POST", { studioId: studio.id }, { body: { ...body(), ...change() } });
    expect(res.status).toBe(422);
    expect(res.json.fields[field]).toMatch(message);
  });
});

describe("editing with versions", () => {
  it("a PATCH saves and bumps the version; a stale one → 409; the dye can be changed to another of the studio's", async () => {
    const s = await makeStock(studio.id, teal.id);
    actAs(dyer);
    const params = { studioId: studio.id, stockId: s.id };
    const ok = await call(stockRoute.PATCH, "PATCH", params, { body: { version: 1, volumeMl: 320, dyeId: rose.id } });
    expect(ok.status).toBe(200);
    expect(ok.json).toMatchObject({ volumeMl: 320, version: 2, dye: { id: rose.id, name: "rose" } });
    const stale = await call(stockRoute.PATCH, "PATCH", params, { body: { version: 1, volumeMl: 100 } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone else saved this stock solution/);
    const bad = await call(stockRoute.PATCH, "PATCH", params, { body: { version: 2, volumeMl: -1 } });
    expect(bad.status).toBe(422);
    expect(bad.json.fields.volumeMl).toMatch(/more than 0 ml/);
  });
});

describe("roles and studios", () => {
  it("a guest reads; every write → 403", async () => {
    const s = await makeStock(studio.id, teal.id);
    actAs(guest);
    const params = { studioId: studio.id, stockId: s.id };
    expect((await call(stockRoute.GET, "GET", params)).status).toBe(200);
    expect((await call(stocksRoute.POST, "POST", { studioId: studio.id }, { body: body() })).status).toBe(403);
    expect((await call(stockRoute.PATCH, "PATCH", params, { body: { version: 1, volumeMl: 1 } })).status).toBe(403);
    expect((await call(stockRoute.DELETE, "DELETE", params)).status).toBe(403);
  });

  it("only the owner archives", async () => {
    const s = await makeStock(studio.id, teal.id);
    const params = { studioId: studio.id, stockId: s.id };
    actAs(dyer);
    expect((await call(stockRoute.DELETE, "DELETE", params)).status).toBe(403);
    actAs(owner);
    expect((await call(stockRoute.DELETE, "DELETE", params)).status).toBe(204);
    expect((await call(stockRoute.GET, "GET", params)).json.archived).toBe(true);
  });

  it("another studio's stock → 404", async () => {
    const theirs = await makeStock(other.id, foreign.id);
    actAs(owner);
    const params = { studioId: studio.id, stockId: theirs.id };
    expect((await call(stockRoute.GET, "GET", params)).status).toBe(404);
    expect((await call(stockRoute.PATCH, "PATCH", params, { body: { version: 1, volumeMl: 5 } })).status).toBe(404);
    expect((await call(stockRoute.DELETE, "DELETE", params)).status).toBe(404);
  });
});

describe("the list, the age warning and the shelf life", () => {
  type Row = { concentrationPct: number; ageDays: number; pastShelfLife: boolean; dye: { name: string }; powderLot: string };
  const fixedPcts = [1, 0.5, 2, 0.1];
  const rows = async (query: string): Promise<Row[]> => {
    actAs(guest);
    const res = await list(query);
    expect(res.status).toBe(200);
    // Only the four list fixtures (other tests add 1 % stocks of their own; these ages are unique).
    return (res.json as Row[]).filter((r) => [10, 30, 61, 200].includes(r.ageDays) && fixedPcts.includes(r.concentrationPct));
  };
  const pcts = async (query: string) => (await rows(query)).map((r) => r.concentrationPct);

  it("newest first by default; by dye name, concentration and volume on request", async () => {
    expect(await pcts("")).toEqual([1, 0.5, 2, 0.1]);
    expect(await pcts("?sort=mixedOn&dir=asc")).toEqual([0.1, 2, 0.5, 1]);
    // rose before Teal ignoring case; each dye's stocks oldest day first.
    expect(await pcts("?sort=dye")).toEqual([0.1, 0.5, 2, 1]);
    expect(await pcts("?sort=concentration")).toEqual([0.1, 0.5, 1, 2]);
    expect(await pcts("?sort=volume&dir=desc")).toEqual([2, 1, 0.5, 0.1]);
  });

  it("with the default 60-day shelf life, 61 and 200 days are past it and 30 is not", async () => {
    const byAge = Object.fromEntries((await rows("")).map((r) => [r.ageDays, r.pastShelfLife]));
    expect(byAge).toEqual({ 10: false, 30: false, 61: true, 200: true });
    expect(await pcts("?pastShelfLife=true")).toEqual([2, 0.1]);
    expect(await pcts("?pastShelfLife=false")).toEqual([1, 0.5]);
  });

  it("filters by dye, definition and text (dye name, lot, notes)", async () => {
    expect(await pcts(`?dyeId=${rose.id}`)).toEqual([0.5, 0.1]);
    expect(await pcts("?definition=in-water")).toEqual([0.5]);
    expect(await pcts("?q=ROSE")).toEqual([0.5, 0.1]);
    expect(await pcts("?q=t-1")).toEqual([1]);
    expect(await pcts("?q=cloudy")).toEqual([2]);
  });

  it("the owner shortens the shelf life to 20 days: the 30-day stock now warns too", async () => {
    actAs(owner);
    const patched = await call(studioRoute.PATCH, "PATCH", { studioId: studio.id }, { body: { stockShelfLifeDays: 20 } });
    expect(patched.status).toBe(200);
    const byAge = Object.fromEntries((await rows("")).map((r) => [r.ageDays, r.pastShelfLife]));
    expect(byAge).toEqual({ 10: false, 30: true, 61: true, 200: true });
    actAs(guest);
    expect((await list()).json[0].shelfLifeDays).toBe(20);
    actAs(dyer);
    expect((await call(studioRoute.PATCH, "PATCH", { studioId: studio.id }, { body: { stockShelfLifeDays: 90 } })).status).toBe(403);
  });

  it("bad list parameters → 422", async () => {
    actAs(owner);
    const res = await list("?sort=age&pastShelfLife=yes&dyeId=abc");
    expect(res.status).toBe(422);
    expect(Object.keys(res.json.fields).sort()).toEqual(["dyeId", "pastShelfLife", "sort"]);
  });
});
