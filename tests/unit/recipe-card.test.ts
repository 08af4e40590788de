// The printed recipe card in the reader's units: metric, or US kitchen measures and °F.
// Amounts are worked from NIST's exact US measures (colour/measures.ts): 1 US gallon = 3 785.411784 ml,
// 1 cup = 236.5882365 ml, 1 tbsp = 14.78676478125 ml; 1 oz = 28.349523125 g.
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { RecipeCardView } from "@/components/learning/recipe-card";
import type { RecipeCard } from "@/lib/learning/recipe";

const card: RecipeCard = {
  colourway: { id: "c1", name: "Harbour Fog", target: { L: 52, a: -8, b: -12 } },
  baseName: "Skerry Sock",
  fromFibreG: 100,
  toFibreG: 800,
  factor: 8,
  layers: [
    {
      position: 1,
      method: "immersion",
      // 1.5 % DOS on 800 g = 12 g powder; 12 g as 1 % stock to volume = 1 200 ml.
      dyes: [{ name: "Slate", hex: "#4a5a6a", dosPct: 1.5, grams: 12, stockPct: 1, stockMl: 1200 }],
      acid: { kind: "vinegar", amount: 236.5882365, unit: "ml" },
      waterL: 3.785411784,
      temperatureC: 85,
      minutes: 30,
      setting: { method: "none", minutes: null },
      coverage: null,
    },
  ],
};

const text = (units?: Parameters<typeof RecipeCardView>[0]["units"]) =>
  renderToStaticMarkup(createElement(RecipeCardView, { card, studioName: "Test Studio", units })).replace(/<[^>]+>/g, " ").replace(/\s+/g, " ");

describe("recipe card", () => {
  it("reads metric by default", () => {
    const t = text();
    expect(t).toContain("For 800 g of dry fibre");
    expect(t).toContain("12.0 g");
    expect(t).toContain("1.2 l of 1 %");
    expect(t).toContain("Acid: 237 ml vinegar");
    expect(t).toContain("water 3.8 l");
    expect(t).toContain("85 °C");
    expect(t).not.toMatch(/cup|gal|°F|oz/);
  });

  it("reads US kitchen measures and °F for a reader who chose them; powder stays in grams", () => {
    const t = text({ system: "us", temperature: "F" });
    expect(t).toContain("For 800 g (28.2 oz) of dry fibre"); // 800 / 28.349523125 = 28.22
    expect(t).toContain("12.0 g"); // dye powder is weighed in grams either way
    expect(t).toContain("5 cups (1.2 l) of 1 %"); // 1 200 ml = 5.07 cups, within 2 %; the ml follow
    expect(t).toContain("Acid: 1 cup (237 ml) vinegar");
    expect(t).toContain("water 1 gal (3.79 l)");
    expect(t).toContain("185 °F"); // 85 °C × 9/5 + 32
    expect(t).not.toContain("°C");
  });
});
