import { describe, expect, it } from "vitest";
import { converter, displayable } from "culori";
import {
  D65_WHITE, bulkLinearToLab, bulkSrgbToLab, hexToLab, hexToRgb, labToHex, labToLch, labToSrgb, labToXyz,
  lchToLab, linearSrgbToXyz, linearToSrgb, srgbDecode, srgbEncode, srgbToLab, srgbToLinear, xyzToLab,
  xyzToLinearSrgb,
} from "@/colour/spaces";
import type { Rgb } from "@/colour/types";

// Seeded PRNG (mulberry32) so the random checks are repeatable.
function rng(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const toLab65 = converter("lab65");
const culoriLab = ([r, g, b]: Rgb) => toLab65({ mode: "rgb", r: r / 255, g: g / 255, b: b / 255 });

describe("sRGB transfer (IEC 61966-2-1)", () => {
  it("uses the linear segment below the thresholds", () => {
    expect(srgbDecode(0.04045)).toBeCloseTo(0.04045 / 12.92, 15); // IEC 61966-2-1: V ≤ 0.04045 → V/12.92
    expect(srgbDecode(0.5)).toBeCloseTo(Math.pow(0.555 / 1.055, 2.4), 15); // IEC 61966-2-1 power segment
    expect(srgbEncode(0.0031308)).toBeCloseTo(0.0031308 * 12.92, 15); // IEC 61966-2-1: L ≤ 0.0031308 → 12.92 L
    expect(srgbEncode(0.5)).toBeCloseTo(1.055 * Math.pow(0.5, 1 / 2.4) - 0.055, 15); // IEC 61966-2-1
  });
  it("decodes and re-encodes every 8-bit code", () => {
    for (let i = 0; i < 256; i++) expect(srgbEncode(srgbDecode(i / 255)) * 255).toBeCloseTo(i, 9);
  });
  it("keeps the sign of negative (out-of-gamut) values", () => {
    expect(srgbDecode(-0.5)).toBeCloseTo(-srgbDecode(0.5), 15);
    expect(srgbEncode(-0.2)).toBeCloseTo(-srgbEncode(0.2), 15);
  });
});

describe("worked values (REFERENCES.md)", () => {
  it("sRGB (128,200,255) → XYZ → Lab D65", () => {
    const xyz = linearSrgbToXyz(srgbToLinear([128, 200, 255]));
    // REFERENCES.md [read, computed]: XYZ ×100 (47.60334, 53.11601, 102.3549)
    expect(xyz.X * 100).toBeCloseTo(47.60334, 4);
    expect(xyz.Y * 100).toBeCloseTo(53.11601, 4);
    expect(xyz.Z * 100).toBeCloseTo(102.3549, 3);
    const lab = srgbToLab([128, 200, 255]);
    // REFERENCES.md: Lab D65 (77.9434, −7.8543, −33.9353)
    expect(lab.L).toBeCloseTo(77.9434, 4);
    expect(lab.a).toBeCloseTo(-7.8543, 4);
    expect(lab.b).toBeCloseTo(-33.9353, 4);
  });
  it("sRGB white → the D65 white and L = 100, a = b = 0", () => {
    const xyz = linearSrgbToXyz(srgbToLinear([255, 255, 255]));
    // REFERENCES.md: white XYZ ×100 (95.04559, 100, 108.9058); white xy (0.3127, 0.3290)
    expect(xyz.X * 100).toBeCloseTo(95.04559, 5);
    expect(xyz.Y * 100).toBeCloseTo(100, 10);
    expect(xyz.Z * 100).toBeCloseTo(108.9058, 4);
    expect(D65_WHITE.X).toBeCloseTo(0.95045593, 8); // REFERENCES.md: 0.95045593, 1, 1.08905775
    expect(D65_WHITE.Z).toBeCloseTo(1.08905775, 8);
    const lab = srgbToLab([255, 255, 255]);
    expect(lab.L).toBeCloseTo(100, 12); // matrix and white consistent (REFERENCES.md)
    expect(Math.abs(lab.a)).toBeLessThan(1e-12);
    expect(Math.abs(lab.b)).toBeLessThan(1e-12);
  });
  it("XYZ (0.20654008, 0.12197225, 0.05136952) → Lab (41.5278752, 52.6385830, 26.9231792)", () => {
    // REFERENCES.md: worked example in the documentation of the "colour" Python library
    const lab = xyzToLab({ X: 0.20654008, Y: 0.12197225, Z: 0.05136952 });
    expect(lab.L).toBeCloseTo(41.5278752, 6);
    expect(lab.a).toBeCloseTo(52.638583, 6);
    expect(lab.b).toBeCloseTo(26.9231792, 6);
  });
});

describe("against culori lab65 (reference library, D65)", () => {
  const random = rng(20261202);
  const colours: Rgb[] = Array.from({ length: 10_000 }, () => [
    Math.floor(random() * 256), Math.floor(random() * 256), Math.floor(random() * 256),
  ]);
  const pixels = new Uint8Array(colours.flat());

  it("srgbToLab matches 10 000 seeded random colours to 1e-6", () => {
    let worst = 0;
    for (const c of colours) {
      const mine = srgbToLab(c), ref = culoriLab(c);
      worst = Math.max(worst, Math.abs(mine.L - ref.l), Math.abs(mine.a - ref.a), Math.abs(mine.b - ref.b));
    }
    expect(worst).toBeLessThan(1e-6);
  });

  it("bulkSrgbToLab (Float64Array out) matches the same colours to 1e-6", () => {
    const out = bulkSrgbToLab(pixels, 3, new Float64Array(pixels.length));
    let worst = 0;
    colours.forEach((c, i) => {
      const ref = culoriLab(c);
      worst = Math.max(worst, Math.abs(out[3 * i] - ref.l), Math.abs(out[3 * i + 1] - ref.a), Math.abs(out[3 * i + 2] - ref.b));
    });
    expect(worst).toBeLessThan(1e-6);
  });

  it("bulkSrgbToLab (default Float32Array) differs only by float32 rounding", () => {
    const out = bulkSrgbToLab(pixels, 3);
    expect(out).toBeInstanceOf(Float32Array);
    colours.forEach((c, i) => {
      const ref = culoriLab(c);
      const vals = [ref.l, ref.a, ref.b];
      // float32 keeps 24 significant bits: half an ulp is |v|·2^-24, plus 1e-6 for the formula
      for (let k = 0; k < 3; k++) expect(Math.abs(out[3 * i + k] - vals[k])).toBeLessThanOrEqual(Math.abs(vals[k]) * 2 ** -24 + 1e-6);
    });
  });

  it("reads RGBA (alpha ignored), Buffers and Uint8ClampedArrays", () => {
    const rgba = new Uint8ClampedArray([128, 200, 255, 7, 0, 0, 0, 255]);
    const out = bulkSrgbToLab(rgba, 4, new Float64Array(6));
    const ref = srgbToLab([128, 200, 255]);
    expect(out[0]).toBeCloseTo(ref.L, 12);
    expect(out[2]).toBeCloseTo(ref.b, 12);
    expect(out[3]).toBe(0); // black: L = 0
    const fromBuffer = bulkSrgbToLab(Buffer.from([128, 200, 255]), 3, new Float64Array(3));
    expect(fromBuffer[1]).toBeCloseTo(ref.a, 12);
  });

  it("bulkLinearToLab agrees with srgbToLab", () => {
    const lin = new Float64Array(colours.slice(0, 500).flatMap((c) => [...srgbToLinear(c)]));
    const out = bulkLinearToLab(lin, new Float64Array(lin.length));
    colours.slice(0, 500).forEach((c, i) => expect(out[3 * i]).toBeCloseTo(srgbToLab(c).L, 9));
  });

  it("bulkLinearToLab handles linear values beyond the fast cube-root table (> 1.1) and below ε", () => {
    const lin = new Float64Array([1.5, 2, 1.2, 0.001, 0.002, 0.0005, 1, 1, 1]);
    const out = bulkLinearToLab(lin, new Float64Array(9));
    for (let i = 0; i < 3; i++) {
      const ref = xyzToLab(linearSrgbToXyz([lin[3 * i], lin[3 * i + 1], lin[3 * i + 2]]));
      expect(out[3 * i]).toBeCloseTo(ref.L, 9);
      expect(out[3 * i + 1]).toBeCloseTo(ref.a, 9);
      expect(out[3 * i + 2]).toBeCloseTo(ref.b, 9);
    }
  });

  it("rejects bad shapes with a plain message", () => {
    expect(() => bulkSrgbToLab(new Uint8Array(5), 3)).toThrow(/whole number/);
    expect(() => bulkSrgbToLab(new Uint8Array(6), 3, new Float32Array(3))).toThrow(/needed/);
    expect(() => bulkSrgbToLab(new Uint8Array(6), 2 as 3)).toThrow(/channels/);
    expect(() => bulkLinearToLab(new Float32Array(4))).toThrow(/triples/);
  });
});

describe("round trips", () => {
  const random = rng(7);
  it("every 8-bit colour sampled survives sRGB → Lab → sRGB exactly and is in gamut", () => {
    for (let i = 0; i < 5000; i++) {
      const c: Rgb = [Math.floor(random() * 256), Math.floor(random() * 256), Math.floor(random() * 256)];
      const back = labToSrgb(srgbToLab(c));
      expect(back.rgb).toEqual(c);
      expect(back.inGamut).toBe(true);
    }
  });
  it("Lab → XYZ → Lab, linear → XYZ → linear, Lab → LCh → Lab", () => {
    for (let i = 0; i < 2000; i++) {
      const lab = { L: random() * 100, a: random() * 200 - 100, b: random() * 200 - 100 };
      const back = xyzToLab(labToXyz(lab));
      expect(back.L).toBeCloseTo(lab.L, 9);
      expect(back.a).toBeCloseTo(lab.a, 9);
      expect(back.b).toBeCloseTo(lab.b, 9);
      const viaLch = lchToLab(labToLch(lab));
      expect(viaLch.a).toBeCloseTo(lab.a, 12);
      expect(viaLch.b).toBeCloseTo(lab.b, 12);
      const lin: Rgb = [random(), random(), random()];
      const linBack = xyzToLinearSrgb(linearSrgbToXyz(lin));
      for (let k = 0; k < 3; k++) expect(linBack[k]).toBeCloseTo(lin[k], 12);
    }
  });
  it("labToXyz matches culori on the dark, linear branch (L < 8)", () => {
    const toXyz = converter("xyz65");
    const ref = toXyz({ mode: "lab65", l: 3, a: 2, b: -1 });
    const mine = labToXyz({ L: 3, a: 2, b: -1 });
    expect(mine.X).toBeCloseTo(ref.x, 12);
    expect(mine.Y).toBeCloseTo(ref.y, 12);
    expect(mine.Z).toBeCloseTo(ref.z, 12);
  });
  it("linearToSrgb returns unclamped 0–255 floats", () => {
    const out = linearToSrgb([1.2, 0.5, -0.01]);
    expect(out[0]).toBeGreaterThan(255);
    expect(out[1]).toBeCloseTo(srgbEncode(0.5) * 255, 12);
    expect(out[2]).toBeLessThan(0);
  });
});

describe("gamut, hex and LCh", () => {
  it("flags out-of-gamut colours like culori's displayable", () => {
    const vivid = { L: 50, a: 100, b: 0 };
    expect(displayable({ mode: "lab65", l: 50, a: 100, b: 0 })).toBe(false); // culori as oracle
    expect(labToSrgb(vivid).inGamut).toBe(false);
    expect(labToSrgb(vivid).rgb.every((v) => v >= 0 && v <= 255 && Number.isInteger(v))).toBe(true);
    expect(labToSrgb({ L: 60, a: 10, b: 10 }).inGamut).toBe(true);
  });
  it("hex in and out", () => {
    expect(hexToRgb("#3a6b8c")).toEqual([0x3a, 0x6b, 0x8c]);
    expect(hexToRgb("fff")).toEqual([255, 255, 255]);
    expect(labToHex(hexToLab("#3A6B8C"))).toBe("#3a6b8c");
    expect(() => hexToLab("#12345")).toThrow(/not a hex colour/);
    expect(() => hexToLab("blue")).toThrow(/#3a6b8c/);
  });
  it("LCh hue is in degrees 0–360 and 0 for neutrals", () => {
    expect(labToLch({ L: 50, a: 0, b: -10 })).toEqual({ L: 50, C: 10, h: 270 });
    expect(labToLch({ L: 50, a: 0, b: 0 }).h).toBe(0);
    const lab = lchToLab({ L: 40, C: 20, h: 90 });
    expect(lab.a).toBeCloseTo(0, 12);
    expect(lab.b).toBeCloseTo(20, 12);
  });
});
