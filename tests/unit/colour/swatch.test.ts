import { describe, expect, it } from "vitest";
import { deltaE00 } from "@/colour/difference";
import { labToXyz, linearToSrgb, srgbToLab, xyzToLab, xyzToLinearSrgb } from "@/colour/spaces";
import {
  classify, cropPixels, kmeans, LAB_WEIGHTS, paletteOf, readRegion, readSwatch, seeded, type ClusterSummary, type ColourGroup,
} from "@/colour/swatch";
import { renderYarn, seededRandom, type YarnSpec } from "@/colour/synthetic";
import type { Lab, Xyz } from "@/colour/types";

const L = (L: number, a: number, b: number): Lab => ({ L, a, b });

/** Scene XYZ → 8-bit sRGB pixels (IEC 61966-2-1), so UNCALIBRATED reading is the exact inverse up to rounding. */
function toSrgbPixels(xyz: Float32Array): Uint8Array {
  const out = new Uint8Array(xyz.length);
  for (let i = 0; i < xyz.length; i += 3) {
    const rgb = linearToSrgb(xyzToLinearSrgb({ X: xyz[i], Y: xyz[i + 1], Z: xyz[i + 2] }));
    for (let c = 0; c < 3; c++) out[i + c] = Math.min(255, Math.max(0, Math.round(rgb[c])));
  }
  return out;
}
function yarn(spec: YarnSpec, seed = 1, size = 300) {
  const { xyz, truth } = renderYarn(spec, size, size, seededRandom(seed), { period: 28, angle: 1.05, gap: 0.16, ply: 0.12, fibre: 0.06, glintRate: 0.12, glintStrength: 0.5 }, seed);
  return { pixels: toSrgbPixels(xyz), truth };
}
const nearest = (palette: { lab: Lab; share: number }[], lab: Lab) =>
  palette.reduce((b, p) => (deltaE00(p.lab, lab) < deltaE00(b.lab, lab) ? p : b));

describe("readSwatch on plain regions", () => {
  it("reads a flat region as exactly its colour, one palette entry, nothing left out", () => {
    const px = new Uint8Array(60 * 60 * 3);
    for (let i = 0; i < px.length; i += 3) px.set([150, 90, 60], i);
    const r = readSwatch(px, 3);
    const want = srgbToLab([150, 90, 60]);
    expect(deltaE00(r.lab, want)).toBeLessThan(1e-9);
    expect(r.palette).toHaveLength(1);
    expect(r.palette[0].share).toBe(1);
    expect(r.excluded).toEqual({ shadow: 0, glint: 0 });
    expect(r.pixelsUsed).toBe(3600);
  });
  it("ignores the alpha channel of RGBA pixels", () => {
    const px = new Uint8Array(20 * 20 * 4);
    for (let i = 0; i < px.length; i += 4) px.set([40, 120, 200, i % 7], i);
    expect(deltaE00(readSwatch(px, 4).lab, srgbToLab([40, 120, 200]))).toBeLessThan(1e-9);
  });
  it("refuses an empty region", () => {
    expect(() => readSwatch(new Uint8Array(0), 3)).toThrow(RangeError);
  });
});

describe("readSwatch on textured yarn (synthetic, no JPEG)", () => {
  // Colours chosen inside the sRGB gamut even at the brightest shading (these pixels are plain sRGB).
  const solids: Lab[] = [L(60, 28, 8), L(42, -20, -10), L(68, 8, 58), L(30, 6, -28), L(78, 2, 12)];
  it("leaves out shadow and glint and reads the lit fibre's colour", () => {
    for (const [i, lab] of solids.entries()) {
      const { pixels } = yarn({ kind: "solid", lab }, i + 1);
      const r = readSwatch(pixels, 3);
      expect(deltaE00(r.lab, lab)).toBeLessThan(0.3); // 8-bit rounding and sampling only
      expect(r.palette).toHaveLength(1);
      expect(r.excluded.shadow / r.pixelsSampled).toBeGreaterThan(0.1); // gaps are 16 % of the surface
      expect(r.excluded.glint).toBeGreaterThan(0);
    }
  });
  it("does better than the plain mean, which shadows pull dark", () => {
    const lab = L(60, 28, 8);
    const { pixels } = yarn({ kind: "solid", lab });
    const sum = { X: 0, Y: 0, Z: 0 };
    const n = pixels.length / 3;
    for (let i = 0; i < pixels.length; i += 3) {
      const x = labToXyz(srgbToLab([pixels[i], pixels[i + 1], pixels[i + 2]]));
      sum.X += x.X / n; sum.Y += x.Y / n; sum.Z += x.Z / n;
    }
    expect(deltaE00(xyzToLab(sum), lab)).toBeGreaterThan(1.5);
    expect(deltaE00(readSwatch(pixels, 3).lab, lab)).toBeLessThan(0.3);
  });
  it("gives speckled and variegated yarn its colours with their shares", () => {
    const specs: YarnSpec[] = [
      { kind: "speckled", base: L(82, 2, 10), speckles: [{ lab: L(45, 55, -5), share: 0.15 }, { lab: L(47, -24, -8), share: 0.1 }] },
      { kind: "speckled", base: L(35, 10, -30), speckles: [{ lab: L(85, 0, 5), share: 0.2 }, { lab: L(70, 10, 65), share: 0.08 }] },
      { kind: "variegated", sections: [{ lab: L(55, 45, 35), share: 0.5 }, { lab: L(70, 10, 60), share: 0.3 }, { lab: L(42, -8, -25), share: 0.2 }] },
    ];
    for (const [i, spec] of specs.entries()) {
      const { pixels, truth } = yarn(spec, 10 + i);
      const r = readSwatch(pixels, 3);
      expect(r.palette).toHaveLength(truth.palette.length);
      expect(r.palette.reduce((s, p) => s + p.share, 0)).toBeCloseTo(1, 12);
      for (const t of truth.palette) {
        const p = nearest(r.palette, t.lab);
        expect(deltaE00(p.lab, t.lab)).toBeLessThan(1);
        expect(Math.abs(p.share - t.share)).toBeLessThan(0.02);
      }
    }
  });
  it("keeps a deeper dye of the same hue as a colour, not a shadow (tonal yarn)", () => {
    const deep = L(38, 40, 28), light = L(66, 22, 16);
    const { pixels, truth } = yarn({ kind: "variegated", sections: [{ lab: deep, share: 0.4 }, { lab: light, share: 0.6 }] }, 21);
    const r = readSwatch(pixels, 3);
    expect(r.palette).toHaveLength(2);
    expect(Math.abs(nearest(r.palette, deep).share - truth.palette[0].share)).toBeLessThan(0.02);
  });
  it("keeps near-black speckles on white yarn as a colour", () => {
    const { pixels, truth } = yarn({ kind: "speckled", base: L(90, 0, 3), speckles: [{ lab: L(20, 0, 0), share: 0.15 }] }, 31);
    const r = readSwatch(pixels, 3);
    expect(r.palette).toHaveLength(2);
    expect(Math.abs(nearest(r.palette, L(20, 0, 0)).share - truth.palette[1].share)).toBeLessThan(0.03);
  });
  it("is repeatable, and samples large regions", () => {
    const { pixels } = yarn({ kind: "solid", lab: L(50, 10, 40) }, 5, 400);
    const a = readSwatch(pixels, 3), b = readSwatch(pixels, 3);
    expect(a).toEqual(b);
    expect(a.pixelsSampled).toBe(20_000);
    const all = readSwatch(pixels, 3, undefined, { maxSamples: 1e9 });
    expect(all.pixelsSampled).toBe(160_000);
    expect(deltaE00(all.lab, a.lab)).toBeLessThan(0.2);
  });
});

describe("cluster roles", () => {
  const summary = (lab: Lab, share: number, scale = 1, add?: Xyz): ClusterSummary => {
    const x = labToXyz(lab);
    const xyz = { X: x.X * scale + (add?.X ?? 0), Y: x.Y * scale + (add?.Y ?? 0), Z: x.Z * scale + (add?.Z ?? 0) };
    return { xyz, lab: xyzToLab(xyz), share };
  };
  it("a darker copy is shadow, a colour plus white light is glint", () => {
    const base = L(55, 30, 20);
    const roles = classify([
      summary(base, 0.8),
      summary(base, 0.15, 0.35),
      summary(base, 0.04, 1, { X: 0.2 * 0.9505, Y: 0.2, Z: 0.2 * 1.089 }),
    ]);
    expect(roles.map((r) => r.kind)).toEqual(["colour", "shadow", "glint"]);
  });
  it("a same-lightness, less saturated cluster between two colours is bleed of the first", () => {
    const navy = summary(L(35, 10, -30), 0.6), white = summary(L(85, 0, 2), 0.3);
    const rim = summary(L(36, 5, -15), 0.1);
    expect(classify([navy, white, rim])[2]).toEqual({ kind: "bleed", of: 0 });
  });
});

describe("paletteOf", () => {
  const group = (lab: Lab, count: number): ColourGroup => ({ lab, xyz: labToXyz(lab), count, area: count });
  it("merges colours under 5 ΔE00, drops those under 3 %, and renormalises", () => {
    const p = paletteOf([group(L(50, 20, 20), 600), group(L(50, 21, 22), 300), group(L(70, -20, 0), 80), group(L(20, 0, 0), 20)]);
    expect(p).toHaveLength(2);
    expect(p[0].share).toBeCloseTo(900 / 980, 12);
    expect(p[1].share).toBeCloseTo(80 / 980, 12);
    expect(p[0].lab.a).toBeGreaterThan(20);
    expect(p[0].lab.a).toBeLessThan(21);
  });
});

describe("kmeans (k-means++ seeding)", () => {
  it("finds three separated blobs, the same way every time", () => {
    const random = seededRandom(9);
    const centres = [[30, 10, 10], [60, -30, 20], [80, 5, -40]];
    const pts = new Float64Array(900 * 3);
    for (let i = 0; i < 900; i++) for (let c = 0; c < 3; c++) pts[i * 3 + c] = centres[i % 3][c] + random.normal();
    const a = kmeans(pts, 3, LAB_WEIGHTS, seeded(1)), b = kmeans(pts, 3, LAB_WEIGHTS, seeded(1));
    expect(Array.from(a.centres)).toEqual(Array.from(b.centres));
    for (const want of centres) {
      const d = Math.min(...[0, 1, 2].map((j) => Math.hypot(a.centres[j * 3] - want[0], a.centres[j * 3 + 1] - want[1], a.centres[j * 3 + 2] - want[2])));
      expect(d).toBeLessThan(0.3);
    }
    expect(Array.from(a.counts)).toEqual([300, 300, 300]);
  });
});

describe("readRegion", () => {
  it("reads a rectangle of a whole image in place exactly as readSwatch reads its copy", () => {
    const { pixels } = yarn({ kind: "speckled", base: L(82, 2, 10), speckles: [{ lab: L(45, 55, -5), share: 0.15 }] }, 41, 300);
    const image = { data: pixels, width: 300, height: 300, channels: 3 };
    const rect = { x: 37, y: 52, width: 201, height: 173 };
    expect(readRegion(image, rect)).toEqual(readSwatch(cropPixels(image, rect), 3));
  });
});

describe("cropPixels", () => {
  it("copies a rectangle row by row and clips it to the image", () => {
    const data = Uint8Array.from({ length: 4 * 3 * 3 }, (_, i) => i);
    const crop = cropPixels({ data, width: 4, height: 3, channels: 3 }, { x: 1, y: 1, width: 2, height: 5 });
    expect(Array.from(crop)).toEqual([15, 16, 17, 18, 19, 20, 27, 28, 29, 30, 31, 32]);
  });
});
