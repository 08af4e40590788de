// Kitchen measures and temperatures: exact US customary units, reading what a dyer types
// ("1 1/2 tsp", "2,5 g", "½ cup") and writing millilitres back as kitchen measures.

import { AU_TBSP_ML, METRIC_CUP_ML, OUNCE_G, POUND_G, US_CUP_ML, US_FLOZ_ML, US_TBSP_ML, US_TSP_ML } from "./measures";

export * from "./measures";

export type AmountUnit = "ml" | "g" | "l" | "tsp" | "tbsp" | "cup" | "floz" | "oz" | "lb" | "%";

export interface Amount {
  value: number;
  unit: AmountUnit;
  /** The amount in millilitres, for volumes. */
  ml?: number;
  /** The amount in grams, for weights. */
  g?: number;
}

export interface MeasureOptions {
  /** What "cup" means: US customary (default) or metric (250 ml). */
  cup?: "us" | "metric";
  /** What "tbsp" means: US customary (default) or Australian (20 ml). */
  tablespoon?: "us" | "au";
}

const UNIT_WORDS: Record<string, AmountUnit> = {
  ml: "ml", mls: "ml", milliliter: "ml", milliliters: "ml", millilitre: "ml", millilitres: "ml",
  l: "l", litre: "l", litres: "l", liter: "l", liters: "l", ltr: "l",
  g: "g", gram: "g", grams: "g", gramme: "g", grammes: "g",
  tsp: "tsp", tsps: "tsp", teaspoon: "tsp", teaspoons: "tsp",
  tbsp: "tbsp", tbsps: "tbsp", tbs: "tbsp", tbl: "tbsp", tablespoon: "tbsp", tablespoons: "tbsp",
  cup: "cup", cups: "cup", c: "cup",
  floz: "floz", "fl oz": "floz", "fluid ounce": "floz", "fluid ounces": "floz",
  oz: "oz", ounce: "oz", ounces: "oz",
  lb: "lb", lbs: "lb", pound: "lb", pounds: "lb",
  "%": "%", percent: "%", "% owf": "%", owf: "%",
};
const UNIT_HINT = "ml, l, g, tsp, tbsp, cup, fl oz, oz, lb or %";
const EXAMPLE = "for example 45 ml, 2.5 g, 1 1/2 tsp or 1/3 cup";
const UNICODE_FRACTIONS: Record<string, string> = {
  "¼": "1/4", "½": "1/2", "¾": "3/4", "⅓": "1/3", "⅔": "2/3", "⅛": "1/8", "⅜": "3/8", "⅝": "5/8", "⅞": "7/8",
  "⅕": "1/5", "⅖": "2/5", "⅗": "3/5", "⅘": "4/5", "⅙": "1/6", "⅚": "5/6",
};

/** Millilitres in one of a volume unit, or undefined for weights and %. */
export function mlPer(unit: AmountUnit, opts: MeasureOptions = {}): number | undefined {
  switch (unit) {
    case "ml": return 1;
    case "l": return 1000;
    case "tsp": return US_TSP_ML;
    case "tbsp": return opts.tablespoon === "au" ? AU_TBSP_ML : US_TBSP_ML;
    case "cup": return opts.cup === "metric" ? METRIC_CUP_ML : US_CUP_ML;
    case "floz": return US_FLOZ_ML;
    default: return undefined;
  }
}

/** Grams in one of a weight unit, or undefined for volumes and %. */
export function gPer(unit: AmountUnit): number | undefined {
  return unit === "g" ? 1 : unit === "oz" ? OUNCE_G : unit === "lb" ? POUND_G : undefined;
}

/**
 * Read an amount as a dyer writes it: "45 ml", "2.5 g", "2,5 g", "1/3 cup", "1 1/2 tsp", "½ cup",
 * "0.5 %", or a sum of kitchen measures ("1/3 cup + 1 tsp", returned in ml). Throws an Error whose
 * message says what to type instead.
 */
export function parseAmount(text: string, opts: MeasureOptions = {}): Amount {
  const parts = text.split("+");
  if (parts.length > 1) return parseSum(text, parts, opts);
  const s = normalise(text);
  if (s === "") throw new Error(`Enter an amount with its unit, ${EXAMPLE}.`);
  if (/^-/.test(s)) throw new Error(`"${text.trim()}" is negative: amounts are zero or more.`);
  if (/\d\s*(-|–|—|to)\s*\d/.test(s) && !/^\d+-\d+\/\d+/.test(s)) {
    throw new Error(`"${text.trim()}" looks like a range: enter one amount (the middle, if unsure).`);
  }
  const m = /^(\d+(?:[.,]\d+)?|[.,]\d+)(?:[\s-]+(\d+)\/(\d+)|\s*\/\s*(\d+))?\s*(.*)$/.exec(s);
  if (!m) throw new Error(`Could not read a number in "${text.trim()}": write it ${EXAMPLE}.`);
  const [, first, mixNum, mixDen, fracDen, unitText] = m;
  let value: number;
  if (mixNum !== undefined) value = whole(first, text) + fraction(mixNum, mixDen, text);
  else if (fracDen !== undefined) value = fraction(whole(first, text).toString(), fracDen, text);
  else value = decimal(first, text);

  const unit = unitOf(unitText, text, value);
  const amount: Amount = { value, unit };
  const perMl = mlPer(unit, opts), perG = gPer(unit);
  if (perMl !== undefined) amount.ml = value * perMl;
  if (perG !== undefined) amount.g = value * perG;
  return amount;
}

function parseSum(text: string, parts: string[], opts: MeasureOptions): Amount {
  const amounts = parts.map((p) => parseAmount(p, opts));
  if (amounts.every((a) => a.ml !== undefined)) {
    const ml = amounts.reduce((s, a) => s + (a.ml ?? 0), 0);
    return { value: ml, unit: "ml", ml };
  }
  if (amounts.every((a) => a.g !== undefined)) {
    const g = amounts.reduce((s, a) => s + (a.g ?? 0), 0);
    return { value: g, unit: "g", g };
  }
  throw new Error(`"${text.trim()}" adds volumes, weights or percentages together: keep to one kind.`);
}

function normalise(text: string): string {
  let s = text.trim().replace(/\u2044/g, "/").replace(/\s+/g, " ");
  // "1½" → "1 1/2", "½" → "1/2"
  s = s.replace(/(\d?)\s*([¼½¾⅓⅔⅛⅜⅝⅞⅕⅖⅗⅘⅙⅚])/g, (_, d: string, f: string) => (d ? `${d} ` : "") + UNICODE_FRACTIONS[f]);
  return s;
}

function whole(digits: string, text: string): number {
  if (!/^\d+$/.test(digits)) throw new Error(`In "${text.trim()}", write a fraction as whole numbers, like 1 1/2.`);
  return Number(digits);
}

function fraction(num: string, den: string, text: string): number {
  const d = Number(den);
  if (d === 0) throw new Error(`"${text.trim()}" divides by zero: check the fraction.`);
  return Number(num) / d;
}

function decimal(digits: string, text: string): number {
  if (/^\d{1,3},\d{3}$/.test(digits)) {
    const [a, b] = digits.split(",");
    const small = Number(`${a}.${b}`), big = Number(`${a}${b}`);
    throw new Error(`Is "${digits}" ${small} or ${big}? Write ${small} or ${big} (a point or comma with one or two decimals is read as a decimal).`);
  }
  const v = Number(digits.replace(",", "."));
  if (!Number.isFinite(v)) throw new Error(`Could not read a number in "${text.trim()}".`);
  return v;
}

function unitOf(unitText: string, text: string, value: number): AmountUnit {
  const raw = unitText.trim();
  if (raw === "") throw new Error(`Add a unit after the number, like "${value} ml" or "${value} g" (${UNIT_HINT}).`);
  if (raw === "T" || raw === "Tb") return "tbsp"; // capital T is a tablespoon in US recipes
  if (raw === "t") return "tsp";
  const key = raw.toLowerCase().replace(/\./g, "").replace(/\s+/g, " ").trim();
  const unit = UNIT_WORDS[key] ?? UNIT_WORDS[key.replace(/\s/g, "")];
  if (!unit) throw new Error(`"${raw}" in "${text.trim()}" is not a unit we know: use ${UNIT_HINT}.`);
  return unit;
}

export { formatAmount, formatMl } from "./units-format";
