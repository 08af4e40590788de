import "server-only";
import { dyeGrams, scaleRecipe, stockMl, type DyeMethod } from "@/colour";
import type { LayerDto } from "@/lib/trials/types";
import type { ColourwayDto } from "./colourways";

const METHOD: Record<string, DyeMethod> = {
  immersion: "immersion",
  kettle: "kettle",
  dip: "dip-dye",
  "hand-paint": "hand-paint",
  speckle: "speckle",
  dry: "dry",
  other: "low-water", // unknown handling: treated as not scaling in a straight line, so it warns
};

export interface ScaledLayer {
  position: number;
  method: string;
  dyes: { name: string; hex: string | null; dosPct: number; grams: number; stockPct: number | null; stockMl: number | null }[];
  acid: { kind: string; amount: number | null; unit: "ml" | "g" | null };
  waterL: number | null;
  temperatureC: number | null;
  minutes: number | null;
  setting: LayerDto["setting"];
  coverage: number | null;
  warning?: string;
}

export interface RecipeCard {
  colourway: { id: string; name: string; target: ColourwayDto["target"] };
  baseName: string | null;
  fromFibreG: number;
  toFibreG: number;
  factor: number;
  layers: ScaledLayer[];
}

/** The colourway's recipe scaled to a lot's weighed fibre: dye by DOS, acid and water per gram of fibre. */
export function scaleColourwayRecipe(c: ColourwayDto, toFibreG: number): RecipeCard {
  const recipe = c.recipe as { fibreWeightG: number; base: { name: string } | null; layers: LayerDto[] };
  const from = recipe.fibreWeightG;
  const layers = recipe.layers.map((l): ScaledLayer => {
    const acidUnit = l.acid.kind === "vinegar" ? "ml" : l.acid.kind === "citric" ? "g" : null;
    const lines = [
      ...(l.acid.amount != null && acidUnit ? [{ name: "acid", amount: l.acid.amount, unit: acidUnit }] : []),
      ...(l.waterL != null ? [{ name: "water", amount: l.waterL, unit: "l" }] : []),
    ];
    const scaled = scaleRecipe(lines, from, toFibreG, METHOD[l.method] ?? "low-water");
    const get = (n: string) => scaled.lines.find((x) => x.name === n)?.amount ?? null;
    return {
      position: l.position,
      method: l.method,
      dyes: l.dyes.map((d) => ({
        name: d.dyeName,
        hex: d.displayHex,
        dosPct: d.dosPct,
        grams: dyeGrams(toFibreG, d.dosPct),
        stockPct: d.stockPct,
        stockMl: d.stockPct ? stockMl(toFibreG, d.dosPct, d.stockPct, d.stockDefinition ?? "to-volume") : null,
      })),
      acid: { kind: l.acid.kind, amount: get("acid"), unit: acidUnit },
      waterL: get("water"),
      temperatureC: l.temperatureC,
      minutes: l.minutes,
      setting: l.setting,
      coverage: l.coverage,
      ...(scaled.warning ? { warning: scaled.warning } : {}),
    };
  });
  return {
    colourway: { id: c.id, name: c.name, target: c.target },
    baseName: recipe.base?.name ?? null,
    fromFibreG: from,
    toFibreG,
    factor: toFibreG / from,
    layers,
  };
}
