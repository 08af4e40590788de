import { cToF, fToC, formatAmount, formatMl, mlPer } from "@/colour/units";
import { dosFromGrams, dosFromStockMl, dyeGrams, stockMl } from "@/colour/arithmetic";
import type { AmountUnit } from "@/lib/schemas/trial";

// Numbers as the dyer reads them: amounts in all three units (DOS %, grams, ml of stock) plus
// kitchen measures for those who think in spoons, temperatures in their scale. The arithmetic is
// the colour module's; this file only words it.

export type UnitSystem = "metric" | "us";
export type TempUnit = "C" | "F";

export interface StockRef {
  pct: number;
  definition: "to-volume" | "in-water";
}

/** Round for reading: 3 significant figures below 10, whole numbers above 100. */
export function num(n: number, digits = 3): string {
  if (!Number.isFinite(n)) return "—";
  if (n === 0) return "0";
  const abs = Math.abs(n);
  const decimals = abs >= 100 ? 0 : Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
  return Number(n.toFixed(Math.min(decimals, 4))).toString();
}

export function temperature(c: number | null, unit: TempUnit): string {
  if (c === null) return "—";
  return unit === "F" ? `${Math.round(cToF(c))} °F` : `${num(c)} °C`;
}

/** A temperature the dyer typed in their own scale, stored in °C. */
export function toCelsius(value: number, unit: TempUnit): number {
  return unit === "F" ? Math.round(fToC(value) * 10) / 10 : value;
}

export function fromCelsius(c: number, unit: TempUnit): number {
  return unit === "F" ? Math.round(cToF(c)) : c;
}

export const UNIT_WORDS: Record<AmountUnit, string> = {
  dos: "DOS %",
  ml: "ml",
  g: "g",
  tsp: "tsp",
  tbsp: "tbsp",
  cup: "cup",
  floz: "fl oz",
};

export const isVolume = (u: AmountUnit) => u !== "dos" && u !== "g";

// The fractions kitchen spoons and cups come in.
const FRACTIONS: [number, string][] = [
  [1 / 8, "1/8"], [1 / 4, "1/4"], [1 / 3, "1/3"], [3 / 8, "3/8"], [1 / 2, "1/2"], [5 / 8, "5/8"], [2 / 3, "2/3"], [3 / 4, "3/4"], [7 / 8, "7/8"],
];

/** A count of spoons or cups as typed in a kitchen: 1.5 → "1 1/2", 0.333… → "1/3"; otherwise a decimal. */
export function kitchenNumber(v: number): string {
  const whole = Math.floor(v + 1e-9);
  const rest = v - whole;
  if (rest < 1e-6) return String(whole);
  const f = FRACTIONS.find(([x]) => Math.abs(x - rest) < 0.005);
  return f ? `${whole ? `${whole} ` : ""}${f[1]}` : num(v);
}

/**
 * Depth of shade for an amount entered in any unit (the same formulas the server uses): DOS as is,
 * grams of powder over fibre weight, or a volume of stock solution. Undefined when it cannot be
 * worked out yet (no fibre weight, or a volume without a stock).
 */
export function dosOf(value: number, unit: AmountUnit, fibreG: number, stock: StockRef | null): number | undefined {
  if (!(value >= 0) || !(fibreG > 0)) return undefined;
  if (unit === "dos") return value;
  if (unit === "g") return dosFromGrams(fibreG, value);
  const perMl = mlPer(unit);
  if (perMl === undefined || !stock) return undefined;
  return dosFromStockMl(fibreG, value * perMl, stock.pct, stock.definition);
}

export interface AmountWords {
  dos: string;
  grams: string;
  /** "50 ml of 1 % stock", or null for powder. */
  stock: string | null;
  /** Kitchen measure of that stock volume, for US units only. */
  kitchen: string | null;
}

/** One dye's amount in every unit, for a trial's fibre weight. */
export function amountWords(dosPct: number, fibreG: number, stock: StockRef | null, system: UnitSystem): AmountWords {
  const g = dyeGrams(fibreG, dosPct);
  const ml = stock ? stockMl(fibreG, dosPct, stock.pct, stock.definition) : null;
  return {
    dos: `${num(dosPct)} % DOS`,
    grams: `${num(g)} g dye`,
    stock: ml === null ? null : `${formatMl(ml)} of ${num(stock!.pct)} % stock`,
    kitchen: ml !== null && system === "us" ? formatAmount(ml, "us").replace(/\s*\([^)]*\)$/, "") : null,
  };
}

/** A volume of water or vinegar in the user's units: "4 l" or "about 1 gal (3.79 l)". */
export function volume(ml: number, system: UnitSystem): string {
  return formatAmount(ml, system);
}
