import { describe, expect, it } from "vitest";
import { deltaE00, deltaECMC } from "@/colour/difference";
import {
  approximateWashGrade, compareVerdict, describeDifference, errorSummary, greyScaleGrade, greyScaleLabel, judgeLot,
} from "@/colour/judgement";
import { lchToLab } from "@/colour/spaces";
import type { Lab } from "@/colour/types";

// Two neutrals placed symmetrically about L* = 50 differ by exactly their ΔL* in ΔE00 (S_L = 1 there,
// Sharma et al. 2005 eq. 17), which gives exact inputs for the band checks.
const neutralPair = (d: number): [Lab, Lab] => [{ L: 50 - d / 2, a: 0, b: 0 }, { L: 50 + d / 2, a: 0, b: 0 }];

describe("grey-scale grade (ISO 105-A05 §8 mapping)", () => {
  // ISO 105-A02 nominal ΔE*ab per grade [EN 20105-A02:1994 preview, via DOMAIN.md/REFERENCES.md];
  // the A05 formula maps them to 5, 4.53, 4.00, 3.53, 3.00, 2.50, 2.00, 1.50, 1.00 [REFERENCES.md, computed].
  const nominal: [number, number][] = [
    [0, 5], [0.8, 4.5], [1.7, 4], [2.5, 3.5], [3.4, 3], [4.8, 2.5], [6.8, 2], [9.6, 1.5], [13.6, 1],
  ];
  it.each(nominal)("A02 nominal ΔE %f → grade %f", (dE, grade) => {
    expect(Math.abs(greyScaleGrade(dE) - grade)).toBeLessThanOrEqual(0.05);
  });
  it("rounds to 0.1 and never goes below 1", () => {
    expect(greyScaleGrade(0.8)).toBe(4.5); // 5 − 0.8/1.7 = 4.529 → 4.5 (A05 §8 rounding to 0.1)
    expect(greyScaleGrade(1)).toBe(4.4); // 5 − 1/1.7 = 4.412
    expect(greyScaleGrade(40)).toBe(1);
  });
  it("joins its two branches at ΔE 3.4", () => {
    expect(greyScaleGrade(3.4)).toBe(3);
    expect(greyScaleGrade(3.41)).toBe(3);
  });
  it("refuses negative or non-numeric differences", () => {
    expect(() => greyScaleGrade(-1)).toThrow(RangeError);
    expect(() => greyScaleGrade(Number.NaN)).toThrow(RangeError);
  });
  it("labels half steps the way grey scales are written (ISO 105-A02: 4-5, 3-4, …)", () => {
    expect(greyScaleLabel(4.5)).toBe("4-5");
    expect(greyScaleLabel(4.6)).toBe("4-5");
    expect(greyScaleLabel(4.8)).toBe("5");
    expect(greyScaleLabel(1.4)).toBe("1-2");
    expect(greyScaleLabel(3)).toBe("3");
  });
});

describe("approximate wash grade", () => {
  it("grades from ΔE*ab and says it is approximate", () => {
    const before = { L: 55, a: 20, b: 10 };
    const after = { L: 55 + 1.7, a: 20, b: 10 }; // ΔE*ab = 1.7 → grade 4 (A02 nominal, A05 mapping)
    const g = approximateWashGrade(before, after);
    expect(g.deltaEab).toBeCloseTo(1.7, 12);
    expect(g.grade).toBe(4);
    expect(g.label).toBe("4");
    expect(g.approximate).toBe(true);
    expect(g.de00).toBeCloseTo(deltaE00(before, after), 12);
  });
  it("labels a 0.8 change 4-5", () => {
    expect(approximateWashGrade({ L: 60, a: 0, b: 0 }, { L: 60, a: 0.8, b: 0 }).label).toBe("4-5");
  });
});

describe("lot judgement", () => {
  const target = { L: 52, a: 18, b: 24 };
  it("passes exactly at the tolerance and fails just beyond it (CMC(2:1), ISO 105-J03)", () => {
    const lot = { L: 51, a: 18.6, b: 24.4 };
    const d = deltaECMC(target, lot, 2, 1);
    expect(judgeLot(target, lot, { metric: "cmc21", max: d }).pass).toBe(true);
    expect(judgeLot(target, lot, { metric: "cmc21", max: d * (1 - 1e-12) }).pass).toBe(false);
  });
  it("uses CIEDE2000 with kL = 2 for the de00 metric unless told otherwise", () => {
    const lot = { L: 49, a: 18, b: 24 };
    const j = judgeLot(target, lot, { metric: "de00", max: 1 });
    expect(j.de00).toBeCloseTo(deltaE00(target, lot, { kL: 2 }), 12);
    expect(j.deltaE).toBe(j.de00);
    expect(j.cmc21).toBeCloseTo(deltaECMC(target, lot, 2, 1), 12);
    expect(judgeLot(target, lot, { metric: "de00", max: 1, kL: 1 }).de00).toBeCloseTo(deltaE00(target, lot), 12);
    const exact = judgeLot(target, lot, { metric: "de00", max: j.de00 });
    expect(exact.pass).toBe(true);
  });
  it("says which way a failing lot missed, and nothing for a passing lot", () => {
    const dark = judgeLot(target, { L: 47, a: 18, b: 24 }, { metric: "cmc21", max: 1 });
    expect(dark.pass).toBe(false);
    expect(dark.misses).toEqual(["darker"]);
    const ok = judgeLot(target, { L: 51.8, a: 18, b: 24 }, { metric: "cmc21", max: 1 });
    expect(ok.pass).toBe(true);
    expect(ok.misses).toEqual([]);
  });
  it("refuses a negative tolerance", () => {
    expect(() => judgeLot(target, target, { metric: "cmc21", max: -1 })).toThrow(RangeError);
  });
});

describe("words for a difference", () => {
  const at = (L: number, C: number, h: number) => lchToLab({ L, C, h });
  it("lightness and chroma", () => {
    expect(describeDifference(at(50, 30, 40), at(52, 30, 40))).toEqual(["lighter"]);
    expect(describeDifference(at(50, 30, 40), at(50, 25, 40))).toEqual(["duller"]);
    expect(describeDifference(at(50, 30, 40), at(50, 35, 40))).toEqual(["brighter"]);
  });
  it("hue, by quadrant of the reference (red 0°, yellow 90°, green 180°, blue 270°)", () => {
    const cases: [number, string, string][] = [
      [45, "yellower", "redder"], [135, "greener", "yellower"], [225, "bluer", "greener"], [315, "redder", "bluer"],
    ];
    for (const [h, up, down] of cases) {
      expect(describeDifference(at(50, 30, h), at(50, 30, h + 5))).toEqual([up]);
      expect(describeDifference(at(50, 30, h), at(50, 30, h - 5))).toEqual([down]);
    }
  });
  it("near-neutral references use a* and b* directly", () => {
    expect(describeDifference({ L: 50, a: 0, b: 0 }, { L: 50, a: 2, b: -2 })).toEqual(["redder", "bluer"]);
    expect(describeDifference({ L: 50, a: 1, b: 1 }, { L: 50, a: -1, b: 3 })).toEqual(["greener", "yellower"]);
  });
  it("stays quiet below the threshold", () => {
    expect(describeDifference(at(50, 30, 40), at(50.4, 30.3, 40.5))).toEqual([]);
  });
});

describe("prediction against measurement", () => {
  it("bands at 2 and 5 ΔE00, boundaries inclusive (our product choice)", () => {
    expect(compareVerdict(...neutralPair(2)).verdict).toBe("close");
    expect(compareVerdict(...neutralPair(2.001)).verdict).toBe("noticeable");
    expect(compareVerdict(...neutralPair(5)).verdict).toBe("noticeable");
    expect(compareVerdict(...neutralPair(5.001)).verdict).toBe("far");
    const v = compareVerdict(...neutralPair(3));
    expect(v.de00).toBeCloseTo(3, 12);
    expect(v.differences).toEqual(["lighter"]);
  });
  it("summarises errors: mean, median, p95 (linear interpolation), max", () => {
    const pairs = Array.from({ length: 20 }, (_, i) => {
      const [predicted, measured] = neutralPair(i + 1);
      return { predicted, measured };
    });
    const s = errorSummary(pairs);
    expect(s.n).toBe(20);
    expect(s.mean).toBeCloseTo(10.5, 10);
    expect(s.median).toBeCloseTo(10.5, 10);
    expect(s.p95).toBeCloseTo(19.05, 10); // rank 0.95·19 = 18.05 → 19 + 0.05
    expect(s.max).toBeCloseTo(20, 10);
    expect(() => errorSummary([])).toThrow(/No predictions/);
  });
});
