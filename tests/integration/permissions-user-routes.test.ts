// Routes that need a signed-in person but no studio (and the two that need neither): signed
// out → 401, signed in → the route's success status, whatever studios the person belongs to.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as studiosRoute from "@/app/api/studios/route";
import * as accountRoute from "@/app/api/account/route";
import * as tokenRoute from "@/app/api/invitations/[token]/route";
import * as healthRoute from "@/app/api/health/route";
import { actAs } from "../support/session";
import { type Person, makeInvitation, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "perm-user";
let owner: Person;
let studioId: string;

beforeAll(async () => {
  owner = await makeUser(TAG, "owner");
  studioId = (await makeStudio("User Routes Studio", [[owner, "owner"]])).id;
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

interface UserRouteCase {
  name: string;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  handler: (req: Request, args: { params: Promise<any> }) => Promise<Response>;
  method: string;
  ok: number;
  /** Params and body for a call by `who` (a fresh person without any studio). */
  prepare: (who: Person) => Promise<{ params: Record<string, string>; body?: unknown }>;
}

const cases: UserRouteCase[] = [
  { name: "GET /api/studios", handler: studiosRoute.GET, method: "GET", ok: 200, prepare: async () => ({ params: {} }) },
  {
    name: "POST /api/studios",
    handler: studiosRoute.POST,
    method: "POST",
    ok: 201,
    prepare: async () => ({ params: {}, body: { name: "Fresh Pot Studio" } }),
  },
  { name: "GET /api/account", handler: accountRoute.GET, method: "GET", ok: 200, prepare: async () => ({ params: {} }) },
  {
    name: "PATCH /api/account",
    handler: accountRoute.PATCH,
    method: "PATCH",
    ok: 200,
    prepare: async () => ({ params: {}, body: { temperatureUnit: "F" } }),
  },
  {
    name: "POST /api/invitations/:token",
    handler: tokenRoute.POST,
    method: "POST",
    ok: 200,
    prepare: async (who) => ({ params: { token: (await makeInvitation(studioId, owner, who.email, "guest")).token } }),
  },
];

describe.each(cases.map((c) => [c.name, c] as const))("%s", (_name, c) => {
  it("signed out → 401", async () => {
    const stranger = await makeUser(TAG, "stranger");
    const { params, body } = await c.prepare(stranger);
    actAs(null);
    const res = await call(c.handler, c.method, params, { body });
    expect(res.status).toBe(401);
    expect(res.json.error).toBe("Sign in to continue.");
  });

  it(`signed in, in no studio → ${c.ok}`, async () => {
    const who = await makeUser(TAG, "someone");
    const { params, body } = await c.prepare(who);
    actAs(who);
    const res = await call(c.handler, c.method, params, { body });
    expect(res.status).toBe(c.ok);
  });
});

describe("routes open to everyone", () => {
  it("GET /api/invitations/:token shows what a link offers without a session", async () => {
    const { token } = await makeInvitation(studioId, owner, "preview@perm-user.test", "dyer");
    actAs(null);
    const res = await call(tokenRoute.GET, "GET", { token });
    expect(res.status).toBe(200);
    expect(res.json).toEqual({
      studioName: "User Routes Studio",
      email: "preview@perm-user.test",
      role: "dyer",
      invitedBy: owner.name,
    });
  });

  it("GET /api/health answers without a session", async () => {
    actAs(null);
    const res = await call(healthRoute.GET as never, "GET", {});
    expect(res.status).toBe(200);
    expect(res.json.ok).toBe(true);
  });

  it("every exported method of these routes is covered", () => {
    const exported = [
      ...Object.keys(studiosRoute).map((m) => `${m} /api/studios`),
      ...Object.keys(accountRoute).map((m) => `${m} /api/account`),
      ...Object.keys(tokenRoute).map((m) => `${m} /api/invitations/:token`),
    ].sort();
    expect([...cases.map((c) => c.name), "GET /api/invitations/:token"].sort()).toEqual(exported);
  });
});
