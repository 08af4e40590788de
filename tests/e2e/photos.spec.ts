// A dyer at the dye table photographs a swatch beside the studio's reference card: the photo goes
// to the object store, the dyer marks the card's corners and the yarn, and gets a calibrated reading
// close to the colour the synthetic photo was made with.
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { randomUUID } from "node:crypto";
import { expect, test } from "@playwright/test";
import sharp from "sharp";
import { deltaE00, renderPhoto } from "@/colour";
import { authFile, layoutFaults, shot } from "./helpers";
import { parseLab } from "./photo-steps";

test.use({ storageState: authFile("dyer") });

const S3_PORT = Number(process.env.S3_PORT ?? 4569);
const BUCKET = process.env.S3_BUCKET ?? "undertone-photos";
const s3 = new S3Client({
  endpoint: `http://127.0.0.1:${S3_PORT}`,
  region: "us-east-1",
  forcePathStyle: true,
  credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
});

async function keysUnder(prefix: string): Promise<string[]> {
  const out = await s3.send(new ListObjectsV2Command({ Bucket: BUCKET, Prefix: prefix }));
  return (out.Contents ?? []).map((o) => o.Key!).sort();
}

test("upload a swatch photo, mark the card and the yarn, read its colour", async ({ page }, info) => {
  test.setTimeout(120_000);
  // The synthetic photo: the demo card under a warm, non-D65 light, and one solid plum swatch.
  const truth = { L: 46, a: 30, b: -20 };
  const W = 1200, H = 800;
  const photo = renderPhoto({
    width: W,
    height: H,
    seed: 11,
    swatches: [{ spec: { kind: "solid", lab: truth }, rect: { x: 700, y: 250, width: 380, height: 320 } }],
  });
  const jpeg = await sharp(photo.data, { raw: { width: W, height: H, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();

  // A fresh trial of our own, so the photo list starts empty.
  await page.goto("/");
  await expect(page).toHaveURL(/\/s\/[0-9a-f-]{36}$/);
  const sid = page.url().match(/\/s\/([0-9a-f-]{36})/)![1];
  const title = `Plum swatch ${randomUUID().slice(0, 6)}`;
  const created = await page.request.post(`/api/studios/${sid}/trials`, { data: { title, fibreWeightG: 20 } });
  expect(created.status(), await created.text()).toBe(201);
  const trial = (await created.json()) as { id: string };

  await page.goto(`/s/${sid}/trials/${trial.id}`);
  await expect(page.getByText("No photos yet")).toBeVisible({ timeout: 30_000 });
  await expect(page.getByLabel("The photo shows")).toHaveValue("base");
  await page.getByLabel("Photo file").setInputFiles({ name: "swatch.jpg", mimeType: "image/jpeg", buffer: jpeg });

  // The thumbnail appears and has really loaded from the bucket.
  const thumb = page.getByRole("img", { name: "Undyed base" });
  await expect(thumb).toBeVisible({ timeout: 30_000 });
  await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(320);
  await page
    .locator("section")
    .filter({ has: page.getByRole("heading", { name: "Photos and readings" }) })
    .screenshot({ path: `test-results/screenshots/${info.project.name}-photo-uploaded.png` });

  await thumb.click();
  await expect(page).toHaveURL(/\/photos\/[0-9a-f-]{36}$/);
  const pid = page.url().match(/\/photos\/([0-9a-f-]{36})$/)![1];

  // The stored objects in the S3 fake: the master and its variants, and no raw upload left behind.
  const prefix = `studios/${sid}/photos/${pid}/`;
  expect(await keysUnder(prefix)).toEqual([`${prefix}master.jpg`, `${prefix}thumb.webp`, `${prefix}web.webp`]);
  expect(await keysUnder(`studios/${sid}/uploads/${pid}`)).toEqual([]);

  await expect(page.getByRole("heading", { name: "Undyed base" })).toBeVisible();
  const status = page.getByRole("status").filter({ hasText: /Tap|Ready/ });
  await expect(status).toContainText("top-left corner");
  const canvas = page.getByTestId("photo-canvas");
  const img = canvas.getByRole("img", { name: "The photo to measure" });
  await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth > 0)).toBe(true);
  const box = (await canvas.boundingBox())!;
  const at = (p: { x: number; y: number }) => ({ x: (p.x / W) * box.width, y: (p.y / H) * box.height });

  // The card's four patch-area corners, in the order the page asks for them.
  for (const [i, corner] of photo.gridCorners.entries()) {
    await expect(status).toContainText(`(${i + 1} of 4)`);
    await canvas.click({ position: at(corner) });
  }
  await expect(status).toContainText("one corner of an area of yarn");
  // The yarn, well inside the swatch.
  await canvas.click({ position: at({ x: 760, y: 300 }) });
  await canvas.click({ position: at({ x: 1020, y: 520 }) });
  await expect(status).toHaveText("Ready to read the marked area.");
  await shot(page, info, "photo-marked");

  await page.getByRole("button", { name: "Read the colour" }).click();
  const readings = page.locator("section").filter({ has: page.getByRole("heading", { name: "Readings of this photo" }) });
  const labText = readings.getByText(/^L\* .* · a\* .* · b\* /).first();
  await expect(labText).toBeVisible({ timeout: 30_000 });
  const lab = parseLab(await labText.innerText());
  const de = deltaE00(lab, photo.swatches[0].lab);
  info.annotations.push({ type: "ΔE00 to the generated truth", description: de.toFixed(2) });
  expect(de).toBeLessThan(2.0);
  await expect(readings.getByText(/Calibration (good|usable)/).first()).toBeVisible();
  await labText.scrollIntoViewIfNeeded();
  await shot(page, info, "photo-reading");
  if (info.project.name === "phone") expect(await layoutFaults(page)).toEqual([]);

  // Back on the trial, the reading is there too.
  await page.getByRole("link", { name: "← Back to the trial" }).click();
  await expect(page.getByText(/^L\* .* · a\* .* · b\* /).first()).toBeVisible();
});
