// Rate limits on signing in, counted in Postgres: the limits themselves (N allowed, N+1 refused,
// a new window allows again, parallel attempts counted exactly, two app instances sharing one
// count), and the next-auth route answering 429 with Retry-After and a sentence the sign-in page
// shows. The route runs for real (next-auth, CSRF, the database, the mail fake); only
// next/headers is fed from the request the test builds, as Next would do.
import { createRequire } from "node:module";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { NextRequest } from "next/server";
import { RateLimiterPostgres } from "rate-limiter-flexible";
import { getEm, getOrm } from "@/lib/db";
import { LIMITS, clientIp, limiterFor, takeAttempt } from "@/lib/auth/rate-limit";
import { type Person, makeUser } from "../support/fixtures";
import { listMessages } from "../support/mail";

// next-auth reads the request through next/headers, with require() at call time (out of reach of
// vi.mock): its entry in the CommonJS cache is swapped for one that answers from `jar`.
const jar = { cookies: new Map<string, string>(), headers: new Headers() };
const fromNextAuth = createRequire(createRequire(import.meta.url).resolve("next-auth"));
const headersPath = fromNextAuth.resolve("next/headers");
fromNextAuth(headersPath);
fromNextAuth.cache[headersPath]!.exports = {
  cookies: async () => ({
    // As Next's cookie store does, values come back decoded.
    getAll: () => [...jar.cookies].map(([name, value]) => ({ name, value: decodeURIComponent(value) })),
  }),
  headers: async () => jar.headers,
};

const TAG = "rate-limit";
let nextauth: typeof import("@/app/api/auth/[...nextauth]/route");

beforeAll(async () => {
  process.env.NEXTAUTH_URL = "http://127.0.0.1:3000";
  nextauth = await import("@/app/api/auth/[...nextauth]/route");
});

afterAll(async () => {
  await (await getOrm()).close();
});

const sql = async <T = Record<string, unknown>>(q: string, params: unknown[] = []) =>
  (await getEm()).getConnection().execute<T[]>(q, params);
/** A client address nobody else in this run uses (TEST-NET-3 range, RFC 5737). */
const freshIp = () => `203.0.113.${Math.floor(Math.random() * 250) + 1}-${Math.random().toString(36).slice(2, 8)}`;
const freshEmail = (local: string) => `${local}-${Math.random().toString(36).slice(2, 10)}@${TAG}.test`;
/** Ends the current window of a counter, as if its 15 minutes had passed. */
const endWindow = (key: string) => sql("update rate_limits set expire = ? where key = ?", [Date.now() - 1, key]);

describe("the limits", () => {
  it("password: 10 attempts per e-mail are allowed, the 11th refused for about 15 minutes", async () => {
    const ip = freshIp();
    const email = freshEmail("guessed");
    for (let i = 0; i < LIMITS.password.email.points; i++) expect(await takeAttempt("password", { ip, email })).toBeNull();
    const refused = await takeAttempt("password", { ip, email });
    expect(refused?.retryAfter).toBeGreaterThan(15 * 60 - 10);
    expect(refused?.retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(refused?.message).toBe("Too many sign-in attempts for this address or from this network. Wait 15 minutes, then try again.");
    // Another person from the same address is not affected by this one's count.
    expect(await takeAttempt("password", { ip, email: freshEmail("other") })).toBeNull();
  });

  it("password: 50 attempts per client address, whatever the e-mails", async () => {
    const ip = freshIp();
    for (let i = 0; i < LIMITS.password.ip.points; i++) expect(await takeAttempt("password", { ip, email: freshEmail(`a${i}`) })).toBeNull();
    expect(await takeAttempt("password", { ip, email: freshEmail("one-more") })).not.toBeNull();
    // Another address is fine.
    expect(await takeAttempt("password", { ip: freshIp(), email: freshEmail("elsewhere") })).toBeNull();
  });

  it("links: 5 per e-mail and 30 per client address", async () => {
    const ip = freshIp();
    const email = freshEmail("inbox");
    for (let i = 0; i < 5; i++) expect(await takeAttempt("link", { ip, email })).toBeNull();
    const refused = await takeAttempt("link", { ip, email });
    expect(refused?.message).toMatch(/^Too many sign-in links were asked for\. Wait 15 minutes, then try again\./);
    const ip2 = freshIp();
    for (let i = 0; i < 30; i++) expect(await takeAttempt("link", { ip: ip2, email: freshEmail(`l${i}`) })).toBeNull();
    expect(await takeAttempt("link", { ip: ip2, email: freshEmail("l31") })).not.toBeNull();
  });

  it("a new window allows again", async () => {
    const ip = freshIp();
    const email = freshEmail("patient");
    for (let i = 0; i < 10; i++) await takeAttempt("password", { ip, email });
    expect(await takeAttempt("password", { ip, email })).not.toBeNull();
    await endWindow(`signin-email:${email}`);
    expect(await takeAttempt("password", { ip, email })).toBeNull();
    const [row] = await sql<{ points: number; expire: string }>("select points, expire from rate_limits where key = ?", [`signin-email:${email}`]);
    expect(row.points).toBe(1);
    expect(Number(row.expire) - Date.now()).toBeGreaterThan(15 * 60 * 1000 - 10_000);

    // The same with a real one-second window, without touching the table.
    const rule = { keyPrefix: "test-window", points: 3, duration: 1 };
    const limiter = await limiterFor(rule);
    const key = freshIp();
    for (let i = 0; i < 3; i++) await limiter.consume(key);
    await expect(limiter.consume(key)).rejects.toMatchObject({ consumedPoints: 4 });
    await new Promise((r) => setTimeout(r, 1100));
    await expect(limiter.consume(key)).resolves.toMatchObject({ consumedPoints: 1 });
  });

  it("60 parallel attempts at one e-mail: exactly 10 get through", async () => {
    const email = freshEmail("burst");
    const results = await Promise.all(Array.from({ length: 60 }, () => takeAttempt("password", { ip: freshIp(), email })));
    expect(results.filter((r) => r === null)).toHaveLength(10);
    const [row] = await sql<{ points: number }>("select points from rate_limits where key = ?", [`signin-email:${email}`]);
    expect(row.points).toBe(60);
  });

  it("two app instances count against the same row", async () => {
    // A second limiter object stands for another server process: it shares nothing in memory.
    const knex = (await getOrm()).em.getConnection().getKnex();
    const other = new RateLimiterPostgres({
      storeClient: knex as never,
      storeType: "knex",
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: LIMITS.password.email.keyPrefix,
      points: LIMITS.password.email.points,
      duration: LIMITS.password.email.duration,
    });
    const email = freshEmail("shared");
    for (let i = 0; i < 6; i++) await other.consume(email);
    for (let i = 0; i < 4; i++) expect(await takeAttempt("password", { ip: freshIp(), email })).toBeNull();
    expect(await takeAttempt("password", { ip: freshIp(), email })).not.toBeNull();
    await expect(other.consume(email)).rejects.toMatchObject({ remainingPoints: 0 });
  });

  it("reads the client address from the last X-Forwarded-For entry", () => {
    expect(clientIp(new Headers({ "x-forwarded-for": "198.51.100.7, 192.0.2.1" }))).toBe("192.0.2.1");
    expect(clientIp(new Headers({ "x-forwarded-for": "::ffff:192.0.2.9" }))).toBe("192.0.2.9");
    expect(clientIp(new Headers({ "x-real-ip": "192.0.2.3" }))).toBe("192.0.2.3");
    expect(clientIp(new Headers())).toBe("unknown");
  });
});

describe("the sign-in route", () => {
  const BASE = "http://127.0.0.1:3000/api/auth";
  let person: Person;
  let ip: string;

  beforeAll(async () => {
    person = await makeUser(TAG, "signer", { password: "correct horse battery" });
  });

  beforeEach(() => {
    ip = freshIp();
    jar.cookies.clear();
  });

  /** Runs the route as Next would: next/headers sees this request's headers and cookies. */
  async function send(method: "GET" | "POST", path: string[], form?: Record<string, string>) {
    const headers = new Headers({ host: "127.0.0.1:3000", "x-forwarded-for": ip });
    if (jar.cookies.size) headers.set("cookie", [...jar.cookies].map(([k, v]) => `${k}=${v}`).join("; "));
    if (form) headers.set("content-type", "application/x-www-form-urlencoded");
    jar.headers = headers;
    const req = new NextRequest(`${BASE}/${path.join("/")}`, { method, headers, body: form ? new URLSearchParams(form) : undefined });
    const handler = method === "GET" ? nextauth.GET : nextauth.POST;
    const res: Response = await handler(req as never, { params: Promise.resolve({ nextauth: path }) } as never);
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const at = pair.indexOf("=");
      jar.cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
    const text = await res.text();
    return { status: res.status, headers: res.headers, json: text ? JSON.parse(text) : null };
  }

  async function csrf(): Promise<string> {
    return (await send("GET", ["csrf"])).json.csrfToken;
  }

  const password = async (email: string, pw: string) =>
    send("POST", ["callback", "password"], { email, password: pw, csrfToken: await csrf(), callbackUrl: "/", json: "true" });

  it("10 wrong passwords are answered as wrong; the 11th attempt, even the right password, gets 429", async () => {
    for (let i = 0; i < 10; i++) {
      const res = await password(person.email, "wrong");
      expect(res.status).toBe(401);
      expect(new URL(res.json.url).searchParams.get("error")).toBe("CredentialsSignin");
    }
    const refused = await password(person.email, "correct horse battery");
    expect(refused.status).toBe(429);
    const wait = Number(refused.headers.get("retry-after"));
    expect(wait).toBeGreaterThan(890);
    expect(wait).toBeLessThanOrEqual(900);
    expect(refused.json.error).toBe("Too many sign-in attempts for this address or from this network. Wait 15 minutes, then try again.");
    // next-auth's client reads `error` from this url; the sign-in page shows it.
    expect(new URL(refused.json.url).searchParams.get("error")).toBe(refused.json.error);
    expect(refused.headers.getSetCookie().some((c) => c.includes("session-token"))).toBe(false);
    await sql("delete from rate_limits where key = ?", [`signin-email:${person.email}`]);
  });

  it("a sign-in form over 64 kB is refused with 413 before anything is counted or checked", async () => {
    const res = await send("POST", ["callback", "password"], { email: person.email, password: "x".repeat(70_000), csrfToken: await csrf(), json: "true" });
    expect(res.status).toBe(413);
    expect(res.json.error).toMatch(/too large \(over 64 kB\)/);
    expect(await sql("select 1 from rate_limits where key = ?", [`signin-email:${person.email}`])).toHaveLength(0);
  });

  it("a successful sign-in gives the attempt back to the address and clears the person's counters", async () => {
    for (let i = 0; i < 3; i++) expect((await password(person.email, "wrong")).status).toBe(401);
    const ok = await password(person.email, "correct horse battery");
    expect(ok.status).toBe(200);
    expect(ok.headers.getSetCookie().some((c) => c.startsWith("next-auth.session-token="))).toBe(true);
    // Not Secure over http; next-auth marks it Secure when NEXTAUTH_URL is https.
    expect(ok.headers.getSetCookie().find((c) => c.startsWith("next-auth.session-token="))).toMatch(/HttpOnly/i);
    const rows = await sql<{ key: string; points: number }>("select key, points from rate_limits where key in (?, ?) order by key", [
      `signin-email:${person.email}`,
      `signin-ip:${ip}`,
    ]);
    expect(rows).toEqual([{ key: `signin-ip:${ip}`, points: 3 }]);
  });

  it("sign-in links: 5 are sent, the 6th gets 429 and no mail", async () => {
    const email = freshEmail("linker");
    for (let i = 0; i < 5; i++) {
      const res = await send("POST", ["signin", "email"], { email, csrfToken: await csrf(), callbackUrl: "/", json: "true" });
      expect(res.status).toBe(200);
      expect(res.json.url).toMatch(/\/api\/auth\/verify-request/);
    }
    const refused = await send("POST", ["signin", "email"], { email, csrfToken: await csrf(), callbackUrl: "/", json: "true" });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(890);
    expect(refused.json.error).toMatch(/^Too many sign-in links were asked for/);
    // Delivery is asynchronous in the fake: wait for the five, then check no sixth came.
    const deadline = Date.now() + 10_000;
    while ((await listMessages(email)).length < 5 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    await new Promise((r) => setTimeout(r, 300));
    expect(await listMessages(email)).toHaveLength(5);
  });

  it("other next-auth POSTs are not counted", async () => {
    const before = await sql<{ n: string }>("select count(*) as n from rate_limits where key like ?", [`%${ip}`]);
    await send("POST", ["signout"], { csrfToken: await csrf(), json: "true" });
    const after = await sql<{ n: string }>("select count(*) as n from rate_limits where key like ?", [`%${ip}`]);
    expect(after[0].n).toBe(before[0].n);
  });
});
