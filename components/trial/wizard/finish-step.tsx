"use client";

import type { DyeDto } from "@/components/library/use-dyes";
import type { StockDto } from "@/components/library/use-stocks";
import type { TrialDto } from "@/lib/trials/types";
import { GradientStrip, layerHex } from "../gradient-strip";
import { PARTIAL_METHODS } from "../warnings";
import { Chips } from "./choice";
import { DEFAULT_GRADIENT, type Draft, previewDye } from "./draft";

const COVERAGE = [0.1, 0.25, 0.5, 0.75, 1];
/** One tap moves a section's depth by a tenth. */
const STEP = 0.1;

/** Even depths falling from full to a tenth, for a new section count. */
function spread(n: number): number[] {
  return Array.from({ length: n }, (_, i) => Math.round((1 - (0.9 * i) / (n - 1)) * 100) / 100);
}

/** The last screen: coverage and gradient when the method has them, then the rinse and what was seen. */
export function FinishStep({
  trial,
  draft,
  set,
  dyes,
  stocks,
}: {
  trial: TrialDto;
  draft: Draft;
  set: (p: Partial<Draft>) => void;
  dyes: DyeDto[];
  stocks: StockDto[];
}) {
  const method = draft.method ?? "other";
  const g = draft.gradient ?? DEFAULT_GRADIENT;
  const hex = layerHex(draft.dyes.map((x) => previewDye(x, trial.fibreWeightG, dyes, stocks)));
  return (
    <div className="space-y-5">
      {PARTIAL_METHODS.includes(method) && (
        <Chips
          label="Coverage: how much of the fibre took dye?"
          value={draft.coverage}
          options={COVERAGE.map((c) => ({ value: c, title: `${Math.round(c * 100)} %` }))}
          onPick={(c) => set({ coverage: c })}
        />
      )}
      {method === "dip" && (
        <fieldset className="space-y-3">
          <legend className="text-sm font-medium text-ink-soft">Gradient, first section dipped on the left</legend>
          <div className="flex items-center gap-3">
            <button
              type="button"
              aria-label="Fewer sections"
              disabled={g.sections <= 2}
              className="h-11 w-11 rounded-md border border-rule-strong bg-sheet text-xl disabled:opacity-40"
              onClick={() => set({ gradient: { sections: g.sections - 1, depths: spread(g.sections - 1) } })}
            >
              −
            </button>
            <span className="tabular text-lg">{g.sections} sections</span>
            <button
              type="button"
              aria-label="More sections"
              disabled={g.sections >= 12}
              className="h-11 w-11 rounded-md border border-rule-strong bg-sheet text-xl disabled:opacity-40"
              onClick={() => set({ gradient: { sections: g.sections + 1, depths: spread(g.sections + 1) } })}
            >
              +
            </button>
          </div>
          <GradientStrip gradient={g} hex={hex} />
          <ul className="divide-y divide-rule rounded-lg border border-rule bg-sheet">
            {g.depths.map((d, i) => {
              const setDepth = (x: number) => set({ gradient: { ...g, depths: g.depths.map((y, j) => (j === i ? x : y)) } });
              return (
                <li key={i} className="flex items-center gap-2 px-3 py-1">
                  <span className="flex-1 text-sm text-ink-soft">Section {i + 1}</span>
                  <button type="button" aria-label={`Section ${i + 1} paler`} disabled={d <= 0} onClick={() => setDepth(Math.max(0, Math.round((d - STEP) * 100) / 100))} className="h-11 w-11 rounded-md border border-rule-strong text-xl disabled:opacity-40">
                    −
                  </button>
                  <span className="tabular w-16 text-center text-lg" aria-live="polite">
                    {Math.round(d * 100)} %
                  </span>
                  <button type="button" aria-label={`Section ${i + 1} deeper`} disabled={d >= 1} onClick={() => setDepth(Math.min(1, Math.round((d + STEP) * 100) / 100))} className="h-11 w-11 rounded-md border border-rule-strong text-xl disabled:opacity-40">
                    +
                  </button>
                </li>
              );
            })}
          </ul>
        </fieldset>
      )}
      <div className="space-y-1">
        <label htmlFor="rinse" className="block text-sm font-medium text-ink-soft">
          Rinse and wash
        </label>
        <input
          id="rinse"
          value={draft.rinseNote}
          onChange={(e) => set({ rinseNote: e.target.value })}
          placeholder="e.g. warm soak, wool wash, two rinses"
          className="block min-h-12 w-full rounded-md border border-rule-strong bg-sheet px-3 text-base"
        />
      </div>
      <Chips
        label="Did it bleed?"
        value={draft.bled === null ? "unknown" : draft.bled ? "yes" : "no"}
        options={[
          { value: "no", title: "Ran clear" },
          { value: "yes", title: "Bled" },
          { value: "unknown", title: "Not rinsed yet" },
        ]}
        onPick={(v) => set({ bled: v === "unknown" ? null : v === "yes" })}
      />
      <div className="space-y-1">
        <label htmlFor="observations" className="block text-sm font-medium text-ink-soft">
          What you see
        </label>
        <textarea
          id="observations"
          rows={3}
          value={draft.observations}
          onChange={(e) => set({ observations: e.target.value })}
          placeholder="e.g. blue broke out at the tips"
          className="block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-base"
        />
      </div>
    </div>
  );
}
