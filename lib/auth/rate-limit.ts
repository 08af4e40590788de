import "server-only";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import { getOrm } from "@/lib/db";

// Limits on signing in, counted in Postgres (table rate_limits) so that several app instances
// share one count. Each kind of attempt is counted twice: per e-mail address (guessing one
// person's password, or filling one inbox with links) and per client address (trying many
// accounts from one place). Windows are fixed: they start with the first attempt.
//
// Password attempts that succeed are given back to the client address, so the address count is
// a count of failures; any successful sign-in clears the person's own counters.

export type LimitKind = "password" | "link";

export interface LimitRule {
  /** Prefix of the counter's key in rate_limits. */
  keyPrefix: string;
  /** Attempts allowed per window. */
  points: number;
  /** Window length in seconds. */
  duration: number;
}

export const LIMITS: Record<LimitKind, { email: LimitRule; ip: LimitRule }> = {
  password: {
    email: { keyPrefix: "signin-email", points: 10, duration: 15 * 60 },
    // A studio's people often share one address (one router), so this is higher.
    ip: { keyPrefix: "signin-ip", points: 50, duration: 15 * 60 },
  },
  link: {
    email: { keyPrefix: "link-email", points: 5, duration: 15 * 60 },
    ip: { keyPrefix: "link-ip", points: 30, duration: 15 * 60 },
  },
};

const TABLE = "rate_limits";

type Knex = ConstructorParameters<typeof RateLimiterPostgres>[0]["storeClient"];
const cache = globalThis as unknown as { __undertoneLimiters?: WeakMap<object, Map<string, RateLimiterPostgres>> };

/** A limiter for one rule on the app's own connection pool (one per rule and pool). */
export async function limiterFor(rule: LimitRule): Promise<RateLimiterPostgres> {
  const knex = (await getOrm()).em.getConnection().getKnex() as unknown as Knex;
  cache.__undertoneLimiters ??= new WeakMap();
  let byRule = cache.__undertoneLimiters.get(knex);
  if (!byRule) cache.__undertoneLimiters.set(knex, (byRule = new Map()));
  const name = `${rule.keyPrefix}/${rule.points}/${rule.duration}`;
  let limiter = byRule.get(name);
  if (!limiter) {
    limiter = new RateLimiterPostgres({
      storeClient: knex,
      storeType: "knex",
      tableName: TABLE,
      // The table comes from a migration (entities/security.ts).
      tableCreated: true,
      keyPrefix: rule.keyPrefix,
      points: rule.points,
      duration: rule.duration,
    });
    byRule.set(name, limiter);
  }
  return limiter;
}

/** The form of an e-mail address used for counting (next-auth and our sign-in use the same). */
export function normalEmail(email: string | null | undefined): string | null {
  const e = email?.trim().toLowerCase();
  return e && e.length <= 254 && e.includes("@") ? e : null;
}

/**
 * The client's address. Behind a reverse proxy, the proxy must set X-Forwarded-For (or append
 * to it): the last entry is the one the nearest proxy saw. Without a proxy, `next start` fills
 * the header from the socket only when the client sent none, so a client can choose its own
 * address; the per-e-mail counts still hold then.
 */
export function clientIp(headers: Headers): string {
  const forwarded = headers.get("x-forwarded-for");
  const last = forwarded?.split(",").map((s) => s.trim()).filter(Boolean).pop();
  const ip = last ?? headers.get("x-real-ip")?.trim() ?? "";
  return ip && ip.length <= 64 ? ip.replace(/^::ffff:/, "") : "unknown";
}

export interface Refusal {
  /** Whole seconds until the attempt would be allowed (for Retry-After). */
  retryAfter: number;
  /** A plain sentence for the sign-in page. */
  message: string;
}

function refusalMessage(kind: LimitKind, retryAfter: number): string {
  const minutes = Math.max(1, Math.ceil(retryAfter / 60));
  const wait = `Wait ${minutes} minute${minutes === 1 ? "" : "s"}, then try again.`;
  return kind === "password"
    ? `Too many sign-in attempts for this address or from this network. ${wait}`
    : `Too many sign-in links were asked for. ${wait} Check your inbox for the links already sent.`;
}

/** Counts one attempt against the client address and the e-mail; a refusal when either is spent. */
export async function takeAttempt(kind: LimitKind, who: { ip: string; email: string | null }): Promise<Refusal | null> {
  const rules = LIMITS[kind];
  const keys: [LimitRule, string][] = [[rules.ip, who.ip]];
  if (who.email) keys.push([rules.email, who.email]);
  const results = await Promise.allSettled(keys.map(async ([rule, key]) => (await limiterFor(rule)).consume(key)));
  let wait = 0;
  for (const r of results) {
    if (r.status === "fulfilled") continue;
    // consume() rejects with the counter's state when the limit is spent, with an Error when
    // the store fails; a store failure is a server error, not a reason to let attempts through.
    if (!(r.reason instanceof RateLimiterRes)) throw r.reason;
    wait = Math.max(wait, Math.ceil(r.reason.msBeforeNext / 1000));
  }
  if (results.every((r) => r.status === "fulfilled")) return null;
  const retryAfter = Math.max(1, wait);
  return { retryAfter, message: refusalMessage(kind, retryAfter) };
}

/** After a password sign-in succeeded: the attempt does not count against the client address. */
export async function refundAddress(kind: LimitKind, ip: string): Promise<void> {
  await (await limiterFor(LIMITS[kind].ip)).reward(ip, 1);
}

/** After any successful sign-in: the person's own counters start again. */
export async function clearEmail(email: string | null | undefined): Promise<void> {
  const e = normalEmail(email);
  if (!e) return;
  await Promise.all(
    (Object.keys(LIMITS) as LimitKind[]).map(async (kind) => (await limiterFor(LIMITS[kind].email)).delete(e)),
  );
}

/** The 429 answer next-auth's client understands: `url` carries the message as its `error`. */
export function tooManyAttempts(refusal: Refusal, appUrl: string): Response {
  const url = new URL("/signin", appUrl);
  url.searchParams.set("error", refusal.message);
  return Response.json(
    { error: refusal.message, retryAfter: refusal.retryAfter, url: url.toString() },
    { status: 429, headers: { "Retry-After": String(refusal.retryAfter), "Cache-Control": "no-store" } },
  );
}
