// The arithmetic a dyer does: depth of shade, stock solutions, liquor ratio, acid, scaling a recipe
// to a dye lot, exhaustion and cost. Formulas as set out in DOMAIN.md ("Arithmetic a dyer does").
// Inputs are checked: a RangeError with a plain message for amounts that make no sense.

/**
 * How a stock solution's percentage is meant. "to-volume": x g of dye made up to 100 ml (a 1 %
 * stock is 10 g/l, the usual meaning). "in-water": x g of dye stirred into 100 g of water, so the
 * solution weighs 100 + x g; we take its density as 1 g/ml (so 1 % "in water" is 1 g per 101 ml).
 */
export type StockDefinition = "to-volume" | "in-water";

/** The ways of applying dye that a recipe can be scaled for (a layer's method). */
export type DyeMethod =
  | "immersion" | "kettle" | "low-water" | "dip-dye" | "hand-paint" | "speckle" | "dry" | "over-dye";

/** Methods whose amounts do not follow fibre weight in a straight line (DOMAIN.md: warn). */
export const NONLINEAR_METHODS: ReadonlySet<DyeMethod> = new Set(["kettle", "low-water", "hand-paint", "speckle", "dry"]);

/** Acetic acid for wool with acid dyes, % owf (Broadbent, Basic Principles of Textile Coloration, SDC 2001, pp. 244–246). */
export const ACETIC_OWF_RANGE: readonly [number, number] = [1, 3];
/** Our default acid dose: the middle of that range. */
export const DEFAULT_ACETIC_OWF = 2;
/** White vinegar is about 5 % acetic acid [common practice]; we take its density as 1 g/ml. */
export const VINEGAR_ACETIC_FRACTION = 0.05;
/** 1 g of citric acid replaces very roughly 10–20 ml of white vinegar [common practice]. */
export const CITRIC_VINEGAR_ML_PER_G: readonly [number, number] = [10, 20];

function positive(name: string, v: number): void {
  if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${name} must be more than zero (got ${v}).`);
}
function nonNegative(name: string, v: number): void {
  if (!(Number.isFinite(v) && v >= 0)) throw new RangeError(`${name} cannot be negative (got ${v}).`);
}

/** Grams of dye for a depth of shade: fibre g × DOS % / 100. */
export function dyeGrams(fibreG: number, dosPct: number): number {
  positive("Fibre weight", fibreG);
  nonNegative("Depth of shade", dosPct);
  return (fibreG * dosPct) / 100;
}

/** Depth of shade (% owf) from grams of dye: dye g / fibre g × 100. */
export function dosFromGrams(fibreG: number, dyeG: number): number {
  positive("Fibre weight", fibreG);
  nonNegative("Dye weight", dyeG);
  return (dyeG / fibreG) * 100;
}

/** Grams of dye per millilitre of a stock solution of the given strength and definition. */
export function stockGramsPerMl(stockPct: number, definition: StockDefinition = "to-volume"): number {
  positive("Stock strength", stockPct);
  return definition === "to-volume" ? stockPct / 100 : stockPct / (100 + stockPct);
}

/** Millilitres of stock for a depth of shade: fibre g × DOS % / stock % (for a "to-volume" stock). */
export function stockMl(fibreG: number, dosPct: number, stockPct: number, definition: StockDefinition = "to-volume"): number {
  return dyeGrams(fibreG, dosPct) / stockGramsPerMl(stockPct, definition);
}

/** Depth of shade (% owf) given by some millilitres of stock on a weight of fibre. */
export function dosFromStockMl(fibreG: number, ml: number, stockPct: number, definition: StockDefinition = "to-volume"): number {
  return dosFromGrams(fibreG, gramsFromStockMl(ml, stockPct, definition));
}

/** Grams of dye in some millilitres of stock ("in-water": x g in 100 g water, density taken as 1). */
export function gramsFromStockMl(ml: number, stockPct: number, definition: StockDefinition): number {
  nonNegative("Stock volume", ml);
  return ml * stockGramsPerMl(stockPct, definition);
}

/** Liquor ratio N of 1:N = bath litres / fibre kg (100 g in 4 l is 1:40). */
export function liquorRatio(bathLitres: number, fibreG: number): number {
  positive("Bath volume", bathLitres);
  positive("Fibre weight", fibreG);
  return bathLitres / (fibreG / 1000);
}

/** Bath litres for a liquor ratio 1:N: fibre kg × N. */
export function bathLitres(fibreG: number, ratioN: number): number {
  positive("Fibre weight", fibreG);
  positive("Liquor ratio", ratioN);
  return (fibreG / 1000) * ratioN;
}

/** Bath strength in g/l: DOS % × 10 / N. */
export function bathStrengthGPerL(dosPct: number, ratioN: number): number {
  nonNegative("Depth of shade", dosPct);
  positive("Liquor ratio", ratioN);
  return (dosPct * 10) / ratioN;
}

export interface AcidAmount {
  kind: "vinegar" | "citric";
  /** Millilitres of 5 % white vinegar, or grams of citric acid. */
  amount: number;
  unit: "ml" | "g";
  /** The acetic-acid dose (% owf) the amount is worked from (for citric, its acetic equivalent). */
  owfPct: number;
  /** The usual span: 1–3 % owf, and for citric also the 10–20 ml-per-gram uncertainty. */
  low: number;
  high: number;
  note: string;
}

/**
 * Acid for a weight of wool: acetic acid at owfPct (default 2, range 1–3 % owf, Broadbent 2001)
 * given as 5 % white vinegar (ml ≈ g) or as citric acid (1 g ≈ 10–20 ml vinegar, common practice).
 */
export function acidFor(fibreG: number, opts: { kind: "vinegar" | "citric"; owfPct?: number }): AcidAmount {
  positive("Fibre weight", fibreG);
  const owfPct = opts.owfPct ?? DEFAULT_ACETIC_OWF;
  positive("Acid dose", owfPct);
  const vinegarMl = (owf: number) => (fibreG * owf) / 100 / VINEGAR_ACETIC_FRACTION;
  const [lo, hi] = ACETIC_OWF_RANGE;
  const check = "Hard water and the wool itself take up acid: measure the bath's pH (about 4.5–5) when you can.";
  if (opts.kind === "vinegar") {
    return {
      kind: "vinegar", amount: vinegarMl(owfPct), unit: "ml", owfPct, low: vinegarMl(lo), high: vinegarMl(hi),
      note: `White vinegar at about 5 % acetic acid. ${check}`,
    };
  }
  const [perGLow, perGHigh] = CITRIC_VINEGAR_ML_PER_G;
  const mid = (perGLow + perGHigh) / 2;
  return {
    kind: "citric", amount: vinegarMl(owfPct) / mid, unit: "g", owfPct,
    low: vinegarMl(lo) / perGHigh, high: vinegarMl(hi) / perGLow,
    note: `Citric acid in place of vinegar is a rough swap (1 g for 10–20 ml of vinegar). ${check}`,
  };
}

export interface RecipeLine {
  name: string;
  amount: number;
  unit: string;
  /** "fibre" (default): per gram of fibre, as dye, acid and bath water are; "fixed": stays as written. */
  scales?: "fibre" | "fixed";
}

/**
 * Scale a recipe from the fibre weight it was written for to today's weighed fibre. Amounts per
 * gram of fibre scale in proportion (water follows the liquor ratio, so it scales too). Kettle,
 * low-water, hand-painted, speckled and dry-applied work does not scale linearly: warn.
 */
export function scaleRecipe(
  recipe: readonly RecipeLine[],
  fromFibreG: number,
  toFibreG: number,
  method: DyeMethod,
): { factor: number; lines: RecipeLine[]; warning?: string } {
  positive("Recipe fibre weight", fromFibreG);
  positive("Fibre weight", toFibreG);
  const factor = toFibreG / fromFibreG;
  const lines = recipe.map((line) => {
    nonNegative(`Amount of ${line.name}`, line.amount);
    return { ...line, amount: line.scales === "fixed" ? line.amount : line.amount * factor };
  });
  if (!NONLINEAR_METHODS.has(method)) return { factor, lines };
  return {
    factor,
    lines,
    warning:
      `${METHOD_WORDS[method]} does not scale in a straight line with weight: coverage depends on how ` +
      "the yarn is laid out and how much water it holds. Treat these amounts as a starting point and try one skein first.",
  };
}

const METHOD_WORDS: Record<DyeMethod, string> = {
  immersion: "Immersion", kettle: "Kettle dyeing", "low-water": "Low-water dyeing", "dip-dye": "Dip-dyeing",
  "hand-paint": "Hand-painting", speckle: "Speckling", dry: "Dry application", "over-dye": "Over-dyeing",
};

/** Exhaustion E % = (dye in − dye left in bath) / dye in × 100 (any one unit for both). */
export function exhaustionPct(dyeIn: number, dyeLeft: number): number {
  positive("Dye put in", dyeIn);
  nonNegative("Dye left in the bath", dyeLeft);
  if (dyeLeft > dyeIn) throw new RangeError("More dye is left in the bath than was put in: check the two amounts.");
  return ((dyeIn - dyeLeft) / dyeIn) * 100;
}

/** Cost per skein = (base + dye + acid + energy + packaging [+ labour]) / skeins. */
export function costPerSkein(
  costs: { base: number; dye: number; acid: number; energy: number; packaging: number; labour?: number },
  skeins: number,
): number {
  if (!(Number.isInteger(skeins) && skeins > 0)) throw new RangeError(`Skeins must be a whole number above zero (got ${skeins}).`);
  let total = 0;
  for (const [name, v] of Object.entries(costs)) {
    if (v === undefined) continue;
    nonNegative(`The ${name} cost`, v);
    total += v;
  }
  return total / skeins;
}
