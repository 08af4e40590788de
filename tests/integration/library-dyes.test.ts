// The dye routes against the real database: validation of class, URL, colour and Colour Index
// name, versions, roles, studio scoping, archiving (which takes the dye's stocks along) and the list.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as dyesRoute from "@/app/api/studios/[studioId]/dyes/route";
import * as dyeRoute from "@/app/api/studios/[studioId]/dyes/[dyeId]/route";
import * as stockRoute from "@/app/api/studios/[studioId]/stocks/[stockId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { makeDye, makeStock } from "../support/library";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "library-dyes";
let owner: Person;
let dyer: Person;
let guest: Person;
let stranger: Person;
let studio: StudioFixture;
let other: StudioFixture;

const good = { name: "Test Teal", dyeClass: "acid", form: "powder", sdsUrl: "https://example.com/sds/teal.pdf", displayHex: "#1F6F78" };
const list = (query = "") => call(async (req, a) => dyesRoute.GET(new Request(`http://127.0.0.1/x${query}`, req), a), "GET", { studioId: studio.id });

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Dyes Studio", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  other = await makeStudio("Other Dyes Studio", [[stranger, "owner"]]);
  await makeDye(studio.id, "Amber", { dyeClass: "acid", form: "powder" });
  await makeDye(studio.id, "beet", { dyeClass: "food", form: "liquid", notes: "kitchen blend" });
  await makeDye(studio.id, "Cobalt", { dyeClass: "reactive", form: "powder", colourIndexName: "Reactive Blue 4" });
  await makeDye(studio.id, "Drab", { dyeClass: "other", form: "liquid" });
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("creating a dye", () => {
  it("a dyer adds a dye; the colour is stored in lower case", async () => {
    actAs(dyer);
    const res = await call(dyesRoute.POST, "POST", { studioId: studio.id }, { body: good });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ ...good, displayHex: "#1f6f78", colourIndexName: null, notes: "", version: 1, archived: false });
  });

  it("blank optional text becomes empty (null), and a C.I. prefix is accepted", async () => {
    actAs(owner);
    const res = await call(dyesRoute.POST, "POST", { studioId: studio.id }, {
      body: { name: "Blanks", dyeClass: "food", form: "liquid", sdsUrl: "  ", colourIndexName: "C.I. Food Blue 1", displayHex: null },
    });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ sdsUrl: null, colourIndexName: "C.I. Food Blue 1", displayHex: null });
  });
});

describe("invalid dyes → 422 with a message on the field", () => {
  const cases: [string, object, string, RegExp][] = [
    ["an unknown dye class", { dyeClass: "disperse" }, "dyeClass", /acid, food colouring, fibre-reactive or other/],
    ["no dye class", { dyeClass: undefined }, "dyeClass", /acid, food colouring/],
    ["an unknown form", { form: "paste" }, "form", /powder or liquid/],
    ["a safety sheet that is not a URL", { sdsUrl: "the red folder" }, "sdsUrl", /starting with https:\/\//],
    ["a javascript: link", { sdsUrl: "javascript:alert(1)" }, "sdsUrl", /https:\/\//],
    ["a file: link", { sdsUrl: "file:///etc/passwd" }, "sdsUrl", /https:\/\//],
    ["an ftp: link", { sdsUrl: "ftp://example.com/sds.pdf" }, "sdsUrl", /https:\/\//],
    ["a colour that is not hex", { displayHex: "teal" }, "displayHex", /#rrggbb/],
    ["a short hex colour", { displayHex: "#1f6" }, "displayHex", /#rrggbb/],
    ["a Colour Index name without a number", { colourIndexName: "Acid Blue" }, "colourIndexName", /class, hue and number/],
    ["a blank name", { name: "" }, "name", /Give it a name/],
    ["notes as a number", { notes: 5 }, "notes", /text/],
  ];
  it.each(cases)("%s", async (_n, change, field, message) => {
    actAs(owner);
    const res = await call(dyesRoute.POST, "POST", { studioId: studio.id }, { body: { ...good, name: "Bad Dye", ...change } });
    expect(res.status).toBe(422);
    expect(res.json.fields[field]).toMatch(message);
  });

  it("a duplicate name → 422 on name", async () => {
    actAs(owner);
    const res = await call(dyesRoute.POST, "POST", { studioId: studio.id }, { body: { ...good, name: "AMBER" } });
    expect(res.status).toBe(422);
    expect(res.json.fields.name).toMatch(/already a dye called/);
  });
});

describe("editing with versions", () => {
  it("PATCH saves with the current version; a stale version → 409; a partial PATCH leaves other fields alone", async () => {
    const d = await makeDye(studio.id, "Versioned", { sdsUrl: "https://example.com/v.pdf", colourIndexName: "Acid Red 1" });
    actAs(dyer);
    const ok = await call(dyeRoute.PATCH, "PATCH", { studioId: studio.id, dyeId: d.id }, { body: { version: 1, notes: "strikes fast" } });
    expect(ok.status).toBe(200);
    expect(ok.json).toMatchObject({ notes: "strikes fast", sdsUrl: "https://example.com/v.pdf", colourIndexName: "Acid Red 1", version: 2 });
    const stale = await call(dyeRoute.PATCH, "PATCH", { studioId: studio.id, dyeId: d.id }, { body: { version: 1, notes: "older" } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone else saved this dye/);
  });

  it("PATCH with an empty safety-sheet link clears it", async () => {
    const d = await makeDye(studio.id, "Clear Link", { sdsUrl: "https://example.com/c.pdf" });
    actAs(owner);
    const res = await call(dyeRoute.PATCH, "PATCH", { studioId: studio.id, dyeId: d.id }, { body: { version: 1, sdsUrl: "" } });
    expect(res.json.sdsUrl).toBeNull();
  });
});

describe("roles and studios", () => {
  it("a guest reads but every write → 403", async () => {
    const d = await makeDye(studio.id, "Guest Proof Dye");
    actAs(guest);
    expect((await call(dyeRoute.GET, "GET", { studioId: studio.id, dyeId: d.id })).status).toBe(200);
    expect((await call(dyesRoute.POST, "POST", { studioId: studio.id }, { body: { ...good, name: "Guest Dye" } })).status).toBe(403);
    expect((await call(dyeRoute.PATCH, "PATCH", { studioId: studio.id, dyeId: d.id }, { body: { version: 1, name: "x" } })).status).toBe(403);
    expect((await call(dyeRoute.DELETE, "DELETE", { studioId: studio.id, dyeId: d.id })).status).toBe(403);
  });

  it("another studio's dye → 404", async () => {
    const theirs = await makeDye(other.id, "Their Dye");
    actAs(owner);
    const params = { studioId: studio.id, dyeId: theirs.id };
    expect((await call(dyeRoute.GET, "GET", params)).status).toBe(404);
    expect((await call(dyeRoute.PATCH, "PATCH", params, { body: { version: 1, notes: "mine" } })).status).toBe(404);
    expect((await call(dyeRoute.DELETE, "DELETE", params)).status).toBe(404);
  });
});

describe("archiving a dye", () => {
  it("archives its stock solutions with it, and leaves other dyes' stocks alone", async () => {
    const d = await makeDye(studio.id, "Leaving Soon");
    const keep = await makeDye(studio.id, "Staying");
    const s1 = await makeStock(studio.id, d.id);
    const s2 = await makeStock(studio.id, d.id, { concentrationPct: 0.5 });
    const s3 = await makeStock(studio.id, keep.id);
    actAs(dyer);
    expect((await call(dyeRoute.DELETE, "DELETE", { studioId: studio.id, dyeId: d.id })).status).toBe(403);
    actAs(owner);
    expect((await call(dyeRoute.DELETE, "DELETE", { studioId: studio.id, dyeId: d.id })).status).toBe(204);
    const archived = async (id: string) => (await call(stockRoute.GET, "GET", { studioId: studio.id, stockId: id })).json.archived;
    expect(await archived(s1.id)).toBe(true);
    expect(await archived(s2.id)).toBe(true);
    expect(await archived(s3.id)).toBe(false);
    expect((await list()).json.map((x: { name: string }) => x.name)).not.toContain("Leaving Soon");
  });
});

describe("the list: filters and sorting", () => {
  const fixed = ["Amber", "beet", "Cobalt", "Drab"];
  const names = async (query: string) => {
    actAs(guest);
    const res = await list(query);
    expect(res.status).toBe(200);
    return (res.json.map((b: { name: string }) => b.name) as string[]).filter((n) => fixed.includes(n));
  };

  it("by name ignoring case, and by class in the order acid, food, reactive, other", async () => {
    expect(await names("")).toEqual(fixed);
    expect(await names("?dir=desc")).toEqual([...fixed].reverse());
    expect(await names("?sort=dyeClass&dir=desc")).toEqual(["Drab", "Cobalt", "beet", "Amber"]);
  });

  it("filters by class, form and text (name, Colour Index name, notes)", async () => {
    expect(await names("?dyeClass=food")).toEqual(["beet"]);
    expect(await names("?form=liquid")).toEqual(["beet", "Drab"]);
    expect(await names("?q=reactive blue")).toEqual(["Cobalt"]);
    expect(await names("?q=KITCHEN")).toEqual(["beet"]);
  });

  it("bad filters → 422", async () => {
    actAs(owner);
    const res = await list("?dyeClass=vat&form=gel");
    expect(res.status).toBe(422);
    expect(res.json.fields.dyeClass).toMatch(/acid, food/);
    expect(res.json.fields.form).toMatch(/powder or liquid/);
  });
});
