// Invitations end to end below the browser: the owner invites, the mail arrives in the SMTP
// fake with a link, the link previews the studio, and accepting it joins the right person with
// the invited role — once.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { InvitationSchema } from "@/entities/studio";
import { UserSchema } from "@/entities/user";
import { getEm, getOrm } from "@/lib/db";
import { env } from "@/lib/env";
import * as invitationsRoute from "@/app/api/studios/[studioId]/invitations/route";
import * as invitationRoute from "@/app/api/studios/[studioId]/invitations/[invitationId]/route";
import * as tokenRoute from "@/app/api/invitations/[token]/route";
import * as studioRoute from "@/app/api/studios/[studioId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, address, makeInvitation, makeStudio, makeUser, roleOf } from "../support/fixtures";
import { call } from "../support/route";
import { flushOutbox } from "@/lib/outbox";
import { type FakeMessage, linksIn, waitForMessage } from "../support/mail";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "auth-invites";
let owner: Person;
let studio: StudioFixture;

beforeAll(async () => {
  owner = await makeUser(TAG, "owner", { name: "Odile Marsh" });
  studio = await makeStudio("Kelp Line Studio", [[owner, "owner"]]);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

/** The owner invites `email`; returns the API answer, the mail and the token from its link. */
async function invite(email: string, role: string) {
  actAs(owner);
  const res = await call(invitationsRoute.POST, "POST", { studioId: studio.id }, { body: { email, role } });
  expect(res.status).toBe(201);
  await flushOutbox(); // the invitation mail waits in the outbox for the worker's flush
  const mail = await waitForMessage(email.toLowerCase(), { match: (m) => linksIn(m).some((l) => l.includes("/invite/")) });
  const link = linksIn(mail).find((l) => l.includes("/invite/"))!;
  return { res, mail, link, token: link.split("/invite/")[1] };
}

async function accept(as: Person | null, token: string) {
  actAs(as);
  return call(tokenRoute.POST, "POST", { token });
}

describe("sending", () => {
  let sent: { res: { json: Record<string, string> }; mail: FakeMessage; link: string; token: string };
  let email: string;

  beforeAll(async () => {
    email = address(TAG, "newcomer");
    sent = await invite(email.toUpperCase(), "dyer");
  });

  it("answers with the pending invitation, the address lower-cased", () => {
    expect(sent.res.json).toMatchObject({ email, role: "dyer", invitedBy: "Odile Marsh" });
    expect(new Date(sent.res.json.expiresAt).getTime() - Date.now()).toBeGreaterThan(6.9 * 86_400_000);
  });

  it("mails a link to the app's own address, naming the inviter, the studio and the role", () => {
    expect(sent.mail.subject).toBe("Odile Marsh invited you to Kelp Line Studio on Undertone");
    expect(sent.mail.text).toContain("as dyer");
    expect(sent.link).toMatch(new RegExp(`^${env.APP_URL.replace(/[.]/g, "\\.")}/invite/[A-Za-z0-9_-]{43}$`));
    expect(sent.mail.html).toContain(`href="${sent.link}"`);
  });

  it("stores only a hash of the link's token", async () => {
    const em = await getEm();
    const row = await em.findOneOrFail(InvitationSchema, { id: sent.res.json.id });
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.tokenHash).not.toContain(sent.token);
  });

  it("is listed for the owner while it waits", async () => {
    actAs(owner);
    const list = await call(invitationsRoute.GET, "GET", { studioId: studio.id });
    expect(list.json.map((i: { id: string }) => i.id)).toContain(sent.res.json.id);
  });

  it("previews the studio to anyone holding the link", async () => {
    actAs(null);
    const res = await call(tokenRoute.GET, "GET", { token: sent.token });
    expect(res.json).toEqual({ studioName: "Kelp Line Studio", email, role: "dyer", invitedBy: "Odile Marsh" });
  });

  it("refuses to invite someone who is already a member (409)", async () => {
    actAs(owner);
    const res = await call(invitationsRoute.POST, "POST", { studioId: studio.id }, { body: { email: owner.email, role: "guest" } });
    expect(res.status).toBe(409);
  });
});

describe("accepting", () => {
  it.each(["owner", "dyer", "guest"] as const)("the invited address joins as %s", async (role) => {
    const invitee = await makeUser(TAG, `joiner-${role}`);
    const { token } = await invite(invitee.email, role);
    const res = await accept(invitee, token);
    expect(res.status).toBe(200);
    expect(res.json).toEqual({ studioId: studio.id });
    expect(await roleOf(studio.id, invitee.id)).toBe(role);
    expect((await call(studioRoute.GET, "GET", { studioId: studio.id })).json.role).toBe(role);
  });

  it("another address is refused (403) and the link stays usable by the right one", async () => {
    const invitee = await makeUser(TAG, "rightful");
    const intruder = await makeUser(TAG, "intruder");
    const { token } = await invite(invitee.email, "guest");
    const wrong = await accept(intruder, token);
    expect(wrong.status).toBe(403);
    expect(wrong.json.error).toContain(invitee.email);
    expect(await roleOf(studio.id, intruder.id)).toBeNull();
    expect((await accept(invitee, token)).status).toBe(200);
  });

  it("a used link is gone (410), even for the person who used it", async () => {
    const invitee = await makeUser(TAG, "once");
    const { token } = await invite(invitee.email, "guest");
    expect((await accept(invitee, token)).status).toBe(200);
    const again = await accept(invitee, token);
    expect(again.status).toBe(410);
    actAs(null);
    expect((await call(tokenRoute.GET, "GET", { token })).status).toBe(410);
  });

  it("a withdrawn link is not found (404) and joins no one", async () => {
    const invitee = await makeUser(TAG, "withdrawn");
    const { token, res } = await invite(invitee.email, "dyer");
    actAs(owner);
    expect((await call(invitationRoute.DELETE, "DELETE", { studioId: studio.id, invitationId: res.json.id })).status).toBe(204);
    expect((await accept(invitee, token)).status).toBe(404);
    expect(await roleOf(studio.id, invitee.id)).toBeNull();
    // Withdrawing twice finds nothing left to withdraw.
    actAs(owner);
    expect((await call(invitationRoute.DELETE, "DELETE", { studioId: studio.id, invitationId: res.json.id })).status).toBe(404);
  });

  it("inviting the same address again retires the earlier link", async () => {
    const invitee = await makeUser(TAG, "twice");
    const first = await invite(invitee.email, "guest");
    const second = await invite(invitee.email, "dyer");
    expect(second.token).not.toBe(first.token);
    expect((await accept(invitee, first.token)).status).toBe(404);
    expect((await accept(invitee, second.token)).status).toBe(200);
    expect(await roleOf(studio.id, invitee.id)).toBe("dyer");
  });

  it("an expired link says so (410)", async () => {
    const invitee = await makeUser(TAG, "late");
    const { token } = await makeInvitation(studio.id, owner, invitee.email, "guest", { expiresAt: new Date(Date.now() - 1000) });
    expect((await accept(invitee, token)).status).toBe(410);
    expect(await roleOf(studio.id, invitee.id)).toBeNull();
  });

  it("signed out, accepting asks for sign-in (401)", async () => {
    const { token } = await makeInvitation(studio.id, owner, address(TAG, "nobody"), "guest");
    expect((await accept(null, token)).status).toBe(401);
  });

  it("joining marks the address as verified", async () => {
    const invitee = await makeUser(TAG, "unverified");
    const em = await getEm();
    await em.nativeUpdate(UserSchema, { id: invitee.id }, { emailVerified: null });
    const { token } = await invite(invitee.email, "guest");
    expect((await accept(invitee, token)).status).toBe(200);
    const u = await (await getEm()).findOneOrFail(UserSchema, { id: invitee.id });
    expect(u.emailVerified).toBeInstanceOf(Date);
  });
});
