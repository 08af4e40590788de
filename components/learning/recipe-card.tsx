import { OUNCE_G } from "@/colour/measures";
import { labToHex } from "@/colour/spaces";
import { formatAmount } from "@/colour/units-format";
import { type TempUnit, type UnitSystem, temperature } from "@/components/trial/units";
import type { RecipeCard } from "@/lib/learning/recipe";
import { labText } from "./colour-bits";

const grams = (g: number) => (g >= 10 ? `${g.toFixed(1)} g` : `${g.toFixed(2)} g`);
const exact = { printColorAdjust: "exact", WebkitPrintColorAdjust: "exact" } as const;

// Our own short safety lines for the dye table; the dye's safety data sheet and local rules come first.
const CAUTIONS = [
  ["Dye powder", "weigh and wet powders out of draughts, with a dust mask and gloves; never eat, drink or weigh food at the dye bench."],
  ["Acid bath", "add acid to water, not the reverse; keep the room aired and lift hot pots with both hands and mitts."],
  ["Steam and microwave", "open lids and packets away from your face; use pots, steamers and a microwave kept for dyeing only."],
  ["Disposal", "let baths cool; a clear spent bath usually goes to the drain with plenty of water, unless your local rules or a septic system say otherwise."],
] as const;

/** The reader's units: volumes in ml and l or in US kitchen measures (with the ml), °C or °F. */
export interface RecipeUnits {
  system: UnitSystem;
  temperature: TempUnit;
}

/**
 * The colourway's recipe scaled to one lot, laid out to print on one A4 page. Dye powder and citric
 * acid stay in grams in either system (dye is weighed on a gram scale); volumes of stock, vinegar
 * and water follow the reader's units.
 */
export function RecipeCardView({ card, studioName, units = { system: "metric", temperature: "C" } }: { card: RecipeCard; studioName: string; units?: RecipeUnits }) {
  const target = card.colourway.target;
  const us = units.system === "us";
  const vol = (ml: number) => formatAmount(ml, units.system);
  const fibre = (g: number) => (us ? `${g} g (${(g / OUNCE_G).toFixed(1)} oz)` : `${g} g`);
  return (
    <article className="recipe-card mx-auto max-w-[190mm] bg-white p-4 text-ink print:max-w-none print:p-0" data-testid="recipe-card">
      <header className="flex items-start gap-4 border-b border-ink pb-3">
        <div className="h-24 w-24 shrink-0 rounded border border-ink" style={{ background: labToHex(target), ...exact }} role="img" aria-label="Target colour" />
        <div className="min-w-0">
          <p className="text-xs uppercase tracking-wide">{studioName} · recipe card</p>
          <h1 className="text-2xl">{card.colourway.name}</h1>
          <p className="tabular text-sm">
            For <strong>{fibre(card.toFibreG)}</strong> of dry fibre{card.baseName ? ` (${card.baseName})` : ""} · scaled ×{card.factor.toFixed(2)} from {card.fromFibreG} g
          </p>
          <p className="tabular font-mono text-xs text-ink-soft">Target {labText(target)}</p>
        </div>
      </header>
      {card.layers.map((l, i) => (
        <section key={i} className="mt-3 break-inside-avoid">
          <h2 className="text-lg">
            Layer {i + 1}: {l.method}
            {l.coverage != null && l.coverage < 1 ? `, about ${Math.round(l.coverage * 100)} % covered` : ""}
          </h2>
          {l.warning && <p className="mt-1 rounded border border-caution px-2 py-1 text-sm">⚠ {l.warning}</p>}
          <table className="tabular mt-1 w-full text-sm">
            <thead>
              <tr className="border-b border-ink text-left">
                <th className="py-1">Dye</th>
                <th>DOS</th>
                <th>Powder</th>
                <th>Stock</th>
              </tr>
            </thead>
            <tbody>
              {l.dyes.map((d, k) => (
                <tr key={k} className="border-b border-rule">
                  <td className="py-1">
                    <span className="mr-2 inline-block h-3 w-3 rounded-sm border border-ink align-middle" style={{ background: d.hex ?? "#fff", ...exact }} />
                    {d.name}
                  </td>
                  <td>{d.dosPct.toFixed(3)} %</td>
                  <td>{grams(d.grams)}</td>
                  <td>{d.stockMl != null && d.stockPct ? `${vol(d.stockMl)} of ${d.stockPct} %` : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="tabular mt-1 text-sm">
            {l.acid.kind !== "none" && l.acid.amount != null
              ? l.acid.unit === "ml"
                ? `Acid: ${vol(l.acid.amount)} ${l.acid.kind}`
                : `Acid: ${l.acid.amount.toFixed(1)} ${l.acid.unit} ${l.acid.kind}`
              : "No acid"}
            {l.waterL != null ? ` · water ${us ? vol(l.waterL * 1000) : `${l.waterL.toFixed(1)} l`}` : ""}
            {l.temperatureC != null ? ` · ${temperature(l.temperatureC, units.temperature)}` : ""}
            {l.minutes != null ? ` for ${l.minutes} min` : ""}
            {l.setting.method !== "none" ? ` · set by ${l.setting.method}${l.setting.minutes ? ` ${l.setting.minutes} min` : ""}` : ""}
          </p>
        </section>
      ))}
      <section className="mt-4 break-inside-avoid border-t border-ink pt-2 text-xs">
        <h2 className="text-sm font-semibold">Before you start</h2>
        <ul className="mt-1 space-y-0.5">
          {CAUTIONS.map(([t, b]) => (
            <li key={t}>
              <strong>{t}:</strong> {b}
            </li>
          ))}
        </ul>
        <p className="mt-1">
          These are reminders, not a safety assessment: the safety data sheet of each dye and acid, your local codes, and practice
          as licensed where you work take precedence.
        </p>
      </section>
    </article>
  );
}
