import { dosFromGrams, dosFromStockMl, dyeGrams, stockMl } from "@/colour/arithmetic";
import { mlPer } from "@/colour/units";
import type { LayerDye } from "@/entities/trial";
import type { StockSolution } from "@/entities/library";
import type { AmountUnit } from "@/lib/schemas/trial";

// Dye amounts: what the dyer entered (DOS %, ml or kitchen measures of a stock, grams of powder)
// turned into depth of shade, and back into all three for display. The arithmetic is the colour
// module's; this file only picks the formula for the unit.

export type StockLike = Pick<StockSolution, "concentrationPct" | "definition">;

/** Millilitres in one of a volume unit (US customary kitchen measures), or undefined for dos and g. */
function mlPerUnit(unit: AmountUnit): number | undefined {
  return unit === "dos" || unit === "g" ? undefined : mlPer(unit);
}

/** Depth of shade (% owf) of an entered amount on a fibre weight; volumes need the stock. */
export function dosFromEntered(entered: LayerDye["entered"], fibreG: number, stock: StockLike | null): number {
  if (entered.unit === "dos") return entered.value;
  if (entered.unit === "g") return dosFromGrams(fibreG, entered.value);
  const perMl = mlPerUnit(entered.unit);
  if (perMl === undefined || !stock) throw new Error(`A volume in ${entered.unit} needs a stock solution.`);
  return dosFromStockMl(fibreG, entered.value * perMl, stock.concentrationPct, stock.definition);
}

/** The same depth of shade expressed in the unit the dyer used (for a copy on a new fibre weight). */
export function enteredFromDos(dosPct: number, unit: AmountUnit, fibreG: number, stock: StockLike | null): LayerDye["entered"] {
  if (unit === "dos") return { value: dosPct, unit };
  if (unit === "g") return { value: dyeGrams(fibreG, dosPct), unit };
  const perMl = mlPerUnit(unit);
  if (perMl === undefined || !stock) return { value: dosPct, unit: "dos" };
  return { value: stockMl(fibreG, dosPct, stock.concentrationPct, stock.definition) / perMl, unit };
}

/** Grams of dye and millilitres of stock (null without a stock) for a depth of shade. */
export function amountsFor(dosPct: number, fibreG: number, stock: StockLike | null): { grams: number; stockMl: number | null } {
  return {
    grams: dyeGrams(fibreG, dosPct),
    stockMl: stock ? stockMl(fibreG, dosPct, stock.concentrationPct, stock.definition) : null,
  };
}
