import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { differenceCiede2000, differenceCmc } from "culori";
import { TEXTILE_KL, deltaE00, deltaECMC, deltaEab } from "@/colour/difference";
import type { Lab } from "@/colour/types";

function rng(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const c65 = (x: Lab) => ({ mode: "lab65" as const, l: x.L, a: x.a, b: x.b });
const randomPairs = (seed: number, n: number): [Lab, Lab][] => {
  const r = rng(seed);
  const lab = (): Lab => ({ L: r() * 100, a: r() * 240 - 120, b: r() * 240 - 120 });
  return Array.from({ length: n }, () => {
    const x = lab();
    // half the pairs close together, as lot checks are
    const y = r() < 0.5 ? lab() : { L: x.L + r() * 4 - 2, a: x.a + r() * 4 - 2, b: x.b + r() * 4 - 2 };
    return [x, y];
  });
};

// Sharma, Wu & Dalal 2005, Table 1 (all 34 pairs)
const sharma = readFileSync(new URL("../../data/ciede2000-sharma2005.csv", import.meta.url), "utf8")
  .trim().split("\n").slice(1).map((line) => line.split(",").map(Number));

describe("CIEDE2000", () => {
  it("has the 34 pairs of Sharma, Wu & Dalal 2005 Table 1", () => {
    expect(sharma).toHaveLength(34);
  });
  it.each(sharma)("pair %i matches Sharma, Wu & Dalal 2005 Table 1 to ±1e-4", (_n, L1, a1, b1, L2, a2, b2, dE) => {
    expect(Math.abs(deltaE00({ L: L1, a: a1, b: b1 }, { L: L2, a: a2, b: b2 }) - dE)).toBeLessThanOrEqual(1e-4);
  });
  it("is symmetric (Sharma et al. 2005 note the formula is; checked on the table and random pairs)", () => {
    for (const [, L1, a1, b1, L2, a2, b2] of sharma) {
      const x = { L: L1, a: a1, b: b1 }, y = { L: L2, a: a2, b: b2 };
      expect(deltaE00(y, x)).toBeCloseTo(deltaE00(x, y), 12);
    }
    for (const [x, y] of randomPairs(3, 2000)) expect(deltaE00(y, x)).toBeCloseTo(deltaE00(x, y), 10);
  });
  it("is zero for identical colours", () => {
    expect(deltaE00({ L: 40, a: 12, b: -7 }, { L: 40, a: 12, b: -7 })).toBe(0);
  });
  it("matches culori differenceCiede2000 (D65 Lab) on 5000 seeded random pairs", () => {
    const ref = differenceCiede2000();
    for (const [x, y] of randomPairs(11, 5000)) expect(deltaE00(x, y)).toBeCloseTo(ref(c65(x), c65(y)), 9);
  });
  it("matches culori with textile weights kL = 2, and with kC, kH", () => {
    expect(TEXTILE_KL).toBe(2); // DOMAIN.md: CIEDE2000 with textile weights kL = 2
    const textile = differenceCiede2000(2, 1, 1);
    const odd = differenceCiede2000(1.5, 0.7, 1.3);
    for (const [x, y] of randomPairs(12, 2000)) {
      expect(deltaE00(x, y, { kL: TEXTILE_KL })).toBeCloseTo(textile(c65(x), c65(y)), 9);
      expect(deltaE00(x, y, { kL: 1.5, kC: 0.7, kH: 1.3 })).toBeCloseTo(odd(c65(x), c65(y)), 9);
    }
    // kL = 2 halves a pure lightness term
    const x = { L: 50, a: 0, b: 0 }, y = { L: 52, a: 0, b: 0 };
    expect(deltaE00(x, y, { kL: 2 })).toBeCloseTo(deltaE00(x, y) / 2, 12);
  });
});

describe("CMC(l:c)", () => {
  // REFERENCES.md check pairs [read, computed with colorjs.io and culori]: Lab1 | Lab2 → CMC(1:1), CMC(2:1)
  const pairs: [Lab, Lab, number, number][] = [
    [{ L: 100, a: 0, b: 0 }, { L: 0, a: 0, b: 0 }, 67.480171, 33.740085],
    [{ L: 100, a: -50, b: 50 }, { L: 20, a: 10, b: -20 }, 66.320207, 47.038863],
    [{ L: 41.41, a: 2.64, b: 4.15 }, { L: 0, a: 0, b: 0 }, 42.570316, 21.769476],
  ];
  it.each(pairs)("%o | %o matches REFERENCES.md to ±1e-5", (std, smp, cmc11, cmc21) => {
    expect(Math.abs(deltaECMC(std, smp, 1, 1) - cmc11)).toBeLessThanOrEqual(1e-5);
    expect(Math.abs(deltaECMC(std, smp) - cmc21)).toBeLessThanOrEqual(1e-5); // default l:c = 2:1
  });
  it("is not symmetric: the weights come from the standard (Clarke, McDonald & Rigg 1984)", () => {
    const std = { L: 100, a: -50, b: 50 }, smp = { L: 20, a: 10, b: -20 };
    expect(Math.abs(deltaECMC(std, smp) - deltaECMC(smp, std))).toBeGreaterThan(1);
  });
  it("matches culori differenceCmc on 5000 seeded random pairs at 1:1 and 2:1", () => {
    const ref11 = differenceCmc(1, 1), ref21 = differenceCmc(2, 1);
    for (const [x, y] of randomPairs(21, 5000)) {
      expect(deltaECMC(x, y, 1, 1)).toBeCloseTo(ref11(c65(x), c65(y)), 9);
      expect(deltaECMC(x, y, 2, 1)).toBeCloseTo(ref21(c65(x), c65(y)), 9);
    }
  });
});

describe("ΔE*ab", () => {
  it("is the Euclidean distance (CIE 1976)", () => {
    expect(deltaEab({ L: 50, a: 3, b: 4 }, { L: 50, a: 0, b: 0 })).toBe(5);
    expect(deltaEab({ L: 10, a: 0, b: 0 }, { L: 12, a: 0, b: 0 })).toBe(2);
  });
});
