// What the routes do with bad input from a caller who is allowed in: invalid bodies → 422 with
// a message per field, malformed JSON → 400, ids that are not ids or belong to another studio
// → 404, and never a 500.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as studiosRoute from "@/app/api/studios/route";
import * as studioRoute from "@/app/api/studios/[studioId]/route";
import * as membersRoute from "@/app/api/studios/[studioId]/members/route";
import * as memberRoute from "@/app/api/studios/[studioId]/members/[memberId]/route";
import * as invitationsRoute from "@/app/api/studios/[studioId]/invitations/route";
import * as invitationRoute from "@/app/api/studios/[studioId]/invitations/[invitationId]/route";
import * as accountRoute from "@/app/api/account/route";
import * as tokenRoute from "@/app/api/invitations/[token]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeInvitation, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "perm-inputs";
let owner: Person;
let dyer: Person;
let studio: StudioFixture;
let other: StudioFixture;
let otherOwner: Person;

beforeAll(async () => {
  [owner, dyer, otherOwner] = await Promise.all([makeUser(TAG, "owner"), makeUser(TAG, "dyer"), makeUser(TAG, "other")]);
  studio = await makeStudio("Inputs Studio", [
    [owner, "owner"],
    [dyer, "dyer"],
  ]);
  // A stranger's studio, for references that cross studios.
  other = await makeStudio("Neighbour Studio", [[otherOwner, "owner"]]);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type H = (req: Request, args: { params: Promise<any> }) => Promise<Response>;
const p = () => ({ studioId: studio.id });
const m = () => ({ studioId: studio.id, memberId: studio.memberships[dyer.id] });

describe("invalid bodies → 422 with field messages", () => {
  const cases: [string, H, string, () => object, unknown, string, RegExp][] = [
    ["POST /api/studios, empty name", studiosRoute.POST, "POST", () => ({}), { name: " " }, "name", /at least 2 characters/],
    ["POST /api/studios, no name", studiosRoute.POST, "POST", () => ({}), {}, "name", /.+/],
    ["POST /api/studios, long name", studiosRoute.POST, "POST", () => ({}), { name: "x".repeat(121) }, "name", /under 120/],
    ["PATCH studio, tolerance too wide", studioRoute.PATCH, "PATCH", p, { lotTolerance: 50 }, "lotTolerance", /almost anything/],
    ["PATCH studio, tolerance as text", studioRoute.PATCH, "PATCH", p, { lotTolerance: "1" }, "lotTolerance", /.+/],
    ["PATCH studio, fractional lots", studioRoute.PATCH, "PATCH", p, { lotsForRepeatable: 1.5 }, "lotsForRepeatable", /.+/],
    ["PATCH studio, shelf life too long", studioRoute.PATCH, "PATCH", p, { stockShelfLifeDays: 1000 }, "stockShelfLifeDays", /Two years/],
    ["PATCH member, unknown role", memberRoute.PATCH, "PATCH", m, { role: "admin" }, "role", /owner, dyer or guest/],
    ["PATCH member, no role", memberRoute.PATCH, "PATCH", m, {}, "role", /owner, dyer or guest/],
    ["POST invitation, bad address", invitationsRoute.POST, "POST", p, { email: "not-an-address", role: "dyer" }, "email", /name@example\.com/],
    ["POST invitation, no role", invitationsRoute.POST, "POST", p, { email: "someone@perm-inputs.test" }, "role", /owner, dyer or guest/],
    ["PATCH account, unknown units", accountRoute.PATCH, "PATCH", () => ({}), { unitSystem: "imperial" }, "unitSystem", /metric or US/],
    ["PATCH account, empty name", accountRoute.PATCH, "PATCH", () => ({}), { name: "  " }, "name", /Enter your name/],
    ["PATCH account, mail as text", accountRoute.PATCH, "PATCH", () => ({}), { mailEnabled: "yes" }, "mailEnabled", /.+/],
  ];
  it.each(cases)("%s", async (_n, handler, method, params, body, field, message) => {
    actAs(owner);
    const res = await call(handler, method, params(), { body });
    expect(res.status).toBe(422);
    expect(res.json.fields[field]).toMatch(message);
    expect(res.json.error).toMatch(/^Check /);
  });

  it.each([
    ["null", "null"],
    ["an array", "[1,2]"],
    ["a string", '"owner"'],
  ])("a JSON body that is %s → 422 about the whole form", async (_n, raw) => {
    actAs(owner);
    const res = await call(memberRoute.PATCH, "PATCH", m(), { raw });
    expect(res.status).toBe(422);
    expect(res.json.fields).toHaveProperty("_");
  });

  it("a rejected settings change leaves the studio as it was", async () => {
    actAs(owner);
    const before = (await call(studioRoute.GET, "GET", p())).json;
    await call(studioRoute.PATCH, "PATCH", p(), { body: { name: "Renamed", lotTolerance: 99 } });
    expect((await call(studioRoute.GET, "GET", p())).json).toEqual(before);
  });
});

describe("malformed JSON → 400", () => {
  const cases: [string, H, string, () => object][] = [
    ["POST /api/studios", studiosRoute.POST, "POST", () => ({})],
    ["PATCH /api/studios/:studioId", studioRoute.PATCH, "PATCH", p],
    ["PATCH /api/studios/:studioId/members/:memberId", memberRoute.PATCH, "PATCH", m],
    ["POST /api/studios/:studioId/invitations", invitationsRoute.POST, "POST", p],
    ["PATCH /api/account", accountRoute.PATCH, "PATCH", () => ({})],
  ];
  it.each(cases)("%s", async (_n, handler, method, params) => {
    actAs(owner);
    for (const raw of ['{"name": "Half', "{name: 'Unquoted'}", "role=dyer"]) {
      const res = await call(handler, method, params(), { raw });
      expect(res.status, raw).toBe(400);
      expect(res.json.error).toBe("The request body is not valid JSON.");
    }
  });
});

describe("a body over 1 MB → 413, nothing stored", () => {
  it("a new studio whose name comes with 1.2 MB of padding is refused and not made", async () => {
    actAs(owner);
    const name = `Padded ${Date.now()}`;
    const res = await call(studiosRoute.POST, "POST", {}, { raw: JSON.stringify({ name, padding: "x".repeat(1_200_000) }) });
    expect(res.status).toBe(413);
    expect(res.json.error).toMatch(/too large \(over 1 MB\)/);
    const em = (await getOrm()).em.fork();
    expect(await em.getConnection().execute("select 1 from studios where name = ?", [name])).toHaveLength(0);
  });
});

describe("ids that are not ids, or not this studio's → 404", () => {
  it.each([
    ["GET", studioRoute.GET, () => ({ studioId: "not-a-uuid" })],
    ["GET", membersRoute.GET, () => ({ studioId: "1 or 1=1" })],
    ["GET", studioRoute.GET, () => ({ studioId: "00000000-0000-4000-8000-000000000000" })],
    ["PATCH", memberRoute.PATCH, () => ({ studioId: studio.id, memberId: "nope" })],
    ["DELETE", memberRoute.DELETE, () => ({ studioId: studio.id, memberId: "00000000-0000-4000-8000-000000000000" })],
    ["DELETE", invitationRoute.DELETE, () => ({ studioId: studio.id, invitationId: "12345" })],
  ] as [string, H, () => object][])("%s with %#", async (method, handler, params) => {
    actAs(owner);
    const res = await call(handler, method, params(), { body: method === "PATCH" ? { role: "guest" } : undefined });
    expect(res.status).toBe(404);
    expect(res.json.error).toMatch(/was not found in this studio/);
  });

  it("an owner cannot reach another studio's member through their own studio's URL", async () => {
    actAs(owner);
    const theirs = other.memberships[otherOwner.id];
    const patch = await call(memberRoute.PATCH, "PATCH", { studioId: studio.id, memberId: theirs }, { body: { role: "guest" } });
    expect(patch.status).toBe(404);
    const del = await call(memberRoute.DELETE, "DELETE", { studioId: studio.id, memberId: theirs });
    expect(del.status).toBe(404);
    actAs(otherOwner);
    const still = await call(membersRoute.GET, "GET", { studioId: other.id });
    expect(still.json).toEqual([expect.objectContaining({ userId: otherOwner.id, role: "owner" })]);
  });

  it("an owner cannot withdraw another studio's invitation through their own studio's URL", async () => {
    const inv = await makeInvitation(other.id, otherOwner, "kept@perm-inputs.test", "dyer");
    actAs(owner);
    const res = await call(invitationRoute.DELETE, "DELETE", { studioId: studio.id, invitationId: inv.id });
    expect(res.status).toBe(404);
    actAs(otherOwner);
    const list = await call(invitationsRoute.GET, "GET", { studioId: other.id });
    expect(list.json.map((i: { id: string }) => i.id)).toContain(inv.id);
  });

  it("an unknown invitation token → 404 to everyone", async () => {
    actAs(null);
    expect((await call(tokenRoute.GET, "GET", { token: "no-such-token" })).status).toBe(404);
    actAs(dyer);
    expect((await call(tokenRoute.POST, "POST", { token: "no-such-token" })).status).toBe(404);
  });
});

describe("a session whose account is gone", () => {
  // A 30-day JWT outlives a deleted account; its requests must be refused, not crash.
  const ghost = { id: "7f3c2a10-5b4e-4c1d-9a8f-0e6d5c4b3a21", email: "gone@perm-inputs.test", name: "Gone" };
  it.each([
    ["GET /api/account", accountRoute.GET, "GET", {}, undefined],
    ["PATCH /api/account", accountRoute.PATCH, "PATCH", {}, { name: "Back" }],
    ["GET /api/studios", studiosRoute.GET, "GET", {}, undefined],
    ["POST /api/studios", studiosRoute.POST, "POST", {}, { name: "Ghost Studio" }],
  ] as [string, H, string, object, unknown][])("%s → 401", async (_n, handler, method, params, body) => {
    actAs(ghost);
    const res = await call(handler, method, params, { body });
    expect(res.status).toBe(401);
  });

  it("a studio route → 401, not 404: the account is gone, not merely outside the studio", async () => {
    actAs(ghost);
    expect((await call(studioRoute.GET, "GET", p())).status).toBe(401);
  });

  it("a session id that is not a UUID → 401", async () => {
    actAs({ ...ghost, id: "forged" });
    expect((await call(studioRoute.GET, "GET", p())).status).toBe(401);
  });
});
