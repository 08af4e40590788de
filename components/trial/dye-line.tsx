import type { LayerDyeDto } from "@/lib/trials/types";
import { type UnitSystem, UNIT_WORDS, amountWords, kitchenNumber, num } from "./units";

/** A dye's colour as a small chip; dashed when the library has no colour for it. */
export function DyeChip({ hex, name }: { hex: string | null; name: string }) {
  return (
    <span className="inline-flex min-w-0 items-center gap-2">
      <span
        aria-hidden="true"
        className={`inline-block h-6 w-6 shrink-0 rounded-full border ${hex ? "border-ink/20" : "border-dashed border-rule-strong"}`}
        style={hex ? { backgroundColor: hex } : undefined}
      />
      <span className="truncate font-medium">{name}</span>
    </span>
  );
}

/** What the dyer typed, in their unit: "3 tbsp", "0.5 % DOS", "1.2 g". */
export function enteredWords(e: LayerDyeDto["entered"]): string {
  if (e.unit === "dos") return `${num(e.value)} % DOS`;
  const kitchen = e.unit === "tsp" || e.unit === "tbsp" || e.unit === "cup";
  return `${kitchen ? kitchenNumber(e.value) : num(e.value)} ${UNIT_WORDS[e.unit]}`;
}

/** One dye of a layer with its amount in every unit: DOS %, grams of dye, ml of stock (and spoons for US). */
export function DyeLine({ dye, fibreG, system }: { dye: LayerDyeDto; fibreG: number; system: UnitSystem }) {
  const stock = dye.stockPct !== null && dye.stockDefinition ? { pct: dye.stockPct, definition: dye.stockDefinition } : null;
  const w = amountWords(dye.dosPct, fibreG, stock, system);
  const parts = [w.dos, w.grams, w.stock, w.kitchen].filter((p): p is string => !!p);
  return (
    <div className="py-2">
      <div className="flex items-center justify-between gap-3">
        <DyeChip hex={dye.displayHex} name={dye.dyeName} />
        <span className="tabular shrink-0 text-lg font-semibold">{enteredWords(dye.entered)}</span>
      </div>
      <p className="tabular mt-0.5 pl-8 text-sm text-ink-soft">
        {parts.join(" · ")}
        {!stock && <span> · powder</span>}
      </p>
    </div>
  );
}
