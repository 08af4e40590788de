import "server-only";
import sharp, { type Metadata, type OutputInfo } from "sharp";
import { badRequest } from "@/lib/errors";

// Checks an uploaded photo by its bytes and writes the stored variants. The image is decoded once
// with its EXIF orientation applied; raw pixels carry no metadata, so no variant keeps EXIF or GPS.

/** Largest image we decode: a 50 MP phone photo; larger is refused as a possible pixel bomb. */
export const MAX_PIXELS = 50_000_000;
const FORMATS: Record<string, string> = { jpeg: "image/jpeg", png: "image/png", webp: "image/webp", heif: "image/heic" };

export interface Variants {
  master: Buffer;
  web: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
  originalType: string;
}

export async function makeVariants(input: Buffer): Promise<Variants> {
  let meta: Metadata;
  try {
    // Reads the header only (no decode), so a huge declared size is safe to look at here.
    meta = await sharp(input, { limitInputPixels: false }).metadata();
  } catch {
    throw badRequest("This file is not a photo we can read. Upload a JPEG, PNG, WebP or HEIC image.");
  }
  const originalType = meta.format ? FORMATS[meta.format] : undefined;
  if (!originalType) throw badRequest("This file is not a JPEG, PNG, WebP or HEIC photo, whatever its name says.");
  if (!meta.width || !meta.height) throw badRequest("This photo has no size we can read.");
  if (meta.width * meta.height > MAX_PIXELS) {
    throw badRequest(`This image has ${Math.round((meta.width * meta.height) / 1e6)} megapixels; at most 50 are accepted.`);
  }
  let decoded: { data: Buffer; info: OutputInfo };
  try {
    decoded = await sharp(input, { limitInputPixels: MAX_PIXELS, failOn: "truncated" })
      .rotate()
      .raw()
      .toBuffer({ resolveWithObject: true });
  } catch {
    throw badRequest("This photo is damaged or cut short (the upload may have stopped). Upload it again.");
  }
  const { data, info } = decoded;
  const raw = () => sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } });
  // The master keeps full resolution and chroma (4:4:4) so readings lose next to nothing.
  const [master, web, thumb] = await Promise.all([
    raw().jpeg({ quality: 95, chromaSubsampling: "4:4:4" }).toBuffer(),
    raw().resize({ width: 1600, height: 1600, fit: "inside", withoutEnlargement: true }).webp({ quality: 82 }).toBuffer(),
    raw().resize({ width: 320, height: 320, fit: "cover" }).webp({ quality: 75 }).toBuffer(),
  ]);
  return { master, web, thumb, width: info.width, height: info.height, originalType };
}
