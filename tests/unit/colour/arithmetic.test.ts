import { describe, expect, it } from "vitest";
import {
  acidFor, bathLitres, bathStrengthGPerL, costPerSkein, dosFromGrams, dosFromStockMl, dyeGrams, exhaustionPct,
  gramsFromStockMl, liquorRatio, scaleRecipe, stockMl,
} from "@/colour/arithmetic";

describe("depth of shade and stock solutions", () => {
  it("grams of dye = fibre g × DOS % / 100 (DOMAIN.md)", () => {
    expect(dyeGrams(100, 1)).toBe(1);
    expect(dyeGrams(454, 2)).toBeCloseTo(9.08, 12);
    expect(dosFromGrams(454, 9.08)).toBeCloseTo(2, 12);
  });
  it("DOMAIN.md check values [common practice]", () => {
    expect(stockMl(100, 1, 1)).toBeCloseTo(100, 12); // 100 g at 1 % with 1 % stock → 100 ml
    expect(stockMl(454, 2, 1)).toBeCloseTo(908, 10); // 454 g at 2 % → 908 ml
    expect(stockMl(454, 0.1, 1)).toBeCloseTo(45.4, 10); // 454 g at 0.1 % → 45.4 ml of 1 % stock
    expect(stockMl(454, 0.1, 0.1)).toBeCloseTo(454, 10); // … or 454 ml of 0.1 % stock
  });
  it("goes back from millilitres to grams and DOS", () => {
    expect(gramsFromStockMl(100, 1, "to-volume")).toBeCloseTo(1, 12); // 1 % stock = 10 g/l (DOMAIN.md)
    expect(dosFromStockMl(454, 908, 1)).toBeCloseTo(2, 12);
  });
  it("a 1 % stock 'in water' is 1 g in 101 g, taken as 101 ml (density 1, our stated assumption)", () => {
    expect(gramsFromStockMl(101, 1, "in-water")).toBeCloseTo(1, 12);
    expect(stockMl(100, 1, 1, "in-water")).toBeCloseTo(101, 12);
    expect(dosFromStockMl(100, 101, 1, "in-water")).toBeCloseTo(1, 12);
  });
  it("refuses meaningless inputs with a plain message", () => {
    expect(() => dyeGrams(0, 1)).toThrow(/Fibre weight must be more than zero/);
    expect(() => dyeGrams(100, -1)).toThrow(/cannot be negative/);
    expect(() => stockMl(100, 1, 0)).toThrow(/Stock strength/);
    expect(() => gramsFromStockMl(-5, 1, "to-volume")).toThrow(RangeError);
    expect(() => dyeGrams(Number.NaN, 1)).toThrow(RangeError);
  });
});

describe("liquor ratio and bath strength", () => {
  it("100 g in 4 l is 1:40 (DOMAIN.md)", () => {
    expect(liquorRatio(4, 100)).toBeCloseTo(40, 12);
    expect(bathLitres(100, 40)).toBeCloseTo(4, 12);
  });
  it("bath strength g/l = DOS % × 10 / N (DOMAIN.md): 1 % on 100 g at 1:40 is 1 g in 4 l", () => {
    expect(bathStrengthGPerL(1, 40)).toBeCloseTo(0.25, 12);
    expect(bathStrengthGPerL(1, 40)).toBeCloseTo(dyeGrams(100, 1) / bathLitres(100, 40), 12);
  });
  it("refuses an empty bath", () => {
    expect(() => liquorRatio(0, 100)).toThrow(/Bath volume/);
  });
});

describe("acid", () => {
  it("a US cup of vinegar per pound of fibre is about 2.6 % owf [common practice, DOMAIN.md]", () => {
    const perPound = acidFor(453.59237, { kind: "vinegar", owfPct: 2.6 });
    expect(Math.abs(perPound.amount - 236.5882365)).toBeLessThan(1); // within a millilitre of a cup
    expect(acidFor(100, { kind: "vinegar", owfPct: 2.6 }).amount).toBeCloseTo(52, 10); // ≈ 52 ml per 100 g
  });
  it("defaults to 2 % owf and gives the 1–3 % owf span (Broadbent 2001, pp. 244–246)", () => {
    const v = acidFor(100, { kind: "vinegar" });
    expect(v.owfPct).toBe(2);
    expect(v.amount).toBeCloseTo(40, 10); // 2 g acetic acid in 5 % vinegar
    expect(v.unit).toBe("ml");
    expect(v.low).toBeCloseTo(20, 10);
    expect(v.high).toBeCloseTo(60, 10);
  });
  it("citric acid: 1 g for 10–20 ml of vinegar [common practice]", () => {
    const c = acidFor(100, { kind: "citric" });
    expect(c.unit).toBe("g");
    expect(c.amount).toBeCloseTo(40 / 15, 10);
    expect(c.low).toBeCloseTo(1, 10); // 20 ml / 20
    expect(c.high).toBeCloseTo(6, 10); // 60 ml / 10
    expect(c.note).toMatch(/rough/);
  });
  it("refuses a zero dose", () => {
    expect(() => acidFor(100, { kind: "vinegar", owfPct: 0 })).toThrow(/Acid dose/);
  });
});

describe("scaling a recipe to a dye lot", () => {
  const recipe = [
    { name: "1 % stock, teal", amount: 60, unit: "ml" },
    { name: "vinegar", amount: 40, unit: "ml" },
    { name: "water", amount: 3, unit: "l" },
    { name: "wetting agent", amount: 2, unit: "drops", scales: "fixed" as const },
  ];
  it("scales per-fibre amounts in proportion and keeps fixed ones", () => {
    const s = scaleRecipe(recipe, 100, 454, "immersion");
    expect(s.factor).toBeCloseTo(4.54, 12);
    const [stock, vinegar, water, wetting] = s.lines.map((l) => l.amount);
    expect(stock).toBeCloseTo(272.4, 10);
    expect(vinegar).toBeCloseTo(181.6, 10);
    expect(water).toBeCloseTo(13.62, 10);
    expect(wetting).toBe(2);
    expect(s.warning).toBeUndefined();
    expect(recipe[0].amount).toBe(60); // input untouched
  });
  it("warns for methods that do not scale linearly (DOMAIN.md)", () => {
    for (const m of ["speckle", "hand-paint", "dry", "low-water", "kettle"] as const) {
      expect(scaleRecipe(recipe, 100, 300, m).warning).toMatch(/straight line/);
    }
    expect(scaleRecipe(recipe, 100, 300, "dip-dye").warning).toBeUndefined();
  });
  it("refuses a zero weight", () => {
    expect(() => scaleRecipe(recipe, 0, 100, "immersion")).toThrow(/Recipe fibre weight/);
  });
});

describe("exhaustion and cost", () => {
  it("E % = (in − left) / in × 100 (DOMAIN.md)", () => {
    expect(exhaustionPct(10, 1)).toBeCloseTo(90, 12);
    expect(exhaustionPct(10, 0)).toBe(100);
    expect(() => exhaustionPct(1, 2)).toThrow(/More dye is left/);
  });
  it("cost per skein = sum of costs / skeins (DOMAIN.md)", () => {
    expect(costPerSkein({ base: 60, dye: 3, acid: 0.5, energy: 1.5, packaging: 5 }, 5)).toBeCloseTo(14, 12);
    expect(costPerSkein({ base: 60, dye: 3, acid: 0.5, energy: 1.5, packaging: 5, labour: 20 }, 5)).toBeCloseTo(18, 12);
    expect(() => costPerSkein({ base: 1, dye: 1, acid: 1, energy: 1, packaging: 1 }, 0)).toThrow(/whole number/);
    expect(() => costPerSkein({ base: -1, dye: 1, acid: 1, energy: 1, packaging: 1 }, 1)).toThrow(/base cost/);
  });
});
