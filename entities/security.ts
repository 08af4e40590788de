import { EntitySchema, type Opt } from "@mikro-orm/core";

// Counters for rate limits (sign-in attempts, sign-in links), kept in Postgres so every app
// instance counts against the same numbers. The rows are written by rate-limiter-flexible's
// Postgres store (lib/auth/rate-limit.ts), which inserts positionally: these three columns, in
// this order, and nothing else.

export interface RateLimit {
  /** `<limiter>:<ip or e-mail>`, e.g. `signin-email:ada@example.org`. */
  key: string;
  /** Points used in the current window. */
  points: number & Opt;
  /** When the window ends, in milliseconds since 1970 (the store's own clock). */
  expire?: string | null;
}

export const RateLimitSchema = new EntitySchema<RateLimit>({
  name: "RateLimit",
  tableName: "rate_limits",
  indexes: [{ properties: ["expire"] }],
  properties: {
    key: { type: "string", length: 255, primary: true },
    points: { type: "integer", default: 0 },
    expire: { type: "bigint", nullable: true },
  },
});
