// What backup.ts and restore.ts share: the folder layout and manifest, the Postgres client
// programs, the database connection and the S3 client, all configured from lib/env.ts.
import { MikroORM } from "@mikro-orm/postgresql";
import { spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, existsSync, readdirSync } from "node:fs";
import { join } from "node:path";
import config from "../../mikro-orm.config";
import { env } from "../../lib/env";

/** A backup folder holds this manifest, the database dump and one file per distinct object. */
export const MANIFEST = "manifest.json";
export const DUMP = "database.dump";
/** Object files are named by their sha256, so keys need no mapping to paths and equal bytes are stored once. */
export const OBJECTS = "objects";

export interface ObjectEntry {
  key: string;
  size: number;
  sha256: string;
  contentType: string | null;
  lastModified: string | null;
  /** Written after the database snapshot was taken: the dump may not refer to it (harmless). */
  newerThanSnapshot: boolean;
}

export interface Manifest {
  format: "undertone-backup";
  version: 1;
  startedAt: string;
  finishedAt: string;
  database: {
    /** host:port/name of the source, without credentials. */
    source: string;
    serverVersion: string;
    /** The database clock when the dump's snapshot was taken; the dump shows the data as of then. */
    snapshotAt: string;
    file: string;
    bytes: number;
    sha256: string;
    /** Rows per table in the snapshot, checked again after a restore. */
    rows: Record<string, number>;
  };
  bucket: {
    name: string;
    endpoint: string;
    listedAt: string;
    objects: ObjectEntry[];
    /** Keys the dumped rows refer to that the bucket no longer had when it was listed. */
    missingReferenced: string[];
  };
}

/** The folder of Debian's Postgres programs: PG_BIN, else the newest /usr/lib/postgresql/N/bin. */
export function pgBin(): string {
  if (env.PG_BIN) return env.PG_BIN;
  const root = "/usr/lib/postgresql";
  const versions = existsSync(root) ? readdirSync(root).filter((v) => /^\d+$/.test(v)) : [];
  const found = versions
    .sort((a, b) => Number(b) - Number(a))
    .map((v) => join(root, v, "bin"))
    .find((dir) => existsSync(join(dir, "pg_dump")));
  if (!found) throw new Error("No pg_dump found under /usr/lib/postgresql/*/bin; install postgresql-client or set PG_BIN.");
  return found;
}

/** Runs a Postgres program; rejects with its stderr when it fails. */
export function runPg(program: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(join(pgBin(), program), args, { stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    child.on("error", reject);
    child.on("close", (code) => {
      if (code === 0) resolve();
      else reject(new Error(`${program} failed (exit ${code}):\n${stderr.trim()}`));
    });
  });
}

/** The database named by a URL, for messages: host, port and name, never the password. */
export function describeDb(url: string): string {
  const u = new URL(url);
  return `${u.hostname}:${u.port || "5432"}${u.pathname}`;
}

/** One small ORM (for plain SQL) on DATABASE_URL. */
export function openDb(): Promise<MikroORM> {
  return MikroORM.init({ ...config, clientUrl: env.DATABASE_URL, pool: { min: 0, max: 2 } });
}

/** Schemas that hold data: the app's tables in public, pg-boss's jobs in its own schema. */
export const DATA_SCHEMAS = "schemaname not in ('pg_catalog', 'information_schema') and schemaname not like 'pg\\_%'";

/** A table's name for reports: bare in public, schema-qualified elsewhere. */
export function tableLabel(schema: string, table: string): string {
  return schema === "public" ? table : `${schema}.${table}`;
}

const ident = (s: string) => `"${s.replace(/"/g, '""')}"`;

/** Row counts of every table in every data schema, by tableLabel. */
export async function rowCounts(run: (sql: string) => Promise<Record<string, unknown>[]>): Promise<Record<string, number>> {
  const tables = await run(`select schemaname, tablename from pg_tables where ${DATA_SCHEMAS} order by 1, 2`);
  const out: Record<string, number> = {};
  for (const t of tables) {
    const [schema, name] = [String(t.schemaname), String(t.tablename)];
    const [r] = await run(`select count(*)::int as n from ${ident(schema)}.${ident(name)}`);
    out[tableLabel(schema, name)] = Number(r.n);
  }
  return out;
}

export function sha256File(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const h = createHash("sha256");
    createReadStream(path)
      .on("data", (d) => h.update(d))
      .on("error", reject)
      .on("end", () => resolve(h.digest("hex")));
  });
}

/** Runs fn over items with at most `limit` at a time. */
export async function eachLimited<T>(items: T[], limit: number, fn: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async () => {
    while (next < items.length) await fn(items[next++]);
  };
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, worker));
}

/** Command-line words: the positional ones and the --flags. */
export function parseArgs(argv: string[]): { positional: string[]; flags: Set<string> } {
  const positional = argv.filter((a) => !a.startsWith("--"));
  const flags = new Set(argv.filter((a) => a.startsWith("--")).map((a) => a.slice(2)));
  return { positional, flags };
}
