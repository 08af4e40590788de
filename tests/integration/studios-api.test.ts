// The studio API's behaviour for people allowed to use it: creating and listing studios,
// settings, members and roles (a studio never loses its last owner), and the account.
import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { getOrm } from "@/lib/db";
import * as studiosRoute from "@/app/api/studios/route";
import * as studioRoute from "@/app/api/studios/[studioId]/route";
import * as membersRoute from "@/app/api/studios/[studioId]/members/route";
import * as memberRoute from "@/app/api/studios/[studioId]/members/[memberId]/route";
import * as invitationsRoute from "@/app/api/studios/[studioId]/invitations/route";
import * as accountRoute from "@/app/api/account/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser, roleOf } from "../support/fixtures";
import { call } from "../support/route";
import { flushOutbox } from "@/lib/outbox";
import { waitForMessage } from "../support/mail";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "studios-api";
let owner: Person;
let dyer: Person;
let guest: Person;
let studio: StudioFixture;

beforeEach(async () => {
  [owner, dyer, guest] = await Promise.all([makeUser(TAG, "owner"), makeUser(TAG, "dyer"), makeUser(TAG, "guest")]);
  studio = await makeStudio("Saltmarsh Dye Room", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

const sid = () => ({ studioId: studio.id });
const mid = (p: Person) => ({ studioId: studio.id, memberId: studio.memberships[p.id] });

describe("studios", () => {
  it("a new studio has its creator as owner and the default settings", async () => {
    const maker = await makeUser(TAG, "maker");
    actAs(maker);
    const created = await call(studiosRoute.POST, "POST", {}, { body: { name: "  Wharf Lane Yarns  " } });
    expect(created.status).toBe(201);
    // Defaults from entities/studio.ts: ΔE_CMC tolerance 1.0 (textile practice, DOMAIN.md), 2 lots, 60 days.
    expect(created.json).toMatchObject({ name: "Wharf Lane Yarns", role: "owner", lotTolerance: 1, lotsForRepeatable: 2, stockShelfLifeDays: 60 });
    expect(await roleOf(created.json.id, maker.id)).toBe("owner");
    const one = await call(studioRoute.GET, "GET", { studioId: created.json.id });
    expect(one.json).toEqual(created.json);
  });

  it("lists the caller's studios by name, each with the caller's role there", async () => {
    await makeStudio("Alder Mill", [[dyer, "guest"]]);
    actAs(dyer);
    const res = await call(studiosRoute.GET, "GET", {});
    expect(res.status).toBe(200);
    expect(res.json.map((s: { name: string; role: string }) => [s.name, s.role])).toEqual([
      ["Alder Mill", "guest"],
      ["Saltmarsh Dye Room", "dyer"],
    ]);
  });

  it("an owner renames the studio and changes its settings; the change is kept", async () => {
    actAs(owner);
    const res = await call(studioRoute.PATCH, "PATCH", sid(), {
      body: { name: "Saltmarsh Dye Works", lotTolerance: 1.4, lotsForRepeatable: 3, stockShelfLifeDays: 45 },
    });
    expect(res.status).toBe(200);
    actAs(guest);
    expect((await call(studioRoute.GET, "GET", sid())).json).toEqual({
      id: studio.id,
      name: "Saltmarsh Dye Works",
      role: "guest",
      lotTolerance: 1.4,
      lotsForRepeatable: 3,
      stockShelfLifeDays: 45,
    });
  });
});

describe("members and roles", () => {
  it("lists owners, then dyers, then guests, with names and addresses", async () => {
    actAs(guest);
    const res = await call(membersRoute.GET, "GET", sid());
    expect(res.status).toBe(200);
    expect(res.json.map((m: { email: string; role: string }) => [m.email, m.role])).toEqual([
      [owner.email, "owner"],
      [dyer.email, "dyer"],
      [guest.email, "guest"],
    ]);
  });

  it("the last owner cannot be demoted or removed (409), and stays owner", async () => {
    actAs(owner);
    const demote = await call(memberRoute.PATCH, "PATCH", mid(owner), { body: { role: "dyer" } });
    expect(demote.status).toBe(409);
    expect(demote.json.error).toMatch(/at least one owner/);
    const remove = await call(memberRoute.DELETE, "DELETE", mid(owner));
    expect(remove.status).toBe(409);
    expect(await roleOf(studio.id, owner.id)).toBe("owner");
  });

  it("with a second owner, one owner may step down; then the other is the last", async () => {
    actAs(owner);
    expect((await call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "owner" } })).json.role).toBe("owner");
    const stepDown = await call(memberRoute.PATCH, "PATCH", mid(owner), { body: { role: "guest" } });
    expect(stepDown.status).toBe(200);
    expect(stepDown.json).toMatchObject({ userId: owner.id, role: "guest" });
    // The former owner is a guest now and may no longer manage members.
    expect((await call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "dyer" } })).status).toBe(403);
    actAs(dyer);
    expect((await call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "dyer" } })).status).toBe(409);
  });

  it("an owner may leave when another owner remains", async () => {
    actAs(owner);
    await call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "owner" } });
    expect((await call(memberRoute.DELETE, "DELETE", mid(owner))).status).toBe(204);
    expect(await roleOf(studio.id, owner.id)).toBeNull();
    // Gone from the studio means the studio is gone for them: 404, not 403.
    expect((await call(studioRoute.GET, "GET", sid())).status).toBe(404);
  });

  it("two owners demoting each other at the same moment leave exactly one owner", async () => {
    actAs(owner);
    await call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "owner" } });
    // Hold the owner rows from outside, so both requests are certainly waiting at the same
    // point (each has read its target as an owner) before either may go on.
    const knex = (await getOrm()).em.getKnex();
    const hold = await knex.transaction();
    await hold.raw("select id from memberships where studio_id = ? and role = 'owner' for update", [studio.id]);
    const racing = Promise.all([
      call(memberRoute.PATCH, "PATCH", mid(dyer), { body: { role: "dyer" } }),
      call(memberRoute.PATCH, "PATCH", mid(owner), { body: { role: "dyer" } }),
    ]);
    const waiting = async () =>
      Number(
        (
          await knex.raw(
            "select count(*) as n from pg_stat_activity where wait_event_type = 'Lock' and query like '%from memberships%for update%' and pid <> pg_backend_pid()",
          )
        ).rows[0].n,
      );
    for (let i = 0; (await waiting()) < 2; i++) {
      if (i > 200) throw new Error("the two requests never reached the owner lock");
      await new Promise((r) => setTimeout(r, 25));
    }
    await hold.commit();
    const results = await racing;
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const roles = [await roleOf(studio.id, owner.id), await roleOf(studio.id, dyer.id)];
    expect(roles.filter((r) => r === "owner")).toHaveLength(1);
  });

  it("a removed member loses the studio at once; a promoted one gains owner routes at once", async () => {
    actAs(owner);
    expect((await call(memberRoute.DELETE, "DELETE", mid(dyer))).status).toBe(204);
    expect((await call(memberRoute.PATCH, "PATCH", mid(guest), { body: { role: "owner" } })).status).toBe(200);
    actAs(dyer);
    expect((await call(membersRoute.GET, "GET", sid())).status).toBe(404);
    actAs(guest);
    expect((await call(invitationsRoute.GET, "GET", sid())).status).toBe(200);
  });
});

describe("account", () => {
  it("starts metric, °C, with mail on; keeps the changes made", async () => {
    actAs(dyer);
    const first = await call(accountRoute.GET, "GET", {});
    expect(first.json).toEqual({
      id: dyer.id,
      email: dyer.email,
      name: dyer.name,
      unitSystem: "metric",
      temperatureUnit: "C",
      mailEnabled: true,
      hasPassword: false,
    });
    const changed = await call(accountRoute.PATCH, "PATCH", {}, { body: { unitSystem: "us", temperatureUnit: "F", mailEnabled: false } });
    expect(changed.status).toBe(200);
    expect((await call(accountRoute.GET, "GET", {})).json).toMatchObject({ unitSystem: "us", temperatureUnit: "F", mailEnabled: false, name: dyer.name });
  });

  it("a new name is used at once, even though the session still carries the old one", async () => {
    actAs(owner);
    expect((await call(accountRoute.PATCH, "PATCH", {}, { body: { name: "Wren Calloway" } })).json.name).toBe("Wren Calloway");
    const to = `renamed-${Date.now()}@studios-api.test`;
    expect((await call(invitationsRoute.POST, "POST", sid(), { body: { email: to, role: "guest" } })).status).toBe(201);
    await flushOutbox(); // the invitation mail waits in the outbox for the worker's flush
    expect((await waitForMessage(to)).subject).toBe("Wren Calloway invited you to Saltmarsh Dye Room on Undertone");
  });
});
