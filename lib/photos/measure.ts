import "server-only";
import sharp from "sharp";
import {
  calibrateCard,
  CalibrationError,
  cropPixels,
  patchGrid,
  readSwatch,
  samplePatch,
  UNCALIBRATED,
  type Calibration,
  type Point,
  type RawImage,
} from "@/colour";
import type { Reading, ReferenceCard } from "@/entities";
import { badRequest } from "@/lib/errors";
import { MAX_PIXELS } from "./process";

// Measuring a decoded photo: calibration from the card's patches, then the swatch area's colour.

type CardValues = Pick<ReferenceCard, "rows" | "cols" | "patches">;

/** Decodes stored image bytes to raw 8-bit pixels. */
export async function decodeRaw(bytes: Buffer): Promise<RawImage> {
  const { data, info } = await sharp(bytes, { limitInputPixels: MAX_PIXELS }).raw().toBuffer({ resolveWithObject: true });
  return { data, width: info.width, height: info.height, channels: info.channels };
}

export function calibrate(image: RawImage, card: CardValues, corners: Point[]): Calibration {
  const places = patchGrid(corners as [Point, Point, Point, Point], card.rows, card.cols);
  const patches = places.map((place, i) => {
    const s = samplePatch(image, place.rect);
    const known = card.patches[i];
    return { known: { L: known.L, a: known.a, b: known.b }, rgb: s.rgb, clippedFraction: s.clippedFraction, name: known.name };
  });
  try {
    return calibrateCard(patches);
  } catch (e) {
    if (e instanceof CalibrationError || e instanceof RangeError) throw badRequest(e.message);
    throw e;
  }
}

export function measure(image: RawImage, rect: Reading["region"], calibration: Calibration | null) {
  const r = {
    x: Math.round(rect.x),
    y: Math.round(rect.y),
    width: Math.round(Math.min(rect.width, image.width - rect.x)),
    height: Math.round(Math.min(rect.height, image.height - rect.y)),
  };
  if (r.width < 4 || r.height < 4) throw badRequest("The swatch area lies outside the photo. Mark it again.");
  try {
    return readSwatch(cropPixels(image, r), image.channels, calibration ?? UNCALIBRATED);
  } catch (e) {
    if (e instanceof RangeError) throw badRequest(e.message);
    throw e;
  }
}

export function calibrationSummary(c: Calibration | null): Reading["calibration"] {
  return c
    ? { model: c.model, looMeanDe00: c.looMeanDe00, looMaxDe00: c.looMaxDe00, quality: c.quality, reasons: c.reasons }
    : null;
}

/** Bytes of a photo → the calibrated colour and palette of one area (the whole server-side reading). */
export async function readFromImage(bytes: Buffer, card: CardValues | null, corners: Point[] | null, rect: Reading["region"]) {
  const image = await decodeRaw(bytes);
  const calibration = card && corners ? calibrate(image, card, corners) : null;
  return { swatch: measure(image, rect, calibration), calibration: calibrationSummary(calibration) };
}
