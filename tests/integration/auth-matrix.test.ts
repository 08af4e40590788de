// Who may call what, for every route handler in app/api. The route files are found on disk when
// the test runs; every exported HTTP method must have an entry in EXPECTED below, keyed
// "METHOD /api/path/[param]", or the coverage test fails (a new route needs a decision here).
// Each entry is called as five kinds of caller (signed out, a member of another studio, and the
// studio's guest, dyer and owner) against real rows, and, where the route names a record, as the
// other studio's owner in their own studio with this studio's ids (the cross-studio case). The
// expectations are written from the product brief's role table, not read from
// lib/auth/permissions.ts, so a wrong entry in that table fails a cell.
import { randomUUID } from "node:crypto";
import { readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import sharp from "sharp";
import { ColourwaySchema, LayerSchema, NotificationSchema, ReadingSchema, ReferenceCardSchema } from "@/entities";
import type { Role } from "@/entities/studio";
import { getEm, getOrm } from "@/lib/db";
import { env } from "@/lib/env";
import { flushKey } from "@/lib/outbox";
import { unsubscribeToken } from "@/lib/notifications";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, address, addMember, makeInvitation, makeStudio, makeUser } from "../support/fixtures";
import { callInRequestScope } from "../support/next-request";
import { makeReading } from "../support/readings";
import { dosDye, makeBase, makeDye, makeStock, makeTrial } from "../support/trial-fixtures";
import { doc, text } from "../support/comments";
import { makeCard, makeColourway, makeComment, makeTimer } from "../support/records";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "auth-matrix";
const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
type Method = (typeof METHODS)[number];

type Caller = "anonymous" | "outsider" | Role;
const CALLERS: Caller[] = ["anonymous", "outsider", "guest", "dyer", "owner"];
const DENIALS = new Set([401, 403, 404]);

/* ---------- the routes on disk ---------- */

interface RouteFile {
  /** "/api/studios/[studioId]/trials" */
  pattern: string;
  file: string;
}

function discoverRoutes(): RouteFile[] {
  const apiDir = path.join(ROOT, "app/api");
  return (readdirSync(apiDir, { recursive: true }) as string[])
    .filter((f) => path.basename(f) === "route.ts")
    .map((f) => ({ pattern: `/api/${path.dirname(f).split(path.sep).join("/")}`, file: path.join(apiDir, f) }))
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

const ROUTES = discoverRoutes();

type Handler = (req: Request, ctx: { params: Promise<unknown> }) => Promise<Response>;
const modules = new Map<string, Record<string, unknown>>();
async function moduleOf(pattern: string): Promise<Record<string, unknown>> {
  const r = ROUTES.find((x) => x.pattern === pattern);
  if (!r) throw new Error(`No route file for ${pattern}`);
  if (!modules.has(pattern)) modules.set(pattern, (await import(/* @vite-ignore */ r.file)) as Record<string, unknown>);
  return modules.get(pattern)!;
}

/** "GET /api/…" for every HTTP method each route file exports. */
async function exportedKeys(): Promise<string[]> {
  const keys: string[] = [];
  for (const r of ROUTES) {
    const mod = await moduleOf(r.pattern);
    for (const m of METHODS) if (typeof mod[m] === "function") keys.push(`${m} ${r.pattern}`);
  }
  return keys.sort();
}

/* ---------- calling a handler ---------- */

interface Req {
  params: Record<string, string | string[]>;
  body?: unknown;
  form?: Record<string, string>;
  query?: string;
  headers?: Record<string, string>;
}

interface Res {
  status: number;
  headers: Headers;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  json: any;
}

async function invoke(key: string, who: Caller | Person | null, r: Req, opts: { requestScope?: boolean } = {}): Promise<Res> {
  const [method, pattern] = key.split(" ");
  const handler = (await moduleOf(pattern))[method] as Handler;
  actAs(who === null || who === "anonymous" ? null : typeof who === "string" ? people[who] : who);
  const urlPath = pattern.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_m, name: string) => {
    const v = r.params[name];
    return Array.isArray(v) ? v.map(encodeURIComponent).join("/") : encodeURIComponent(v);
  });
  const url = `http://127.0.0.1:3000${urlPath}${r.query ? `?${r.query}` : ""}`;
  const headers: Record<string, string> = { ...r.headers };
  let body: string | undefined;
  if (r.body !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(r.body);
  } else if (r.form) {
    headers["content-type"] = "application/x-www-form-urlencoded";
    body = new URLSearchParams(r.form).toString();
  }
  const init: RequestInit = { method, headers, body, redirect: "manual" };
  const res = opts.requestScope
    ? await callInRequestScope(handler, `${pattern}/route`, url, init, r.params)
    : await handler(new Request(url, init), { params: Promise.resolve(r.params) });
  const type = res.headers.get("content-type") ?? "";
  const raw = type.includes("json") ? await res.text() : null;
  if (!type.includes("json")) await res.arrayBuffer();
  return { status: res.status, headers: res.headers, json: raw ? JSON.parse(raw) : null };
}

/* ---------- fixtures ---------- */

let people: Record<Exclude<Caller, "anonymous">, Person>;
let A: StudioFixture; // the studio under test
let B: StudioFixture; // the outsider's own studio
const a = {} as {
  baseId: string; dyeId: string; stockId: string; trialId: string; layerIds: string[]; readingId: string;
  colourwayId: string; cardId: string; photoId: string;
};
const b = {} as { trialId: string; layerId: string; readingId: string; colourwayId: string; photoId: string };

async function versionOf(schema: typeof LayerSchema | typeof ColourwaySchema | typeof ReferenceCardSchema, id: string): Promise<number> {
  const em = await getEm();
  const row = (await em.findOneOrFail(schema as typeof LayerSchema, { id })) as { version: number };
  return row.version;
}

/** A trial of studio A with two layers, written directly; fresh for calls that change it. */
async function freshTrial(layers = 0): Promise<{ trialId: string; layerIds: string[] }> {
  const trialId = await makeTrial(A.id, {
    title: "Matrix scratch trial",
    authorId: people.dyer.id,
    layers: Array.from({ length: layers }, () => ({ method: "immersion" as const, dyes: [dosDye(a.dyeId, 1)] })),
  });
  const em = await getEm();
  const ls = await em.find(LayerSchema, { trial: trialId }, { orderBy: { position: "asc" } });
  return { trialId, layerIds: ls.map((l) => l.id) };
}

/** A person for a call: the caller's own fixture, or the owner for the signed-out caller. */
const personFor = (who: Caller): Person => (who === "anonymous" ? people.owner : people[who]);
const passwordOf = "matrix-correct-horse";
/** A client address of this run's own, so sign-in rate limits counted for other tests do not apply. */
const CLIENT_IP = `10.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}.${1 + Math.floor(Math.random() * 250)}`;

beforeAll(async () => {
  const [owner, dyer, guest, outsider] = await Promise.all([
    makeUser(TAG, "owner", { password: passwordOf }),
    makeUser(TAG, "dyer"),
    makeUser(TAG, "guest"),
    makeUser(TAG, "outsider"),
  ]);
  people = { owner, dyer, guest, outsider };
  A = await makeStudio("Matrix Dye Works", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  B = await makeStudio("Matrix Elsewhere", [[outsider, "owner"]]);

  a.baseId = await makeBase(A.id, "Matrix sock base");
  a.dyeId = await makeDye(A.id, "Matrix slate");
  a.stockId = await makeStock(A.id, a.dyeId);
  a.trialId = await makeTrial(A.id, {
    title: "Matrix slate over grey",
    authorId: dyer.id,
    baseId: a.baseId,
    layers: [{ method: "immersion", dyes: [dosDye(a.dyeId, 1)] }, { method: "dip" }],
  });
  const em = await getEm();
  a.layerIds = (await em.find(LayerSchema, { trial: a.trialId }, { orderBy: { position: "asc" } })).map((l) => l.id);
  a.readingId = await makeReading(A.id, a.trialId, dyer.id, { L: 52, a: -1, b: -6 });
  a.colourwayId = await makeColourway(A.id, a.trialId, a.readingId, dyer.id);
  a.cardId = await makeCard(A.id);

  // One real photo, uploaded through the routes (presigned PUT, then confirm), for the file and reading routes.
  const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 110, g: 120, b: 140 } } }).jpeg().toBuffer();
  const start = await invoke("POST /api/studios/[studioId]/photos", "owner", {
    params: { studioId: A.id },
    body: { trialId: a.trialId, kind: "base", contentType: "image/jpeg", bytes: jpeg.length },
  });
  expect(start.status).toBe(201);
  const put = await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(jpeg) });
  expect(put.ok).toBe(true);
  a.photoId = start.json.photo.id;
  const confirm = await invoke("POST /api/studios/[studioId]/photos/[photoId]/confirm", "owner", { params: { studioId: A.id, photoId: a.photoId } });
  expect(confirm.status).toBe(200);

  // The outsider's studio has records of its own, so cross-studio calls get past its own checks.
  b.trialId = await makeTrial(B.id, { title: "Elsewhere trial", authorId: outsider.id, layers: [{ method: "kettle" }] });
  b.layerId = (await em.find(LayerSchema, { trial: b.trialId }))[0].id;
  b.readingId = await makeReading(B.id, b.trialId, outsider.id, { L: 40, a: 10, b: 10 });
  b.colourwayId = await makeColourway(B.id, b.trialId, b.readingId, outsider.id);
  // The reading's photo row (written by makeReading) is the other studio's photo.
  b.photoId = (await em.findOneOrFail(ReadingSchema, { id: b.readingId })).photo.id;
});

afterAll(async () => {
  actAs(null);
  await (await getOrm()).close();
});

/* ---------- the expected outcomes ---------- */

/** Who may call a route: nobody needs to sign in, any signed-in person, or studio roles. */
type Allow = "public" | "signed-in" | Role[];

interface Extra {
  name: string;
  /** Statuses this call may answer; a call that should be refused lists only refusals. */
  expect: number[];
  run: () => Promise<Res>;
}

interface Entry {
  allow: Allow;
  /** Statuses an allowed caller may get (2xx, or a 4xx for a valid refusal such as 409/422). */
  ok: number[];
  /** The request for one call by this caller; called afresh for every cell. */
  req: (who: Caller) => Promise<Req> | Req;
  /** The other studio's owner, in their own studio, naming this studio's records. */
  cross?: { expect: number[]; req: () => Promise<Req> | Req };
  /** Per-caller expectations that differ from the role rule (documented public behaviour). */
  override?: Partial<Record<Caller, number[]>>;
  /** Further cells: ownership rules inside a role, tokens and keys. */
  extra?: () => Extra[];
  requestScope?: boolean;
  /** Runs around the cells of this entry (e.g. to act as a production server). */
  around?: <T>(fn: () => Promise<T>) => Promise<T>;
}

const ALL: Role[] = ["owner", "dyer", "guest"];
const EDIT: Role[] = ["owner", "dyer"];
const OWNER: Role[] = ["owner"];
const S = () => ({ studioId: A.id });
const inB = () => ({ studioId: B.id });
const commentDoc = doc(text("Matrix note: the dip line is soft."));

/** As a production server without the flush route switched on. */
async function asProduction<T>(fn: () => Promise<T>): Promise<T> {
  const before = { NODE_ENV: env.NODE_ENV, OUTBOX_FLUSH_ROUTE: env.OUTBOX_FLUSH_ROUTE };
  env.NODE_ENV = "production";
  env.OUTBOX_FLUSH_ROUTE = undefined;
  try {
    return await fn();
  } finally {
    Object.assign(env, before);
  }
}

/** A fresh invitation to a third studio, addressed to this person. */
async function invitationFor(p: Person): Promise<string> {
  const host = await makeUser(TAG, "host");
  const studio = await makeStudio("Matrix Invite Studio", [[host, "owner"]]);
  return (await makeInvitation(studio.id, host, p.email, "dyer")).token;
}

const EXPECTED: Record<string, Entry> = {
  /* ----- outside any studio ----- */
  "GET /api/health": { allow: "public", ok: [200], req: () => ({ params: {} }) },
  "GET /api/health/live": { allow: "public", ok: [200], req: () => ({ params: {} }) },
  "GET /api/auth/[...nextauth]": {
    allow: "public",
    ok: [200],
    requestScope: true,
    req: () => ({ params: { nextauth: ["providers"] } }),
  },
  "POST /api/auth/[...nextauth]": {
    // A password sign-in with the wrong password: next-auth redirects to the error page, no session.
    allow: "public",
    ok: [302],
    requestScope: true,
    req: async () => {
      const { cookie, csrfToken } = await csrf();
      return {
        params: { nextauth: ["callback", "password"] },
        headers: { cookie, "x-forwarded-for": CLIENT_IP },
        form: { csrfToken, email: people.owner.email, password: "wrong-password" },
      };
    },
    extra: () => [
      {
        name: "wrong password sets no session cookie",
        expect: [302],
        run: async () => {
          const { cookie, csrfToken } = await csrf();
          const res = await invoke("POST /api/auth/[...nextauth]", null, {
            params: { nextauth: ["callback", "password"] },
            headers: { cookie, "x-forwarded-for": CLIENT_IP },
            form: { csrfToken, email: people.owner.email, password: "wrong-password" },
          }, { requestScope: true });
          expect(res.headers.get("location")).toMatch(/error=CredentialsSignin/);
          expect(res.headers.get("set-cookie") ?? "").not.toMatch(/session-token=/);
          return res;
        },
      },
      {
        name: "right password sets a session cookie",
        expect: [302],
        run: async () => {
          const { cookie, csrfToken } = await csrf();
          const res = await invoke("POST /api/auth/[...nextauth]", null, {
            params: { nextauth: ["callback", "password"] },
            headers: { cookie, "x-forwarded-for": CLIENT_IP },
            form: { csrfToken, email: people.owner.email, password: passwordOf },
          }, { requestScope: true });
          expect(res.headers.get("set-cookie") ?? "").toMatch(/session-token=/);
          return res;
        },
      },
      {
        name: "no CSRF token: no sign-in",
        expect: [302],
        run: async () => {
          const res = await invoke("POST /api/auth/[...nextauth]", null, {
            params: { nextauth: ["callback", "password"] },
            headers: { "x-forwarded-for": CLIENT_IP },
            form: { email: people.owner.email, password: passwordOf },
          }, { requestScope: true });
          expect(res.headers.get("set-cookie") ?? "").not.toMatch(/session-token=/);
          return res;
        },
      },
    ],
  },
  "POST /api/internal/outbox/flush": {
    // In production the route is hidden (404) from every caller without the server's key.
    allow: "public",
    ok: [404],
    around: asProduction,
    req: () => ({ params: {} }),
    extra: () => [
      { name: "production, with the bearer key", expect: [200], run: () => asProduction(() => invoke("POST /api/internal/outbox/flush", null, { params: {}, headers: { authorization: `Bearer ${flushKey()}` } })) },
      { name: "production, with a wrong key", expect: [404], run: () => asProduction(() => invoke("POST /api/internal/outbox/flush", null, { params: {}, headers: { authorization: "Bearer 0000" } })) },
      { name: "outside production, no key", expect: [200], run: () => invoke("POST /api/internal/outbox/flush", null, { params: {} }) },
    ],
  },
  "GET /api/invitations/[token]": {
    // The link itself is the credential: anyone holding it sees what it offers.
    allow: "public",
    ok: [200],
    req: async (who) => ({ params: { token: await invitationFor(personFor(who)) } }),
    extra: () => [{ name: "a made-up token", expect: [404], run: () => invoke("GET /api/invitations/[token]", null, { params: { token: "not-a-real-token" } }) }],
  },
  "POST /api/invitations/[token]": {
    allow: "signed-in",
    ok: [200],
    req: async (who) => ({ params: { token: await invitationFor(personFor(who)) } }),
    extra: () => [
      {
        name: "someone else's invitation",
        expect: [403],
        run: async () => invoke("POST /api/invitations/[token]", "dyer", { params: { token: await invitationFor(people.guest) } }),
      },
    ],
  },
  "GET /api/unsubscribe": {
    allow: "public",
    ok: [200],
    req: async () => ({ params: {}, query: `token=${encodeURIComponent(unsubscribeToken((await makeUser(TAG, "reader")).id))}` }),
    extra: () => [{ name: "a forged token", expect: [400], run: () => invoke("GET /api/unsubscribe", null, { params: {}, query: `token=${people.owner.id}.forged` }) }],
  },
  "POST /api/unsubscribe": {
    allow: "public",
    ok: [200],
    req: async () => ({ params: {}, form: { token: unsubscribeToken((await makeUser(TAG, "reader")).id) } }),
    extra: () => [{ name: "a forged token", expect: [400], run: () => invoke("POST /api/unsubscribe", null, { params: {}, form: { token: `${people.owner.id}.forged` } }) }],
  },
  "GET /api/account": { allow: "signed-in", ok: [200], req: () => ({ params: {} }) },
  "PATCH /api/account": { allow: "signed-in", ok: [200], req: () => ({ params: {}, body: { unitSystem: "metric" } }) },
  "GET /api/studios": { allow: "signed-in", ok: [200], req: () => ({ params: {} }) },
  "POST /api/studios": { allow: "signed-in", ok: [201], req: () => ({ params: {}, body: { name: "Matrix side studio" } }) },

  /* ----- the studio and its people ----- */
  "GET /api/studios/[studioId]": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "PATCH /api/studios/[studioId]": { allow: OWNER, ok: [200], req: () => ({ params: S(), body: { lotTolerance: 1 } }) },
  "GET /api/studios/[studioId]/activity": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "GET /api/studios/[studioId]/members": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "PATCH /api/studios/[studioId]/members/[memberId]": {
    allow: OWNER,
    ok: [200],
    req: async () => ({ params: { ...S(), memberId: await addMember(A.id, await makeUser(TAG, "extra"), "guest") }, body: { role: "dyer" } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), memberId: A.memberships[people.guest.id] }, body: { role: "owner" } }) },
  },
  "DELETE /api/studios/[studioId]/members/[memberId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), memberId: await addMember(A.id, await makeUser(TAG, "extra"), "guest") } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), memberId: A.memberships[people.guest.id] } }) },
  },
  "GET /api/studios/[studioId]/invitations": { allow: OWNER, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/invitations": {
    allow: OWNER,
    ok: [201],
    req: () => ({ params: S(), body: { email: address(TAG, "invitee"), role: "guest" } }),
  },
  "DELETE /api/studios/[studioId]/invitations/[invitationId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), invitationId: (await makeInvitation(A.id, people.owner, address(TAG, "pending"), "dyer")).id } }),
    cross: {
      expect: [404],
      req: async () => ({ params: { ...inB(), invitationId: (await makeInvitation(A.id, people.owner, address(TAG, "pending"), "dyer")).id } }),
    },
  },
  "GET /api/studios/[studioId]/notifications": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "GET /api/studios/[studioId]/notifications/count": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/notifications/read": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: S(), body: {} }),
    extra: () => [
      {
        name: "marking another member's notification read leaves it unread",
        expect: [200],
        run: async () => {
          const em = await getEm();
          const n = em.create(NotificationSchema, { user: people.dyer.id, studio: A.id, kind: "mention", summary: "Matrix mention" });
          await em.flush();
          const res = await invoke("POST /api/studios/[studioId]/notifications/read", "guest", { params: S(), body: { ids: [n.id] } });
          const after = await (await getEm()).findOneOrFail(NotificationSchema, { id: n.id });
          expect(after.readAt ?? null).toBeNull();
          return res;
        },
      },
    ],
  },
  "GET /api/studios/[studioId]/follows": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  ...(() => {
    const follow = (ok: number[]): Entry => ({
      allow: ALL,
      ok,
      req: () => ({ params: { ...S(), targetType: "trial", targetId: a.trialId } }),
      cross: { expect: [404], req: () => ({ params: { ...inB(), targetType: "trial", targetId: a.trialId } }) },
    });
    return {
      "GET /api/studios/[studioId]/follows/[targetType]/[targetId]": follow([200]),
      "PUT /api/studios/[studioId]/follows/[targetType]/[targetId]": follow([200]),
      "DELETE /api/studios/[studioId]/follows/[targetType]/[targetId]": follow([200]),
    };
  })(),

  /* ----- libraries ----- */
  "GET /api/studios/[studioId]/bases": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/bases": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { name: `Matrix DK ${randomUUID().slice(0, 8)}`, fibres: [{ fibre: "merino", pct: 100 }], weightClass: "dk" } }),
  },
  "GET /api/studios/[studioId]/bases/[baseId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), baseId: a.baseId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), baseId: a.baseId } }) },
  },
  "PATCH /api/studios/[studioId]/bases/[baseId]": {
    allow: EDIT,
    ok: [200],
    req: async () => ({ params: { ...S(), baseId: await makeBase(A.id, "Patchable base") }, body: { version: 1, notes: "Soft twist." } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), baseId: a.baseId }, body: { version: 1, notes: "x" } }) },
  },
  "DELETE /api/studios/[studioId]/bases/[baseId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), baseId: await makeBase(A.id, "Archivable base") } }),
    cross: { expect: [404], req: async () => ({ params: { ...inB(), baseId: await makeBase(A.id, "Archivable base") } }) },
  },
  "GET /api/studios/[studioId]/dyes": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/dyes": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { name: `Matrix rust ${randomUUID().slice(0, 8)}`, dyeClass: "acid", form: "powder" } }),
  },
  "GET /api/studios/[studioId]/dyes/[dyeId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), dyeId: a.dyeId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), dyeId: a.dyeId } }) },
  },
  "PATCH /api/studios/[studioId]/dyes/[dyeId]": {
    allow: EDIT,
    ok: [200],
    req: async () => ({ params: { ...S(), dyeId: await makeDye(A.id, "Patchable dye") }, body: { version: 1, notes: "Strikes fast." } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), dyeId: a.dyeId }, body: { version: 1, notes: "x" } }) },
  },
  "DELETE /api/studios/[studioId]/dyes/[dyeId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), dyeId: await makeDye(A.id, "Archivable dye") } }),
    cross: { expect: [404], req: async () => ({ params: { ...inB(), dyeId: await makeDye(A.id, "Archivable dye") } }) },
  },
  "GET /api/studios/[studioId]/stocks": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/stocks": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { dyeId: a.dyeId, concentrationPct: 1, definition: "to-volume", volumeMl: 250, mixedOn: "2026-01-05" } }),
    cross: {
      expect: [404, 422],
      req: () => ({ params: inB(), body: { dyeId: a.dyeId, concentrationPct: 1, definition: "to-volume", volumeMl: 250, mixedOn: "2026-01-05" } }),
    },
  },
  "GET /api/studios/[studioId]/stocks/[stockId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), stockId: a.stockId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), stockId: a.stockId } }) },
  },
  "PATCH /api/studios/[studioId]/stocks/[stockId]": {
    allow: EDIT,
    ok: [200],
    req: async () => ({ params: { ...S(), stockId: await makeStock(A.id, a.dyeId) }, body: { version: 1, powderLot: "L-22" } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), stockId: a.stockId }, body: { version: 1, powderLot: "x" } }) },
  },
  "DELETE /api/studios/[studioId]/stocks/[stockId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), stockId: await makeStock(A.id, a.dyeId) } }),
    cross: { expect: [404], req: async () => ({ params: { ...inB(), stockId: await makeStock(A.id, a.dyeId) } }) },
  },

  /* ----- trials and layers ----- */
  "GET /api/studios/[studioId]/trials": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/trials": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { title: "Matrix new trial", fibreWeightG: 100, baseId: a.baseId } }),
    cross: { expect: [404, 422], req: () => ({ params: inB(), body: { title: "Borrowed base", fibreWeightG: 100, baseId: a.baseId } }) },
  },
  "GET /api/studios/[studioId]/trials/export": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "GET /api/studios/[studioId]/trials/facets": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "GET /api/studios/[studioId]/trials/[trialId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), trialId: a.trialId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId } }) },
  },
  "PATCH /api/studios/[studioId]/trials/[trialId]": {
    allow: EDIT,
    ok: [200],
    req: async () => ({ params: { ...S(), trialId: (await freshTrial()).trialId }, body: { version: 1, status: "in-progress" } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId }, body: { version: 1, title: "Taken" } }) },
  },
  "DELETE /api/studios/[studioId]/trials/[trialId]": {
    allow: OWNER,
    ok: [204],
    req: async () => ({ params: { ...S(), trialId: (await freshTrial()).trialId } }),
    cross: { expect: [404], req: async () => ({ params: { ...inB(), trialId: (await freshTrial()).trialId } }) },
  },
  "POST /api/studios/[studioId]/trials/[trialId]/copy": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: { ...S(), trialId: a.trialId }, body: {} }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId }, body: {} }) },
  },
  "GET /api/studios/[studioId]/trials/[trialId]/comparison": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), trialId: a.trialId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId } }) },
  },
  "GET /api/studios/[studioId]/trials/[trialId]/photos": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), trialId: a.trialId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId } }) },
  },
  "POST /api/studios/[studioId]/trials/[trialId]/layers": {
    allow: EDIT,
    ok: [201],
    req: async () => ({ params: { ...S(), trialId: (await freshTrial()).trialId }, body: { method: "immersion", dyes: [{ dyeId: a.dyeId, amount: { value: 1, unit: "dos" } }] } }),
    // Into their own trial, with this studio's dye.
    cross: {
      expect: [404, 422],
      req: () => ({ params: { ...inB(), trialId: b.trialId }, body: { method: "immersion", dyes: [{ dyeId: a.dyeId, amount: { value: 1, unit: "dos" } }] } }),
    },
  },
  "PUT /api/studios/[studioId]/trials/[trialId]/layer-order": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const t = await freshTrial(2);
      return { params: { ...S(), trialId: t.trialId }, body: { layerIds: [...t.layerIds].reverse() } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId }, body: { layerIds: [...a.layerIds].reverse() } }) },
  },
  "PATCH /api/studios/[studioId]/trials/[trialId]/layers/[layerId]": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const t = await freshTrial(1);
      return { params: { ...S(), trialId: t.trialId, layerId: t.layerIds[0] }, body: { version: await versionOf(LayerSchema, t.layerIds[0]), minutes: 30 } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: b.trialId, layerId: a.layerIds[0] }, body: { version: 1, minutes: 5 } }) },
  },
  "DELETE /api/studios/[studioId]/trials/[trialId]/layers/[layerId]": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const t = await freshTrial(1);
      return { params: { ...S(), trialId: t.trialId, layerId: t.layerIds[0] } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: b.trialId, layerId: a.layerIds[0] } }) },
  },
  "POST /api/studios/[studioId]/trials/[trialId]/layers/[layerId]/duplicate": {
    allow: EDIT,
    ok: [201],
    req: async () => {
      const t = await freshTrial(1);
      return { params: { ...S(), trialId: t.trialId, layerId: t.layerIds[0] } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: b.trialId, layerId: a.layerIds[0] } }) },
  },
  "POST /api/studios/[studioId]/trials/[trialId]/layers/[layerId]/prediction": {
    // Without a measured base there is nothing to predict from: a 422 that says so.
    allow: EDIT,
    ok: [201, 422],
    req: () => ({ params: { ...S(), trialId: a.trialId, layerId: a.layerIds[0] } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: b.trialId, layerId: a.layerIds[0] } }) },
  },

  /* ----- comments ----- */
  "GET /api/studios/[studioId]/trials/[trialId]/comments": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), trialId: a.trialId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), trialId: a.trialId } }) },
  },
  "POST /api/studios/[studioId]/trials/[trialId]/comments": {
    allow: ALL,
    ok: [201],
    req: () => ({ params: { ...S(), trialId: a.trialId }, body: { body: commentDoc } }),
    // On their own trial, about this studio's photo.
    cross: { expect: [404, 422], req: () => ({ params: { ...inB(), trialId: b.trialId }, body: { body: commentDoc, photoId: a.photoId } }) },
  },
  "PATCH /api/studios/[studioId]/trials/[trialId]/comments/[commentId]": {
    // Everyone may write comments; each edits their own (ownership cells in `extra`).
    allow: ALL,
    ok: [200],
    req: async (who) => {
      const c = await makeComment(A.id, a.trialId, personFor(who));
      return { params: { ...S(), trialId: a.trialId, commentId: c.id }, body: { body: commentDoc, version: c.version } };
    },
    cross: {
      expect: [404],
      req: async () => {
        const c = await makeComment(A.id, a.trialId, people.owner);
        return { params: { ...inB(), trialId: b.trialId, commentId: c.id }, body: { body: commentDoc, version: c.version } };
      },
    },
    extra: () => [
      {
        name: "a dyer edits the owner's comment",
        expect: [403],
        run: async () => {
          const c = await makeComment(A.id, a.trialId, people.owner);
          return invoke("PATCH /api/studios/[studioId]/trials/[trialId]/comments/[commentId]", "dyer", { params: { ...S(), trialId: a.trialId, commentId: c.id }, body: { body: commentDoc, version: c.version } });
        },
      },
      {
        name: "an owner edits a guest's comment",
        expect: [403],
        run: async () => {
          const c = await makeComment(A.id, a.trialId, people.guest);
          return invoke("PATCH /api/studios/[studioId]/trials/[trialId]/comments/[commentId]", "owner", { params: { ...S(), trialId: a.trialId, commentId: c.id }, body: { body: commentDoc, version: c.version } });
        },
      },
    ],
  },
  "DELETE /api/studios/[studioId]/trials/[trialId]/comments/[commentId]": {
    allow: ALL,
    ok: [204],
    req: async (who) => ({ params: { ...S(), trialId: a.trialId, commentId: (await makeComment(A.id, a.trialId, personFor(who))).id } }),
    cross: {
      expect: [404],
      req: async () => ({ params: { ...inB(), trialId: b.trialId, commentId: (await makeComment(A.id, a.trialId, people.owner)).id } }),
    },
    extra: () => [
      {
        name: "a guest removes the dyer's comment",
        expect: [403],
        run: async () => {
          const c = await makeComment(A.id, a.trialId, people.dyer);
          return invoke("DELETE /api/studios/[studioId]/trials/[trialId]/comments/[commentId]", "guest", { params: { ...S(), trialId: a.trialId, commentId: c.id } });
        },
      },
      {
        name: "an owner removes a guest's comment (moderation)",
        expect: [204],
        run: async () => {
          const c = await makeComment(A.id, a.trialId, people.guest);
          return invoke("DELETE /api/studios/[studioId]/trials/[trialId]/comments/[commentId]", "owner", { params: { ...S(), trialId: a.trialId, commentId: c.id } });
        },
      },
    ],
  },

  /* ----- timers ----- */
  "GET /api/studios/[studioId]/timers": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/timers": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { trialId: a.trialId, label: "Rest", durationSec: 300 } }),
    cross: { expect: [404], req: () => ({ params: inB(), body: { trialId: a.trialId, label: "Rest", durationSec: 300 } }) },
  },
  "PATCH /api/studios/[studioId]/timers/[timerId]": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const t = await makeTimer(A.id, a.trialId, people.dyer.id);
      return { params: { ...S(), timerId: t.id }, body: { action: "cancel", version: t.version } };
    },
    cross: {
      expect: [404],
      req: async () => {
        const t = await makeTimer(A.id, a.trialId, people.dyer.id);
        return { params: { ...inB(), timerId: t.id }, body: { action: "cancel", version: t.version } };
      },
    },
  },

  /* ----- photos, cards, readings ----- */
  "POST /api/studios/[studioId]/photos": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { trialId: a.trialId, kind: "final", contentType: "image/jpeg", bytes: 1000 } }),
    cross: { expect: [404], req: () => ({ params: inB(), body: { trialId: a.trialId, kind: "final", contentType: "image/jpeg", bytes: 1000 } }) },
  },
  "POST /api/studios/[studioId]/photos/[photoId]/confirm": {
    // Confirming a photo that is already in is a no-op that answers its record.
    allow: EDIT,
    ok: [200],
    req: () => ({ params: { ...S(), photoId: a.photoId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), photoId: a.photoId } }) },
  },
  "GET /api/studios/[studioId]/photos/[photoId]/file": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), photoId: a.photoId }, query: "v=thumb" }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), photoId: a.photoId }, query: "v=thumb" }) },
  },
  "DELETE /api/studios/[studioId]/photos/[photoId]": {
    allow: EDIT,
    ok: [204],
    req: async () => {
      const readingId = await makeReading(A.id, a.trialId, people.dyer.id, { L: 50, a: 0, b: 0 });
      const r = await (await getEm()).findOneOrFail(ReadingSchema, { id: readingId });
      return { params: { ...S(), photoId: r.photo.id } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), photoId: a.photoId } }) },
  },
  "POST /api/studios/[studioId]/photos/[photoId]/readings": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: { ...S(), photoId: a.photoId }, body: { regions: [{ label: "middle", rect: { x: 16, y: 12, width: 24, height: 20 } }] } }),
    // On their own photo, calibrated with this studio's card.
    cross: {
      expect: [404],
      req: () => ({
        params: { ...inB(), photoId: b.photoId },
        body: { cardId: a.cardId, corners: [{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 10, y: 10 }, { x: 0, y: 10 }], regions: [{ rect: { x: 0, y: 0, width: 8, height: 8 } }] },
      }),
    },
  },
  "DELETE /api/studios/[studioId]/readings/[readingId]": {
    allow: EDIT,
    ok: [204],
    req: async () => ({ params: { ...S(), readingId: await makeReading(A.id, a.trialId, people.dyer.id, { L: 50, a: 0, b: 0 }) } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), readingId: a.readingId } }) },
  },
  "GET /api/studios/[studioId]/cards": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/cards": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { name: "Matrix card", rows: 1, cols: 1, patches: [{ L: 50, a: 0, b: 0 }] } }),
  },
  "GET /api/studios/[studioId]/cards/[cardId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), cardId: a.cardId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), cardId: a.cardId } }) },
  },
  "PUT /api/studios/[studioId]/cards/[cardId]": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const cardId = await makeCard(A.id);
      return { params: { ...S(), cardId }, body: { version: 1, name: "Renamed card", rows: 1, cols: 1, patches: [{ L: 60, a: 0, b: 0 }] } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), cardId: a.cardId }, body: { version: 1, name: "Taken", rows: 1, cols: 1, patches: [{ L: 60, a: 0, b: 0 }] } }) },
  },

  /* ----- learning: profiles, colourways, lots, colour search ----- */
  "GET /api/studios/[studioId]/profiles": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/profiles/refit": { allow: EDIT, ok: [200], req: () => ({ params: S() }) },
  "GET /api/studios/[studioId]/colour-search": { allow: ALL, ok: [200], req: () => ({ params: S(), query: "hex=%23808a99" }) },
  "GET /api/studios/[studioId]/colourways": { allow: ALL, ok: [200], req: () => ({ params: S() }) },
  "POST /api/studios/[studioId]/colourways": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: S(), body: { trialId: a.trialId, readingId: a.readingId, name: "Matrix harbour" } }),
    cross: { expect: [404, 422], req: () => ({ params: inB(), body: { trialId: b.trialId, readingId: a.readingId, name: "Borrowed target" } }) },
  },
  "GET /api/studios/[studioId]/colourways/[colourwayId]": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), colourwayId: a.colourwayId } }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), colourwayId: a.colourwayId } }) },
  },
  "PATCH /api/studios/[studioId]/colourways/[colourwayId]": {
    allow: EDIT,
    ok: [200],
    req: async () => {
      const id = await makeColourway(A.id, a.trialId, a.readingId, people.dyer.id);
      return { params: { ...S(), colourwayId: id }, body: { version: await versionOf(ColourwaySchema, id), description: "Cool grey with a blue cast." } };
    },
    cross: { expect: [404], req: () => ({ params: { ...inB(), colourwayId: a.colourwayId }, body: { version: 1, name: "Taken" } }) },
    extra: () => [
      {
        name: "a dyer retires a colourway (owner only)",
        expect: [403],
        run: async () => {
          const id = await makeColourway(A.id, a.trialId, a.readingId, people.dyer.id);
          return invoke("PATCH /api/studios/[studioId]/colourways/[colourwayId]", "dyer", { params: { ...S(), colourwayId: id }, body: { version: await versionOf(ColourwaySchema, id), status: "retired" } });
        },
      },
      {
        name: "the owner retires it",
        expect: [200],
        run: async () => {
          const id = await makeColourway(A.id, a.trialId, a.readingId, people.dyer.id);
          return invoke("PATCH /api/studios/[studioId]/colourways/[colourwayId]", "owner", { params: { ...S(), colourwayId: id }, body: { version: await versionOf(ColourwaySchema, id), status: "retired" } });
        },
      },
    ],
  },
  "POST /api/studios/[studioId]/colourways/[colourwayId]/lots": {
    allow: EDIT,
    ok: [201],
    req: () => ({ params: { ...S(), colourwayId: a.colourwayId }, body: { trialId: a.trialId, code: "M-1", skeins: 4, fibreWeightG: 400 } }),
    // Into their own colourway, naming this studio's trial.
    cross: { expect: [404, 422], req: () => ({ params: { ...inB(), colourwayId: b.colourwayId }, body: { trialId: a.trialId, code: "X-1", skeins: 1, fibreWeightG: 100 } }) },
  },
  "GET /api/studios/[studioId]/colourways/[colourwayId]/recipe": {
    allow: ALL,
    ok: [200],
    req: () => ({ params: { ...S(), colourwayId: a.colourwayId }, query: "weight=800" }),
    cross: { expect: [404], req: () => ({ params: { ...inB(), colourwayId: a.colourwayId }, query: "weight=800" }) },
  },
};

/** A CSRF token and its cookie, as a browser gets them before signing in. */
async function csrf(): Promise<{ cookie: string; csrfToken: string }> {
  const res = await invoke("GET /api/auth/[...nextauth]", null, { params: { nextauth: ["csrf"] } }, { requestScope: true });
  const cookie = (res.headers.getSetCookie?.() ?? [res.headers.get("set-cookie") ?? ""]).map((c) => c.split(";")[0]).join("; ");
  return { cookie, csrfToken: res.json.csrfToken };
}

function expectedFor(e: Entry, who: Caller): number[] {
  if (e.override?.[who]) return e.override[who]!;
  if (e.allow === "public") return e.ok;
  if (who === "anonymous") return [401];
  if (e.allow === "signed-in") return e.ok;
  if (who === "outsider") return [404]; // the studio's existence is not revealed
  return e.allow.includes(who) ? e.ok : [403];
}

/* ---------- the tally ---------- */

const tally = { cells: 0, leaks: 0, serverErrors: 0, mismatches: [] as string[] };

function record(name: string, expected: number[], res: Res) {
  tally.cells++;
  const denialExpected = expected.every((s) => DENIALS.has(s));
  if (res.status >= 500) tally.serverErrors++;
  else if (denialExpected && !DENIALS.has(res.status)) tally.leaks++;
  if (!expected.includes(res.status)) tally.mismatches.push(`${name}: expected ${expected.join("/")}, got ${res.status}`);
}

function checkRefusal(res: Res) {
  if (res.status >= 400 && res.json) {
    // Every refusal is a JSON message a person can read, never a stack.
    expect(typeof res.json.error).toBe("string");
    expect(res.json.error).not.toMatch(/\bat .+:\d+:\d+/);
  }
}

/* ---------- the tests ---------- */

describe("the table covers the routes on disk", () => {
  it("finds the route files", () => {
    expect(ROUTES.length).toBeGreaterThan(40);
  });

  it("has an entry for every exported method, and none for a method that does not exist", async () => {
    const exported = await exportedKeys();
    const missing = exported.filter((k) => !(k in EXPECTED));
    const stale = Object.keys(EXPECTED).filter((k) => !exported.includes(k));
    expect(missing, "route methods with no entry in EXPECTED").toEqual([]);
    expect(stale, "entries in EXPECTED for no route method").toEqual([]);
  });
});

const keys = Object.keys(EXPECTED).sort();

describe.each(keys)("%s", (key) => {
  const e = EXPECTED[key];
  const around = e.around ?? (<T,>(fn: () => Promise<T>) => fn());

  it.each(CALLERS.map((who) => [who, expectedFor(e, who)] as const))("as %s → %j", async (who, expected) => {
    const res = await around(async () => invoke(key, who, await e.req(who), { requestScope: e.requestScope }));
    record(`${key} as ${who}`, expected, res);
    checkRefusal(res);
    expect(expected).toContain(res.status);
  });

  if (e.cross) {
    const cross = e.cross;
    it(`as the other studio's owner, with this studio's ids → ${JSON.stringify(cross.expect)}`, async () => {
      const res = await invoke(key, "outsider", await cross.req(), { requestScope: e.requestScope });
      record(`${key} across studios`, cross.expect, res);
      checkRefusal(res);
      expect(cross.expect).toContain(res.status);
    });
  }

  if (e.extra) {
    // The extra cells are built lazily (they close over fixtures made in beforeAll).
    const names = e.extra().map((x) => x.name);
    it.each(names)("%s", async (name) => {
      const x = e.extra!().find((y) => y.name === name)!;
      const res = await x.run();
      record(`${key}: ${name}`, x.expect, res);
      checkRefusal(res);
      expect(x.expect).toContain(res.status);
    });
  }
});

describe("the matrix in figures", () => {
  it("has no leaks and no server errors", () => {
    console.log(`auth matrix: ${tally.cells} cells checked over ${keys.length} route methods; leaks: ${tally.leaks}; 5xx: ${tally.serverErrors}`);
    if (tally.mismatches.length) console.log(tally.mismatches.join("\n"));
    expect(tally.cells).toBeGreaterThanOrEqual(keys.length * CALLERS.length);
    expect(tally.leaks).toBe(0);
    expect(tally.serverErrors).toBe(0);
  });
});
