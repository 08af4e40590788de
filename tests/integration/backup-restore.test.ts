// npm run backup and npm run restore end to end: the demo studio with swatch photos in a fresh
// database and bucket, backed up, restored into a second empty database and another bucket, then
// every row of every table and every object compared byte for byte. Nothing is excluded: a
// restore copies rows as they are, so not even timestamps may differ.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { createHash, randomUUID } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import sharp from "sharp";
import {
  CreateBucketCommand,
  DeleteBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
} from "@aws-sdk/client-s3";
import { MikroORM } from "@mikro-orm/postgresql";
import PgBoss from "pg-boss";
import config from "@/mikro-orm.config";
import { PhotoSchema, StudioSchema, TrialSchema, UserSchema } from "@/entities";
import { env } from "@/lib/env";
import { BOSS_SCHEMA } from "@/lib/jobs/boss";
import { storageClient } from "@/lib/storage";
import { makeVariants } from "@/lib/photos/process";
import { DATA_SCHEMAS, type Manifest, tableLabel } from "@/scripts/backup/common";

const root = fileURLToPath(new URL("../..", import.meta.url));
const base = new URL(env.DATABASE_URL);
const dbName = base.pathname.slice(1);
const urlOf = (name: string) => Object.assign(new URL(base.href), { pathname: `/${name}` }).href;
const SOURCE_DB = `${dbName}_backup`;
const TARGET_DB = `${dbName}_restore`;
const bucketStem = dbName.toLowerCase().replace(/[^a-z0-9]+/g, "-");
const SOURCE_BUCKET = `${bucketStem}-backup-src`;
const TARGET_BUCKET = `${bucketStem}-restore`;

const s3 = storageClient();
const orms = new Map<string, MikroORM>();
let admin: MikroORM;
let folder: string;
let backupDir: string;

/** One small ORM per database, for plain SQL. */
async function open(name: string): Promise<MikroORM> {
  let orm = orms.get(name);
  if (!orm) {
    orm = await MikroORM.init({ ...config, clientUrl: urlOf(name), pool: { min: 0, max: 2 } });
    orms.set(name, orm);
  }
  return orm;
}

/** Runs an npm script against one database and bucket; resolves with its exit code and output. */
function npm(args: string[], db: string, bucket: string): Promise<{ code: number; out: string; err: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn("npm", ["run", "--silent", ...args], {
      cwd: root,
      env: { ...process.env, DATABASE_URL: urlOf(db), S3_BUCKET: bucket },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let out = "";
    let err = "";
    child.stdout.on("data", (d: Buffer) => (out += d.toString()));
    child.stderr.on("data", (d: Buffer) => (err += d.toString()));
    child.on("error", reject);
    child.on("close", (code) => resolve({ code: code ?? -1, out, err }));
  });
}

async function resetDb(name: string) {
  await admin.em.execute(`drop database if exists "${name}" with (force)`);
  await admin.em.execute(`create database "${name}"`);
}

async function keysOf(bucket: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    keys.push(...(page.Contents ?? []).map((o) => o.Key!));
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys.sort();
}

async function dropBucket(bucket: string) {
  let keys: string[];
  try {
    keys = await keysOf(bucket);
  } catch {
    return; // no such bucket
  }
  for (const Key of keys) await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key }));
  await s3.send(new DeleteBucketCommand({ Bucket: bucket }));
}

async function bytesOf(bucket: string, key: string): Promise<Buffer> {
  const out = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  return Buffer.from(await out.Body!.transformToByteArray());
}

/** Adds swatch photos to the seeded demo studio as the app stores them: rows plus variants. */
async function addPhotos(orm: MikroORM) {
  const em = orm.em.fork();
  const studio = await em.findOneOrFail(StudioSchema, { name: "Tidewrack Yarn Studio" });
  const owner = await em.findOneOrFail(UserSchema, { email: "maren@tidewrack.example" });
  const trials = await em.find(TrialSchema, { studio }, { orderBy: { createdAt: "asc" }, limit: 2 });
  expect(trials.length).toBe(2);
  const colours = [
    { r: 38, g: 92, b: 120 },
    { r: 170, g: 64, b: 58 },
  ];
  for (const [i, trial] of trials.entries()) {
    const original = await sharp({ create: { width: 640, height: 480, channels: 3, background: colours[i], noise: { type: "gaussian", mean: 128, sigma: 30 } } })
      .jpeg({ quality: 90 })
      .toBuffer();
    const v = await makeVariants(original);
    const id = randomUUID();
    const prefix = `studios/${studio.id}/photos/${id}`;
    const photo = em.create(PhotoSchema, {
      id,
      studio,
      trial,
      kind: "final",
      uploadedBy: owner,
      status: "ready",
      uploadKey: `studios/${studio.id}/uploads/${id}`,
      masterKey: `${prefix}/master.jpg`,
      webKey: `${prefix}/web.webp`,
      thumbKey: `${prefix}/thumb.webp`,
      width: v.width,
      height: v.height,
      bytes: original.length,
      originalType: v.originalType,
      confirmedAt: new Date(),
    });
    const put = (Key: string, Body: Buffer, ContentType: string) =>
      s3.send(new PutObjectCommand({ Bucket: SOURCE_BUCKET, Key, Body, ContentType }));
    await put(photo.masterKey!, v.master, "image/jpeg");
    await put(photo.webKey!, v.web, "image/webp");
    await put(photo.thumbKey!, v.thumb, "image/webp");
  }
  // An upload still waiting for confirmation, and an object no row refers to, with an awkward key.
  const pending = em.create(PhotoSchema, {
    studio,
    trial: trials[0],
    kind: "base",
    uploadedBy: owner,
    status: "pending",
    uploadKey: `studios/${studio.id}/uploads/waiting`,
  });
  await s3.send(new PutObjectCommand({ Bucket: SOURCE_BUCKET, Key: pending.uploadKey, Body: Buffer.from([0xff, 0xd8, 0xff, 0xd9]), ContentType: "image/jpeg" }));
  await s3.send(new PutObjectCommand({ Bucket: SOURCE_BUCKET, Key: "stray/notes ü & 100%.txt", Body: Buffer.from("left over\n"), ContentType: "text/plain" }));
  await em.flush();
}

/** A queued job, so pg-boss's own schema (its tables and a row) is part of what is backed up. */
async function addJob() {
  const boss = new PgBoss({ connectionString: urlOf(SOURCE_DB), schema: BOSS_SCHEMA, supervise: false, schedule: false, migrate: true, max: 1 });
  boss.on("error", () => undefined);
  await boss.start();
  await boss.createQueue("outbox-flush", { name: "outbox-flush" });
  await boss.send("outbox-flush", {}, { startAfter: new Date(Date.now() + 86_400_000) });
  await boss.stop({ graceful: false, wait: true });
}

/**
 * The schema as the catalogue describes it: columns with types, nullability and defaults, every
 * index's definition, and the constraints by name, kind and table. A check constraint's text is
 * left out on purpose: Postgres deparses `x in ('a', 'b')` on a varchar differently after a dump
 * and reload (the same condition, other casts), so only its presence is compared.
 */
async function schemaOf(orm: MikroORM): Promise<string[]> {
  const em = orm.em.fork();
  const rows = await em.execute<{ r: string }[]>(`
    select format('column %s.%s %s null=%s default=%s', table_name, column_name, data_type, is_nullable, column_default) as r
      from information_schema.columns where ${DATA_SCHEMAS.replaceAll("schemaname", "table_schema")}
    union all
    select format('index %s', indexdef) from pg_indexes where ${DATA_SCHEMAS}
    union all
    select format('constraint %s %s on %s%s', c.conname, c.contype, c.conrelid::regclass,
                  case when c.contype = 'c' then '' else ' ' || pg_get_constraintdef(c.oid) end)
      from pg_constraint c join pg_namespace n on n.oid = c.connamespace where ${DATA_SCHEMAS.replaceAll("schemaname", "n.nspname")}
    order by 1`);
  return rows.map((x) => x.r);
}

/** Every table's rows as text, in a fixed order, in every data schema (public and pg-boss's). */
async function tableDump(orm: MikroORM): Promise<Map<string, string[]>> {
  const em = orm.em.fork();
  const tables = await em.execute<{ s: string; t: string }[]>(`select schemaname as s, tablename as t from pg_tables where ${DATA_SCHEMAS} order by 1, 2`);
  const out = new Map<string, string[]>();
  for (const { s, t } of tables) {
    const rows = await em.execute<{ r: string }[]>(`select x::text as r from "${s}"."${t}" x order by 1`);
    out.set(tableLabel(s, t), rows.map((r) => r.r));
  }
  return out;
}

beforeAll(async () => {
  admin = await open("postgres");
  await resetDb(SOURCE_DB);
  await resetDb(TARGET_DB);
  await dropBucket(SOURCE_BUCKET);
  await dropBucket(TARGET_BUCKET);
  await s3.send(new CreateBucketCommand({ Bucket: SOURCE_BUCKET }));
  folder = mkdtempSync(join(tmpdir(), "undertone-backup-"));

  for (const script of ["migrate", "seed"]) {
    const r = await npm([script], SOURCE_DB, SOURCE_BUCKET);
    expect(r.code, `${script}: ${r.out}\n${r.err}`).toBe(0);
  }
  await addPhotos(await open(SOURCE_DB));
  await addJob();
}, 180_000);

afterAll(async () => {
  for (const orm of orms.values()) if (orm !== admin) await orm.close();
  await admin.em.execute(`drop database if exists "${SOURCE_DB}" with (force)`);
  await admin.em.execute(`drop database if exists "${TARGET_DB}" with (force)`);
  await admin.close();
  await dropBucket(SOURCE_BUCKET);
  await dropBucket(TARGET_BUCKET);
  if (folder) rmSync(folder, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("backs up the database and every object with a manifest", async () => {
    const r = await npm(["backup", "--", folder], SOURCE_DB, SOURCE_BUCKET);
    expect(r.code, `${r.out}\n${r.err}`).toBe(0);
    backupDir = /^backup: (.+)$/m.exec(r.out)![1];
    const manifest = JSON.parse(readFileSync(join(backupDir, "manifest.json"), "utf8")) as Manifest;
    expect(manifest.bucket.name).toBe(SOURCE_BUCKET);
    expect(manifest.bucket.objects.map((o) => o.key)).toEqual(await keysOf(SOURCE_BUCKET));
    // The seed's own photos, plus 2 × 3 variants, a pending upload and a stray object added here.
    expect(manifest.bucket.objects.length).toBeGreaterThanOrEqual(8);
    expect(manifest.bucket.missingReferenced).toEqual([]);
    for (const o of manifest.bucket.objects) {
      const file = readFileSync(join(backupDir, "objects", o.sha256));
      expect(file.length).toBe(o.size);
      expect(createHash("sha256").update(file).digest("hex")).toBe(o.sha256);
    }
    const source = await tableDump(await open(SOURCE_DB));
    expect(manifest.database.rows).toEqual(Object.fromEntries([...source].map(([t, rows]) => [t, rows.length])));
    expect(manifest.database.rows.photos).toBeGreaterThanOrEqual(3);
    expect(manifest.database.rows[`${BOSS_SCHEMA}.job`]).toBeGreaterThanOrEqual(1);
    expect(manifest.database.rows.studios).toBe(1);
  }, 120_000);

  it("restores into an empty database and another bucket, every row and object equal", async () => {
    const r = await npm(["restore", "--", backupDir], TARGET_DB, TARGET_BUCKET);
    expect(r.code, `${r.out}\n${r.err}`).toBe(0);

    const [source, target] = await Promise.all([tableDump(await open(SOURCE_DB)), tableDump(await open(TARGET_DB))]);
    expect([...target.keys()]).toEqual([...source.keys()]);
    let rows = 0;
    for (const [table, sourceRows] of source) {
      expect(target.get(table), table).toEqual(sourceRows);
      rows += sourceRows.length;
    }
    expect(source.get("trials")!.length).toBeGreaterThan(0);
    // Indexes, constraints and defaults too.
    const [sourceSchema, targetSchema] = await Promise.all([schemaOf(await open(SOURCE_DB)), schemaOf(await open(TARGET_DB))]);
    expect(targetSchema).toEqual(sourceSchema);

    const keys = await keysOf(SOURCE_BUCKET);
    expect(await keysOf(TARGET_BUCKET)).toEqual(keys);
    let bytes = 0;
    for (const key of keys) {
      const [a, b] = await Promise.all([bytesOf(SOURCE_BUCKET, key), bytesOf(TARGET_BUCKET, key)]);
      expect(createHash("sha256").update(b).digest("hex"), key).toBe(createHash("sha256").update(a).digest("hex"));
      bytes += a.length;
    }
    console.log(
      `backup-restore: compared ${rows} rows in ${source.size} tables, ${sourceSchema.length} schema items and ${keys.length} objects (${bytes} bytes): all equal`,
    );
  }, 120_000);

  it("refuses to restore over a database that has studios, unless forced", async () => {
    const refused = await npm(["restore", "--", backupDir], TARGET_DB, TARGET_BUCKET);
    expect(refused.code).toBe(2);
    expect(refused.err).toMatch(/already has 1 studio\(s\).*--force/);

    const forced = await npm(["restore", "--", backupDir, "--force"], TARGET_DB, TARGET_BUCKET);
    expect(forced.code, `${forced.out}\n${forced.err}`).toBe(0);
    expect(forced.out).toMatch(/counts match/);
  }, 120_000);

  it("refuses a damaged backup before writing anything", async () => {
    const manifest = JSON.parse(readFileSync(join(backupDir, "manifest.json"), "utf8")) as Manifest;
    const victim = manifest.bucket.objects.find((o) => o.key.endsWith("thumb.webp"))!;
    const file = join(backupDir, "objects", victim.sha256);
    const original = readFileSync(file);
    writeFileSync(file, Buffer.concat([original, Buffer.from([0])]));
    try {
      const r = await npm(["restore", "--", backupDir, "--force"], TARGET_DB, TARGET_BUCKET);
      expect(r.code).toBe(1);
      expect(r.err).toMatch(/missing or damaged.*thumb\.webp/);
    } finally {
      writeFileSync(file, original);
    }
  }, 120_000);
});
