import { z } from "zod";

// Every setting Undertone reads, checked once. Defaults match the local services that
// scripts/services.sh starts on loopback, so a fresh clone runs without an .env file.
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().url().default("postgres://postgres@127.0.0.1:54329/undertone"),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  NEXTAUTH_SECRET: z.string().min(16).default("undertone-local-development-secret-change-me"),
  S3_ENDPOINT: z.string().url().default("http://127.0.0.1:4569"),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().default("undertone-photos"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  MAIL_FROM: z.string().default("Undertone <notebook@undertone.local>"),
  MAIL_FAKE_URL: z.string().url().default("http://127.0.0.1:2580"),
  /** Notifications for one recipient within this many seconds leave as one mail. */
  MAIL_BATCH_SECONDS: z.coerce.number().int().min(0).max(86_400).default(120),
  /** Seconds before the first retry of a failed mail (then doubled per attempt, at most an hour). */
  MAIL_RETRY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** "off" when a separate `npm run worker` runs the background jobs; otherwise the web server runs them. */
  UNDERTONE_WORKER: z.enum(["on", "off"]).default("on"),
  /** POST /api/internal/outbox/flush: "on" or "off"; unset means on outside production. */
  OUTBOX_FLUSH_ROUTE: z.enum(["on", "off"]).optional(),
  /** Folder of pg_dump and pg_restore for npm run backup/restore; unset means the newest Debian one. */
  PG_BIN: z.string().optional(),
});

export type Env = z.infer<typeof schema>;

export const env: Env = schema.parse({
  ...process.env,
  APP_URL: process.env.APP_URL ?? process.env.NEXTAUTH_URL,
});
