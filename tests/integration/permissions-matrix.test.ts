// Who may call which studio route: every studio-scoped route and method, called by each kind
// of caller (signed out, a member of another studio, guest, dyer, owner). The roles each route
// admits are written out here from the product brief's role table, not read from
// lib/auth/permissions.ts, so a wrong entry in that table fails a check.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Role } from "@/entities/studio";
import { getOrm } from "@/lib/db";
import * as studioRoute from "@/app/api/studios/[studioId]/route";
import * as membersRoute from "@/app/api/studios/[studioId]/members/route";
import * as memberRoute from "@/app/api/studios/[studioId]/members/[memberId]/route";
import * as invitationsRoute from "@/app/api/studios/[studioId]/invitations/route";
import * as invitationRoute from "@/app/api/studios/[studioId]/invitations/[invitationId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, address, addMember, makeInvitation, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("next-auth", async (importOriginal) => {
  const { fakeGetServerSession } = await import("../support/session");
  return { ...(await importOriginal<object>()), getServerSession: fakeGetServerSession };
});

const TAG = "perm-matrix";
type Caller = "anonymous" | "outsider" | Role;
const CALLERS: Caller[] = ["anonymous", "outsider", "guest", "dyer", "owner"];

let people: Record<Exclude<Caller, "anonymous">, Person>;
let studio: StudioFixture;

beforeAll(async () => {
  const [owner, dyer, guest, outsider] = await Promise.all(
    ["owner", "dyer", "guest", "outsider"].map((n) => makeUser(TAG, n)),
  );
  people = { owner, dyer, guest, outsider };
  studio = await makeStudio("Matrix Dye Works", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  // The outsider owns a studio of their own: a real member, just not of this one.
  await makeStudio("Elsewhere Studio", [[outsider, "owner"]]);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

interface RouteCase {
  route: string;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  handler: (req: Request, args: { params: Promise<any> }) => Promise<Response>;
  method: string;
  /** Roles the product brief lets do this. */
  allowed: Role[];
  /** Status of a successful call. */
  ok: number;
  /** Fresh params and a valid body for one call (may create a throwaway member or invitation). */
  prepare: () => Promise<{ params: Record<string, string>; body?: unknown }>;
}

const everyone: Role[] = ["owner", "dyer", "guest"];
const ownerOnly: Role[] = ["owner"];

const cases: RouteCase[] = [
  {
    route: "/api/studios/:studioId",
    handler: studioRoute.GET,
    method: "GET",
    allowed: everyone,
    ok: 200,
    prepare: async () => ({ params: { studioId: studio.id } }),
  },
  {
    route: "/api/studios/:studioId",
    handler: studioRoute.PATCH,
    method: "PATCH",
    allowed: ownerOnly,
    ok: 200,
    prepare: async () => ({ params: { studioId: studio.id }, body: { lotTolerance: 1.5 } }),
  },
  {
    route: "/api/studios/:studioId/members",
    handler: membersRoute.GET,
    method: "GET",
    allowed: everyone,
    ok: 200,
    prepare: async () => ({ params: { studioId: studio.id } }),
  },
  {
    route: "/api/studios/:studioId/members/:memberId",
    handler: memberRoute.PATCH,
    method: "PATCH",
    allowed: ownerOnly,
    ok: 200,
    prepare: async () => {
      const memberId = await addMember(studio.id, await makeUser(TAG, "extra"), "guest");
      return { params: { studioId: studio.id, memberId }, body: { role: "dyer" } };
    },
  },
  {
    route: "/api/studios/:studioId/members/:memberId",
    handler: memberRoute.DELETE,
    method: "DELETE",
    allowed: ownerOnly,
    ok: 204,
    prepare: async () => {
      const memberId = await addMember(studio.id, await makeUser(TAG, "extra"), "guest");
      return { params: { studioId: studio.id, memberId } };
    },
  },
  {
    route: "/api/studios/:studioId/invitations",
    handler: invitationsRoute.GET,
    method: "GET",
    allowed: ownerOnly,
    ok: 200,
    prepare: async () => ({ params: { studioId: studio.id } }),
  },
  {
    route: "/api/studios/:studioId/invitations",
    handler: invitationsRoute.POST,
    method: "POST",
    allowed: ownerOnly,
    ok: 201,
    prepare: async () => ({ params: { studioId: studio.id }, body: { email: address(TAG, "invitee"), role: "guest" } }),
  },
  {
    route: "/api/studios/:studioId/invitations/:invitationId",
    handler: invitationRoute.DELETE,
    method: "DELETE",
    allowed: ownerOnly,
    ok: 204,
    prepare: async () => {
      const inv = await makeInvitation(studio.id, people.owner, address(TAG, "pending"), "dyer");
      return { params: { studioId: studio.id, invitationId: inv.id } };
    },
  },
];

function expected(c: RouteCase, caller: Caller): number {
  if (caller === "anonymous") return 401;
  if (caller === "outsider") return 404; // the studio's existence is not revealed
  return c.allowed.includes(caller) ? c.ok : 403;
}

describe.each(cases.map((c) => [`${c.method} ${c.route}`, c] as const))("%s", (_name, c) => {
  it.each(CALLERS.map((who) => [who, expected(c, who)] as const))("%s → %i", async (who, status) => {
    const { params, body } = await c.prepare();
    actAs(who === "anonymous" ? null : people[who]);
    const res = await call(c.handler, c.method, params, { body });
    expect(res.status).toBe(status);
    if (status >= 400) {
      // Every refusal is a JSON message a person can read, never a stack.
      expect(typeof res.json.error).toBe("string");
      expect(res.json.error).not.toMatch(/\bat .+:\d+:\d+/);
    }
  });
});

describe("the matrix itself", () => {
  it("covers every method of the studio, member and invitation routes", () => {
    const exported = [
      ...Object.keys(studioRoute).map((m) => `${m} /api/studios/:studioId`),
      ...Object.keys(membersRoute).map((m) => `${m} /api/studios/:studioId/members`),
      ...Object.keys(memberRoute).map((m) => `${m} /api/studios/:studioId/members/:memberId`),
      ...Object.keys(invitationsRoute).map((m) => `${m} /api/studios/:studioId/invitations`),
      ...Object.keys(invitationRoute).map((m) => `${m} /api/studios/:studioId/invitations/:invitationId`),
    ].sort();
    expect(cases.map((c) => `${c.method} ${c.route}`).sort()).toEqual(exported);
    expect(cases.length * CALLERS.length).toBe(40);
  });
});
