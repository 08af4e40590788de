import { describe, expect, it } from "vitest";
import { BANDS, CMF_X, CMF_Y, CMF_Z, D65_SPD, SPECTRAL_WHITE, WEIGHT_X, WEIGHT_Y, WEIGHT_Z, wavelengthOf } from "@/colour/spectral/cie-data";
import { reflectanceToLab } from "@/colour/spectral/reflectance";

describe("CIE 1931 2° × D65 table, 380–730 nm at 10 nm", () => {
  it("has 36 bands from 380 to 730 nm", () => {
    expect(BANDS).toBe(36);
    for (const t of [CMF_X, CMF_Y, CMF_Z, D65_SPD, WEIGHT_X, WEIGHT_Y, WEIGHT_Z]) expect(t.length).toBe(36);
    expect(wavelengthOf(0)).toBe(380);
    expect(wavelengthOf(35)).toBe(730);
  });
  it("spot values of the CIE 15:2004 tables (from memory, cross-checked with spectral.js below)", () => {
    expect(CMF_Y[18]).toBe(0.995); // ȳ(560)
    expect(CMF_X[22]).toBe(1.0622); // x̄(600), the peak of x̄
    expect(CMF_Z[7]).toBe(1.77211); // z̄(450)
    expect(D65_SPD[18]).toBe(100); // D65 is normalised to 100 at 560 nm
  });
  it("matches the D65-weighted CMFs shipped by spectral.js 3.0.0 (MIT) up to one scale factor", () => {
    // spectral.js CIE.CMF values (its 380–750 nm table, Y of white = 1 over its range):
    const theirs: [Float64Array, number, number][] = [
      [WEIGHT_X, 10, 0.0104909907685421], // x̄·S at 480 nm
      [WEIGHT_X, 22, 0.0904661376847769], // x̄·S at 600 nm
      [WEIGHT_Y, 18, 0.0941521856862608], // ȳ·S at 560 nm
      [WEIGHT_Y, 30, 0.0012593033677378], // ȳ·S at 680 nm
      [WEIGHT_Z, 7, 0.196206575558657], // z̄·S at 450 nm
      [WEIGHT_Z, 0, 0.000305017147638], // z̄·S at 380 nm
    ];
    const scale = theirs[2][0][18] / theirs[2][2];
    for (const [w, i, v] of theirs) expect(w[i] / v / scale).toBeCloseTo(1, 4);
  });
  it("white sums (our computation from the rows): Y = 1, X 0.950119, Z 1.088161", () => {
    expect(SPECTRAL_WHITE.Y).toBeCloseTo(1, 14); // normalised so by construction
    expect(SPECTRAL_WHITE.X).toBeCloseTo(0.950119, 6);
    expect(SPECTRAL_WHITE.Z).toBeCloseTo(1.088161, 6);
    // spectral.js's 380–750 nm table sums to 0.950164 / 1.088134 (REFERENCES.md [computed]); the two
    // bands 740 and 750 nm that we drop move the sums by under 1e-4.
    expect(Math.abs(SPECTRAL_WHITE.X - 0.950164)).toBeLessThan(1e-4);
    expect(Math.abs(SPECTRAL_WHITE.Z - 1.088134)).toBeLessThan(1e-4);
  });
  it("differs from the 1 nm ASTM E308 white (95.047, 108.883) by a few 1e-4: sampling, not an error", () => {
    // REFERENCES.md: plain 10 nm sampling is not the 1 nm sum; E308 publishes weighting tables for that.
    expect(Math.abs(SPECTRAL_WHITE.X - 0.95047)).toBeGreaterThan(1e-4);
    expect(Math.abs(SPECTRAL_WHITE.X - 0.95047)).toBeLessThan(1e-3);
    expect(Math.abs(SPECTRAL_WHITE.Z - 1.08883)).toBeGreaterThan(1e-4);
    expect(Math.abs(SPECTRAL_WHITE.Z - 1.08883)).toBeLessThan(1e-3);
  });
  it("a flat reflectance is exactly neutral and the perfect white has L* 100 (table white used for Lab)", () => {
    const white = reflectanceToLab(new Float64Array(36).fill(1));
    expect(white.L).toBeCloseTo(100, 10);
    expect(white.a).toBeCloseTo(0, 10);
    expect(white.b).toBeCloseTo(0, 10);
    const grey = reflectanceToLab(new Float64Array(36).fill(0.18));
    expect(grey.a).toBeCloseTo(0, 10);
    expect(grey.L).toBeCloseTo(116 * Math.cbrt(0.18) - 16, 10); // CIE 15:2004 L* of Y = 0.18
  });
});
