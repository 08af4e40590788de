// Where each card patch lies in the photo, and its mean camera RGB.
//
// The card's patch area is a grid of rows × cols cells; a photo sees it in perspective. Given the
// grid's four outer corners in the photo, the square-to-quadrilateral homography (P. Heckbert,
// "Fundamentals of Texture Mapping and Image Warping", UC Berkeley MS thesis, 1989, §2.2.3) places
// every cell, and an inset keeps the sampling away from cell edges and printing bleed.
import type { Rgb } from "../types";

export interface Point {
  x: number;
  y: number;
}

/** An integer pixel box: x, y of its top-left pixel, width and height in pixels. */
export interface PixelRect {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Where to sample one patch. */
export interface PatchPlace {
  row: number;
  col: number;
  /** Centre of the cell in the photo. */
  centre: Point;
  /** The inset cell in the photo (top-left, top-right, bottom-right, bottom-left). */
  quad: [Point, Point, Point, Point];
  /** An axis-aligned pixel box that lies inside `quad` whatever the card's rotation. */
  rect: PixelRect;
}

/** A raw decoded image: 8-bit interleaved channels, row-major, no padding. */
export interface RawImage {
  data: Uint8Array | Uint8ClampedArray;
  width: number;
  height: number;
  channels: number;
}

/**
 * Sampling places of a rows × cols patch grid whose outer corners are seen at `corners`
 * (top-left, top-right, bottom-right, bottom-left), row by row. `inset` is the share of a cell's
 * width and height trimmed from each side (0.25 keeps the middle half).
 */
export function patchGrid(corners: readonly [Point, Point, Point, Point], rows: number, cols: number, inset = 0.25): PatchPlace[] {
  if (!(rows >= 1 && cols >= 1 && Number.isInteger(rows) && Number.isInteger(cols))) {
    throw new RangeError("rows and cols must be whole numbers of at least 1.");
  }
  if (!(inset >= 0 && inset < 0.5)) throw new RangeError("inset must be at least 0 and below 0.5.");
  const map = squareToQuad(corners);
  const out: PatchPlace[] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const u0 = (c + inset) / cols, u1 = (c + 1 - inset) / cols;
      const v0 = (r + inset) / rows, v1 = (r + 1 - inset) / rows;
      const quad: PatchPlace["quad"] = [map(u0, v0), map(u1, v0), map(u1, v1), map(u0, v1)];
      const centre = map((c + 0.5) / cols, (r + 0.5) / rows);
      out.push({ row: r, col: c, centre, quad, rect: innerBox(centre, quad) });
    }
  }
  return out;
}

/** The homography taking the unit square (u right, v down) to the quadrilateral p0..p3 (Heckbert 1989). */
export function squareToQuad(p: readonly [Point, Point, Point, Point]): (u: number, v: number) => Point {
  const [a, b, c, d, e, f, g, h] = squareToQuadMatrix(p);
  return (u, v) => {
    const w = g * u + h * v + 1;
    return { x: (a * u + b * v + c) / w, y: (d * u + e * v + f) / w };
  };
}

/**
 * The same homography as a row-major 3×3 matrix [a b c; d e f; g h 1]: x = (a u + b v + c) / w,
 * y = (d u + e v + f) / w, w = g u + h v + 1 (Heckbert 1989, §2.2.3).
 */
export function squareToQuadMatrix(p: readonly [Point, Point, Point, Point]): number[] {
  const [p0, p1, p2, p3] = p;
  const dx1 = p1.x - p2.x, dx2 = p3.x - p2.x, dx3 = p0.x - p1.x + p2.x - p3.x;
  const dy1 = p1.y - p2.y, dy2 = p3.y - p2.y, dy3 = p0.y - p1.y + p2.y - p3.y;
  let g = 0, h = 0;
  const den = dx1 * dy2 - dx2 * dy1;
  if (Math.abs(den) < 1e-12) throw new RangeError("The four corners do not form a quadrilateral.");
  if (Math.abs(dx3) > 1e-12 || Math.abs(dy3) > 1e-12) {
    g = (dx3 * dy2 - dx2 * dy3) / den;
    h = (dx1 * dy3 - dx3 * dy1) / den;
  }
  return [
    p1.x - p0.x + g * p1.x, p3.x - p0.x + h * p3.x, p0.x,
    p1.y - p0.y + g * p1.y, p3.y - p0.y + h * p3.y, p0.y,
    g, h, 1,
  ];
}

/** A square box around `centre` inside the convex quad: half-side = (distance to nearest edge) / √2. */
function innerBox(centre: Point, quad: readonly Point[]): PixelRect {
  let dMin = Infinity;
  for (let i = 0; i < 4; i++) {
    const a = quad[i], b = quad[(i + 1) % 4];
    const len = Math.hypot(b.x - a.x, b.y - a.y);
    const dist = Math.abs((b.x - a.x) * (a.y - centre.y) - (a.x - centre.x) * (b.y - a.y)) / len;
    dMin = Math.min(dMin, dist);
  }
  const half = dMin / Math.SQRT2;
  const x0 = Math.ceil(centre.x - half), y0 = Math.ceil(centre.y - half);
  const x1 = Math.floor(centre.x + half), y1 = Math.floor(centre.y + half);
  return { x: x0, y: y0, width: Math.max(0, x1 - x0), height: Math.max(0, y1 - y0) };
}

/**
 * Mean camera RGB of a pixel box, robust to dust and specks: per channel the 10 % trimmed mean,
 * taken from a 256-bin histogram. Also the share of pixels with any channel at 255.
 */
export function samplePatch(image: RawImage, rect: PixelRect): { rgb: Rgb; clippedFraction: number; pixels: number } {
  const { data, width, height, channels } = image;
  const x0 = Math.max(0, rect.x), y0 = Math.max(0, rect.y);
  const x1 = Math.min(width, rect.x + rect.width), y1 = Math.min(height, rect.y + rect.height);
  const hist = [new Uint32Array(256), new Uint32Array(256), new Uint32Array(256)];
  let n = 0, clipped = 0;
  for (let y = y0; y < y1; y++) {
    for (let x = x0, p = (y * width + x0) * channels; x < x1; x++, p += channels) {
      const r = data[p], g = data[p + 1], b = data[p + 2];
      hist[0][r]++;
      hist[1][g]++;
      hist[2][b]++;
      if (r === 255 || g === 255 || b === 255) clipped++;
      n++;
    }
  }
  if (n === 0) throw new RangeError("The patch's sampling box lies outside the image or is empty.");
  const rgb = hist.map((h) => trimmedMean(h, n, 0.1)) as unknown as Rgb;
  return { rgb, clippedFraction: clipped / n, pixels: n };
}

/** Mean of the values between the `trim` and 1 − `trim` quantiles of a histogram (fractional bins at the cuts). */
export function trimmedMean(hist: Uint32Array, n: number, trim: number): number {
  const lo = n * trim, hi = n * (1 - trim);
  let seen = 0, sum = 0;
  for (let v = 0; v < hist.length; v++) {
    const c = hist[v];
    if (c === 0) continue;
    const from = Math.max(seen, lo), to = Math.min(seen + c, hi);
    if (to > from) sum += (to - from) * v;
    seen += c;
  }
  return sum / (hi - lo);
}
