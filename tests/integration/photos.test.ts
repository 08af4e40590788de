// Swatch photos through their routes against the real S3 fake and Postgres: presigned upload,
// confirmation by the bytes, variants without EXIF, refusals that leave nothing behind, studio
// scoping, and a calibrated reading of a synthetic photo against its known truth.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { deflateSync } from "node:zlib";
import sharp from "sharp";
import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import * as uploadsRoute from "@/app/api/studios/[studioId]/photos/route";
import * as confirmRoute from "@/app/api/studios/[studioId]/photos/[photoId]/confirm/route";
import * as fileRoute from "@/app/api/studios/[studioId]/photos/[photoId]/file/route";
import * as readingsRoute from "@/app/api/studios/[studioId]/photos/[photoId]/readings/route";
import * as cardsRoute from "@/app/api/studios/[studioId]/cards/route";
import * as cardRoute from "@/app/api/studios/[studioId]/cards/[cardId]/route";
import * as trialPhotosRoute from "@/app/api/studios/[studioId]/trials/[trialId]/photos/route";
import { deltaE00, DEMO_CARD, renderPhoto } from "@/colour";
import { PhotoSchema } from "@/entities";
import { getEm, getOrm } from "@/lib/db";
import { stopBoss } from "@/lib/jobs/boss";
import { env } from "@/lib/env";
import { storageClient } from "@/lib/storage";
import { sweepPendingUploads } from "@/lib/photos/photos";
import { actAs } from "../support/session";
import { type Person, type StudioFixture, makeStudio, makeUser } from "../support/fixtures";
import { call } from "../support/route";
import { makeTrial } from "../support/trial-fixtures";
import { drainQueue } from "../support/jobs";

vi.mock("@/lib/auth/session-token", async (importOriginal) => {
  const { fakeSessionUserId } = await import("../support/session");
  return { ...(await importOriginal<object>()), sessionUserIdFromCookies: fakeSessionUserId };
});

const TAG = "photos";
let owner: Person, dyer: Person, guest: Person, stranger: Person;
let studio: StudioFixture, other: StudioFixture;
let trialId: string;

async function objectsUnder(prefix: string): Promise<string[]> {
  const out = await storageClient().send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, Prefix: prefix }));
  return (out.Contents ?? []).map((o) => o.Key!);
}

/** Starts an upload, PUTs the bytes to the presigned URL like a browser, then confirms. */
async function upload(bytes: Buffer, contentType = "image/jpeg", kind = "base") {
  const start = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind, contentType, bytes: bytes.length } });
  expect(start.status).toBe(201);
  const put = await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": contentType }, body: new Uint8Array(bytes) });
  expect(put.ok).toBe(true);
  const confirm = await call(confirmRoute.POST, "POST", { studioId: studio.id, photoId: start.json.photo.id });
  return { id: start.json.photo.id as string, confirm };
}

/** A valid all-black greyscale PNG of width × height: tens of megapixels in a few dozen kB. */
function blackPng(width: number, height: number): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (buf: Buffer) => {
    let c = 0xffffffff;
    for (const b of buf) c = crcTable[(c ^ b) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
    const out = Buffer.alloc(8 + data.length + 4);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc(body), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  const rows = deflateSync(Buffer.alloc(height * (width + 1)), { level: 9 }); // filter byte 0 + zeros per row
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", rows),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

async function photoRowExists(id: string): Promise<boolean> {
  return Boolean(await (await getEm()).findOne(PhotoSchema, { id }));
}

beforeAll(async () => {
  [owner, dyer, guest, stranger] = await Promise.all(["owner", "dyer", "guest", "stranger"].map((n) => makeUser(TAG, n)));
  studio = await makeStudio("Photo Studio", [[owner, "owner"], [dyer, "dyer"], [guest, "guest"]]);
  other = await makeStudio("Elsewhere", [[stranger, "owner"]]);
  trialId = await makeTrial(studio.id, { title: "Photo trial", authorId: dyer.id });
});

afterAll(async () => {
  await stopBoss();
  await (await getOrm()).close();
});

describe("upload and confirm", () => {
  it("stores oriented variants without EXIF (GPS included) and removes the raw upload", async () => {
    actAs(dyer);
    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: "#7a4f8c" } })
      .jpeg()
      .withExif({ IFD0: { Make: "TestCam" }, IFD3: { GPSLatitudeRef: "N", GPSLatitude: "51/1 30/1 0/1" } })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    expect((await sharp(jpeg).metadata()).exif).toBeDefined(); // the upload really carries EXIF
    const { id, confirm } = await upload(jpeg);
    expect(confirm.status).toBe(200);
    expect(confirm.json).toMatchObject({ status: "ready", width: 480, height: 640 }); // rotated by orientation 6
    const keys = await objectsUnder(`studios/${studio.id}/`);
    expect(keys.filter((k) => k.includes(id)).sort()).toEqual(
      [`studios/${studio.id}/photos/${id}/master.jpg`, `studios/${studio.id}/photos/${id}/thumb.webp`, `studios/${studio.id}/photos/${id}/web.webp`],
    );
    for (const v of ["thumb", "web", "master"]) {
      const res = await fileRoute.GET(new Request(`http://x/?v=${v}`), { params: Promise.resolve({ studioId: studio.id, photoId: id }) });
      expect(res.status).toBe(200);
      const meta = await sharp(Buffer.from(await res.arrayBuffer())).metadata();
      expect(meta.exif, `${v} has no EXIF`).toBeUndefined();
      if (v === "thumb") expect([meta.width, meta.height]).toEqual([320, 320]);
    }
  });

  it.each([
    ["a text file named .jpg", Buffer.from("this is not a picture at all, just words"), 422, /not a photo/i],
    ["a truncated JPEG", null, 422, /damaged or cut short/i],
    ["a pixel bomb (tiny PNG claiming 60 MP)", "bomb", 422, /megapixels/i],
  ])("refuses %s and leaves no object or record", async (_name, bytes, status, message) => {
    actAs(dyer);
    let body: Buffer;
    if (bytes === null) {
      const full = await sharp({ create: { width: 800, height: 600, channels: 3, background: "#336699" } }).jpeg().toBuffer();
      body = full.subarray(0, Math.floor(full.length * 0.6));
    } else if (bytes === "bomb") {
      body = blackPng(8000, 7500); // 60 MP
    } else body = bytes as Buffer;
    const { id, confirm } = await upload(body);
    expect(confirm.status).toBe(status);
    expect(confirm.json.error).toMatch(message);
    expect(await photoRowExists(id)).toBe(false);
    expect((await objectsUnder(`studios/${studio.id}/`)).filter((k) => k.includes(id))).toEqual([]);
  });

  it("a confirm sent twice at once (a phone retrying on bad Wi-Fi) makes one photo, once", async () => {
    actAs(dyer);
    const jpeg = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: "#3c7a5a" } }).jpeg().toBuffer();
    const start = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "final", contentType: "image/jpeg", bytes: jpeg.length } });
    expect(start.status).toBe(201);
    await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(jpeg) });
    const id = start.json.photo.id as string;
    const [a, b, c] = await Promise.all([0, 1, 2].map(() => call(confirmRoute.POST, "POST", { studioId: studio.id, photoId: id })));
    for (const r of [a, b, c]) {
      expect(r.status, JSON.stringify(r.json)).toBe(200);
      expect(r.json).toMatchObject({ id, status: "ready", width: 1600, height: 1200 });
    }
    const em = await getEm();
    const events = await em.getConnection().execute("select 1 from activity_events where kind = 'photo.added' and subject_id = ?", [id]);
    expect(events).toHaveLength(1);
    expect((await objectsUnder(`studios/${studio.id}/`)).filter((k) => k.includes(id)).sort()).toEqual(
      [`studios/${studio.id}/photos/${id}/master.jpg`, `studios/${studio.id}/photos/${id}/thumb.webp`, `studios/${studio.id}/photos/${id}/web.webp`],
    );
  });

  it("refuses a 30 MB file before any upload URL is given", async () => {
    actAs(dyer);
    const res = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "base", contentType: "image/jpeg", bytes: 30 * 1024 * 1024 } });
    expect(res.status).toBe(422);
    expect(res.json.fields.bytes).toMatch(/25 MB/);
  });

  it("refuses a 30 MB object that arrives anyway (size checked again on confirm)", async () => {
    actAs(dyer);
    const start = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "base", contentType: "image/jpeg", bytes: 1000 } });
    await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(30 * 1024 * 1024) });
    const confirm = await call(confirmRoute.POST, "POST", { studioId: studio.id, photoId: start.json.photo.id });
    expect(confirm.status).toBe(413);
    expect(await photoRowExists(start.json.photo.id)).toBe(false);
    expect((await objectsUnder(`studios/${studio.id}/uploads/${start.json.photo.id}`))).toEqual([]);
  });

  it("lets a guest see photos but not upload; another studio gets 404", async () => {
    actAs(guest);
    const res = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "base", contentType: "image/jpeg", bytes: 1000 } });
    expect(res.status).toBe(403);
    const list = await call(trialPhotosRoute.GET, "GET", { studioId: studio.id, trialId });
    expect(list.status).toBe(200);
    expect(list.json.photos.length).toBeGreaterThan(0);
    const photoId = list.json.photos[0].id;
    actAs(stranger);
    const own = await fileRoute.GET(new Request("http://x/?v=thumb"), { params: Promise.resolve({ studioId: other.id, photoId }) });
    expect(own.status).toBe(404); // the photo exists, but not in the stranger's studio
    const theirs = await fileRoute.GET(new Request("http://x/?v=thumb"), { params: Promise.resolve({ studioId: studio.id, photoId }) });
    expect(theirs.status).toBe(404);
    actAs(null);
    const anon = await fileRoute.GET(new Request("http://x/?v=thumb"), { params: Promise.resolve({ studioId: studio.id, photoId }) });
    expect(anon.status).toBe(401);
  });

  it("sweeps unconfirmed uploads older than a day", async () => {
    actAs(dyer);
    const start = await call(uploadsRoute.POST, "POST", { studioId: studio.id }, { body: { trialId, kind: "final", contentType: "image/png", bytes: 10 } });
    await fetch(start.json.uploadUrl, { method: "PUT", headers: { "content-type": "image/png" }, body: "x" });
    const em = await getEm();
    await em.getConnection().execute("update photos set created_at = now() - interval '25 hours' where id = ?", [start.json.photo.id]);
    expect(await sweepPendingUploads(await getEm())).toBeGreaterThanOrEqual(1);
    expect(await photoRowExists(start.json.photo.id)).toBe(false);
    expect(await objectsUnder(`studios/${studio.id}/uploads/${start.json.photo.id}`)).toEqual([]);
  });
});

describe("calibrated readings", () => {
  it("reads a synthetic swatch within ΔE00 2.0 of its truth and recomputes when the card changes", async () => {
    actAs(dyer);
    const card = await call(cardsRoute.POST, "POST", { studioId: studio.id }, {
      body: { name: "Demo card", rows: DEMO_CARD.rows, cols: DEMO_CARD.cols, patches: DEMO_CARD.patches.map((p) => ({ name: p.name, ...p.lab })), measured: true },
    });
    expect(card.status).toBe(201);
    const truthLab = { L: 48, a: 32, b: -18 };
    const photo = renderPhoto({
      width: 1200,
      height: 800,
      seed: 7,
      swatches: [{ spec: { kind: "solid", lab: truthLab }, rect: { x: 700, y: 250, width: 350, height: 300 } }],
    });
    const jpeg = await sharp(photo.data, { raw: { width: photo.width, height: photo.height, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
    const { id, confirm } = await upload(jpeg);
    expect(confirm.status).toBe(200);
    const res = await call(readingsRoute.POST, "POST", { studioId: studio.id, photoId: id }, {
      body: { cardId: card.json.id, corners: photo.gridCorners, regions: [{ label: "skein", rect: { x: 740, y: 290, width: 270, height: 220 } }] },
    });
    expect(res.status).toBe(201);
    const reading = res.json[0];
    expect(deltaE00(reading.lab, photo.swatches[0].lab)).toBeLessThan(2.0);
    expect(reading.calibration.quality).not.toBe("retake");
    expect(reading.cardVersion).toBe(card.json.version);

    // Changing the card's values queues a job that re-measures the reading with the new version;
    // until it has run the reading says it is being measured again.
    const patches = card.json.patches.map((p: { L: number }, i: number) => (i === 0 ? { ...p, L: p.L - 1 } : p));
    const put = await call(cardRoute.PUT, "PUT", { studioId: studio.id, cardId: card.json.id }, { body: { ...card.json, patches, version: card.json.version } });
    expect(put.status).toBe(200);
    expect(put.json.recomputing).toBe(1);
    const readingOf = async () =>
      (await call(trialPhotosRoute.GET, "GET", { studioId: studio.id, trialId })).json.readings.find((r: { id: string }) => r.id === reading.id);
    expect(await readingOf()).toMatchObject({ cardVersion: card.json.version, remeasuring: true });
    const drained = await drainQueue("card-readings-recompute");
    expect(drained.ran).toContainEqual({ cardId: card.json.id });
    expect(drained.failed).toEqual([]);
    expect(await readingOf()).toMatchObject({ cardVersion: put.json.version, remeasuring: false });
    const stale = await call(cardRoute.PUT, "PUT", { studioId: studio.id, cardId: card.json.id }, { body: { ...card.json, patches, version: card.json.version } });
    expect(stale.status).toBe(409);
  });

  it("refuses a reading whose card corners miss the card, with the reason", async () => {
    actAs(dyer);
    const cards = await call(cardsRoute.GET, "GET", { studioId: studio.id });
    const photo = renderPhoto({ width: 600, height: 400, seed: 3 });
    const jpeg = await sharp(photo.data, { raw: { width: 600, height: 400, channels: 3 } }).jpeg().toBuffer();
    const { id } = await upload(jpeg);
    const res = await call(readingsRoute.POST, "POST", { studioId: studio.id, photoId: id }, {
      body: { cardId: cards.json[0].id, corners: [{ x: 400, y: 10 }, { x: 590, y: 10 }, { x: 590, y: 100 }, { x: 400, y: 100 }], regions: [{ rect: { x: 10, y: 10, width: 50, height: 50 } }] },
    });
    expect(res.status).toBe(422);
    expect(res.json.error.length).toBeGreaterThan(10);
  });
});
