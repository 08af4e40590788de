import { describe, expect, it } from "vitest";
import {
  dyedReflectance, ksFromReflectance, ksSpectrum, reflectanceFromKs, reflectanceFromKsSpectrum, saundersonForward,
  saundersonInverse,
} from "@/colour/spectral/kubelka-munk";

describe("Kubelka-Munk single constant", () => {
  it("K/S = (1 − R)² / 2R: REFERENCES.md check values [computed]", () => {
    expect(ksFromReflectance(0.5)).toBeCloseTo(0.25, 14); // R 0.5 → 0.25
    expect(ksFromReflectance(0.2)).toBeCloseTo(1.6, 14); // R 0.2 → 1.6
    expect(ksFromReflectance(0.05)).toBeCloseTo(9.025, 12); // R 0.05 → 9.025
    expect(ksFromReflectance(1)).toBe(0); // a perfect white absorbs nothing
  });
  it("R = 1 + K/S − √((K/S)² + 2 K/S): K/S 1 → 2 − √3 (REFERENCES.md [computed])", () => {
    expect(reflectanceFromKs(1)).toBeCloseTo(2 - Math.sqrt(3), 15);
    expect(reflectanceFromKs(0)).toBe(1);
  });
  it("the two are inverses from very pale to very deep, without cancellation (stable form)", () => {
    for (const r of [0.999, 0.9, 0.5, 0.1, 0.01, 1e-3, 1e-5]) {
      expect(reflectanceFromKs(ksFromReflectance(r)) / r).toBeCloseTo(1, 10);
    }
    // Deep shade: K/S 1e6 → R ≈ 1/(2 K/S); the textbook form 1 + x − √(x² + 2x) loses digits here.
    expect(reflectanceFromKs(1e6) * 2e6).toBeCloseTo(1, 5);
  });
});

describe("Saunderson surface correction", () => {
  it("R∞ 0.5 → Rm 0.3142857143 with k1 0.04, k2 0.6 (REFERENCES.md, Allen 1980 coefficients)", () => {
    expect(saundersonForward(0.5)).toBeCloseTo(0.3142857143, 10);
    expect(saundersonForward(0.5, { k1: 0.04, k2: 0.6 })).toBeCloseTo(0.3142857143, 10);
  });
  it("the inverse gives R∞ back; a reading at or under k1 floors at 1e-4", () => {
    for (const r of [0.9, 0.5, 0.2, 0.01]) expect(saundersonInverse(saundersonForward(r))).toBeCloseTo(r, 12);
    expect(saundersonInverse(0.03)).toBe(1e-4);
  });
});

describe("K/S spectra and additivity", () => {
  const base = Float64Array.from({ length: 36 }, (_, i) => 0.4 + 0.01 * i);
  it("spectrum ↔ reflectance round trip, with and without the surface correction", () => {
    for (const surface of ["none", "saunderson"] as const) {
      const back = reflectanceFromKsSpectrum(ksSpectrum(base, surface), surface);
      back.forEach((v, i) => expect(v).toBeCloseTo(base[i], 12));
    }
  });
  it("K/S adds: substrate + Σ c·k per band (Nobbs 1985; Berns 2000)", () => {
    const ks = ksSpectrum(base);
    const k1 = new Float64Array(36).fill(0.5), k2 = Float64Array.from({ length: 36 }, (_, i) => i / 10);
    const rho = dyedReflectance(ks, [k1, k2], [2, 0.5]);
    for (const i of [0, 17, 35]) expect(ksFromReflectance(rho[i])).toBeCloseTo(ks[i] + 2 * 0.5 + 0.5 * (i / 10), 10);
    // No dye → the substrate itself.
    dyedReflectance(ks, [], []).forEach((v, i) => expect(v).toBeCloseTo(base[i], 12));
  });
});
