import { describe, expect, it } from "vitest";
import { Matrix } from "ml-matrix";
import { deltaE00 } from "@/colour/difference";
import { fitDyeProfile, fitDyeProfiles, profileFromJson, profileToJson, type CalibrationDyeing } from "@/colour/spectral/profile";
import { nnls } from "@/colour/spectral/nnls";
import { predictLayer } from "@/colour/spectral/predict";
import { reflectanceToLab } from "@/colour/spectral/reflectance";
import {
  SYNTHETIC_BASES, seededRandom, syntheticCalibrationSet, syntheticDyeing, trueResult,
} from "@/colour/spectral/synthetic-dyeings";

describe("non-negative least squares (Lawson & Hanson 1974)", () => {
  it("equals ordinary least squares when that is already non-negative", () => {
    const A = new Matrix([[1, 0], [0, 1], [1, 1]]);
    const x = nnls(A, [1, 2, 3.3]); // OLS: x = (1.1, 2.1)
    expect(x[0]).toBeCloseTo(1.1, 10);
    expect(x[1]).toBeCloseTo(2.1, 10);
  });
  it("clamps a variable that OLS would make negative and refits the rest", () => {
    const A = new Matrix([[1, 0], [0, 1]]);
    expect(nnls(A, [2, -3])).toEqual([2, 0]);
    // Correlated columns: OLS gives (3, −1); the constrained optimum sets x₂ = 0 and x₁ = Σab/Σa² = 11/5.
    const B = new Matrix([[1, 1], [2, 1], [0, 1]]);
    const y = nnls(B, [2, 5, -1]);
    expect(y[1]).toBe(0);
    expect(y[0]).toBeCloseTo(12 / 5, 10);
  });
});

describe("fitting dye profiles", () => {
  it("refuses with a plain message when there is nothing usable", () => {
    const none = fitDyeProfiles([]);
    expect(none.ok).toBe(false);
    if (!none.ok) expect(none.message).toMatch(/No calibration dyeings/);
    const bad: CalibrationDyeing[] = [
      { base: { L: 90, a: 0, b: 5 }, dyes: [], result: { L: 50, a: 10, b: 10 } },
      { base: { L: 90, a: 0, b: 5 }, dyes: [{ dyeId: "x", dosPct: 0 }], result: { L: 50, a: 10, b: 10 } },
      { base: { L: Number.NaN, a: 0, b: 5 }, dyes: [{ dyeId: "x", dosPct: 1 }], result: { L: 50, a: 10, b: 10 } },
      { base: { L: 90, a: 0, b: 5 }, dyes: [{ dyeId: "x", dosPct: 1 }], uptake: 1.5, result: { L: 50, a: 10, b: 10 } },
    ];
    const fit = fitDyeProfiles(bad);
    expect(fit.ok).toBe(false);
    if (!fit.ok) {
      expect(fit.message).toMatch(/None of the calibration dyeings can be used/);
      expect(fit.skipped.map((s) => s.reason)).toEqual([
        "no dye is listed", "the depth of x is not above 0 %", "the base colour is missing or not a CIELAB value",
        "the uptake is not between 0 and 1",
      ]);
    }
    const missing = fitDyeProfile(syntheticCalibrationSet(), "indigo");
    expect(missing.ok).toBe(false);
  });
  it("learns every invented dye from single-dye dyeings and reports its own fit quality", () => {
    const fit = fitDyeProfiles(syntheticCalibrationSet(), { fibre: "wool" });
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(fit.profiles.map((p) => p.dyeId).sort()).toEqual(["black", "golden-yellow", "magenta", "turquoise"]);
    for (const p of fit.profiles) {
      expect(p.fibre).toBe("wool");
      expect(p.quality.n).toBe(3);
      expect(p.calibratedUpTo).toBe(3);
      expect(p.quality.maxDE00).toBeGreaterThanOrEqual(p.quality.meanDE00);
      for (const v of p.unitKs) expect(v).toBeGreaterThanOrEqual(0);
    }
    expect(fit.quality.n).toBe(12);
    console.log(`fit to own dyeings: mean ΔE00 ${fit.quality.meanDE00.toFixed(2)}, max ${fit.quality.maxDE00.toFixed(2)}`);
    expect(fit.quality.meanDE00).toBeLessThan(2);
  });
  it("stores as plain JSON and reads back; refuses a damaged spectrum", () => {
    const fit = fitDyeProfiles(syntheticCalibrationSet());
    if (!fit.ok) throw new Error(fit.message);
    const p = fit.profiles[0];
    const back = profileFromJson(JSON.parse(JSON.stringify(profileToJson(p))));
    expect(Array.from(back.unitKs)).toEqual(Array.from(p.unitKs));
    expect(back.quality).toEqual(p.quality);
    expect(() => profileFromJson({ ...profileToJson(p), unitKs: [1, 2] })).toThrow(/36 non-negative/);
  });
  it("learns two dyes jointly from mixes only", () => {
    const w = SYNTHETIC_BASES.white;
    const mixes = [
      [0.2, 1], [1, 0.2], [0.5, 0.5], [2, 0.6], [0.6, 2],
    ].map(([t, y]) => syntheticDyeing(w, [{ dyeId: "turquoise", dosPct: t }, { dyeId: "golden-yellow", dosPct: y }]));
    const fit = fitDyeProfiles(mixes);
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(fit.notes).toEqual([]);
    const [t, y] = ["turquoise", "golden-yellow"].map((id) => fit.profiles.find((p) => p.dyeId === id)!);
    // Held out: each dye alone at 1 %.
    for (const p of [t, y]) {
      const truth = reflectanceToLab(trueResult(w, [{ dyeId: p.dyeId, dosPct: 1 }]));
      const pred = predictLayer(reflectanceToLab(w), { dyes: [{ profile: p, dosPct: 1 }] });
      expect(deltaE00(pred.lab, truth)).toBeLessThan(6);
    }
  });
  it("says when two dyes always come in the same proportion", () => {
    const w = SYNTHETIC_BASES.white;
    const same = [0.5, 1, 2].map((d) => syntheticDyeing(w, [{ dyeId: "magenta", dosPct: d }, { dyeId: "black", dosPct: d / 2 }]));
    const fit = fitDyeProfiles(same);
    expect(fit.ok && fit.notes.some((n) => /cannot be told apart/.test(n))).toBe(true);
  });
  it("counts uptake: half the dye taken up at 2 % is learnt like 1 %", () => {
    const w = SYNTHETIC_BASES.white;
    const a = fitDyeProfile([syntheticDyeing(w, [{ dyeId: "magenta", dosPct: 2 }], { uptake: 0.5 })], "magenta");
    const b = fitDyeProfile([syntheticDyeing(w, [{ dyeId: "magenta", dosPct: 1 }])], "magenta");
    expect(a.ok && b.ok).toBe(true);
    if (a.ok && b.ok) a.profile.unitKs.forEach((v, i) => expect(v).toBeCloseTo(b.profile.unitKs[i], 8));
  });
  it("tolerates measuring noise (ΔE ≈ 0.5 per reading) and still fits within a few ΔE00", () => {
    const fit = fitDyeProfiles(syntheticCalibrationSet({ noiseSd: 0.3, random: seededRandom(3) }));
    expect(fit.ok).toBe(true);
    if (fit.ok) expect(fit.quality.meanDE00).toBeLessThan(3);
  });
  it("fits with Saunderson's surface correction too, and marks the profiles so", () => {
    // Measurements that include a surface reflection (k1 0.04, k2 0.6), fitted with the correction.
    const cal = syntheticCalibrationSet({ surface: "saunderson" });
    const fit = fitDyeProfiles(cal, { surface: "saunderson" });
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(fit.profiles.every((p) => p.surface === "saunderson")).toBe(true);
    expect(fit.quality.meanDE00).toBeLessThan(1);
    const magenta = fit.profiles.find((p) => p.dyeId === "magenta")!;
    const w = SYNTHETIC_BASES.white;
    const truth = syntheticDyeing(w, [{ dyeId: "magenta", dosPct: 2 }], { surface: "saunderson" });
    const pred = predictLayer(truth.base, { dyes: [{ profile: magenta, dosPct: 2 }] });
    expect(deltaE00(pred.lab, truth.result)).toBeLessThan(1.5);
  });
});
