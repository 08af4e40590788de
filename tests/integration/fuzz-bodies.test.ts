// Generated request bodies against every write route that reads one, called as the studio's
// owner (who may write everywhere). Bodies are shaped by the route's zod schema with hostile
// values mixed in (tests/support/fuzz.ts). Two things must hold: no call answers 5xx, and after
// the run every row the routes could have written still passes its schema and the database's
// own rules (names present, weights positive, fibres adding up to 100 %, records of one studio
// pointing only at records of the same studio).
// FUZZ_RUNS sets the runs per route (default 1000); FUZZ_SEED replays a run; FUZZ_SHRINK=1
// shrinks a failing body to a small one (slow with the database in the loop).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import fc from "fast-check";
import sharp from "sharp";
import type { z } from "zod";
import { LayerSchema, NotificationSchema, ReadingSchema } from "@/entities";
import { getEm, getOrm } from "@/lib/db";
import { accountInput, invitationInput, memberRoleInput, studioInput, studioSettingsInput } from "@/lib/schemas/studio";
import { baseInput, basePatch, dyeInput, dyePatch, stockInput, stockPatch } from "@/lib/schemas/library";
import { copyInput, layerInput, layerOrderInput, layerPatch, trialInput, trialPatch } from "@/lib/schemas/trial";
import { cardInput, cardPatch, readingInput, uploadInput } from "@/lib/schemas/photo";
import { colourwayInput, colourwayPatch, lotInput } from "@/lib/schemas/colourway";
import { commentDoc, commentInput, commentUpdate } from "@/lib/schemas/comment";
import { timerActionInput, timerInput } from "@/lib/schemas/timer";
import { notificationsRead } from "@/lib/schemas/activity";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, addMember, makeStudio, makeUser } from "../support/fixtures";
import { makeReading } from "../support/readings";
import { dosDye, makeBase, makeDye, makeStock, makeTrial } from "../support/trial-fixtures";
import { makeCard, makeColourway, makeComment, makeTimer } from "../support/records";
import { CURRENT_VERSION, type Hints, bodiesFor, emailAddress, hostile, hugeString, idHint, nastyString, versionHint, webUrl } from "../support/fuzz";
import { callInRequestScope } from "../support/next-request";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});
// Invitations mail their link at once; a fuzz run would send hundreds. The mail path has its own tests.
vi.mock("@/lib/mail", async (importOriginal) => ({
  ...(await importOriginal<object>()),
  sendMail: async () => "fuzz-not-sent",
}));

const TAG = "fuzz-bodies";
const RUNS = Number(process.env.FUZZ_RUNS ?? 1000);
const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined;
const SHRINK = process.env.FUZZ_SHRINK === "1";

let owner: Person, dyer: Person, guest: Person, stranger: Person;
let F: StudioFixture; // the studio written to
let G: StudioFixture; // another studio, whose ids are mixed into bodies
const f = {} as {
  baseId: string; dyeId: string; stockId: string; trialId: string; layerIds: string[]; readingId: string; colourwayId: string;
  cardId: string; photoId: string; commentId: string; timerId: string; memberId: string; notificationId: string;
  patchBaseId: string; patchDyeId: string; patchStockId: string; patchTrialId: string; orderTrialId: string; orderLayerIds: string[];
  layersTrialId: string;
};
const g = {} as { baseId: string; dyeId: string; stockId: string; trialId: string; layerId: string; readingId: string; cardId: string };
let foreignCounts: Record<string, number>;

async function sql<T = Record<string, unknown>>(text: string, params: unknown[] = []): Promise<T[]> {
  return (await (await getEm()).getConnection().execute(text, params)) as T[];
}

async function countsIn(studioId: string): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of ["yarn_bases", "dyes", "stock_solutions", "trials", "reference_cards", "colourways", "dye_lots", "photos", "readings", "step_timers", "comments", "invitations", "memberships"]) {
    out[t] = Number((await sql<{ n: string }>(`select count(*) as n from ${t} where studio_id = ?`, [studioId]))[0].n);
  }
  out.layers = Number((await sql<{ n: string }>("select count(*) as n from layers l join trials t on t.id = l.trial_id where t.studio_id = ?", [studioId]))[0].n);
  return out;
}

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  F = await makeStudio("Fuzz Dye Works", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  G = await makeStudio("Fuzz Elsewhere", [[stranger, "owner"]]);
  const em = await getEm();

  f.baseId = await makeBase(F.id, "Fuzz base", { fibres: [{ fibre: "wool", pct: 80 }, { fibre: "nylon", pct: 20 }] });
  f.dyeId = await makeDye(F.id, "Fuzz teal");
  f.stockId = await makeStock(F.id, f.dyeId);
  f.trialId = await makeTrial(F.id, {
    title: "Fuzz trial",
    authorId: owner.id,
    baseId: f.baseId,
    layers: [{ method: "immersion", dyes: [dosDye(f.dyeId, 1)] }, { method: "speckle" }],
  });
  f.layerIds = (await em.find(LayerSchema, { trial: f.trialId }, { orderBy: { position: "asc" } })).map((l) => l.id);
  f.readingId = await makeReading(F.id, f.trialId, owner.id, { L: 48, a: -12, b: -20 });
  f.colourwayId = await makeColourway(F.id, f.trialId, f.readingId, owner.id);
  f.cardId = await makeCard(F.id);
  f.commentId = (await makeComment(F.id, f.trialId, owner)).id;
  f.timerId = (await makeTimer(F.id, f.trialId, owner.id)).id;
  f.memberId = await addMember(F.id, await makeUser(TAG, "member"), "guest");
  const n = em.create(NotificationSchema, { user: dyer.id, studio: F.id, kind: "mention", summary: "Fuzz mention for the dyer" });
  await em.flush();
  f.notificationId = n.id;
  // Records the PATCH and PUT routes write to, apart from those the POST routes point at.
  f.patchBaseId = await makeBase(F.id, "Fuzz patch base");
  f.patchDyeId = await makeDye(F.id, "Fuzz patch dye");
  f.patchStockId = await makeStock(F.id, f.dyeId);
  f.patchTrialId = await makeTrial(F.id, { title: "Fuzz patch trial", authorId: owner.id });
  f.orderTrialId = await makeTrial(F.id, { title: "Fuzz order trial", authorId: owner.id, layers: [{ method: "dip" }, { method: "dip" }, { method: "dry" }] });
  f.orderLayerIds = (await em.find(LayerSchema, { trial: f.orderTrialId })).map((l) => l.id);
  f.layersTrialId = await makeTrial(F.id, { title: "Fuzz layers trial", authorId: owner.id, fibreWeightG: 250 });

  // A real photo (64 × 48) to take readings from.
  actAs(owner);
  const uploads = await import("@/app/api/studios/[studioId]/photos/route");
  const confirm = await import("@/app/api/studios/[studioId]/photos/[photoId]/confirm/route");
  const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 60, g: 120, b: 130 } } }).jpeg().toBuffer();
  const start = await uploads.POST(
    new Request("http://127.0.0.1/x", { method: "POST", body: JSON.stringify({ trialId: f.trialId, kind: "base", contentType: "image/jpeg", bytes: jpeg.length }) }),
    { params: Promise.resolve({ studioId: F.id }) },
  );
  const started = await start.json();
  expect((await fetch(started.uploadUrl, { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(jpeg) })).ok).toBe(true);
  f.photoId = started.photo.id;
  expect((await confirm.POST(new Request("http://127.0.0.1/x", { method: "POST" }), { params: Promise.resolve({ studioId: F.id, photoId: f.photoId }) })).status).toBe(200);

  g.baseId = await makeBase(G.id, "Elsewhere base");
  g.dyeId = await makeDye(G.id, "Elsewhere dye");
  g.stockId = await makeStock(G.id, g.dyeId);
  g.trialId = await makeTrial(G.id, { title: "Elsewhere trial", authorId: stranger.id, layers: [{ method: "kettle" }] });
  g.layerId = (await em.find(LayerSchema, { trial: g.trialId }))[0].id;
  g.readingId = await makeReading(G.id, g.trialId, stranger.id, { L: 30, a: 30, b: 10 });
  g.cardId = await makeCard(G.id);
  foreignCounts = await countsIn(G.id);
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

/* ---------- the routes and how to call them ---------- */

type Handler = (req: Request, ctx: { params: Promise<unknown> }) => Promise<Response>;

interface FuzzRoute {
  key: string;
  load: () => Promise<Record<string, unknown>>;
  params: () => Record<string, string>;
  bodies: () => fc.Arbitrary<{ text: string; kind: string }>;
  /** The version a CURRENT_VERSION placeholder stands for. */
  version?: () => Promise<number>;
  /** Runs before each call (e.g. to start a stopped timer again, so actions on it can pass). */
  before?: () => Promise<void>;
}

async function versionIn(table: string, id: string): Promise<number> {
  return Number((await sql<{ version: number }>(`select version from ${table} where id = ?`, [id]))[0]?.version ?? 1);
}

const ids = {
  trial: () => idHint(f.trialId, f.patchTrialId, g.trialId),
  layer: () => idHint(...f.layerIds, g.layerId),
  dye: () => idHint(f.dyeId, f.patchDyeId, g.dyeId),
  stock: () => idHint(f.stockId, g.stockId),
  base: () => idHint(f.baseId, g.baseId),
  reading: () => idHint(f.readingId, g.readingId),
  card: () => idHint(f.cardId, g.cardId),
};

const today = () => new Date().toISOString().slice(0, 10);
const dayHint = () =>
  fc.oneof(
    fc.constantFrom(today(), "2025-11-30", "2024-02-29", "2023-02-29", "2026-13-01", "9999-12-31", "0001-01-01", "2026-1-5"),
    fc.date({ min: new Date("1900-01-01"), max: new Date("2100-01-01"), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10)),
    nastyString,
  );

/** An editor document: mostly of the allowed nodes, sometimes with nodes, marks and links that are not. */
/** Editor documents: a comment's (mentions, swatches) or a trial's notes (neither; lib/schemas/notes.ts). */
function docHint(strict = false, kind: "comment" | "notes" = "comment"): fc.Arbitrary<unknown> {
  const chips = kind === "comment" ? 1 : 0;
  const bad = strict ? 0 : 1;
  const textNode = fc.record({
    type: fc.constant("text"),
    text: fc.oneof({ weight: 4, arbitrary: fc.string({ minLength: 1, maxLength: 80 }) }, { weight: bad, arbitrary: nastyString }),
    marks: fc.option(
      fc.array(
        fc.oneof(
          { weight: 2, arbitrary: fc.constantFrom({ type: "bold" }, { type: "italic" }) },
          { weight: 1, arbitrary: fc.record({ type: fc.constant("link"), attrs: fc.record({ href: webUrl }) }) },
          { weight: bad, arbitrary: fc.record({ type: fc.constant("link"), attrs: fc.record({ href: fc.constantFrom("javascript:alert(1)", "data:text/html,x", "//evil.test", "https://x.test/\u0000") }) }) },
          { weight: bad, arbitrary: fc.record({ type: fc.constantFrom("strike", "code", "script") }) },
        ),
        { maxLength: 3 },
      ),
      { nil: undefined },
    ),
  });
  const member = strict ? fc.constantFrom(owner.id, dyer.id, guest.id) : idHint(owner.id, dyer.id, stranger.id);
  const mention = fc.record({ type: fc.constant("mention"), attrs: fc.record({ id: member, label: fc.option(fc.string({ maxLength: 30 })) }) });
  const swatch = fc.record({ type: fc.constant("swatch"), attrs: fc.record({ hex: strict ? fc.stringMatching(/^#[0-9a-f]{6}$/) : fc.oneof(fc.stringMatching(/^#[0-9a-f]{6}$/), nastyString) }) });
  const inline = fc.oneof(
    { weight: 6, arbitrary: textNode },
    { weight: chips, arbitrary: mention },
    { weight: chips, arbitrary: swatch },
    { weight: 1, arbitrary: fc.constant({ type: "hardBreak" }) },
    { weight: bad, arbitrary: hostile },
  );
  const paragraph = fc.record({ type: fc.constant("paragraph"), content: fc.array(inline, { minLength: 1, maxLength: 4 }) });
  const { block } = fc.letrec<{ block: unknown; item: unknown }>((tie) => ({
    block: fc.oneof(
      { depthSize: "small", withCrossShrink: true },
      { weight: 4, arbitrary: paragraph },
      { weight: 1, arbitrary: fc.record({ type: fc.constantFrom("bulletList", "orderedList"), content: fc.array(tie("item"), { minLength: 1, maxLength: 3 }) }) },
      { weight: bad, arbitrary: fc.record({ type: fc.constantFrom("heading", "image", "codeBlock"), content: fc.array(inline, { maxLength: 2 }) }) },
    ),
    item: fc.record({ type: fc.constant("listItem"), content: fc.array(tie("block"), { minLength: 1, maxLength: 2 }) }),
  }));
  const doc = fc.record({ type: fc.constant("doc"), content: fc.array(block, { minLength: 1, maxLength: 3 }) });
  return strict ? doc : fc.oneof({ weight: 8, arbitrary: doc }, { weight: 1, arbitrary: hostile });
}

/* Bodies meant to pass, for routes whose schema has rules across fields. */
const name = fc.stringMatching(/^[A-Za-z][A-Za-z0-9 '-]{1,30}[a-z]$/);
const FIBRE_MIXES = [[{ fibre: "wool", pct: 100 }], [{ fibre: "merino", pct: 80 }, { fibre: "nylon", pct: 20 }], [{ fibre: "silk", pct: 33.33 }, { fibre: "wool", pct: 33.33 }, { fibre: "nylon", pct: 33.34 }]];
const validBase = () =>
  fc.record(
    {
      name,
      fibres: fc.constantFrom(...FIBRE_MIXES),
      weightClass: fc.constantFrom("lace", "fingering", "dk", "worsted"),
      superwash: fc.boolean(),
      metresPer100g: fc.oneof(fc.constant(null), fc.double({ min: 1, max: 5000, noNaN: true })),
      notes: fc.string({ maxLength: 100 }),
    },
    { requiredKeys: ["name", "fibres", "weightClass"] },
  );
const validStock = () =>
  fc.record({
    dyeId: fc.constant(f.dyeId),
    concentrationPct: fc.double({ min: 0.01, max: 25, noNaN: true }),
    definition: fc.constantFrom("to-volume", "in-water"),
    volumeMl: fc.double({ min: 1, max: 50_000, noNaN: true }),
    mixedOn: fc.constantFrom(today(), "2025-11-30", "2024-02-29"),
  });
const validTrial = () =>
  fc.record(
    {
      title: name,
      fibreWeightG: fc.double({ min: 0.1, max: 20_000, noNaN: true }),
      baseId: fc.constantFrom(f.baseId, null),
      status: fc.constantFrom("planned", "in-progress", "done"),
      tags: fc.array(fc.stringMatching(/^[a-z]{1,12}$/), { maxLength: 4 }),
      notes: fc.oneof(fc.constant(null), docHint(true, "notes")),
    },
    { requiredKeys: ["title", "fibreWeightG"] },
  );
const validLayer = () =>
  fc.record(
    {
      method: fc.constantFrom("immersion", "kettle", "dip", "hand-paint", "speckle", "dry", "other"),
      dyes: fc.array(
        fc.oneof(
          fc.record({ dyeId: fc.constantFrom(f.dyeId, f.patchDyeId), amount: fc.record({ value: fc.double({ min: 0, max: 20, noNaN: true }), unit: fc.constantFrom("dos", "g") }) }),
          fc.record({ dyeId: fc.constant(f.dyeId), stockId: fc.constant(f.stockId), amount: fc.record({ value: fc.double({ min: 0, max: 200, noNaN: true }), unit: fc.constantFrom("ml", "tsp", "tbsp") }) }),
        ),
        { maxLength: 3 },
      ),
      acid: fc.record({ kind: fc.constantFrom("vinegar", "citric", "none"), amount: fc.option(fc.double({ min: 0, max: 500, noNaN: true })), ph: fc.option(fc.double({ min: 2, max: 8, noNaN: true })) }),
      waterL: fc.option(fc.double({ min: 0.1, max: 50, noNaN: true })),
      temperatureC: fc.option(fc.double({ min: 15, max: 100, noNaN: true })),
      minutes: fc.option(fc.integer({ min: 0, max: 240 })),
      setting: fc.record({ method: fc.constantFrom("simmer", "steam", "microwave", "none"), minutes: fc.option(fc.integer({ min: 0, max: 90 })) }),
      rinseNote: fc.string({ maxLength: 60 }),
      bled: fc.option(fc.boolean()),
      coverage: fc.option(fc.double({ min: 0, max: 1, noNaN: true })),
      gradient: fc.option(fc.integer({ min: 2, max: 6 }).chain((n) => fc.record({ sections: fc.constant(n), depths: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: n, maxLength: n }) }))),
      observations: fc.string({ maxLength: 100 }),
    },
    { requiredKeys: ["method"] },
  );
const validCard = () =>
  fc.tuple(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 4 })).chain(([rows, cols]) =>
    fc.record({
      name,
      rows: fc.constant(rows),
      cols: fc.constant(cols),
      patches: fc.array(
        fc.record({ name: fc.string({ maxLength: 10 }), L: fc.double({ min: 0, max: 100, noNaN: true }), a: fc.double({ min: -128, max: 127, noNaN: true }), b: fc.double({ min: -128, max: 127, noNaN: true }) }),
        { minLength: rows * cols, maxLength: rows * cols },
      ),
      measured: fc.boolean(),
      notes: fc.string({ maxLength: 60 }),
    }),
  );
/** Swatch areas inside the 64 × 48 test photo. */
const validReading = () =>
  fc.record({
    regions: fc.array(
      fc.record({ label: fc.string({ maxLength: 20 }), rect: fc.record({ x: fc.integer({ min: 0, max: 40 }), y: fc.integer({ min: 0, max: 30 }), width: fc.integer({ min: 4, max: 24 }), height: fc.integer({ min: 4, max: 18 }) }) }),
      { minLength: 1, maxLength: 3 },
    ),
  });
const withVersion = (arb: fc.Arbitrary<unknown>) => arb.map((b) => ({ ...(b as object), version: CURRENT_VERSION }));

/** A JSON body route: its module, params, and the schema its bodies are shaped by. */
function jsonRoute(
  key: string,
  load: () => Promise<Record<string, unknown>>,
  params: () => Record<string, string>,
  schema: z.ZodType,
  opts: { hints?: () => Hints; valid?: () => fc.Arbitrary<unknown>; version?: () => Promise<number>; before?: () => Promise<void> } = {},
): FuzzRoute {
  return { key, load, params, bodies: () => bodiesFor(schema, opts.hints?.() ?? {}, opts.valid?.()), version: opts.version, before: opts.before };
}

const S = () => ({ studioId: F.id });

const ROUTES: FuzzRoute[] = [
  jsonRoute("PATCH /api/account", () => import("@/app/api/account/route"), () => ({}), accountInput),
  jsonRoute("POST /api/studios", () => import("@/app/api/studios/route"), () => ({}), studioInput),
  jsonRoute("PATCH /api/studios/[studioId]", () => import("@/app/api/studios/[studioId]/route"), S, studioSettingsInput),
  jsonRoute("POST /api/studios/[studioId]/invitations", () => import("@/app/api/studios/[studioId]/invitations/route"), S, invitationInput),
  jsonRoute("PATCH /api/studios/[studioId]/members/[memberId]", () => import("@/app/api/studios/[studioId]/members/[memberId]/route"), () => ({ ...S(), memberId: f.memberId }), memberRoleInput),
  jsonRoute("POST /api/studios/[studioId]/notifications/read", () => import("@/app/api/studios/[studioId]/notifications/read/route"), S, notificationsRead, {
    hints: () => ({ "[]": idHint(f.notificationId, g.readingId) }),
  }),
  jsonRoute("POST /api/studios/[studioId]/bases", () => import("@/app/api/studios/[studioId]/bases/route"), S, baseInput, { valid: validBase }),
  jsonRoute("PATCH /api/studios/[studioId]/bases/[baseId]", () => import("@/app/api/studios/[studioId]/bases/[baseId]/route"), () => ({ ...S(), baseId: f.patchBaseId }), basePatch, {
    hints: () => ({ version: versionHint }),
    valid: () => withVersion(validBase()),
    version: () => versionIn("yarn_bases", f.patchBaseId),
  }),
  jsonRoute("POST /api/studios/[studioId]/dyes", () => import("@/app/api/studios/[studioId]/dyes/route"), S, dyeInput, {
    hints: () => ({
      sdsUrl: fc.oneof(webUrl, fc.constantFrom("javascript:alert(1)", "ftp://x.test/", "https://", ""), nastyString),
      colourIndexName: fc.oneof(fc.constantFrom("Acid Red 1", "C.I. Acid Blue 25", "Acid Yellow 17:1", "acid", ""), nastyString),
    }),
  }),
  jsonRoute("PATCH /api/studios/[studioId]/dyes/[dyeId]", () => import("@/app/api/studios/[studioId]/dyes/[dyeId]/route"), () => ({ ...S(), dyeId: f.patchDyeId }), dyePatch, {
    hints: () => ({ version: versionHint }),
    version: () => versionIn("dyes", f.patchDyeId),
  }),
  jsonRoute("POST /api/studios/[studioId]/stocks", () => import("@/app/api/studios/[studioId]/stocks/route"), S, stockInput, {
    hints: () => ({ dyeId: ids.dye(), mixedOn: dayHint() }),
    valid: validStock,
  }),
  jsonRoute("PATCH /api/studios/[studioId]/stocks/[stockId]", () => import("@/app/api/studios/[studioId]/stocks/[stockId]/route"), () => ({ ...S(), stockId: f.patchStockId }), stockPatch, {
    hints: () => ({ version: versionHint, dyeId: ids.dye(), mixedOn: dayHint() }),
    version: () => versionIn("stock_solutions", f.patchStockId),
  }),
  jsonRoute("POST /api/studios/[studioId]/trials", () => import("@/app/api/studios/[studioId]/trials/route"), S, trialInput, {
    hints: () => ({ baseId: ids.base(), notes: docHint(false, "notes") }),
    valid: validTrial,
  }),
  jsonRoute("PATCH /api/studios/[studioId]/trials/[trialId]", () => import("@/app/api/studios/[studioId]/trials/[trialId]/route"), () => ({ ...S(), trialId: f.patchTrialId }), trialPatch, {
    hints: () => ({ version: versionHint, baseId: ids.base(), notes: docHint(false, "notes") }),
    valid: () => withVersion(validTrial()),
    version: () => versionIn("trials", f.patchTrialId),
  }),
  jsonRoute("POST /api/studios/[studioId]/trials/[trialId]/copy", () => import("@/app/api/studios/[studioId]/trials/[trialId]/copy/route"), () => ({ ...S(), trialId: f.trialId }), copyInput, {
    hints: () => ({ baseId: ids.base() }),
  }),
  jsonRoute("PUT /api/studios/[studioId]/trials/[trialId]/layer-order", () => import("@/app/api/studios/[studioId]/trials/[trialId]/layer-order/route"), () => ({ ...S(), trialId: f.orderTrialId }), layerOrderInput, {
    hints: () => ({
      layerIds: fc.oneof(
        { weight: 4, arbitrary: fc.shuffledSubarray(f.orderLayerIds, { minLength: f.orderLayerIds.length, maxLength: f.orderLayerIds.length }) },
        { weight: 2, arbitrary: fc.array(idHint(...f.orderLayerIds, ...f.layerIds, g.layerId), { maxLength: 5 }) },
        { weight: 1, arbitrary: hostile },
      ),
    }),
  }),
  jsonRoute("POST /api/studios/[studioId]/trials/[trialId]/layers", () => import("@/app/api/studios/[studioId]/trials/[trialId]/layers/route"), () => ({ ...S(), trialId: f.layersTrialId }), layerInput, {
    hints: () => ({ dyeId: ids.dye(), stockId: ids.stock() }),
    valid: validLayer,
  }),
  jsonRoute("PATCH /api/studios/[studioId]/trials/[trialId]/layers/[layerId]", () => import("@/app/api/studios/[studioId]/trials/[trialId]/layers/[layerId]/route"), () => ({ ...S(), trialId: f.trialId, layerId: f.layerIds[0] }), layerPatch, {
    hints: () => ({ version: versionHint, dyeId: ids.dye(), stockId: ids.stock() }),
    valid: () => withVersion(validLayer()),
    version: () => versionIn("layers", f.layerIds[0]),
  }),
  jsonRoute("POST /api/studios/[studioId]/trials/[trialId]/comments", () => import("@/app/api/studios/[studioId]/trials/[trialId]/comments/route"), () => ({ ...S(), trialId: f.trialId }), commentInput, {
    hints: () => ({ body: docHint(), layerId: ids.layer(), photoId: idHint(f.photoId, g.readingId) }),
    valid: () => fc.record({ body: docHint(true), layerId: fc.constantFrom(null, f.layerIds[0]), photoId: fc.constantFrom(null, f.photoId) }, { requiredKeys: ["body"] }),
  }),
  jsonRoute("PATCH /api/studios/[studioId]/trials/[trialId]/comments/[commentId]", () => import("@/app/api/studios/[studioId]/trials/[trialId]/comments/[commentId]/route"), () => ({ ...S(), trialId: f.trialId, commentId: f.commentId }), commentUpdate, {
    hints: () => ({ body: docHint(), version: versionHint }),
    valid: () => fc.record({ body: docHint(true), version: fc.constant(CURRENT_VERSION) }),
    version: () => versionIn("comments", f.commentId),
  }),
  jsonRoute("POST /api/studios/[studioId]/timers", () => import("@/app/api/studios/[studioId]/timers/route"), S, timerInput, {
    hints: () => ({ trialId: ids.trial(), layerId: ids.layer() }),
    valid: () => fc.record({ trialId: fc.constant(f.trialId), layerId: fc.constantFrom(null, f.layerIds[0]), label: name, durationSec: fc.integer({ min: 1, max: 86_400 }) }),
    // The studio allows a dozen timers going at once; stop the fuzz's own now and then.
    before: async () => {
      await sql("update step_timers set state = 'cancelled', running_since = null, finished_at = now() where studio_id = ? and id <> ? and state in ('running', 'paused') and (select count(*) from step_timers where studio_id = ? and state in ('running', 'paused')) >= 10", [F.id, f.timerId, F.id]);
    },
  }),
  jsonRoute("PATCH /api/studios/[studioId]/timers/[timerId]", () => import("@/app/api/studios/[studioId]/timers/[timerId]/route"), () => ({ ...S(), timerId: f.timerId }), timerActionInput, {
    hints: () => ({ version: versionHint }),
    version: () => versionIn("step_timers", f.timerId),
    // A finished or cancelled timer takes no more actions: start it again so they can pass.
    before: async () => {
      await sql("update step_timers set state = 'running', running_since = now(), finished_at = null, version = version + 1 where id = ? and state in ('done', 'cancelled')", [f.timerId]);
    },
  }),
  jsonRoute("POST /api/studios/[studioId]/photos", () => import("@/app/api/studios/[studioId]/photos/route"), S, uploadInput, { hints: () => ({ trialId: ids.trial(), layerId: ids.layer() }) }),
  jsonRoute("POST /api/studios/[studioId]/photos/[photoId]/readings", () => import("@/app/api/studios/[studioId]/photos/[photoId]/readings/route"), () => ({ ...S(), photoId: f.photoId }), readingInput, {
    hints: () => ({
      cardId: ids.card(),
      x: fc.oneof(fc.integer({ min: 0, max: 70 }), fc.double({ min: 0, max: 70, noNaN: true }), hostile),
      y: fc.oneof(fc.integer({ min: 0, max: 50 }), fc.double({ min: 0, max: 50, noNaN: true }), hostile),
      width: fc.oneof(fc.integer({ min: 3, max: 80 }), fc.double({ min: 3.5, max: 80, noNaN: true }), hostile),
      height: fc.oneof(fc.integer({ min: 3, max: 60 }), fc.double({ min: 3.5, max: 60, noNaN: true }), hostile),
    }),
    valid: validReading,
  }),
  jsonRoute("POST /api/studios/[studioId]/cards", () => import("@/app/api/studios/[studioId]/cards/route"), S, cardInput, { valid: validCard }),
  jsonRoute("PUT /api/studios/[studioId]/cards/[cardId]", () => import("@/app/api/studios/[studioId]/cards/[cardId]/route"), () => ({ ...S(), cardId: f.cardId }), cardPatch, {
    hints: () => ({ version: versionHint }),
    valid: () => withVersion(validCard()),
    version: () => versionIn("reference_cards", f.cardId),
  }),
  jsonRoute("POST /api/studios/[studioId]/colourways", () => import("@/app/api/studios/[studioId]/colourways/route"), S, colourwayInput, { hints: () => ({ trialId: ids.trial(), readingId: ids.reading() }) }),
  jsonRoute("PATCH /api/studios/[studioId]/colourways/[colourwayId]", () => import("@/app/api/studios/[studioId]/colourways/[colourwayId]/route"), () => ({ ...S(), colourwayId: f.colourwayId }), colourwayPatch, {
    hints: () => ({ version: versionHint }),
    version: () => versionIn("colourways", f.colourwayId),
  }),
  jsonRoute("POST /api/studios/[studioId]/colourways/[colourwayId]/lots", () => import("@/app/api/studios/[studioId]/colourways/[colourwayId]/lots/route"), () => ({ ...S(), colourwayId: f.colourwayId }), lotInput, {
    hints: () => ({ trialId: ids.trial(), readingId: ids.reading() }),
  }),
];

/** Where a sign-in may send the browser: this site, however it is addressed. */
const SITE_HOSTS = new Set(["127.0.0.1:3000", "localhost:3000", new URL(process.env.NEXTAUTH_URL ?? "http://localhost:3000").host]);

/** Form-encoded routes outside the studio: the unsubscribe link and the password sign-in. */
const formString = fc.oneof(fc.string({ maxLength: 60 }), nastyString, hugeString);

async function send(route: FuzzRoute, text: string): Promise<{ status: number; body: string }> {
  const [method] = route.key.split(" ");
  const handler = (await route.load())[method] as Handler;
  const req = new Request("http://127.0.0.1:3000/api/fuzz", { method, headers: { "content-type": "application/json" }, body: text });
  const res = await handler(req, { params: Promise.resolve(route.params()) });
  return { status: res.status, body: await res.text() };
}

/* ---------- the run ---------- */

const counts: Record<string, { runs: number; ok: number; refused: number }> = {};
const started = Date.now();

function checkAnswer(status: number, body: string, label: string, ownErrors = true) {
  if (status >= 500) throw new Error(`${label} answered ${status}: ${body.slice(0, 300)}`);
  // Our routes refuse with { error }; next-auth answers in its own shape.
  if (ownErrors && status >= 400 && body.startsWith("{")) {
    const json = JSON.parse(body);
    if (typeof json.error !== "string") throw new Error(`${label} refused without a message: ${body.slice(0, 200)}`);
    if (/\bat .+:\d+:\d+/.test(json.error)) throw new Error(`${label} leaked a stack: ${json.error.slice(0, 200)}`);
  }
}

async function fuzz<T>(key: string, arb: fc.Arbitrary<T>, run: (v: T) => Promise<{ status: number; body: string }>, ownErrors = true) {
  const c = (counts[key] = { runs: 0, ok: 0, refused: 0 });
  const result = await fc.check(
    fc.asyncProperty(arb, async (v) => {
      const { status, body } = await run(v);
      c.runs++;
      if (status < 300) c.ok++;
      else c.refused++;
      checkAnswer(status, body, key, ownErrors);
    }),
    { numRuns: RUNS, seed: SEED, endOnFailure: !SHRINK },
  );
  if (result.failed) {
    const example = JSON.stringify(result.counterexample)?.slice(0, 600);
    throw new Error(`${key} failed after ${result.numRuns} runs (seed ${result.seed}, path ${result.counterexamplePath}):\n${String(result.errorInstance).slice(0, 800)}\nbody: ${example}`);
  }
  expect(c.runs).toBeGreaterThanOrEqual(RUNS);
}

// Routes run a few at a time (vitest's maxConcurrency): each call mostly waits on the database.
// Concurrent routes write to different records, so they do not wait on each other's row locks.
describe.concurrent("fuzzed bodies, as the owner", () => {
  it.each(ROUTES.map((r) => [r.key, r] as const))("%s", async (_key, route) => {
    actAs(owner);
    await fuzz(route.key, route.bodies(), async (b) => {
      await route.before?.();
      let text = b.text;
      if (route.version && text.includes(CURRENT_VERSION)) text = text.replaceAll(`"${CURRENT_VERSION}"`, String(await route.version()));
      return send(route, text);
    });
  }, 600_000);

  it("POST /api/unsubscribe", async () => {
    const mod = await import("@/app/api/unsubscribe/route");
    await fuzz("POST /api/unsubscribe", fc.tuple(fc.boolean(), formString), async ([asForm, token]) => {
      const req = asForm
        ? new Request("http://127.0.0.1:3000/api/unsubscribe", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ token }).toString() })
        : new Request(`http://127.0.0.1:3000/api/unsubscribe?${new URLSearchParams({ token: token.slice(0, 4000) })}`, { method: "POST" });
      const res = await mod.POST(req);
      return { status: res.status, body: await res.text() };
    });
  }, 600_000);

  it("POST /api/auth/[...nextauth] (password sign-in)", async () => {
    const mod = await import("@/app/api/auth/[...nextauth]/route");
    const handler = mod.POST as unknown as Handler;
    const page = "/api/auth/[...nextauth]/route";
    const csrfRes = await callInRequestScope(mod.GET as unknown as Handler, page, "http://127.0.0.1:3000/api/auth/csrf", { method: "GET" }, { nextauth: ["csrf"] });
    const cookie = csrfRes.headers.getSetCookie().map((x) => x.split(";")[0]).join("; ");
    const { csrfToken } = await csrfRes.json();
    const form = fc.record({
      csrfToken: fc.oneof({ weight: 4, arbitrary: fc.constant(csrfToken as string) }, { weight: 1, arbitrary: formString }),
      email: fc.oneof(fc.constant(owner.email), emailAddress, formString),
      password: formString,
      callbackUrl: fc.oneof(fc.constantFrom("https://evil.test/", "//evil.test", "/trials", "javascript:alert(1)", "http://127.0.0.1:3000/x"), formString),
      json: fc.constantFrom("true", "false", ""),
      // Mostly addresses of their own (so the sign-in rate limit is met now and then, not at once).
      ip: fc.oneof({ weight: 6, arbitrary: fc.ipV4() }, { weight: 1, arbitrary: fc.constantFrom("", "unknown", "a".repeat(100), "1.2.3.4, 5.6.7.8", "::ffff:10.0.0.1", "::1") }),
    });
    await fuzz("POST /api/auth/[...nextauth]", form, async ({ ip, ...body }) => {
      const res = await callInRequestScope(
        handler,
        page,
        "http://127.0.0.1:3000/api/auth/callback/password",
        {
          method: "POST",
          headers: { "content-type": "application/x-www-form-urlencoded", cookie, "x-forwarded-for": ip },
          body: new URLSearchParams(body).toString(),
          redirect: "manual",
        },
        { nextauth: ["callback", "password"] },
      );
      const text = await res.text();
      // Nobody is signed in by a guessed password, and no redirect leaves the site.
      if (/session-token=/.test(res.headers.get("set-cookie") ?? "")) throw new Error(`a session for ${body.email}`);
      const to = res.headers.get("location") ?? (text.startsWith("{") ? (JSON.parse(text).url as string | undefined) : undefined);
      if (to && !SITE_HOSTS.has(new URL(to, "http://127.0.0.1:3000").host)) {
        throw new Error(`redirected off the site: ${to}`);
      }
      return { status: res.status, body: text.startsWith("{") ? text : "" };
    }, false);
  }, 600_000);
});

/* ---------- what was stored ---------- */

type Row = Record<string, unknown>;
const problems: string[] = [];
function check(table: string, rows: Row[], valid: (r: Row) => true | string) {
  for (const r of rows) {
    const v = valid(r);
    if (v !== true) problems.push(`${table} ${String(r.id)}: ${v}`);
  }
}
const parsed = (schema: z.ZodType, value: unknown): true | string => {
  const res = schema.safeParse(value);
  return res.success ? true : res.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
};
const trimmed = (s: unknown, min: number, max: number) => typeof s === "string" && s === s.trim() && s.length >= min && s.length <= max;

describe("what the fuzzing stored", () => {
  it("every row the routes could write still passes its schema", async () => {
    const inF = [F.id];
    check("studios", await sql("select * from studios where id = ? or id in (select studio_id from memberships where user_id = ?)", [F.id, owner.id]), (r) =>
      trimmed(r.name, 2, 120) ? parsed(studioSettingsInput, { name: r.name, lotTolerance: r.lot_tolerance, lotsForRepeatable: r.lots_for_repeatable, stockShelfLifeDays: r.stock_shelf_life_days }) : "name",
    );
    check("studios without an owner", await sql("select s.id from studios s where s.id in (select studio_id from memberships where user_id = ?) and not exists (select 1 from memberships m where m.studio_id = s.id and m.role = 'owner')", [owner.id]), () => "no owner");
    check("users", await sql("select * from users where id = ?", [owner.id]), (r) =>
      trimmed(r.name, 1, 120) ? parsed(accountInput, { name: r.name, unitSystem: r.unit_system, temperatureUnit: r.temperature_unit, mailEnabled: r.mail_enabled }) : "name",
    );
    check("users' mail setting", await sql("select * from users where id in (?, ?) and mail_enabled = false", [dyer.id, guest.id]), () => "mail turned off without a valid link");
    check("memberships", await sql("select * from memberships where studio_id = ?", inF), (r) => parsed(memberRoleInput, { role: r.role }));
    check("invitations", await sql("select * from invitations where studio_id = ?", inF), (r) =>
      r.email === String(r.email).trim().toLowerCase() ? parsed(invitationInput, { email: r.email, role: r.role }) : "email not normalised",
    );
    check("notifications", await sql("select * from notifications where id = ? and read_at is not null", [f.notificationId]), () => "another member's notification marked read");
    check("yarn_bases", await sql("select * from yarn_bases where studio_id = ?", inF), (r) =>
      trimmed(r.name, 1, 120)
        ? parsed(baseInput, { name: r.name, fibres: r.fibres, superwash: r.superwash, weightClass: r.weight_class, metresPer100g: r.metres_per100g, notes: r.notes })
        : "name",
    );
    check("dyes", await sql("select * from dyes where studio_id = ?", inF), (r) =>
      trimmed(r.name, 1, 120)
        ? parsed(dyeInput, { name: r.name, dyeClass: r.dye_class, form: r.form, colourIndexName: r.colour_index_name ?? "", sdsUrl: r.sds_url ?? "", displayHex: r.display_hex, notes: r.notes })
        : "name",
    );
    check("stock_solutions", await sql("select s.*, to_char(s.mixed_on, 'YYYY-MM-DD') as day, d.studio_id as dye_studio from stock_solutions s join dyes d on d.id = s.dye_id where s.studio_id = ?", inF), (r) =>
      r.dye_studio !== F.id
        ? "dye of another studio"
        : parsed(stockInput, { dyeId: r.dye_id, concentrationPct: r.concentration_pct, definition: r.definition, volumeMl: r.volume_ml, mixedOn: r.day, powderLot: r.powder_lot, notes: r.notes }),
    );
    check("trials", await sql("select t.*, b.studio_id as base_studio from trials t left join yarn_bases b on b.id = t.base_id where t.studio_id = ?", inF), (r) =>
      r.base_id && r.base_studio !== F.id
        ? "base of another studio"
        : trimmed(r.title, 1, 160)
          ? parsed(trialInput, { title: r.title, baseId: r.base_id, fibreWeightG: r.fibre_weight_g, status: r.status, tags: r.tags, notes: r.notes })
          : "title",
    );
    const layers = await sql<Row>("select l.* from layers l join trials t on t.id = l.trial_id where t.studio_id = ? order by l.trial_id, l.position", inF);
    const fDyes = new Set((await sql<{ id: string }>("select id from dyes where studio_id = ?", inF)).map((d) => d.id));
    const fStocks = new Set((await sql<{ id: string }>("select id from stock_solutions where studio_id = ?", inF)).map((d) => d.id));
    check("layers", layers, (r) => {
      const dyes = r.dyes as { dyeId: string; stockId: string | null; dosPct: number; entered: { value: number } }[];
      if (!Array.isArray(dyes) || dyes.length > 12) return "dyes";
      for (const d of dyes) {
        if (!fDyes.has(d.dyeId)) return "a dye of another studio";
        if (d.stockId && !fStocks.has(d.stockId)) return "a stock of another studio";
        if (!Number.isFinite(d.dosPct) || d.dosPct < 0 || d.dosPct > 20) return `depth of shade ${d.dosPct}`;
        if (!Number.isFinite(d.entered?.value) || d.entered.value < 0) return "entered amount";
      }
      return parsed(layerInput, {
        method: r.method, acid: r.acid, waterL: r.water_l, temperatureC: r.temperature_c, minutes: r.minutes, setting: r.setting,
        rinseNote: r.rinse_note, bled: r.bled, coverage: r.coverage, gradient: r.gradient, observations: r.observations,
      });
    });
    const byTrial = new Map<string, number[]>();
    for (const l of layers) byTrial.set(String(l.trial_id), [...(byTrial.get(String(l.trial_id)) ?? []), Number(l.position)]);
    for (const [trial, positions] of byTrial) {
      if (positions.some((p, i) => p !== i)) problems.push(`layers of trial ${trial}: positions ${positions.join(",")}`);
    }
    check("reference_cards", await sql("select * from reference_cards where studio_id = ?", inF), (r) =>
      trimmed(r.name, 1, 120) ? parsed(cardInput, { name: r.name, rows: r.rows, cols: r.cols, patches: r.patches, measured: r.measured, notes: r.notes }) : "name",
    );
    check("colourways", await sql("select c.*, t.studio_id as trial_studio from colourways c join trials t on t.id = c.source_trial_id where c.studio_id = ?", inF), (r) =>
      r.trial_studio !== F.id
        ? "trial of another studio"
        : trimmed(r.name, 2, 120)
          ? parsed(colourwayPatch, { version: 1, name: r.name, description: r.description, status: r.status })
          : "name",
    );
    check("dye_lots", await sql("select l.*, t.studio_id as trial_studio, r.studio_id as reading_studio from dye_lots l join trials t on t.id = l.trial_id left join readings r on r.id = l.reading_id where l.studio_id = ?", inF), (r) =>
      r.trial_studio !== F.id || (r.reading_id && r.reading_studio !== F.id)
        ? "a record of another studio"
        : trimmed(r.code, 1, 40)
          ? parsed(lotInput, { trialId: r.trial_id, code: r.code, skeins: r.skeins, fibreWeightG: r.fibre_weight_g, readingId: r.reading_id, notes: r.notes })
          : "code",
    );
    check("step_timers", await sql("select s.*, t.studio_id as trial_studio from step_timers s join trials t on t.id = s.trial_id where s.studio_id = ?", inF), (r) =>
      r.trial_studio !== F.id
        ? "trial of another studio"
        : !["running", "paused", "done", "cancelled"].includes(String(r.state)) || !(Number(r.elapsed_sec) >= 0)
          ? "state"
          : trimmed(r.label, 1, 80)
            ? parsed(timerInput, { trialId: r.trial_id, layerId: r.layer_id, label: r.label, durationSec: r.duration_sec })
            : "label",
    );
    check("photos", await sql("select p.*, t.studio_id as trial_studio from photos p join trials t on t.id = p.trial_id where p.studio_id = ?", inF), (r) =>
      r.trial_studio !== F.id
        ? "trial of another studio"
        : !["base", "after-layer", "final", "before-wash", "after-wash"].includes(String(r.kind)) || (r.kind === "after-layer" && !r.layer_id)
          ? "kind"
          : true,
    );
    check("readings", await sql("select * from readings where studio_id = ?", inF), (r) => {
      const region = r.region as { x: number; y: number; width: number; height: number };
      if (![r.l, r.a, r.b].every((x) => Number.isFinite(x))) return "L*a*b* not finite";
      if (!(Number(r.l) >= 0 && Number(r.l) <= 100)) return `L* ${r.l}`;
      if (!(region.x >= 0 && region.y >= 0 && region.width >= 4 && region.height >= 4)) return "region";
      return String(r.label).length <= 80 ? true : "label";
    });
    check("comments", await sql("select * from comments where studio_id = ? and deleted_at is null", inF), (r) => parsed(commentDoc, r.body));

    console.log(problems.length ? `stored rows failing their rules:\n${problems.slice(0, 40).join("\n")}` : "stored rows: all pass their rules");
    expect(problems).toEqual([]);
    // Nothing was written into, or taken from, the other studio.
    expect(await countsIn(G.id)).toEqual(foreignCounts);
  });

  it("prints the counts", () => {
    const total = Object.values(counts).reduce((s, c) => s + c.runs, 0);
    const lines = Object.entries(counts).map(([k, c]) => `  ${k}: ${c.runs} bodies (${c.ok} accepted, ${c.refused} refused)`);
    console.log(`fuzzed bodies: ${total} over ${Object.keys(counts).length} routes in ${((Date.now() - started) / 1000).toFixed(1)} s\n${lines.join("\n")}`);
    expect(total).toBeGreaterThanOrEqual(Object.keys(counts).length * RUNS);
  });
});
