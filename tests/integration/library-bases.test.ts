// The yarn-base routes against the real database: validation, optimistic locking, roles,
// studio scoping, archiving, and the list's filters and sorting.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as basesRoute from "@/app/api/studios/[studioId]/bases/route";
import * as baseRoute from "@/app/api/studios/[studioId]/bases/[baseId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { makeBase } from "../support/library";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "library-bases";
let owner: Person;
let dyer: Person;
let guest: Person;
let stranger: Person;
let studio: StudioFixture;
let other: StudioFixture;

const sock = { name: "Test Sock", fibres: [{ fibre: "merino", pct: 75 }, { fibre: "nylon", pct: 25 }], superwash: true, weightClass: "fingering", metresPer100g: 420 };
const list = (query = "") => call(async (req, a) => basesRoute.GET(new Request(`http://127.0.0.1/x${query}`, req), a), "GET", { studioId: studio.id });

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Bases Studio", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  other = await makeStudio("Other Bases Studio", [[stranger, "owner"]]);
  // A fixed set for the list checks, written straight to the database.
  await makeBase(studio.id, "aran plain", { fibres: [{ fibre: "wool", pct: 100 }], weightClass: "aran", metresPer100g: 160 });
  await makeBase(studio.id, "Blend Sport", { fibres: [{ fibre: "wool", pct: 70 }, { fibre: "cotton", pct: 30 }], weightClass: "sport", metresPer100g: 250 });
  await makeBase(studio.id, "Cloud Lace", { fibres: [{ fibre: "merino", pct: 50 }, { fibre: "silk", pct: 50 }], superwash: true, weightClass: "lace", metresPer100g: 800 });
  await makeBase(studio.id, "Dune DK", { fibres: [{ fibre: "wool", pct: 100 }], weightClass: "dk", notes: "Undyed from the Dune farm" });
  await makeBase(studio.id, "Echo Gone", { archived: true });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("creating a base", () => {
  it("a dyer adds a base and gets it back with version 1, largest fibre share first", async () => {
    actAs(dyer);
    const res = await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { ...sock, fibres: [...sock.fibres].reverse() } });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ name: "Test Sock", superwash: true, weightClass: "fingering", metresPer100g: 420, notes: "", archived: false, version: 1 });
    expect(res.json.fibres).toEqual(sock.fibres);
    const again = await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: res.json.id });
    expect(again.json.name).toBe("Test Sock");
  });

  it("optional fields may be left out", async () => {
    actAs(owner);
    const res = await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { name: "Bare Minimum", fibres: [{ fibre: "alpaca", pct: 100 }], weightClass: "other" } });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ superwash: false, metresPer100g: null, notes: "" });
  });

  it("a second base with the same name (any case) → 422 on name", async () => {
    actAs(owner);
    const res = await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { ...sock, name: "test SOCK" } });
    expect(res.status).toBe(422);
    expect(res.json.fields.name).toMatch(/already a base called/);
  });

  it("an archived base's name is free again", async () => {
    actAs(owner);
    const res = await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { ...sock, name: "Echo Gone" } });
    expect(res.status).toBe(201);
  });
});

describe("invalid bases → 422 with a message on the field", () => {
  const cases: [string, object, string, RegExp][] = [
    ["fibres summing to 90", { fibres: [{ fibre: "wool", pct: 60 }, { fibre: "nylon", pct: 30 }] }, "fibres", /add up to 90 %; they must make exactly 100 %/],
    ["fibres summing to 110", { fibres: [{ fibre: "wool", pct: 80 }, { fibre: "nylon", pct: 30 }] }, "fibres", /add up to 110 %/],
    ["no fibres", { fibres: [] }, "fibres", /at least one fibre/],
    ["a fibre listed twice", { fibres: [{ fibre: "wool", pct: 50 }, { fibre: "wool", pct: 50 }] }, "fibres", /listed twice/],
    ["an unknown fibre", { fibres: [{ fibre: "unicorn", pct: 100 }] }, "fibres.0.fibre", /Choose a fibre/],
    ["a zero share", { fibres: [{ fibre: "wool", pct: 0 }, { fibre: "silk", pct: 100 }] }, "fibres.0.pct", /more than 0 %/],
    ["a share as text", { fibres: [{ fibre: "wool", pct: "100" }] }, "fibres.0.pct", /Enter a percentage/],
    ["a blank name", { name: "   " }, "name", /Give it a name/],
    ["a long name", { name: "x".repeat(121) }, "name", /under 120/],
    ["an unknown weight class", { weightClass: "chunky-ish" }, "weightClass", /Choose a weight class/],
    ["negative metres", { metresPer100g: -5 }, "metresPer100g", /more than 0/],
    ["metres as text", { metresPer100g: "400" }, "metresPer100g", /as a number/],
    ["superwash as text", { superwash: "yes" }, "superwash", /superwash/],
  ];
  it.each(cases)("%s", async (_n, change, field, message) => {
    actAs(owner);
    const res = await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { ...sock, name: "Bad One", ...change } });
    expect(res.status).toBe(422);
    expect(res.json.fields[field]).toMatch(message);
  });

  it("a PATCH without a version → 422 on version", async () => {
    actAs(owner);
    const b = await makeBase(studio.id, "Versionless");
    const res = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { name: "New" } });
    expect(res.status).toBe(422);
    expect(res.json.fields.version).toMatch(/version you last saw/);
  });

  it("a PATCH with bad fibres → 422 and nothing saved", async () => {
    actAs(owner);
    const b = await makeBase(studio.id, "Keep Fibres");
    const res = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, fibres: [{ fibre: "wool", pct: 99 }] } });
    expect(res.status).toBe(422);
    const now = await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: b.id });
    expect(now.json.fibres).toEqual([{ fibre: "wool", pct: 100 }]);
  });
});

describe("editing with versions", () => {
  it("a PATCH with the current version saves and bumps the version; the stale one → 409", async () => {
    actAs(dyer);
    const b = await makeBase(studio.id, "Two Hands");
    const first = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, notes: "Ivo's note" } });
    expect(first.status).toBe(200);
    expect(first.json).toMatchObject({ notes: "Ivo's note", version: 2, name: "Two Hands" });
    actAs(owner);
    const stale = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, notes: "Maren's note" } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone else saved this base/);
    const now = await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: b.id });
    expect(now.json).toMatchObject({ notes: "Ivo's note", version: 2 });
  });

  it("renaming onto another base's name → 422", async () => {
    actAs(owner);
    const b = await makeBase(studio.id, "Rename Me");
    const res = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, name: "dune dk" } });
    expect(res.status).toBe(422);
    expect(res.json.fields.name).toMatch(/already a base/);
  });
});

describe("roles and studios", () => {
  it("a guest reads the list and one base", async () => {
    actAs(guest);
    const res = await list();
    expect(res.status).toBe(200);
    expect(res.json.map((b: { name: string }) => b.name)).toContain("Dune DK");
  });

  it("a guest's writes → 403 and change nothing", async () => {
    const b = await makeBase(studio.id, "Guest Proof");
    actAs(guest);
    expect((await call(basesRoute.POST, "POST", { studioId: studio.id }, { body: { ...sock, name: "Guest Base" } })).status).toBe(403);
    expect((await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, name: "Hacked" } })).status).toBe(403);
    expect((await call(baseRoute.DELETE, "DELETE", { studioId: studio.id, baseId: b.id })).status).toBe(403);
    actAs(owner);
    const now = await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: b.id });
    expect(now.json).toMatchObject({ name: "Guest Proof", archived: false, version: 1 });
  });

  it("a dyer may not archive (owner only)", async () => {
    const b = await makeBase(studio.id, "Dyer Proof");
    actAs(dyer);
    expect((await call(baseRoute.DELETE, "DELETE", { studioId: studio.id, baseId: b.id })).status).toBe(403);
  });

  it("another studio's base → 404 for read, edit and archive, even for that studio's owner here", async () => {
    const theirs = await makeBase(other.id, "Their Base");
    actAs(owner);
    const params = { studioId: studio.id, baseId: theirs.id };
    expect((await call(baseRoute.GET, "GET", params)).status).toBe(404);
    expect((await call(baseRoute.PATCH, "PATCH", params, { body: { version: 1, name: "Mine Now" } })).status).toBe(404);
    expect((await call(baseRoute.DELETE, "DELETE", params)).status).toBe(404);
    // The stranger cannot reach it through our studio's URL either: not a member → 404.
    actAs(stranger);
    expect((await call(baseRoute.GET, "GET", params)).status).toBe(404);
  });

  it("an id that is not an id → 404", async () => {
    actAs(owner);
    expect((await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: "not-a-uuid" })).status).toBe(404);
  });
});

describe("archiving", () => {
  it("the owner archives a base: 204, gone from the list, still readable by id, no longer editable", async () => {
    const b = await makeBase(studio.id, "Retiring");
    actAs(owner);
    const res = await call(baseRoute.DELETE, "DELETE", { studioId: studio.id, baseId: b.id });
    expect(res.status).toBe(204);
    const names = (await list()).json.map((x: { name: string }) => x.name);
    expect(names).not.toContain("Retiring");
    const archived = (await list("?archived=true")).json.map((x: { name: string }) => x.name);
    expect(archived).toContain("Retiring");
    const one = await call(baseRoute.GET, "GET", { studioId: studio.id, baseId: b.id });
    expect(one.json.archived).toBe(true);
    const edit = await call(baseRoute.PATCH, "PATCH", { studioId: studio.id, baseId: b.id }, { body: { version: 1, notes: "x" } });
    expect(edit.status).toBe(409);
    expect(edit.json.error).toMatch(/archived/);
  });
});

describe("the list: filters and sorting", () => {
  const names = async (query: string) => {
    actAs(guest);
    const res = await list(query);
    expect(res.status).toBe(200);
    return res.json.map((b: { name: string }) => b.name) as string[];
  };
  const fixed = ["aran plain", "Blend Sport", "Cloud Lace", "Dune DK"];
  const only = (xs: string[]) => xs.filter((n) => fixed.includes(n));

  it("by name, ignoring letter case, both ways", async () => {
    expect(only(await names("?sort=name"))).toEqual(fixed);
    expect(only(await names("?sort=name&dir=desc"))).toEqual([...fixed].reverse());
  });

  it("by weight class in the order lace → bulky", async () => {
    expect(only(await names("?sort=weightClass"))).toEqual(["Cloud Lace", "Blend Sport", "Dune DK", "aran plain"]);
  });

  it("by metres, blanks last either way", async () => {
    expect(only(await names("?sort=metres"))).toEqual(["aran plain", "Blend Sport", "Cloud Lace", "Dune DK"]);
    expect(only(await names("?sort=metres&dir=desc"))).toEqual(["Cloud Lace", "Blend Sport", "aran plain", "Dune DK"]);
  });

  it("filters by fibre, superwash, weight class and text (name or notes)", async () => {
    expect(only(await names("?fibre=cotton"))).toEqual(["Blend Sport"]);
    expect(only(await names("?fibre=silk&superwash=true"))).toEqual(["Cloud Lace"]);
    expect(only(await names("?superwash=false&weightClass=dk"))).toEqual(["Dune DK"]);
    expect(only(await names("?q=LACE"))).toEqual(["Cloud Lace"]);
    expect(only(await names("?q=farm"))).toEqual(["Dune DK"]);
    // Wildcards in the search are taken literally.
    expect(only(await names("?q=%25"))).toEqual([]);
  });

  it("bad list parameters → 422 on the parameter", async () => {
    actAs(owner);
    const res = await list("?sort=colour&superwash=maybe");
    expect(res.status).toBe(422);
    expect(res.json.fields.sort).toMatch(/Sort by name/);
    expect(res.json.fields.superwash).toMatch(/true or false/);
  });

  it("another studio's bases never appear", async () => {
    await makeBase(other.id, "Foreign Sock");
    expect(await names("?q=Foreign")).toEqual([]);
  });
});
