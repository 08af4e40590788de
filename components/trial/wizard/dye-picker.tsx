"use client";

import { useEffect, useState } from "react";
import { parseAmount } from "@/colour/units";
import type { DyeDto } from "@/components/library/use-dyes";
import type { StockDto } from "@/components/library/use-stocks";
import { Button } from "@/components/ui/button";
import type { AmountUnit } from "@/lib/schemas/trial";
import { DyeChip } from "../dye-line";
import { type UnitSystem, UNIT_WORDS, amountWords, dosOf } from "../units";
import { Chips } from "./choice";
import type { DraftDye } from "./draft";

const STOCK_UNITS: AmountUnit[] = ["ml", "tsp", "tbsp", "cup", "dos"];
const POWDER_UNITS: AmountUnit[] = ["g", "dos"];
/** How parseAmount reads each of our units ("1 1/2 tsp", "0.5 %"). */
const PARSE_UNIT: Record<AmountUnit, string> = { dos: "%", ml: "ml", g: "g", tsp: "tsp", tbsp: "tbsp", cup: "cup", floz: "fl oz" };

function mixedOn(s: StockDto): string {
  return new Date(`${s.mixedOn}T12:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "short" });
}

/** Pick a dye, then what it was measured from (a stock or the powder), then how much: big taps, one screen. */
export function DyePicker({
  dyes,
  stocks,
  fibreG,
  system,
  onAdd,
  onCancel,
  onPending,
  loading = false,
}: {
  loading?: boolean;
  /** The dye on the picker with a readable amount, not yet added: "Next" takes it along. */
  onPending?: (d: Omit<DraftDye, "key"> | null) => void;
  dyes: DyeDto[];
  stocks: StockDto[];
  fibreG: number;
  system: UnitSystem;
  onAdd: (d: Omit<DraftDye, "key">) => void;
  onCancel?: () => void;
}) {
  const [dyeId, setDyeId] = useState<string | null>(null);
  const [stockId, setStockId] = useState<string | null>(null);
  const [unit, setUnit] = useState<AmountUnit>(system === "us" ? "tsp" : "ml");
  const [text, setText] = useState("");
  const dye = dyes.find((d) => d.id === dyeId);
  const itsStocks = stocks.filter((s) => s.dye.id === dyeId);
  const stock = itsStocks.find((s) => s.id === stockId) ?? null;

  const pickDye = (id: string) => {
    setDyeId(id);
    const own = stocks.filter((s) => s.dye.id === id);
    // One stock of this dye: take it. None: the powder.
    const only = own.length >= 1 ? own[0] : null;
    setStockId(only?.id ?? null);
    setUnit(only ? (system === "us" ? "tsp" : "ml") : "g");
  };

  let value: number | undefined;
  let parseError: string | undefined;
  if (text.trim()) {
    try {
      value = parseAmount(`${text} ${PARSE_UNIT[unit]}`).value;
    } catch (e) {
      parseError = e instanceof Error ? e.message : String(e);
    }
  }
  const ref = stock ? { pct: stock.concentrationPct, definition: stock.definition } : null;
  const dos = value === undefined ? undefined : dosOf(value, unit, fibreG, ref);
  const words = dos === undefined ? null : amountWords(dos, fibreG, ref, system);
  const ready = dye && value !== undefined && dos !== undefined ? { dyeId: dye.id, stockId, value, unit } : null;
  useEffect(() => {
    onPending?.(ready);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ready?.dyeId, ready?.stockId, ready?.value, ready?.unit]);
  useEffect(() => () => onPending?.(null), [onPending]);

  if (!dye) {
    return (
      <div className="space-y-2">
        <p className="text-sm font-medium text-ink-soft">Which dye?</p>
        {loading && <p className="text-ink-soft">Reading the library…</p>}
        {!loading && dyes.length === 0 && <p className="text-ink-soft">The library has no dyes yet: add them under Library first.</p>}
        <div className="grid grid-cols-2 gap-2">
          {/* Dyes and stocks arrive together, so a picked dye finds its stock at once. */}
          {!loading && dyes.map((d) => (
            <button
              key={d.id}
              type="button"
              onClick={() => pickDye(d.id)}
              className="flex min-h-14 items-center rounded-lg border border-rule bg-sheet px-3 text-left"
            >
              <DyeChip hex={d.displayHex} name={d.name} />
            </button>
          ))}
        </div>
        {onCancel && (
          <Button variant="plain" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    );
  }

  const units = stock ? STOCK_UNITS : POWDER_UNITS;
  return (
    <div className="space-y-3 rounded-lg border border-accent/40 bg-sheet p-3">
      <div className="flex items-center justify-between gap-2">
        <DyeChip hex={dye.displayHex} name={dye.name} />
        <Button variant="quiet" onClick={() => setDyeId(null)}>
          Other dye
        </Button>
      </div>
      <Chips
        label="Measured from"
        value={stockId ?? "powder"}
        options={[
          ...itsStocks.map((s) => ({ value: s.id, title: `${s.concentrationPct} % stock · ${mixedOn(s)}${s.pastShelfLife ? " ⚠" : ""}` })),
          { value: "powder", title: dye.form === "liquid" ? "Straight from the bottle (g)" : "Powder (g)" },
        ]}
        onPick={(v) => {
          const s = v === "powder" ? null : v;
          setStockId(s);
          if (!(s ? STOCK_UNITS : POWDER_UNITS).includes(unit)) setUnit(s ? (system === "us" ? "tsp" : "ml") : "g");
        }}
      />
      <Chips label="Unit" value={unit} options={units.map((u) => ({ value: u, title: UNIT_WORDS[u] }))} onPick={setUnit} />
      <div className="space-y-1">
        <label htmlFor="dye-amount" className="block text-sm font-medium text-ink-soft">
          How much ({UNIT_WORDS[unit]})
        </label>
        <input
          id="dye-amount"
          inputMode="decimal"
          autoComplete="off"
          value={text}
          placeholder={unit === "tsp" || unit === "tbsp" || unit === "cup" ? "e.g. 1 1/2" : "e.g. 2.5"}
          onChange={(e) => setText(e.target.value)}
          className="tabular block min-h-12 w-full rounded-md border border-rule-strong bg-sheet px-3 text-xl focus:border-accent focus:outline-none"
        />
        {parseError && <p className="text-sm text-danger">{parseError}</p>}
        {words && (
          <p className="tabular text-sm text-ink-soft" aria-live="polite">
            = {[words.dos, words.grams, words.stock, words.kitchen].filter(Boolean).join(" · ")}
          </p>
        )}
      </div>
      <div className="flex gap-2">
        <Button
          disabled={value === undefined || dos === undefined}
          onClick={() => value !== undefined && onAdd({ dyeId: dye.id, stockId, value, unit })}
        >
          Add {dye.name}
        </Button>
        {onCancel && (
          <Button variant="plain" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </div>
  );
}
