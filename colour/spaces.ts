// Colour space conversions: sRGB ↔ linear sRGB ↔ CIE XYZ (D65) ↔ CIELAB (D65) ↔ LCh.
//
// Written by hand (a few lines each) so that the single-colour functions and the bulk path below
// share one set of constants; culori's `lab65` is the oracle in the tests. The matrix and the white
// are the full-precision sRGB values that culori and colorjs.io use (derived from the sRGB
// primaries and white xy 0.3127, 0.3290), so the white maps to L = 100, a = b = 0.
import type { Lab, Lch, Rgb, Xyz } from "./types";

/** The sRGB D65 white, Y = 1 (white xy 0.3127, 0.3290; as in culori and colorjs.io). */
export const D65_WHITE: Xyz = Object.freeze({ X: 0.3127 / 0.329, Y: 1, Z: (1 - 0.3127 - 0.329) / 0.329 });

// Linear sRGB → XYZ D65 (rows sum to the white above) and its inverse, as in culori 4 / CSS Color 4.
/** Linear sRGB → XYZ D65, row-major (culori 4, CSS Color 4). */
export const SRGB_TO_XYZ: readonly number[] = [
  0.4123907992659593, 0.357584339383878, 0.1804807884018343,
  0.2126390058715102, 0.715168678767756, 0.0721923153607337,
  0.0193308187155918, 0.119194779794626, 0.9505321522496607,
];
/** XYZ D65 → linear sRGB, row-major (culori 4, CSS Color 4). */
export const XYZ_TO_SRGB: readonly number[] = [
  3.2409699419045226, -1.5373831775700939, -0.4986107602930034,
  -0.9692436362808796, 1.8759675015077204, 0.0415550574071756,
  0.0556300796969936, -0.2039769588889765, 1.0569715142428784,
];
const M = SRGB_TO_XYZ;
const M_INV = XYZ_TO_SRGB;

// CIELAB constants, CIE 15:2004: ε = 216/24389, κ = 24389/27.
const EPSILON = 216 / 24389;
const KAPPA = 24389 / 27;

/** Decode one sRGB channel (0–1) to linear light (IEC 61966-2-1). */
export function srgbDecode(v: number): number {
  const a = Math.abs(v);
  const lin = a <= 0.04045 ? a / 12.92 : Math.pow((a + 0.055) / 1.055, 2.4);
  return v < 0 ? -lin : lin;
}

/** Encode one linear channel (0–1) to sRGB (IEC 61966-2-1). */
export function srgbEncode(v: number): number {
  const a = Math.abs(v);
  const enc = a <= 0.0031308 ? 12.92 * a : 1.055 * Math.pow(a, 1 / 2.4) - 0.055;
  return v < 0 ? -enc : enc;
}

/** sRGB 0–255 → linear sRGB 0–1 (IEC 61966-2-1). */
export function srgbToLinear(rgb255: Rgb): Rgb {
  return [srgbDecode(rgb255[0] / 255), srgbDecode(rgb255[1] / 255), srgbDecode(rgb255[2] / 255)];
}

/** Linear sRGB 0–1 → sRGB 0–255 as unclamped floats (IEC 61966-2-1). */
export function linearToSrgb(lin: Rgb): Rgb {
  return [srgbEncode(lin[0]) * 255, srgbEncode(lin[1]) * 255, srgbEncode(lin[2]) * 255];
}

/** Linear sRGB → CIE XYZ D65 (Y of white = 1). */
export function linearSrgbToXyz(lin: Rgb): Xyz {
  const [r, g, b] = lin;
  return {
    X: M[0] * r + M[1] * g + M[2] * b,
    Y: M[3] * r + M[4] * g + M[5] * b,
    Z: M[6] * r + M[7] * g + M[8] * b,
  };
}

/** CIE XYZ D65 → linear sRGB (may fall outside 0–1 for out-of-gamut colours). */
export function xyzToLinearSrgb(xyz: Xyz): Rgb {
  const { X, Y, Z } = xyz;
  return [
    M_INV[0] * X + M_INV[1] * Y + M_INV[2] * Z,
    M_INV[3] * X + M_INV[4] * Y + M_INV[5] * Z,
    M_INV[6] * X + M_INV[7] * Y + M_INV[8] * Z,
  ];
}

const labF = (t: number): number => (t > EPSILON ? Math.cbrt(t) : (KAPPA * t + 16) / 116);
const labFInv = (f: number): number => {
  const f3 = f * f * f;
  return f3 > EPSILON ? f3 : (116 * f - 16) / KAPPA;
};

/** CIE XYZ → CIELAB relative to `white` (default D65_WHITE) (CIE 15:2004). */
export function xyzToLab(xyz: Xyz, white: Xyz = D65_WHITE): Lab {
  const fx = labF(xyz.X / white.X);
  const fy = labF(xyz.Y / white.Y);
  const fz = labF(xyz.Z / white.Z);
  return { L: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) };
}

/** CIELAB → CIE XYZ relative to `white` (default D65_WHITE) (CIE 15:2004). */
export function labToXyz(lab: Lab, white: Xyz = D65_WHITE): Xyz {
  const fy = (lab.L + 16) / 116;
  const fx = fy + lab.a / 500;
  const fz = fy - lab.b / 200;
  // Y uses L directly below L = 8 (κε) so that the dark end stays linear and exact.
  const yr = lab.L > KAPPA * EPSILON ? fy * fy * fy : lab.L / KAPPA;
  return { X: labFInv(fx) * white.X, Y: yr * white.Y, Z: labFInv(fz) * white.Z };
}

/** sRGB 0–255 → CIELAB D65. */
export function srgbToLab(rgb255: Rgb): Lab {
  return xyzToLab(linearSrgbToXyz(srgbToLinear(rgb255)));
}

/**
 * CIELAB D65 → sRGB 0–255 integers, clamped. `inGamut` is false when some channel had to be
 * clamped by more than half a code value (i.e. rounding alone could not bring it into 0–255).
 */
export function labToSrgb(lab: Lab): { rgb: Rgb; inGamut: boolean } {
  const raw = linearToSrgb(xyzToLinearSrgb(labToXyz(lab)));
  let inGamut = true;
  const out = raw.map((v) => {
    if (!(v >= -0.5 && v <= 255.5)) inGamut = false; // also catches NaN
    return Math.min(255, Math.max(0, Math.round(Number.isFinite(v) ? v : 0)));
  });
  return { rgb: [out[0], out[1], out[2]], inGamut };
}

/** CIELAB D65 → "#rrggbb" (clamped into the sRGB gamut). */
export function labToHex(lab: Lab): string {
  return "#" + labToSrgb(lab).rgb.map((v) => v.toString(16).padStart(2, "0")).join("");
}

/** "#rrggbb" or "#rgb" (the # optional) → CIELAB D65. Throws on anything else. */
export function hexToLab(hex: string): Lab {
  return srgbToLab(hexToRgb(hex));
}

/** "#rrggbb" or "#rgb" (the # optional) → sRGB 0–255 integers. */
export function hexToRgb(hex: string): Rgb {
  const s = hex.trim().replace(/^#/, "");
  const full = /^[0-9a-f]{3}$/i.test(s) ? s.replace(/./g, (c) => c + c) : s;
  if (!/^[0-9a-f]{6}$/i.test(full)) {
    throw new RangeError(`"${hex}" is not a hex colour; write it like #3a6b8c.`);
  }
  const n = parseInt(full, 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/** CIELAB → LCh(ab); hue in degrees 0–360, 0 for a neutral (C = 0). */
export function labToLch(lab: Lab): Lch {
  const C = Math.hypot(lab.a, lab.b);
  let h = C === 0 ? 0 : (Math.atan2(lab.b, lab.a) * 180) / Math.PI;
  if (h < 0) h += 360;
  return { L: lab.L, C, h };
}

/** LCh(ab) → CIELAB (hue in degrees). */
export function lchToLab(lch: Lch): Lab {
  const r = (lch.h * Math.PI) / 180;
  return { L: lch.L, a: lch.C * Math.cos(r), b: lch.C * Math.sin(r) };
}


// ---- Bulk path: typed arrays in, L,a,b triples out, no allocation per pixel. ----

/** Linear value of each 8-bit sRGB code (IEC 61966-2-1), built once. */
const DECODE_LUT = new Float64Array(256);
for (let i = 0; i < 256; i++) DECODE_LUT[i] = srgbDecode(i / 255);

// Matrix rows pre-divided by the white, so the loop goes straight to X/Xn, Y/Yn, Z/Zn.
const W = [
  M[0] / D65_WHITE.X, M[1] / D65_WHITE.X, M[2] / D65_WHITE.X,
  M[3], M[4], M[5],
  M[6] / D65_WHITE.Z, M[7] / D65_WHITE.Z, M[8] / D65_WHITE.Z,
];

type LabOut = Float32Array | Float64Array;

function outFor<T extends LabOut>(n: number, out: T | undefined): T | Float32Array {
  if (out === undefined) return new Float32Array(n * 3);
  if (out.length < n * 3) throw new RangeError(`out holds ${out.length} values; ${n * 3} are needed.`);
  return out;
}

/**
 * Many 8-bit sRGB pixels (RGB or RGBA, alpha ignored) → CIELAB D65 triples. Decoding uses an
 * 8-bit lookup table (IEC 61966-2-1). A Float64Array `out` keeps full precision; the default
 * Float32Array rounds to float32 (about 4e-6 near L = 100).
 */
export function bulkSrgbToLab(pixels: Uint8Array | Uint8ClampedArray, channels: 3 | 4, out?: Float32Array): Float32Array;
export function bulkSrgbToLab(pixels: Uint8Array | Uint8ClampedArray, channels: 3 | 4, out: Float64Array): Float64Array;
export function bulkSrgbToLab(pixels: Uint8Array | Uint8ClampedArray, channels: 3 | 4, out?: LabOut): LabOut {
  if (channels !== 3 && channels !== 4) throw new RangeError("channels must be 3 (RGB) or 4 (RGBA).");
  if (pixels.length % channels !== 0) {
    throw new RangeError(`${pixels.length} bytes is not a whole number of ${channels}-channel pixels.`);
  }
  const n = pixels.length / channels;
  const dst = outFor(n, out);
  const lut = DECODE_LUT;
  const [m0, m1, m2, m3, m4, m5, m6, m7, m8] = W;
  for (let i = 0, p = 0, o = 0; i < n; i++, p += channels, o += 3) {
    const r = lut[pixels[p]], g = lut[pixels[p + 1]], b = lut[pixels[p + 2]];
    const fx = fLab(m0 * r + m1 * g + m2 * b);
    const fy = fLab(m3 * r + m4 * g + m5 * b);
    const fz = fLab(m6 * r + m7 * g + m8 * b);
    dst[o] = 116 * fy - 16;
    dst[o + 1] = 500 * (fx - fy);
    dst[o + 2] = 200 * (fy - fz);
  }
  return dst;
}

/** Many linear sRGB triples (0–1) → CIELAB D65 triples (same formulas as `bulkSrgbToLab`). */
export function bulkLinearToLab(lin: Float32Array | Float64Array, out?: Float32Array): Float32Array;
export function bulkLinearToLab(lin: Float32Array | Float64Array, out: Float64Array): Float64Array;
export function bulkLinearToLab(lin: Float32Array | Float64Array, out?: LabOut): LabOut {
  if (lin.length % 3 !== 0) throw new RangeError(`${lin.length} values is not a whole number of RGB triples.`);
  const n = lin.length / 3;
  const dst = outFor(n, out);
  const [m0, m1, m2, m3, m4, m5, m6, m7, m8] = W;
  for (let o = 0; o < lin.length; o += 3) {
    const r = lin[o], g = lin[o + 1], b = lin[o + 2];
    const fx = fLab(m0 * r + m1 * g + m2 * b);
    const fy = fLab(m3 * r + m4 * g + m5 * b);
    const fz = fLab(m6 * r + m7 * g + m8 * b);
    dst[o] = 116 * fy - 16;
    dst[o + 1] = 500 * (fx - fy);
    dst[o + 2] = 200 * (fy - fz);
  }
  return dst;
}

// Fast cube root for t in (ε, 1.1): linear interpolation in a 1024-step table (relative error
// below 4e-4 there), then one Halley step, which cubes the error (worst seen 8e-12). Three times
// faster than Math.cbrt in Node 20; values outside the table fall back to Math.cbrt.
const CBRT_STEPS = 1024;
const CBRT_MAX = 1.1;
const CBRT_SCALE = CBRT_STEPS / CBRT_MAX;
const CBRT_LUT = new Float64Array(CBRT_STEPS + 2);
for (let i = 0; i < CBRT_LUT.length; i++) CBRT_LUT[i] = Math.cbrt(i / CBRT_SCALE);

/** The CIELAB f(t) of the bulk path (CIE 15:2004), with the fast cube root above. */
function fLab(t: number): number {
  if (t <= EPSILON) return (KAPPA * t + 16) / 116;
  if (!(t < CBRT_MAX)) return Math.cbrt(t);
  const x = t * CBRT_SCALE;
  const i = x | 0;
  const y = CBRT_LUT[i] + (CBRT_LUT[i + 1] - CBRT_LUT[i]) * (x - i);
  const y3 = y * y * y;
  return (y * (y3 + 2 * t)) / (2 * y3 + t);
}
