// The lower bound that lets the nearest-colour search stop early must never exceed the true
// CIEDE2000 (Sharma, Wu & Dalal 2005), or the search could miss a match.
import { describe, expect, it } from "vitest";
import { deltaE00, deltaEab } from "@/colour";
import { de00LowerBound, radiusFor } from "@/lib/learning/colour-bound";

function rng(seed: number) {
  return () => ((seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

describe("de00LowerBound", () => {
  it("stays below the true ΔE00 for 200 000 random pairs, saturated ones included", () => {
    const r = rng(42);
    let worst = Infinity;
    let violations = 0;
    for (let i = 0; i < 200_000; i++) {
      const x = { L: r() * 100, a: r() * 256 - 128, b: r() * 256 - 128 };
      // Half the pairs are near each other, where the bound is tightest.
      const s = i % 2 ? 10 : 120;
      const y = { L: Math.min(100, Math.max(0, x.L + (r() - 0.5) * s)), a: x.a + (r() - 0.5) * s, b: x.b + (r() - 0.5) * s };
      const bound = de00LowerBound(deltaEab(x, y), Math.hypot(x.a, x.b));
      const ratio = deltaE00(x, y) / bound;
      worst = Math.min(worst, ratio);
      if (!(ratio >= 1)) violations++;
    }
    expect(violations).toBe(0);
    expect(worst).toBeGreaterThan(1); // a real margin, not an equality by accident
  });

  it("grows with distance, so a wider search box always raises it", () => {
    for (const c of [0, 30, 90]) {
      expect(de00LowerBound(16, c)).toBeGreaterThan(de00LowerBound(8, c));
      expect(de00LowerBound(0, c)).toBe(0);
    }
  });

  it("radiusFor inverts it: at that radius the bound reaches the given difference", () => {
    for (const [d, c] of [[1, 0], [3, 30], [8, 90]]) expect(de00LowerBound(radiusFor(d, c), c)).toBeCloseTo(d, 9);
    expect(radiusFor(20, 0)).toBe(Infinity); // beyond what the bound can ever promise
  });
});
