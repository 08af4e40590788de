import { describe, expect, it } from "vitest";
import {
  AU_TBSP_ML, METRIC_CUP_ML, OUNCE_G, POUND_G, US_CUP_ML, US_FLOZ_ML, US_GALLON_ML, US_TBSP_ML, US_TSP_ML,
  cToF, fToC, formatAmount, formatMl, parseAmount,
} from "@/colour/units";

describe("US customary measures (NIST Handbook 44, Appendix C)", () => {
  it("the gallon is 231 cubic inches, the inch 2.54 cm exactly", () => {
    expect(231 * 2.54 ** 3).toBeCloseTo(3785.411784, 9);
    expect(US_GALLON_ML).toBe(3785.411784);
  });
  it("cup = 1/16 gal, fl oz = 1/8 cup, tbsp = 1/2 fl oz, tsp = 1/3 tbsp, to the exact decimals", () => {
    expect(US_CUP_ML).toBe(236.5882365);
    expect(US_FLOZ_ML).toBe(29.5735295625);
    expect(US_TBSP_ML).toBe(14.78676478125);
    expect(US_TSP_ML).toBe(4.92892159375);
    expect(US_GALLON_ML / 16).toBeCloseTo(US_CUP_ML, 12);
    expect(US_CUP_ML / 8).toBeCloseTo(US_FLOZ_ML, 12);
    expect(US_FLOZ_ML / 2).toBeCloseTo(US_TBSP_ML, 12);
    expect(US_TBSP_ML / 3).toBeCloseTo(US_TSP_ML, 12);
  });
  it("pound = 453.59237 g, ounce = 1/16 lb (exact)", () => {
    expect(POUND_G).toBe(453.59237);
    expect(OUNCE_G).toBe(28.349523125);
    expect(POUND_G / 16).toBeCloseTo(OUNCE_G, 12);
  });
  it("metric cup 250 ml, Australian tablespoon 20 ml (DOMAIN.md)", () => {
    expect(METRIC_CUP_ML).toBe(250);
    expect(AU_TBSP_ML).toBe(20);
  });
  it("a third of a cup is about 79 ml (DOMAIN.md)", () => {
    expect(Math.round(US_CUP_ML / 3)).toBe(79);
  });
});

describe("temperatures", () => {
  it("°C ↔ °F by the scale definitions (water freezes at 0 °C = 32 °F, boils at 100 °C = 212 °F)", () => {
    expect(cToF(0)).toBe(32);
    expect(cToF(100)).toBe(212);
    expect(fToC(212)).toBe(100);
    expect(cToF(-40)).toBe(-40);
    expect(fToC(cToF(85))).toBeCloseTo(85, 12);
  });
});

describe("parseAmount", () => {
  it.each([
    ["1/3 cup", 1 / 3, "cup", US_CUP_ML / 3],
    ["1 1/2 tsp", 1.5, "tsp", 1.5 * US_TSP_ML],
    ["1-1/2 tsp", 1.5, "tsp", 1.5 * US_TSP_ML],
    ["½ cup", 0.5, "cup", US_CUP_ML / 2],
    ["1½ cups", 1.5, "cup", 1.5 * US_CUP_ML],
    ["1 tbsp", 1, "tbsp", US_TBSP_ML],
    ["2 T", 2, "tbsp", 2 * US_TBSP_ML],
    ["2 t", 2, "tsp", 2 * US_TSP_ML],
    ["45 ml", 45, "ml", 45],
    ["45ml", 45, "ml", 45],
    ["3 l", 3, "l", 3000],
    ["2 fl oz", 2, "floz", 2 * US_FLOZ_ML],
    [".5 Teaspoons", 0.5, "tsp", 0.5 * US_TSP_ML],
  ] as const)("reads %s as a volume", (text, value, unit, ml) => {
    const a = parseAmount(text);
    expect(a.value).toBeCloseTo(value, 12);
    expect(a.unit).toBe(unit);
    expect(a.ml).toBeCloseTo(ml, 9);
    expect(a.g).toBeUndefined();
  });
  it.each([
    ["2.5 g", 2.5, "g", 2.5],
    ["2,5 g", 2.5, "g", 2.5],
    ["4 oz", 4, "oz", 4 * OUNCE_G],
    ["1 lb", 1, "lb", POUND_G],
  ] as const)("reads %s as a weight", (text, value, unit, g) => {
    const a = parseAmount(text);
    expect(a.value).toBeCloseTo(value, 12);
    expect(a.unit).toBe(unit);
    expect(a.g).toBeCloseTo(g, 9);
    expect(a.ml).toBeUndefined();
  });
  it("reads a percentage with neither ml nor g", () => {
    expect(parseAmount("0.5 %")).toEqual({ value: 0.5, unit: "%" });
    expect(parseAmount("2% owf")).toEqual({ value: 2, unit: "%" });
  });
  it("reads a sum of kitchen measures in millilitres", () => {
    const a = parseAmount("1/3 cup + 1 tsp");
    expect(a.unit).toBe("ml");
    expect(a.ml).toBeCloseTo(US_CUP_ML / 3 + US_TSP_ML, 9);
    expect(parseAmount("1 lb + 2 oz").g).toBeCloseTo(POUND_G + 2 * OUNCE_G, 9);
  });
  it("honours a metric cup and an Australian tablespoon when asked", () => {
    expect(parseAmount("1 cup", { cup: "metric" }).ml).toBe(250);
    expect(parseAmount("1 tbsp", { tablespoon: "au" }).ml).toBe(20);
  });
  it.each([
    ["", /Enter an amount/],
    ["cup", /Could not read a number/],
    ["5", /Add a unit/],
    ["2 pinches", /not a unit we know: use ml/],
    ["70-80 ml", /range/],
    ["-5 g", /negative/],
    ["1/0 cup", /divides by zero/],
    ["1,000 g", /Is "1,000" 1 or 1000\?/],
    ["1 cup + 5 g", /one kind/],
    ["1.5/2 cup", /whole numbers/],
  ])("explains what is wrong with %j", (text, message) => {
    expect(() => parseAmount(text)).toThrow(message);
  });
});

describe("formatAmount", () => {
  it("writes the nearest kitchen measures with the exact ml", () => {
    expect(formatAmount(US_CUP_ML / 3, "us")).toBe("1/3 cup (78.9 ml)");
    expect(formatAmount(US_CUP_ML / 3 + US_TSP_ML, "us")).toBe("1/3 cup + 1 tsp (83.8 ml)");
    expect(formatAmount(US_TBSP_ML, "us")).toBe("1 tbsp (14.8 ml)");
    expect(formatAmount(1.5 * US_CUP_ML, "us")).toBe("1 1/2 cups (355 ml)");
    expect(formatAmount(70, "us")).toBe("1/4 cup + 2 tsp (70 ml)"); // 69.0 ml, within 2 %
    expect(formatAmount(US_GALLON_ML * 1.25, "us")).toBe("1 1/4 gal (4.73 l)");
    expect(formatAmount(4000, "us")).toBe("about 1 gal (4 l)"); // 5 % off a gallon
    expect(formatAmount(0.2, "us")).toBe("less than 1/8 tsp (0.2 ml)");
    expect(formatAmount(0, "us")).toBe("0 ml");
  });
  it("what it writes reads back within 2 % (or 1/16 tsp) below half a gallon", () => {
    for (let ml = 0.5; ml < US_GALLON_ML / 2; ml *= 1.03) {
      const text = formatAmount(ml, "us");
      expect(text).not.toMatch(/^about/);
      const back = parseAmount(text.replace(/ \(.*\)$/, "")).ml ?? NaN;
      expect(Math.abs(back - ml)).toBeLessThanOrEqual(Math.max(ml * 0.02, US_TSP_ML / 16) + 1e-9);
    }
  });
  it("prefers fewer and plainer measures when they are close enough", () => {
    expect(formatAmount(20, "us")).toBe("1 tbsp + 1 tsp (20 ml)"); // 19.7 ml, not 1 tbsp + 1 1/8 tsp
    expect(formatAmount(3 * US_TSP_ML, "us")).toBe("1 tbsp (14.8 ml)");
    expect(formatAmount(4 * US_TBSP_ML, "us")).toBe("1/4 cup (59.1 ml)");
  });
  it("writes metric amounts plainly", () => {
    expect(formatAmount(45, "metric")).toBe("45 ml");
    expect(formatAmount(4.93, "metric")).toBe("4.9 ml");
    expect(formatAmount(1500, "metric")).toBe("1.5 l");
    expect(formatMl(236.5882365)).toBe("237 ml");
  });
  it("refuses a negative volume", () => {
    expect(() => formatAmount(-1, "us")).toThrow(RangeError);
  });
});
