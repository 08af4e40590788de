import { describe, expect, it } from "vitest";
import { srgbToLinear, srgbToLab, linearToSrgb } from "@/colour/spaces";
import { deltaE00 } from "@/colour/difference";
import {
  BLACK_REFLECTANCE, T_MATRIX, differenceMatrix, labToReflectance, linearRgbToReflectance, reflectanceToLab,
  reflectanceToLinearRgb, reflectanceToXyz,
} from "@/colour/spectral/reflectance";
import { seededRandom } from "@/colour/spectral/synthetic-dyeings";
import type { Rgb } from "@/colour/types";

const rgb = (r: number, g: number, b: number): Rgb => srgbToLinear([r, g, b]);

describe("Burns's T and D matrices (arXiv:1710.05732)", () => {
  it("T is 3×36 and each row sums to 1, so ρ = 1 maps to RGB (1, 1, 1)", () => {
    expect(T_MATRIX.length).toBe(3 * 36);
    for (let r = 0; r < 3; r++) expect(T_MATRIX.slice(r * 36, r * 36 + 36).reduce((s, v) => s + v, 0)).toBeCloseTo(1, 12);
  });
  it("D is tridiagonal: 4 on the diagonal, 2 at both ends, −2 beside it", () => {
    const D = differenceMatrix();
    expect([D[0], D[1], D[36 + 1], D[36 + 0], D[36 + 2], D[35 * 36 + 35], D[35 * 36 + 34], D[5]]).toEqual([2, -2, 4, -2, -2, 2, -2, 0]);
    for (let i = 0; i < 36; i++) expect(D.slice(i * 36, i * 36 + 36).reduce((s, v) => s + v, 0)).toBe(0); // constants are free
  });
});

describe("LHTSS reflectance from linear RGB (Burns 2020)", () => {
  it("grey (128,128,128) → a flat curve at 0.21586 (Burns's worked value)", () => {
    const rho = linearRgbToReflectance(rgb(128, 128, 128));
    for (const v of rho) expect(v).toBeCloseTo(0.21586, 5);
  });
  it("white → all ones and black → all 1e-4 (Burns's special cases); near-white stays below 1", () => {
    expect([...linearRgbToReflectance(rgb(255, 255, 255))].every((v) => v === 1)).toBe(true);
    expect([...linearRgbToReflectance(rgb(0, 0, 0))].every((v) => v === BLACK_REFLECTANCE)).toBe(true);
    const near = linearRgbToReflectance(rgb(254, 254, 254));
    for (const v of near) expect(v > 0.99 && v < 1).toBe(true);
  });
  it("round trip sRGB → ρ → sRGB within 1e-6 over a 12³ grid and 300 random colours, ρ always in (0, 1)", () => {
    const steps = [1, 10, 33, 64, 90, 128, 150, 180, 200, 230, 250, 255];
    const colours: Rgb[] = [];
    for (const r of steps) for (const g of steps) for (const b of steps) colours.push([r, g, b]);
    const rand = seededRandom(7);
    for (let i = 0; i < 300; i++) colours.push([0, 0, 0].map(() => Math.floor(rand() * 256)) as unknown as Rgb);
    let worst = 0;
    for (const c of colours) {
      if (c[0] + c[1] + c[2] === 0) continue; // black is the special case above
      const rho = linearRgbToReflectance(srgbToLinear(c));
      for (const v of rho) if (!(v > 0 && v <= 1)) throw new Error(`ρ ${v} for ${c}`);
      const back = linearToSrgb(reflectanceToLinearRgb(rho));
      for (let k = 0; k < 3; k++) worst = Math.max(worst, Math.abs(back[k] - c[k]));
    }
    expect(worst).toBeLessThan(1e-6);
  });
  it("matches spectral.js 3.0.0's stored curves for red and magenta within 0.004 (REFERENCES.md)", () => {
    // spectral.js BASE_SPECTRA.R and .M, first 36 of its 38 bands, rounded to 5 decimals (MIT).
    const R = [0.03156, 0.03155, 0.03151, 0.03133, 0.03067, 0.02865, 0.02465, 0.0193, 0.01421, 0.01029, 0.00762, 0.0059, 0.00482, 0.00423, 0.00406, 0.00435, 0.00534, 0.00769, 0.0136, 0.0317, 0.10786, 0.46381, 0.84706, 0.94319, 0.96886, 0.97803, 0.98204, 0.98392, 0.98485, 0.98529, 0.98551, 0.98561, 0.98565, 0.98568, 0.98569, 0.98569];
    const M = [0.99067, 0.99067, 0.99066, 0.99062, 0.99045, 0.98987, 0.98829, 0.98429, 0.97393, 0.94182, 0.81739, 0.43247, 0.13845, 0.05373, 0.02922, 0.02131, 0.02013, 0.02413, 0.03722, 0.07605, 0.20538, 0.54127, 0.81584, 0.91282, 0.94634, 0.95993, 0.96626, 0.96933, 0.97085, 0.97161, 0.97196, 0.97213, 0.97221, 0.97225, 0.97227, 0.97228];
    const r = linearRgbToReflectance([1, 0, 0]);
    const m = linearRgbToReflectance([1, 0, 1]);
    for (let i = 0; i < 36; i++) {
      expect(Math.abs(r[i] - R[i])).toBeLessThan(0.004);
      expect(Math.abs(m[i] - M[i])).toBeLessThan(0.004);
    }
  });
  it("refuses channels outside [0, 1] unless asked", () => {
    expect(() => linearRgbToReflectance([-0.1, 0.5, 0.5])).toThrow(/outside \[0, 1\]/);
  });
});

describe("curves ↔ CIE XYZ and CIELAB", () => {
  it("XYZ is the weighted sum; a flat 0.5 has Y 0.5", () => {
    expect(reflectanceToXyz(new Float64Array(36).fill(0.5)).Y).toBeCloseTo(0.5, 14);
  });
  it("Lab → ρ → Lab round trip inside sRGB (ΔE00 < 1e-6)", () => {
    const rand = seededRandom(11);
    for (let i = 0; i < 100; i++) {
      const lab = srgbToLab([0, 0, 0].map(() => 5 + Math.floor(rand() * 246)) as unknown as Rgb);
      const est = labToReflectance(lab);
      expect(est.inGamut && est.matched).toBe(true);
      expect(deltaE00(reflectanceToLab(est.reflectance), lab)).toBeLessThan(1e-6);
    }
  });
  it("a deep turquoise outside sRGB is still reproduced exactly by a curve in (0, 1)", () => {
    const lab = { L: 45, a: -12, b: -50 }; // linear red channel < 0: outside sRGB, a real surface colour
    const est = labToReflectance(lab);
    expect(est.inGamut).toBe(false);
    expect(est.matched).toBe(true);
    expect(est.note).toBeUndefined();
    expect(deltaE00(reflectanceToLab(est.reflectance), lab)).toBeLessThan(1e-6);
  });
  it("a colour no curve reaches is desaturated toward grey, with a note", () => {
    // (50, −200, 0) lies beyond the optimal colours; so does a pale blue as light as L* 90 with b* −80.
    for (const lab of [{ L: 50, a: -200, b: 0 }, { L: 90, a: 0, b: -80 }]) {
      const est = labToReflectance(lab);
      expect(est.matched).toBe(false);
      expect(est.note).toMatch(/approximate/);
      const got = reflectanceToLab(est.reflectance);
      expect(got.L).toBeCloseTo(lab.L, 6); // same Y: pulled toward its own grey
      expect(Math.hypot(got.a, got.b)).toBeLessThan(Math.hypot(lab.a, lab.b));
      expect(Math.hypot(got.a, got.b)).toBeGreaterThan(10); // but not all the way to grey
      expect(Math.sign(got.a + got.b)).toBe(Math.sign(lab.a + lab.b)); // same side of the hue circle
      for (const v of est.reflectance) expect(v > 0 && v < 1).toBe(true);
    }
  });
});
