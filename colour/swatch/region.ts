// readSwatch: the calibrated colour of a yarn region and its dominant colours with area shares.
import type { ModelParams } from "../calibration/fit";
import type { PixelRect, RawImage } from "../calibration/grid";
import { D65_WHITE, linearSrgbToXyz, SRGB_TO_XYZ, srgbDecode, xyzToLab } from "../spaces";
import type { Lab, PaletteEntry, Rgb, Xyz } from "../types";
import { seeded } from "./kmeans";
import { groupColours, paletteOf, type Samples } from "./palette";

/** What the reader needs from a calibration: the tone curve's 8-bit lookup table and the linear → XYZ fit. */
export interface SwatchCalibration {
  toneCurve: { lut: readonly [Float64Array, Float64Array, Float64Array] };
  linearToXyz(lin: Rgb): Xyz;
  /** The fitted model's numbers, when known: lets the reader run its own allocation-free loop. */
  params?: { fit: ModelParams };
}

const SRGB_LUT = Float64Array.from({ length: 256 }, (_, i) => srgbDecode(i / 255));

/** No card in the photo: read the pixels as sRGB (IEC 61966-2-1). Indicative only. */
export const UNCALIBRATED: SwatchCalibration = {
  toneCurve: { lut: [SRGB_LUT, SRGB_LUT, SRGB_LUT] },
  linearToXyz: linearSrgbToXyz,
  params: { fit: { model: "matrix3x3", coefficients: [...SRGB_TO_XYZ] } },
};

export interface SwatchReading {
  /** Robust colour of the region (CIELAB D65): the area-weighted linear mean of its colours. */
  lab: Lab;
  /** Dominant colours, largest share first; shares sum to 1. */
  palette: PaletteEntry[];
  /** Pixels read (a seeded random sample of the region when it is large). */
  pixelsSampled: number;
  /** Sampled pixels that count towards the colour. */
  pixelsUsed: number;
  /** Sampled pixels left out as inter-strand shadow and as specular glint. */
  excluded: { shadow: number; glint: number };
}

export interface ReadOptions {
  /** Most pixels to read; larger regions are sampled at random (default 20 000). */
  maxSamples?: number;
  /** Seed of the sampling and clustering (default 1): the same pixels always give the same reading. */
  seed?: number;
  /** Merge palette colours closer than this ΔE00 (default 5) and drop those under this share (default 0.03). */
  mergeDe00?: number;
  minShare?: number;
}

/**
 * Read a yarn region: calibrate its pixels to CIELAB, leave out inter-strand shadows and glints,
 * and give its robust colour and dominant colours with area shares (see palette.ts for the method).
 * `pixels` holds only the region (see `cropPixels`), 8-bit, `channels` per pixel (alpha ignored).
 */
export function readSwatch(
  pixels: Uint8Array | Uint8ClampedArray, channels: number, calibration: SwatchCalibration = UNCALIBRATED, options: ReadOptions = {},
): SwatchReading {
  const total = Math.floor(pixels.length / Math.max(channels, 1));
  return readArea({ data: pixels, width: total, height: 1, channels }, { x: 0, y: 0, width: total, height: 1 }, calibration, options);
}

/** The same reading as readSwatch, taken from a rectangle of a whole decoded photo without copying it. */
export function readRegion(
  image: RawImage, rect: PixelRect, calibration: SwatchCalibration = UNCALIBRATED, options: ReadOptions = {},
): SwatchReading {
  const x0 = Math.max(0, Math.round(rect.x)), y0 = Math.max(0, Math.round(rect.y));
  const x1 = Math.min(image.width, Math.round(rect.x + rect.width)), y1 = Math.min(image.height, Math.round(rect.y + rect.height));
  return readArea(image, { x: x0, y: y0, width: Math.max(0, x1 - x0), height: Math.max(0, y1 - y0) }, calibration, options);
}

function readArea(image: RawImage, rect: PixelRect, calibration: SwatchCalibration, options: ReadOptions): SwatchReading {
  if (image.channels < 3) throw new RangeError("readSwatch needs RGB pixels (3 or 4 channels).");
  if (rect.width * rect.height === 0) throw new RangeError("The swatch region holds no pixels.");
  const maxSamples = options.maxSamples ?? 20_000;
  const samples = sample(image, rect, maxSamples, calibration, options.seed ?? 1);
  const { groups, shadow, glint } = groupColours(samples, options.seed ?? 1);
  const used = groups.reduce((t, g) => t + g.count, 0);
  const area = groups.reduce((t, g) => t + g.area, 0);
  if (used === 0) throw new RangeError("Every pixel of the region was left out as shadow or glint.");
  const mean = { X: 0, Y: 0, Z: 0 };
  for (const g of groups) {
    mean.X += (g.xyz.X * g.area) / area;
    mean.Y += (g.xyz.Y * g.area) / area;
    mean.Z += (g.xyz.Z * g.area) / area;
  }
  return {
    lab: xyzToLab(mean),
    palette: paletteOf(groups, options.mergeDe00 ?? 5, options.minShare ?? 0.03),
    pixelsSampled: samples.n,
    pixelsUsed: used,
    excluded: { shadow, glint },
  };
}

/** Copy a rectangle of a raw image into its own buffer (rows joined, same channels). */
export function cropPixels(image: RawImage, rect: PixelRect): Uint8Array {
  const { data, width, height, channels } = image;
  const x0 = Math.max(0, rect.x), y0 = Math.max(0, rect.y);
  const x1 = Math.min(width, rect.x + rect.width), y1 = Math.min(height, rect.y + rect.height);
  const w = Math.max(0, x1 - x0), rowBytes = w * channels;
  const out = new Uint8Array(rowBytes * Math.max(0, y1 - y0));
  for (let y = y0; y < y1; y++) {
    const from = (y * width + x0) * channels;
    out.set(data.subarray(from, from + rowBytes), (y - y0) * rowBytes);
  }
  return out;
}

function sample(image: RawImage, rect: PixelRect, max: number, cal: SwatchCalibration, seed: number): Samples {
  const { data: pixels, width, channels } = image;
  const total = rect.width * rect.height;
  const n = Math.min(total, max);
  const random = seeded(seed ^ 0x5eed);
  const [lr, lg, lb] = cal.toneCurve.lut;
  const s: Samples = {
    n,
    X: new Float64Array(n), Y: new Float64Array(n), Z: new Float64Array(n),
    L: new Float64Array(n), a: new Float64Array(n), b: new Float64Array(n),
  };
  const fit = cal.params?.fit;
  const c = fit?.coefficients ?? [];
  const root = fit?.model === "root-polynomial";
  const t = root ? 6 : 3;
  const xyz = { X: 0, Y: 0, Z: 0 };
  // Every pixel when the region is small; otherwise a random pick (a regular stride could beat with
  // the yarn's twist), read in memory order so that a large photo is walked once, not hopped about.
  const pick = new Int32Array(n);
  for (let i = 0; i < n; i++) pick[i] = n === total ? i : Math.floor(random() * total);
  if (n < total) pick.sort();
  for (let i = 0; i < n; i++) {
    const k = pick[i];
    const row = Math.floor(k / rect.width);
    const p = ((rect.y + row) * width + rect.x + (k - row * rect.width)) * channels;
    const r = lr[pixels[p]], g = lg[pixels[p + 1]], b = lb[pixels[p + 2]];
    if (fit) {
      // The fit's own formula (calibration/fit.ts predictXyz), inlined: no allocation per pixel.
      let X = c[0] * r + c[1] * g + c[2] * b, Y = c[t] * r + c[t + 1] * g + c[t + 2] * b;
      let Z = c[2 * t] * r + c[2 * t + 1] * g + c[2 * t + 2] * b;
      if (root) {
        const rg = Math.sqrt(r * g), rb = Math.sqrt(r * b), gb = Math.sqrt(g * b);
        X += c[3] * rg + c[4] * rb + c[5] * gb;
        Y += c[9] * rg + c[10] * rb + c[11] * gb;
        Z += c[15] * rg + c[16] * rb + c[17] * gb;
      }
      xyz.X = X; xyz.Y = Y; xyz.Z = Z;
    } else Object.assign(xyz, cal.linearToXyz([r, g, b]));
    s.X[i] = xyz.X; s.Y[i] = xyz.Y; s.Z[i] = xyz.Z;
    labInto(xyz, s, i);
  }
  return s;
}

const EPS = 216 / 24389, KAPPA = 24389 / 27;
const f = (v: number) => (v > EPS ? Math.cbrt(v) : (KAPPA * v + 16) / 116);

/** CIELAB D65 of one XYZ into the samples (CIE 15:2004; the formula of spaces.ts xyzToLab, inlined). */
function labInto(xyz: Xyz, s: Samples, i: number): void {
  const fx = f(xyz.X / D65_WHITE.X), fy = f(xyz.Y), fz = f(xyz.Z / D65_WHITE.Z);
  s.L[i] = 116 * fy - 16;
  s.a[i] = 500 * (fx - fy);
  s.b[i] = 200 * (fy - fz);
}
