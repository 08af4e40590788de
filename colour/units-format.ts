// Writing a volume back for people: millilitres/litres, or the nearest US kitchen measures.
import { US_CUP_ML, US_GALLON_ML, US_TBSP_ML, US_TSP_ML } from "./measures";

// [value, words, plainness]: plainer measures (whole, halves) win over eighths when both are close.
const CUP_FRACTIONS: [number, string, number][] = [
  [0, "", 0], [1 / 4, "1/4", 2], [1 / 3, "1/3", 2], [1 / 2, "1/2", 1], [2 / 3, "2/3", 2], [3 / 4, "3/4", 2],
];
// Teaspoons in eighths up to 2 7/8 (a set of 1, 1/2, 1/4 and 1/8 tsp spoons measures them all).
const TSP_STEPS: [number, string, number][] = Array.from({ length: 24 }, (_, k) => {
  const whole = Math.floor(k / 8), eighths = k % 8;
  const den = eighths === 0 ? 1 : eighths % 4 === 0 ? 2 : eighths % 2 === 0 ? 4 : 8;
  const frac = eighths === 0 ? "" : `${(eighths * den) / 8}/${den}`;
  return [k / 8, [whole || "", frac].filter(Boolean).join(" "), [0, 1, 2, 3][Math.log2(den)]];
});
const GALLON_QUARTERS = ["", "1/4", "1/2", "3/4"];

/** Relative error within which a kitchen measure counts as the amount (our choice: 2 %). */
const CLOSE_ENOUGH = 0.02;
/** Half of the smallest spoon (1/8 tsp): nothing closer can be measured in a kitchen. */
const SMALLEST = US_TSP_ML / 16;

/** Millilitres as "0.62 ml", "4.9 ml", "79 ml", "237 ml" or "3.79 l". */
export function formatMl(ml: number): string {
  checkVolume(ml);
  if (ml >= 1000) return `${trim((ml / 1000).toFixed(2))} l`;
  if (ml >= 100) return `${Math.round(ml)} ml`;
  if (ml >= 1) return `${trim(ml.toFixed(1))} ml`;
  return `${trim(ml.toFixed(2))} ml`;
}

/**
 * A volume as people measure it. "metric": ml or l. "us": the nearest combination of cups, tablespoons
 * and teaspoons (fewest measures within 2 %, else the closest, marked "about"), or quarter gallons from
 * half a gallon up, followed by the exact millilitres: "1/3 cup + 1 tsp (83.8 ml)".
 */
export function formatAmount(ml: number, system: "metric" | "us"): string {
  checkVolume(ml);
  if (system === "metric" || ml === 0) return formatMl(ml);
  const exact = `(${formatMl(ml)})`;
  if (ml < SMALLEST) return `less than 1/8 tsp ${exact}`;
  if (ml >= US_GALLON_ML / 2) {
    const quarters = Math.round((ml / US_GALLON_ML) * 4);
    const gal = quarters / 4;
    const words = [Math.floor(gal) || "", GALLON_QUARTERS[quarters % 4]].filter(Boolean).join(" ");
    return `${about(gal * US_GALLON_ML, ml)}${words} gal ${exact}`;
  }

  let best = { err: Infinity, cost: Infinity, text: "" };
  const tol = Math.max(SMALLEST, ml * CLOSE_ENOUGH);
  for (let whole = 0; whole < 16; whole++) {
    for (const [cf, cfText, cfPlain] of CUP_FRACTIONS) {
      const cups = whole + cf;
      if (cups * US_CUP_ML > ml + tol) break;
      for (let tbsp = 0; tbsp <= 3; tbsp++) {
        for (const [tsp, tspText, tspPlain] of TSP_STEPS) {
          const total = cups * US_CUP_ML + tbsp * US_TBSP_ML + tsp * US_TSP_ML;
          const err = Math.abs(total - ml);
          const terms = (cups > 0 ? 1 : 0) + (tbsp > 0 ? 1 : 0) + (tsp > 0 ? 1 : 0);
          if (terms === 0) continue;
          // Within tolerance: fewest measures, then the plainest fractions, then the closest.
          const cost = terms * 10 + cfPlain + tspPlain;
          const better = err <= tol
            ? best.err > tol || cost < best.cost || (cost === best.cost && err < best.err)
            : err < best.err;
          if (!better) continue;
          const parts: string[] = [];
          if (cups > 0) parts.push(`${[whole || "", cfText].filter(Boolean).join(" ")} ${cups > 1 ? "cups" : "cup"}`);
          if (tbsp > 0) parts.push(`${tbsp} tbsp`);
          if (tsp > 0) parts.push(`${tspText} tsp`);
          best = { err, cost, text: `${err > tol ? "about " : ""}${parts.join(" + ")}` };
        }
      }
    }
  }
  return `${best.text} ${exact}`;
}

function about(measured: number, ml: number): string {
  return Math.abs(measured - ml) > ml * CLOSE_ENOUGH ? "about " : "";
}

function trim(fixed: string): string {
  return fixed.includes(".") ? fixed.replace(/\.?0+$/, "") : fixed;
}

function checkVolume(ml: number): void {
  if (!(Number.isFinite(ml) && ml >= 0)) throw new RangeError(`A volume is zero or more millilitres (got ${ml}).`);
}
