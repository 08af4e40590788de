// Swatch photos for the browser tests: synthetic photos of a known colour beside the demo card,
// sent through the real upload routes (for set-up), or marked and read on the measure page as a
// dyer would.
import { type APIRequestContext, type Page, expect } from "@playwright/test";
import sharp from "sharp";
import { renderPhoto, type Lab } from "@/colour";

export const PHOTO_W = 1200;
export const PHOTO_H = 800;
/** Where the yarn lies in every test photo, and the part of it the tests read. */
const SWATCH = { x: 700, y: 250, width: 380, height: 320 };
export const READ_RECT = { x: 760, y: 300, width: 260, height: 220 };

export interface TestPhoto {
  jpeg: Buffer;
  gridCorners: { x: number; y: number }[];
  /** The colour the yarn was rendered with. */
  truth: Lab;
}

/** A phone-like JPEG of a solid swatch of `lab` beside the demo card (colour/synthetic). */
export async function swatchPhoto(lab: Lab, seed: number): Promise<TestPhoto> {
  const photo = renderPhoto({ width: PHOTO_W, height: PHOTO_H, seed, swatches: [{ spec: { kind: "solid", lab }, rect: SWATCH }] });
  const jpeg = await sharp(photo.data, { raw: { width: PHOTO_W, height: PHOTO_H, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
  return { jpeg, gridCorners: photo.gridCorners, truth: photo.swatches[0].lab };
}

async function ok<T>(res: Awaited<ReturnType<APIRequestContext["post"]>>, status = [200, 201]): Promise<T> {
  expect(status, `${res.url()} → ${res.status()} ${await res.text()}`).toContain(res.status());
  return (await res.json()) as T;
}

/**
 * Uploads `photo` to a trial through the routes the page uses (start → PUT to the bucket →
 * confirm) and reads it with the studio's card. Returns the reading's id.
 */
export async function photographViaApi(
  request: APIRequestContext,
  studioId: string,
  at: { trialId: string; layerId?: string | null; kind: string },
  photo: TestPhoto,
): Promise<string> {
  const start = await ok<{ photo: { id: string }; uploadUrl: string }>(
    await request.post(`/api/studios/${studioId}/photos`, {
      data: { trialId: at.trialId, layerId: at.layerId ?? null, kind: at.kind, contentType: "image/jpeg", bytes: photo.jpeg.length },
    }),
  );
  const put = await request.put(start.uploadUrl, { data: photo.jpeg, headers: { "content-type": "image/jpeg" } });
  expect(put.ok(), `PUT to the bucket → ${put.status()}`).toBe(true);
  await ok(await request.post(`/api/studios/${studioId}/photos/${start.photo.id}/confirm`));
  const cards = await ok<{ id: string }[]>(await request.get(`/api/studios/${studioId}/cards`));
  const readings = await ok<{ id: string }[]>(
    await request.post(`/api/studios/${studioId}/photos/${start.photo.id}/readings`, {
      data: { cardId: cards[0].id, corners: photo.gridCorners, regions: [{ label: "", rect: READ_RECT }] },
    }),
  );
  return readings[0].id;
}

/** On the measure page: taps the card's four corners and two corners of the yarn, then reads. */
export async function markAndRead(page: Page, photo: TestPhoto) {
  const status = page.getByRole("status").filter({ hasText: /Tap|Ready/ });
  const canvas = page.getByTestId("photo-canvas");
  const img = canvas.getByRole("img", { name: "The photo to measure" });
  await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth > 0)).toBe(true);
  const box = (await canvas.boundingBox())!;
  const at = (p: { x: number; y: number }) => ({ x: (p.x / PHOTO_W) * box.width, y: (p.y / PHOTO_H) * box.height });
  for (const [i, corner] of photo.gridCorners.entries()) {
    await expect(status).toContainText(`(${i + 1} of 4)`);
    await canvas.click({ position: at(corner) });
  }
  await canvas.click({ position: at({ x: READ_RECT.x, y: READ_RECT.y }) });
  await canvas.click({ position: at({ x: READ_RECT.x + READ_RECT.width, y: READ_RECT.y + READ_RECT.height }) });
  await expect(status).toHaveText("Ready to read the marked area.");
  await page.getByRole("button", { name: "Read the colour" }).click();
  const readings = page.locator("section").filter({ has: page.getByRole("heading", { name: "Readings of this photo" }) });
  await expect(readings.getByText(/^L\* .* · a\* .* · b\* /).first()).toBeVisible({ timeout: 30_000 });
}

/** Reads "L* 48.1 · a* 31.7 · b* -18.2" back into numbers. */
export function parseLab(text: string): Lab {
  const m = text.match(/L\*\s*(-?[\d.]+)\s*·\s*a\*\s*(-?[\d.]+)\s*·\s*b\*\s*(-?[\d.]+)/);
  expect(m, `Lab text in "${text}"`).toBeTruthy();
  return { L: Number(m![1]), a: Number(m![2]), b: Number(m![3]) };
}
