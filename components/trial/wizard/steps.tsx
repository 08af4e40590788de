"use client";

import { useState } from "react";
import { acidFor, liquorRatio } from "@/colour/arithmetic";
import type { DyeDto } from "@/components/library/use-dyes";
import type { StockDto } from "@/components/library/use-stocks";
import { Button } from "@/components/ui/button";
import { LAYER_METHODS, type LayerMethod, METHOD_LABELS } from "@/lib/schemas/trial";
import type { TrialDto } from "@/lib/trials/types";
import { SafetyCautions, Warnings } from "../cautions";
import { DyeLine } from "../dye-line";
import { type TempUnit, type UnitSystem, num, toCelsius } from "../units";
import { formatAmount } from "@/colour/units";

/** A volume as US kitchen measures, without the millilitres already shown beside it. */
const kitchen = (ml: number) => `≈ ${formatAmount(ml, "us").replace(/\s*\([^)]*\)$/, "").replace(/^about /, "")}`;
import { boilDraftWarning, draftCautions, fibreDraftWarnings, stockDraftWarnings } from "../warnings";
import { Chips, NumberField, Tiles } from "./choice";
import { type Draft, numberOf, previewDye } from "./draft";
import { DyePicker } from "./dye-picker";

const METHOD_HINTS: Record<LayerMethod, string> = {
  immersion: "The whole skein in a full bath",
  kettle: "Little water, dye poured in places",
  dip: "Sections dipped in turn",
  "hand-paint": "Dye brushed or poured on",
  speckle: "Powder or drops on damp yarn",
  dry: "Dye rubbed into dry yarn",
  other: "Anything else",
};

export function MethodStep({ value, onPick }: { value: LayerMethod | null; onPick: (m: LayerMethod) => void }) {
  return (
    <Tiles
      label="How does the dye go on?"
      value={value}
      onPick={onPick}
      options={LAYER_METHODS.map((m) => ({ value: m, title: METHOD_LABELS[m], hint: METHOD_HINTS[m] }))}
    />
  );
}

interface Ctx {
  trial: TrialDto;
  draft: Draft;
  set: (patch: Partial<Draft>) => void;
  dyes: DyeDto[];
  stocks: StockDto[];
  system: UnitSystem;
  tempUnit: TempUnit;
  libraryLoading: boolean;
  /** Told about a dye chosen on the picker with its amount typed but not yet added. */
  onPendingDye?: (d: Omit<Draft["dyes"][number], "key"> | null) => void;
}

export function DyesStep({ trial, draft, set, dyes, stocks, system, libraryLoading, onPendingDye }: Ctx) {
  const [picking, setPicking] = useState(draft.dyes.length === 0);
  const fibreG = trial.fibreWeightG;
  const lines = draft.dyes.map((x) => previewDye(x, fibreG, dyes, stocks));
  const drafts = draft.dyes.map((x) => {
    const d = dyes.find((y) => y.id === x.dyeId);
    const s = x.stockId ? stocks.find((y) => y.id === x.stockId) : null;
    return { dyeClass: d?.dyeClass ?? null, name: d?.name ?? "dye", stock: s ?? null };
  });
  const warnings = [...fibreDraftWarnings(trial.base, drafts), ...stockDraftWarnings(drafts)].map((w) => ({ ...w, key: `${trial.id}:draft:${w.key}` }));
  const cautions = draftCautions({
    method: draft.method ?? "other",
    powder: lines.some((l) => !l.stockId && l.dyeForm !== "liquid"),
    acid: "none",
    setting: "none",
    hasDyes: false,
  });
  return (
    <div className="space-y-4">
      {lines.length > 0 && (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-sheet px-3" aria-label="Dyes in this layer">
          {lines.map((l, i) => (
            <li key={draft.dyes[i].key} className="flex items-center gap-2">
              <div className="min-w-0 flex-1">
                <DyeLine dye={l} fibreG={fibreG} system={system} />
              </div>
              <button
                type="button"
                className="flex h-11 w-11 shrink-0 items-center justify-center rounded-md text-xl text-ink-soft"
                aria-label={`Remove ${l.dyeName}`}
                onClick={() => set({ dyes: draft.dyes.filter((_, j) => j !== i) })}
              >
                ×
              </button>
            </li>
          ))}
        </ul>
      )}
      {picking ? (
        <DyePicker
          loading={libraryLoading}
          onPending={onPendingDye}
          dyes={dyes}
          stocks={stocks}
          fibreG={fibreG}
          system={system}
          onAdd={(d) => {
            set({ dyes: [...draft.dyes, { ...d, key: Math.random().toString(36).slice(2) }] });
            setPicking(false);
          }}
          onCancel={draft.dyes.length > 0 ? () => setPicking(false) : undefined}
        />
      ) : (
        <Button variant="plain" className="w-full" onClick={() => setPicking(true)}>
          + Another dye
        </Button>
      )}
      <Warnings items={warnings} />
      <SafetyCautions context={trial.id} kinds={cautions} dyes={lines} />
    </div>
  );
}

export function HeatStep({ trial, draft, set, tempUnit, system }: Ctx) {
  const fibreG = trial.fibreWeightG;
  const water = numberOf(draft.waterL);
  const ratio = water && water > 0 ? liquorRatio(water, fibreG) : null;
  const suggestion = draft.acidKind === "none" ? null : acidFor(fibreG, { kind: draft.acidKind });
  const cautions = draftCautions({ method: draft.method ?? "other", powder: false, acid: draft.acidKind, setting: draft.setting, hasDyes: false });
  const temp = numberOf(draft.temperature);
  const vinegarMl = numberOf(draft.acidAmount);
  const usVinegar = system === "us" && draft.acidKind === "vinegar" && vinegarMl && vinegarMl > 0 ? kitchen(vinegarMl) : null;
  const boil = boilDraftWarning(trial.base, {
    temperatureC: temp === null || Number.isNaN(temp) ? null : toCelsius(temp, tempUnit),
    minutes: numberOf(draft.minutes),
    setting: { method: draft.setting, minutes: numberOf(draft.settingMinutes) },
  }).map((w) => ({ ...w, key: `${trial.id}:draft:${w.key}` }));
  return (
    <div className="space-y-5">
      <Chips
        label="Acid"
        value={draft.acidKind}
        options={[
          { value: "vinegar", title: "White vinegar" },
          { value: "citric", title: "Citric acid" },
          { value: "none", title: "None" },
        ]}
        onPick={(k) => set({ acidKind: k, acidAmount: k === "none" ? "" : String(Math.round(acidFor(fibreG, { kind: k }).amount * 10) / 10) })}
      />
      {draft.acidKind !== "none" && suggestion && (
        <div className="grid grid-cols-2 gap-3">
          <NumberField
            id="acid-amount"
            label={draft.acidKind === "vinegar" ? "Vinegar" : "Citric acid"}
            unit={suggestion.unit}
            value={draft.acidAmount}
            onChange={(v) => set({ acidAmount: v })}
            hint={`Usual: ${num(suggestion.low)}–${num(suggestion.high)} ${suggestion.unit}${usVinegar ? ` · ${usVinegar}` : ""}`}
          />
          <NumberField id="acid-ph" label="Measured pH" value={draft.ph} onChange={(v) => set({ ph: v })} hint="If you have it" />
        </div>
      )}
      <div className="grid grid-cols-2 gap-3">
        <NumberField
          id="water"
          label="Water"
          unit="l"
          value={draft.waterL}
          onChange={(v) => set({ waterL: v })}
          hint={ratio ? `Liquor ratio 1:${num(ratio, 2)}${system === "us" && water ? ` · ${kitchen(water * 1000)}` : ""}` : "Leave empty for no bath"}
        />
        <NumberField id="temp" label="Temperature" unit={tempUnit === "F" ? "°F" : "°C"} value={draft.temperature} onChange={(v) => set({ temperature: v })} />
        <NumberField id="minutes" label="Time in the bath" unit="min" value={draft.minutes} onChange={(v) => set({ minutes: v })} />
      </div>
      <Chips
        label="Setting"
        value={draft.setting}
        options={[
          { value: "steam", title: "Steam" },
          { value: "simmer", title: "Simmer" },
          { value: "microwave", title: "Microwave" },
          { value: "none", title: "None" },
        ]}
        onPick={(s) => set({ setting: s, settingMinutes: s === "none" ? "" : draft.settingMinutes || (s === "microwave" ? "2" : s === "steam" ? "20" : "30") })}
      />
      {draft.setting !== "none" && (
        <NumberField id="setting-min" label="Setting time" unit="min" value={draft.settingMinutes} onChange={(v) => set({ settingMinutes: v })} />
      )}
      <Warnings items={boil} />
      <SafetyCautions context={trial.id} kinds={cautions} dyes={[]} />
    </div>
  );
}
