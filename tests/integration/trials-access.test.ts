// Who may do what with trials: a guest reads but every write answers 403; a member of another
// studio gets 404 for every route (the trial's existence is not revealed); signed out is 401.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as trialsRoute from "@/app/api/studios/[studioId]/trials/route";
import * as exportRoute from "@/app/api/studios/[studioId]/trials/export/route";
import * as facetsRoute from "@/app/api/studios/[studioId]/trials/facets/route";
import * as trialRoute from "@/app/api/studios/[studioId]/trials/[trialId]/route";
import * as copyRoute from "@/app/api/studios/[studioId]/trials/[trialId]/copy/route";
import * as layersRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/route";
import * as layerRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/route";
import * as duplicateRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/duplicate/route";
import * as orderRoute from "@/app/api/studios/[studioId]/trials/[trialId]/layer-order/route";
import { getOrm } from "@/lib/db";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "trials-access";
let owner: Person;
let guest: Person;
let stranger: Person;
let studio: StudioFixture;
let theirs: StudioFixture;
let trialId: string;
let layerId: string;
let layerVersion: number;
let trialVersion: number;

beforeAll(async () => {
  [owner, guest, stranger] = await Promise.all([makeUser(TAG, "owner"), makeUser(TAG, "guest"), makeUser(TAG, "stranger")]);
  studio = await makeStudio("Access Studio", [[owner, "owner"], [guest, "guest"]]);
  theirs = await makeStudio("Stranger Studio", [[stranger, "owner"]]);
  actAs(owner);
  const t = await call(trialsRoute.POST, "POST", { studioId: studio.id }, { body: { title: "Guarded", fibreWeightG: 100 } });
  const withLayer = await call(layersRoute.POST, "POST", { studioId: studio.id, trialId: t.json.id }, { body: { method: "immersion" } });
  trialId = t.json.id;
  trialVersion = withLayer.json.version;
  layerId = withLayer.json.layers[0].id;
  layerVersion = withLayer.json.layers[0].version;
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type H = (req: Request, args: { params: Promise<any> }) => Promise<Response>;
type Route = [string, H, string, (studioId: string) => object, () => unknown];

const s = (studioId: string) => ({ studioId });
const t = (studioId: string) => ({ studioId, trialId });
const l = (studioId: string) => ({ studioId, trialId, layerId });

const writes: Route[] = [
  ["POST trials", trialsRoute.POST, "POST", s, () => ({ title: "Nope", fibreWeightG: 100 })],
  ["PATCH trial", trialRoute.PATCH, "PATCH", t, () => ({ version: trialVersion, title: "Nope" })],
  ["DELETE trial", trialRoute.DELETE, "DELETE", t, () => undefined],
  ["POST copy", copyRoute.POST, "POST", t, () => ({})],
  ["POST layer", layersRoute.POST, "POST", t, () => ({ method: "dip" })],
  ["PATCH layer", layerRoute.PATCH, "PATCH", l, () => ({ version: layerVersion, minutes: 5 })],
  ["DELETE layer", layerRoute.DELETE, "DELETE", l, () => undefined],
  ["POST duplicate", duplicateRoute.POST, "POST", l, () => undefined],
  ["PUT layer-order", orderRoute.PUT, "PUT", t, () => ({ layerIds: [layerId] })],
];
const reads: Route[] = [
  ["GET trials", trialsRoute.GET, "GET", s, () => undefined],
  ["GET export", exportRoute.GET, "GET", s, () => undefined],
  ["GET facets", facetsRoute.GET, "GET", s, () => undefined],
  ["GET trial", trialRoute.GET, "GET", t, () => undefined],
];

describe("a guest", () => {
  it.each(reads)("may %s", async (_n, handler, method, params) => {
    actAs(guest);
    const res = await handler(new Request("http://127.0.0.1/api", { method }), { params: Promise.resolve(params(studio.id)) });
    expect(res.status).toBe(200);
  });

  it.each(writes)("gets 403 for %s, and nothing changes", async (_n, handler, method, params, body) => {
    actAs(guest);
    const res = await call(handler, method, params(studio.id), { body: body() });
    expect(res.status).toBe(403);
    expect(res.json.error).toMatch(/role in this studio/);
    actAs(owner);
    const now = await call(trialRoute.GET, "GET", t(studio.id));
    expect(now.json).toMatchObject({ title: "Guarded", version: trialVersion, layers: [{ id: layerId, version: layerVersion }] });
  });
});

describe("a member of another studio", () => {
  it.each([...reads, ...writes].filter(([, , , p]) => p !== s))("gets 404 for %s through their own studio", async (_n, handler, method, params, body) => {
    actAs(stranger);
    const res = await call(handler, method, params(theirs.id), { body: body() });
    expect(res.status).toBe(404);
    expect(res.json.error).toMatch(/not found/);
  });

  it.each([...reads, ...writes])("gets 404 for %s in the studio itself", async (_n, handler, method, params, body) => {
    actAs(stranger);
    const res = await call(handler, method, params(studio.id), { body: body() });
    expect(res.status).toBe(404);
  });
});

describe("signed out", () => {
  it.each([...reads, ...writes])("gets 401 for %s", async (_n, handler, method, params, body) => {
    actAs(null);
    const res = await call(handler, method, params(studio.id), { body: body() });
    expect(res.status).toBe(401);
  });
});

describe("ids that are not ids", () => {
  it("a malformed trial or layer id is a 404, not a 500", async () => {
    actAs(owner);
    expect((await call(trialRoute.GET, "GET", { studioId: studio.id, trialId: "not-a-uuid" })).status).toBe(404);
    const res = await call(layerRoute.PATCH, "PATCH", { studioId: studio.id, trialId, layerId: "nope" }, { body: { version: 1 } });
    expect(res.status).toBe(404);
  });
});
