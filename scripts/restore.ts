// npm run restore -- DIR [--force] – brings a backup folder from npm run backup into an empty
// install: DATABASE_URL and the S3_BUCKET (created when missing). Every file is checked against
// the manifest's sha256 before anything is written, every object is read back and checked after,
// and the restored row counts are compared with the backup's.
//
// Refuses when the database already has studios or the bucket already holds any of the keys,
// unless --force: then the database's public schema (and pg-boss's) is replaced by the backup's
// and those objects are overwritten.
import {
  CreateBucketCommand,
  GetObjectCommand,
  HeadBucketCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { createHash } from "node:crypto";
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import type { Readable } from "node:stream";
import { env } from "../lib/env";
import { storageClient } from "../lib/storage";
import { DUMP, MANIFEST, type Manifest, OBJECTS, describeDb, eachLimited, openDb, parseArgs, rowCounts, runPg, sha256File } from "./backup/common";

class Refusal extends Error {}

const { positional, flags } = parseArgs(process.argv.slice(2));
const force = flags.has("force");

try {
  await restore();
} catch (e) {
  if (e instanceof Refusal) {
    console.error(`restore refused: ${e.message}`);
    process.exit(2);
  }
  console.error(`restore failed: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
}

function ident(s: string): string {
  return `"${s.replace(/"/g, '""')}"`;
}

/**
 * Empties the target (the public schema and the backup's other schemas, recreated as a fresh
 * database has them) and loads the dump, in one psql transaction: on any error nothing changes.
 * pg_restore first writes the dump as SQL to a file, so a failure there stops before psql runs.
 */
async function restoreDump(dump: string, otherSchemas: string[]): Promise<void> {
  const work = mkdtempSync(join(tmpdir(), "undertone-restore-"));
  try {
    const reset = join(work, "reset.sql");
    const load = join(work, "load.sql");
    writeFileSync(
      reset,
      [
        ...otherSchemas.map((s) => `drop schema if exists ${ident(s)} cascade;`),
        "drop schema if exists public cascade;",
        "create schema public;",
        "alter schema public owner to pg_database_owner;",
        "grant usage on schema public to public;",
        "",
      ].join("\n"),
    );
    await runPg("pg_restore", ["--no-owner", "--no-privileges", `--file=${load}`, dump]);
    await runPg("psql", ["-X", "-q", "-v", "ON_ERROR_STOP=1", "--single-transaction", "-f", reset, "-f", load, `--dbname=${env.DATABASE_URL}`]);
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

async function restore() {
  if (!positional[0]) throw new Refusal("name the backup folder: npm run restore -- .data/backups/undertone-…");
  const dir = resolve(positional[0]);
  if (!existsSync(join(dir, MANIFEST))) {
    const inside = existsSync(dir) ? readdirSync(dir).filter((f) => existsSync(join(dir, f, MANIFEST))) : [];
    throw new Refusal(
      `${dir} holds no ${MANIFEST}.` + (inside.length ? ` Backups inside it: ${inside.sort().join(", ")}` : ""),
    );
  }
  const manifest = JSON.parse(readFileSync(join(dir, MANIFEST), "utf8")) as Manifest;
  if (manifest.format !== "undertone-backup" || manifest.version !== 1) {
    throw new Refusal(`${MANIFEST} is not an Undertone backup manifest of version 1.`);
  }

  // 1. The backup is whole: the dump and every object file match their sha256.
  if ((await sha256File(join(dir, DUMP))) !== manifest.database.sha256) {
    throw new Error(`${DUMP} does not match the sha256 in the manifest: the backup is damaged.`);
  }
  const shas = [...new Set(manifest.bucket.objects.map((o) => o.sha256))];
  const damaged: string[] = [];
  await eachLimited(shas, 4, async (sha) => {
    const file = join(dir, OBJECTS, sha);
    if (!existsSync(file) || (await sha256File(file)) !== sha) damaged.push(sha);
  });
  if (damaged.length) {
    const keys = manifest.bucket.objects.filter((o) => damaged.includes(o.sha256)).map((o) => o.key);
    throw new Error(`${keys.length} object file(s) are missing or damaged in the backup: ${keys.slice(0, 5).join(", ")}`);
  }
  console.log(`backup: ${dir} checked (dump and ${shas.length} object files match their sha256)`);

  // 2. The target is empty, or --force.
  const target = describeDb(env.DATABASE_URL);
  const orm = await openDb();
  try {
    const em = orm.em.fork();
    const [{ has }] = await em.execute<{ has: boolean }[]>("select to_regclass('public.studios') is not null as has");
    const studios = has ? Number((await em.execute<{ n: string }[]>("select count(*) as n from studios"))[0].n) : 0;
    if (studios > 0 && !force) {
      throw new Refusal(
        `the database ${target} already has ${studios} studio(s). Restore into an empty database, ` +
          `or pass --force to drop and replace its tables with the backup's.`,
      );
    }

    const s3 = storageClient();
    const bucket = env.S3_BUCKET;
    try {
      await s3.send(new HeadBucketCommand({ Bucket: bucket }));
    } catch (e) {
      if (!(e instanceof S3ServiceException && e.$metadata.httpStatusCode === 404)) throw e;
      await s3.send(new CreateBucketCommand({ Bucket: bucket }));
      console.log(`bucket: created ${bucket}`);
    }
    const wanted = new Set(manifest.bucket.objects.map((o) => o.key));
    let clashes = 0;
    let token: string | undefined;
    do {
      const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
      clashes += (page.Contents ?? []).filter((o) => wanted.has(o.Key!)).length;
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    if (clashes > 0 && !force) {
      throw new Refusal(`the bucket ${bucket} already holds ${clashes} of the backup's keys. Use an empty bucket, or pass --force to overwrite them.`);
    }

    // 3. The database, in one transaction: the backup's schemas are dropped and created afresh, then
    // the dump's SQL runs. (pg_restore --clean cannot drop pg-boss's partitioned tables: a
    // partition's inherited key refuses to go first.)
    const schemas = [...new Set(Object.keys(manifest.database.rows).filter((t) => t.includes(".")).map((t) => t.split(".")[0]))];
    await restoreDump(join(dir, DUMP), schemas);
    const rows = await rowCounts((sql) => em.execute(sql));
    const wrong = Object.entries(manifest.database.rows).filter(([t, n]) => rows[t] !== n);
    if (wrong.length) {
      throw new Error(`restored row counts differ from the backup's: ${wrong.map(([t, n]) => `${t} ${rows[t]} ≠ ${n}`).join(", ")}`);
    }
    const total = Object.values(rows).reduce((a, b) => a + b, 0);
    console.log(`database: ${target} restored, ${Object.keys(manifest.database.rows).length} tables, ${total} rows (counts match)`);

    // 4. The objects, each read back and checked.
    let bytes = 0;
    const bad: string[] = [];
    await eachLimited(manifest.bucket.objects, 4, async (o) => {
      const body = readFileSync(join(dir, OBJECTS, o.sha256));
      await s3.send(
        new PutObjectCommand({ Bucket: bucket, Key: o.key, Body: body, ContentType: o.contentType ?? undefined }),
      );
      const back = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: o.key }));
      const hash = createHash("sha256");
      for await (const chunk of back.Body as Readable) hash.update(chunk as Buffer);
      if (hash.digest("hex") !== o.sha256) bad.push(o.key);
      bytes += o.size;
    });
    if (bad.length) throw new Error(`${bad.length} object(s) read back differently after upload: ${bad.slice(0, 5).join(", ")}`);
    console.log(`bucket: ${bucket}: ${manifest.bucket.objects.length} objects, ${bytes} bytes restored (sha256 checked)`);
  } finally {
    await orm.close();
  }
  if (manifest.bucket.missingReferenced.length) {
    console.warn(`note: the backup lacked ${manifest.bucket.missingReferenced.length} object(s) its rows refer to (see the manifest).`);
  }
  console.log("restore: done");
}
