// Step timers through their route handlers against the real database: the state machine, times
// taken from the server's clock (Date is faked, nothing else), stale versions, roles and studios.
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { LayerSchema, TrialSchema } from "@/entities/trial";
import { getEm, getOrm } from "@/lib/db";
import * as timersRoute from "@/app/api/studios/[studioId]/timers/route";
import * as timerRoute from "@/app/api/studios/[studioId]/timers/[timerId]/route";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "timers";
let owner: Person, dyer: Person, guest: Person, outsider: Person;
let studio: StudioFixture, other: StudioFixture;
let trialId: string, layerId: string, otherTrialId: string;

async function makeTrial(studioId: string, authorId: string, title: string) {
  const em = await getEm();
  const trial = em.create(TrialSchema, { studio: studioId, author: authorId, title, fibreWeightG: 100 });
  const layer = em.create(LayerSchema, { trial, position: 0, method: "immersion" });
  await em.flush();
  return { trialId: trial.id, layerId: layer.id };
}

const T0 = new Date("2026-12-03T09:00:00.000Z").getTime();
const at = (sec: number) => vi.setSystemTime(new Date(T0 + sec * 1000));

// The shared call() helper sends no query string, so the list's search parameters go in here.
const list = (studioId = studio.id, query = "") =>
  call((_req, args) => timersRoute.GET(new Request(`http://127.0.0.1/api/timers${query}`), args), "GET", { studioId });
const start = (body: unknown, studioId = studio.id) => call(timersRoute.POST, "POST", { studioId }, { body });
const act = (timerId: string, body: unknown, studioId = studio.id) =>
  call(timerRoute.PATCH, "PATCH", { studioId, timerId }, { body });

beforeAll(async () => {
  [owner, dyer, guest, outsider] = await Promise.all(["owner", "dyer", "guest", "outsider"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Timer Test Dyeworks", [
    [owner, "owner"],
    [dyer, "dyer"],
    [guest, "guest"],
  ]);
  other = await makeStudio("Other Timer Studio", [[outsider, "owner"]]);
  ({ trialId, layerId } = await makeTrial(studio.id, dyer.id, "Steamed teal"));
  ({ trialId: otherTrialId } = await makeTrial(other.id, outsider.id, "Elsewhere"));
});

afterEach(() => {
  vi.useRealTimers();
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("a timer's life", () => {
  it("runs, pauses, resumes and finishes with every time read from the server's clock", async () => {
    // Only Date is faked: the database driver's own timers stay real.
    vi.useFakeTimers({ toFake: ["Date"] });
    actAs(dyer);
    at(0);
    const started = await start({ trialId, layerId, label: "Steam", durationSec: 1200 });
    expect(started.status).toBe(201);
    const t = started.json.timer;
    expect(t).toMatchObject({ state: "running", label: "Steam", durationSec: 1200, elapsedSec: 0, remainingSec: 1200, layerId, trialId });
    expect(t.trialTitle).toBe("Steamed teal");
    expect(t.startedBy).toEqual({ id: dyer.id, name: dyer.name });
    expect(t.runningSince).toBe(new Date(T0).toISOString());
    expect(started.json.now).toBe(new Date(T0).toISOString());

    // Five minutes later, by the server's clock, a fresh read shows 15 minutes left.
    at(300);
    let l = await list();
    expect(l.status).toBe(200);
    expect(l.json.now).toBe(new Date(T0 + 300_000).toISOString());
    expect(l.json.items.find((x: { id: string }) => x.id === t.id).remainingSec).toBe(900);

    const paused = await act(t.id, { action: "pause", version: t.version });
    expect(paused.status).toBe(200);
    expect(paused.json.timer).toMatchObject({ state: "paused", elapsedSec: 300, runningSince: null, remainingSec: 900 });
    expect(paused.json.timer.version).toBe(t.version + 1);

    // A paused timer does not count down, however long it waits.
    at(2000);
    l = await list();
    expect(l.json.items.find((x: { id: string }) => x.id === t.id)).toMatchObject({ state: "paused", remainingSec: 900 });

    const resumed = await act(t.id, { action: "resume", version: paused.json.timer.version });
    expect(resumed.json.timer).toMatchObject({ state: "running", elapsedSec: 300, remainingSec: 900 });
    expect(resumed.json.timer.runningSince).toBe(new Date(T0 + 2_000_000).toISOString());

    at(2120);
    const done = await act(t.id, { action: "finish", version: resumed.json.timer.version });
    expect(done.status).toBe(200);
    // 300 s before the pause + 120 s after resuming = 420 s run; 780 s were left when it finished.
    expect(done.json.timer).toMatchObject({ state: "done", elapsedSec: 420, runningSince: null, remainingSec: 780 });
    expect(done.json.timer.finishedAt).toBe(new Date(T0 + 2_120_000).toISOString());

    // Gone from the studio's running list, kept in the trial's history.
    l = await list();
    expect(l.json.items.some((x: { id: string }) => x.id === t.id)).toBe(false);
    const history = await list(studio.id, `?trialId=${trialId}`);
    expect(history.json.items.find((x: { id: string }) => x.id === t.id)).toMatchObject({ state: "done", remainingSec: 780 });
  });

  it("shows no time left once a running step is overdue, and can be cancelled", async () => {
    vi.useFakeTimers({ toFake: ["Date"] });
    actAs(owner);
    at(10_000);
    const t = (await start({ trialId, label: "Rest", durationSec: 300 })).json.timer;
    expect(t.layerId).toBeNull();
    at(10_000 + 360);
    const l = await list();
    expect(l.json.items.find((x: { id: string }) => x.id === t.id)).toMatchObject({ state: "running", remainingSec: 0 });
    const c = await act(t.id, { action: "cancel", version: t.version });
    expect(c.json.timer).toMatchObject({ state: "cancelled", elapsedSec: 360, remainingSec: 0 });
  });

  it("refuses moves the state machine does not have", async () => {
    actAs(dyer);
    const t = (await start({ trialId, label: "Hold", durationSec: 1800 })).json.timer;
    const resume = await act(t.id, { action: "resume", version: t.version });
    expect(resume.status).toBe(409);
    expect(resume.json.error).toMatch(/paused timer/);
    const fin = (await act(t.id, { action: "finish", version: t.version })).json.timer;
    for (const action of ["pause", "resume", "finish", "cancel"]) {
      const r = await act(t.id, { action, version: fin.version });
      expect(r.status, action).toBe(409);
    }
  });

  it("answers 409 to a stale version and leaves the timer as it was", async () => {
    actAs(dyer);
    const t = (await start({ trialId, label: "Steam", durationSec: 600 })).json.timer;
    const paused = await act(t.id, { action: "pause", version: t.version });
    expect(paused.status).toBe(200);
    // A second phone still holds the first version and tries to finish the step.
    const stale = await act(t.id, { action: "finish", version: t.version });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatch(/Someone changed this timer/);
    const l = await list();
    expect(l.json.items.find((x: { id: string }) => x.id === t.id)).toMatchObject({ state: "paused", version: paused.json.timer.version });
    await act(t.id, { action: "cancel", version: paused.json.timer.version });
  });
});

describe("bad input", () => {
  it.each([
    ["no label", { trialId, label: " ", durationSec: 60 }, "label"],
    ["zero seconds", { trialId, label: "Steam", durationSec: 0 }, "durationSec"],
    ["fractional seconds", { trialId, label: "Steam", durationSec: 1.5 }, "durationSec"],
    ["over a day", { trialId, label: "Steam", durationSec: 86_401 }, "durationSec"],
    ["minutes as text", { trialId, label: "Steam", durationSec: "20" }, "durationSec"],
    ["no trial", { label: "Steam", durationSec: 60 }, "trialId"],
    ["a trial id that is not an id", { trialId: "soup", label: "Steam", durationSec: 60 }, "trialId"],
  ])("422 for %s", async (_name, body, field) => {
    actAs(dyer);
    // trialId is read when the case runs (beforeAll has set it by then).
    const b = { ...(body as Record<string, unknown>) };
    if ("trialId" in b && b.trialId === undefined) b.trialId = trialId;
    const r = await start(b);
    expect(r.status).toBe(422);
    expect(Object.keys(r.json.fields)).toContain(field);
  });

  it("422 for an unknown action or a missing version", async () => {
    actAs(dyer);
    const t = (await start({ trialId, label: "Steam", durationSec: 60 })).json.timer;
    const a = await act(t.id, { action: "skip", version: t.version });
    expect(a.status).toBe(422);
    expect(a.json.fields).toHaveProperty("action");
    const v = await act(t.id, { action: "pause" });
    expect(v.status).toBe(422);
    expect(v.json.fields).toHaveProperty("version");
    await act(t.id, { action: "cancel", version: t.version });
  });

  it("404 for a layer of another trial", async () => {
    actAs(dyer);
    const second = await makeTrial(studio.id, dyer.id, "Second");
    const r = await start({ trialId, layerId: second.layerId, label: "Steam", durationSec: 60 });
    expect(r.status).toBe(404);
  });
});

describe("who may", () => {
  it("lets a guest see timers but not start or stop one", async () => {
    actAs(dyer);
    const t = (await start({ trialId, label: "Steam", durationSec: 600 })).json.timer;
    actAs(guest);
    const l = await list();
    expect(l.status).toBe(200);
    expect(l.json.items.some((x: { id: string }) => x.id === t.id)).toBe(true);
    expect((await start({ trialId, label: "Steam", durationSec: 60 })).status).toBe(403);
    expect((await act(t.id, { action: "finish", version: t.version })).status).toBe(403);
    actAs(dyer);
    expect((await act(t.id, { action: "finish", version: t.version })).status).toBe(200);
  });

  it("keeps studios apart: another studio's trial and timer answer 404", async () => {
    actAs(dyer);
    expect((await start({ trialId: otherTrialId, label: "Steam", durationSec: 60 })).status).toBe(404);
    actAs(outsider);
    const theirs = (await start({ trialId: otherTrialId, label: "Steam", durationSec: 60 }, other.id)).json.timer;
    actAs(dyer);
    expect((await act(theirs.id, { action: "finish", version: theirs.version })).status).toBe(404);
    const mine = await list();
    expect(mine.json.items.some((x: { id: string }) => x.id === theirs.id)).toBe(false);
    // Not a member at all: the studio itself is not found.
    expect((await list(other.id)).status).toBe(404);
    actAs(null);
    expect((await list()).status).toBe(401);
  });
});
