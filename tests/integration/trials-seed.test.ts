// The demo trials: the kinds the demo must show are there, their amounts go through the colour
// module, and running the seed again adds nothing.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as trialRoute from "@/app/api/studios/[studioId]/trials/[trialId]/route";
import { type Studio, StudioSchema } from "@/entities/studio";
import { type User, UserSchema } from "@/entities/user";
import { getEm, getOrm } from "@/lib/db";
import type { TrialDto, TrialSummaryDto } from "@/lib/trials/types";
import { seedLibrary } from "@/scripts/seed/library";
import { seedTrials } from "@/scripts/seed/trials";
import { actAs } from "../support/session";
import { type Person, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-seed";
let owner: Person;
const people = {} as { dyer: Person; guest: Person };
let studioId: string;
let trials: TrialDto[];

async function runSeed(): Promise<number> {
  const em = await getEm();
  return em.transactional(async (tx) => {
    const studio = (await tx.findOneOrFail(StudioSchema, { id: studioId })) as Studio;
    // One after another: a transaction holds one connection.
    const find = (p: Person) => tx.findOneOrFail(UserSchema, { id: p.id });
    const o = await find(owner);
    const d = await find(people.dyer);
    const g = await find(people.guest);
    const lib = await seedLibrary(tx, studio);
    return seedTrials(tx, studio, { owner: o as User, dyer: d as User, guest: g as User }, lib);
  });
}

beforeAll(async () => {
  [people.dyer, people.guest, owner] = await Promise.all([makeUser(TAG, "dyer"), makeUser(TAG, "guest"), makeUser(TAG, "owner")]);
  studioId = (await makeStudio("Seed Test Studio", [[owner, "owner"], [people.dyer, "dyer"], [people.guest, "guest"]])).id;
  expect(await runSeed()).toBeGreaterThanOrEqual(6);
  actAs(owner);
  const list = await call(trialsRoute.GET, "GET", { studioId });
  trials = await Promise.all(
    (list.json.items as TrialSummaryDto[]).map(async (t) => (await call(trialRoute.GET, "GET", { studioId, trialId: t.id })).json),
  );
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

describe("demo trials", () => {
  it("include a breaking dip gradient of food colouring in 4 sections", () => {
    const t = trials.find((x) => x.layers.some((l) => l.method === "dip" && l.gradient?.sections === 4 && l.dyes.some((d) => d.dyeClass === "food")));
    expect(t).toBeDefined();
    expect(t!.layers[0].observations).toMatch(/blue/i);
    expect(t!.layers[0].observations).toMatch(/yellow/i);
  });

  it("include a dry application over a dyed skein (2 layers), with a kitchen measure", () => {
    const t = trials.find((x) => x.layers.length === 2 && x.layers[1].method === "dry");
    expect(t).toBeDefined();
    const d = t!.layers[1].dyes[0];
    expect(d.entered.unit).toBe("tbsp");
    // 2 US tbsp = 29.5735295625 ml (NIST Handbook 44, Appendix C).
    expect(d.stockMl).toBeCloseTo(29.5735295625, 9);
  });

  it("include a speckle at 0.15 coverage, a two-dye immersion, a failed attempt and a planned trial", () => {
    expect(trials.some((t) => t.layers.some((l) => l.method === "speckle" && l.coverage === 0.15))).toBe(true);
    expect(trials.some((t) => t.layers.some((l) => l.method === "immersion" && new Set(l.dyes.map((d) => d.dyeId)).size === 2))).toBe(true);
    const failed = trials.find((t) => t.tags.includes("failed"));
    expect(failed?.status).toBe("done");
    expect(failed?.layers[0].observations).toMatch(/did not exhaust/);
    expect(trials.some((t) => t.status === "planned")).toBe(true);
  });

  it("the copy on a new base keeps DOS and doubles ml on twice the fibre", () => {
    const copy = trials.find((t) => t.copiedFromId);
    const source = trials.find((t) => t.id === copy?.copiedFromId);
    expect(copy && source).toBeTruthy();
    expect(copy!.base?.id).not.toBe(source!.base?.id);
    expect(copy!.layers[0].dyes.map((d) => d.dosPct)).toEqual(source!.layers[0].dyes.map((d) => d.dosPct));
    expect(copy!.layers[0].dyes[1].stockMl).toBeCloseTo(2 * source!.layers[0].dyes[1].stockMl!, 9);
  });

  it("running the seed again adds nothing", async () => {
    expect(await runSeed()).toBe(0);
    const list = await call(trialsRoute.GET, "GET", { studioId });
    expect(list.json.total).toBe(trials.length);
  });
});
