// npm run backup [-- DIR] – the database (pg_dump, custom format) and a copy of every object in the
// photo bucket, with a manifest of keys, sizes and sha256, in a new folder DIR/undertone-<time>
// (DIR defaults to .data/backups). Reads DATABASE_URL and S3_* like the app.
//
// Consistency: the dump is one snapshot, exported from a repeatable-read transaction that also
// counts the rows and reads the object keys the photos refer to. The bucket is listed after the
// dump; objects written after the snapshot are copied too and marked `newerThanSnapshot` (the
// restored rows may not refer to them), and keys the snapshot refers to that were deleted before
// the listing are reported as `missingReferenced`.
import { GetObjectCommand, ListObjectsV2Command, type _Object } from "@aws-sdk/client-s3";
import { IsolationLevel } from "@mikro-orm/core";
import { createHash } from "node:crypto";
import { createWriteStream, existsSync, mkdirSync, renameSync, statSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";
import type { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { env } from "../lib/env";
import { storageClient } from "../lib/storage";
import {
  DUMP,
  MANIFEST,
  type Manifest,
  type ObjectEntry,
  OBJECTS,
  describeDb,
  eachLimited,
  openDb,
  parseArgs,
  rowCounts,
  runPg,
  sha256File,
} from "./backup/common";

const { positional } = parseArgs(process.argv.slice(2));
const parent = resolve(positional[0] ?? ".data/backups");
const startedAt = new Date();
const stamp = startedAt.toISOString().replace(/[:.]/g, "-");
const dir = join(parent, `undertone-${stamp}`);
if (existsSync(dir)) throw new Error(`${dir} exists already.`);
mkdirSync(join(dir, OBJECTS), { recursive: true });

// 1. The database, as one snapshot.
const orm = await openDb();
let snap: { at: string; version: string; rows: Record<string, number>; referenced: string[] };
try {
  snap = await orm.em.fork().transactional(
    async (tx) => {
      const [s] = await tx.execute<{ id: string; at: Date; version: string }[]>(
        "select pg_export_snapshot() as id, now() as at, current_setting('server_version') as version",
      );
      const rows = await rowCounts((sql) => tx.execute(sql));
      const referenced =
        "photos" in rows
          ? (
              await tx.execute<{ key: string }[]>(
                `select k as key from photos, unnest(array[master_key, web_key, thumb_key]) as k
                 where status = 'ready' and k is not null`,
              )
            ).map((r) => r.key)
          : [];
      // The exporting transaction stays open until pg_dump has run on its snapshot.
      await runPg("pg_dump", ["--format=custom", `--dbname=${env.DATABASE_URL}`, `--snapshot=${s.id}`, `--file=${join(dir, DUMP)}`]);
      return { at: new Date(s.at).toISOString(), version: s.version, rows, referenced };
    },
    { isolationLevel: IsolationLevel.REPEATABLE_READ, readOnly: true },
  );
} finally {
  await orm.close();
}
const dumpPath = join(dir, DUMP);
console.log(`database: ${describeDb(env.DATABASE_URL)} dumped (${statSync(dumpPath).size} bytes, snapshot at ${snap.at})`);

// 2. Every object in the bucket, listed after the dump.
const s3 = storageClient();
const listed: _Object[] = [];
let token: string | undefined;
do {
  const page = await s3.send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, ContinuationToken: token }));
  listed.push(...(page.Contents ?? []));
  token = page.IsTruncated ? page.NextContinuationToken : undefined;
} while (token);
const listedAt = new Date().toISOString();

const objects: ObjectEntry[] = [];
await eachLimited(listed, 4, async (o) => {
  const key = o.Key!;
  const out = await s3.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key: key }));
  const hash = createHash("sha256");
  let size = 0;
  const tmp = join(dir, OBJECTS, `.part-${objects.length}-${Math.random().toString(36).slice(2)}`);
  await pipeline(
    out.Body as Readable,
    async function* (src: AsyncIterable<Buffer>) {
      for await (const chunk of src) {
        hash.update(chunk);
        size += chunk.length;
        yield chunk;
      }
    },
    createWriteStream(tmp),
  );
  const sha256 = hash.digest("hex");
  renameSync(tmp, join(dir, OBJECTS, sha256));
  const lastModified = o.LastModified ? o.LastModified.toISOString() : null;
  objects.push({
    key,
    size,
    sha256,
    contentType: out.ContentType ?? null,
    lastModified,
    newerThanSnapshot: lastModified !== null && lastModified > snap.at,
  });
});
objects.sort((a, b) => (a.key < b.key ? -1 : 1));

const have = new Set(objects.map((o) => o.key));
const missingReferenced = [...new Set(snap.referenced)].filter((k) => !have.has(k)).sort();

const manifest: Manifest = {
  format: "undertone-backup",
  version: 1,
  startedAt: startedAt.toISOString(),
  finishedAt: new Date().toISOString(),
  database: {
    source: describeDb(env.DATABASE_URL),
    serverVersion: snap.version,
    snapshotAt: snap.at,
    file: DUMP,
    bytes: statSync(dumpPath).size,
    sha256: await sha256File(dumpPath),
    rows: snap.rows,
  },
  bucket: { name: env.S3_BUCKET, endpoint: env.S3_ENDPOINT, listedAt, objects, missingReferenced },
};
writeFileSync(join(dir, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`);

const rows = Object.values(snap.rows).reduce((a, b) => a + b, 0);
const bytes = objects.reduce((a, o) => a + o.size, 0);
const newer = objects.filter((o) => o.newerThanSnapshot).length;
console.log(`database: ${Object.keys(snap.rows).length} tables, ${rows} rows`);
console.log(`bucket: ${env.S3_BUCKET}: ${objects.length} objects, ${bytes} bytes${newer ? ` (${newer} written after the snapshot)` : ""}`);
if (missingReferenced.length) {
  console.warn(
    `warning: ${missingReferenced.length} object(s) the dumped rows refer to were gone from the bucket by the listing ` +
      `(deleted while the backup ran?): ${missingReferenced.slice(0, 5).join(", ")}${missingReferenced.length > 5 ? ", …" : ""}`,
  );
}
console.log(`backup: ${dir}`);
