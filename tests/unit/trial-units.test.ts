// The trial page's amount words: DOS %, grams and ml of stock must be the colour module's numbers,
// checked here against the worked values in DOMAIN.md ("Stock solutions", marked common practice
// there) and the exact US measures of NIST Handbook 44, Appendix C.
import { describe, expect, it } from "vitest";
import { amountWords, dosOf, kitchenNumber, num, temperature, toCelsius } from "@/components/trial/units";

const ONE_PCT = { pct: 1, definition: "to-volume" as const };

describe("amounts in all three units", () => {
  it("100 g at 1 % with a 1 % stock is 1 g of dye and 100 ml of stock (DOMAIN.md check value)", () => {
    expect(amountWords(1, 100, ONE_PCT, "metric")).toEqual({
      dos: "1 % DOS",
      grams: "1 g dye",
      stock: "100 ml of 1 % stock",
      kitchen: null,
    });
  });

  it("454 g at 2 % is 908 ml of a 1 % stock (DOMAIN.md check value)", () => {
    const w = amountWords(2, 454, ONE_PCT, "metric");
    expect(w.stock).toBe("908 ml of 1 % stock");
    expect(w.grams).toBe("9.08 g dye");
  });

  it("454 g at 0.1 % is 45.4 ml of a 1 % stock or 454 ml of a 0.1 % stock (DOMAIN.md check values)", () => {
    expect(amountWords(0.1, 454, ONE_PCT, "metric").stock).toBe("45.4 ml of 1 % stock");
    expect(amountWords(0.1, 454, { pct: 0.1, definition: "to-volume" }, "metric").stock).toBe("454 ml of 0.1 % stock");
  });

  it("adds the kitchen measure only for US units: one US tablespoon of stock reads as 1 tbsp", () => {
    // 1 tbsp = 14.78676478125 ml (NIST HB 44): on 100 g with a 1 % stock that is 0.1478676… % DOS.
    const dos = 14.78676478125 / 100;
    expect(amountWords(dos, 100, ONE_PCT, "us").kitchen).toBe("1 tbsp");
    expect(amountWords(dos, 100, ONE_PCT, "metric").kitchen).toBeNull();
  });

  it("has no stock volume for powder", () => {
    expect(amountWords(0.5, 100, null, "us")).toMatchObject({ grams: "0.5 g dye", stock: null, kitchen: null });
  });
});

describe("depth of shade from what the dyer typed", () => {
  it("reads teaspoons of stock with the exact US teaspoon", () => {
    // 1 1/2 tsp = 7.393382390625 ml of 1 % stock = 0.07393… g on 100 g of fibre.
    expect(dosOf(1.5, "tsp", 100, ONE_PCT)).toBeCloseTo(0.07393382390625, 12);
  });

  it("reads grams of powder and DOS as they are", () => {
    expect(dosOf(2, "g", 100, null)).toBe(2);
    expect(dosOf(0.75, "dos", 100, null)).toBe(0.75);
  });

  it("takes an 'in water' stock as 1 g in 101 ml (DOMAIN.md: 1 g of dye in 100 g of water)", () => {
    expect(dosOf(101, "ml", 100, { pct: 1, definition: "in-water" })).toBeCloseTo(1, 12);
  });

  it("cannot work out a volume without its stock, or anything without a fibre weight", () => {
    expect(dosOf(5, "ml", 100, null)).toBeUndefined();
    expect(dosOf(5, "g", 0, null)).toBeUndefined();
  });
});

describe("reading numbers", () => {
  it("keeps three significant figures for small amounts and whole numbers from 100", () => {
    expect(num(0.07393)).toBe("0.0739");
    expect(num(52.52)).toBe("52.5");
    expect(num(908.2)).toBe("908");
    expect(num(0)).toBe("0");
  });

  it("writes spoon and cup counts the way a measuring set has them", () => {
    expect(kitchenNumber(1.5)).toBe("1 1/2");
    expect(kitchenNumber(1 / 3)).toBe("1/3");
    expect(kitchenNumber(2)).toBe("2");
    expect(kitchenNumber(0.3)).toBe("0.3");
  });

  it("shows temperatures in the user's scale and stores °C", () => {
    // 90 °C = 194 °F, 85 °C = 185 °F (F = C × 9/5 + 32).
    expect(temperature(90, "F")).toBe("194 °F");
    expect(temperature(90, "C")).toBe("90 °C");
    expect(toCelsius(185, "F")).toBe(85);
    expect(toCelsius(85, "C")).toBe(85);
  });
});
