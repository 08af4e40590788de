"use client";

import Link from "next/link";
import { useState } from "react";
import { buttonClass } from "@/components/ui/button";
import { TimerStart, presetsFor } from "@/components/timers/timer-start";
import { METHOD_LABELS } from "@/lib/schemas/trial";
import type { CautionKey, LayerDto, TrialWarning } from "@/lib/trials/types";
import { SafetyCautions, Warnings } from "./cautions";
import { DyeLine } from "./dye-line";
import { GradientStrip, layerHex } from "./gradient-strip";
import { ObservationEditor } from "./observation-editor";
import { type TempUnit, type UnitSystem, num, temperature, volume } from "./units";

const SETTING_WORDS = { simmer: "Simmer", steam: "Steam", microwave: "Microwave", none: "No setting step" } as const;

export interface LayerActions {
  onMove: (dir: -1 | 1) => void;
  onDuplicate: () => void;
  onDelete: () => void;
  onObservations: (text: string) => void;
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="grid grid-cols-[6.5rem_1fr] gap-2 py-1.5">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="tabular min-w-0">{children}</dd>
    </div>
  );
}

function acidWords(acid: LayerDto["acid"], system: UnitSystem): string {
  if (acid.kind === "none") return "None";
  const amount =
    acid.amount === null ? "" : acid.kind === "vinegar" ? ` ${volume(acid.amount, system)}` : ` ${num(acid.amount)} g`;
  const ph = acid.ph === null ? "" : ` · pH ${num(acid.ph, 2)}`;
  return `${acid.kind === "vinegar" ? "White vinegar" : "Citric acid"}${amount}${ph}`;
}

/** One layer of a trial, read top to bottom as it happens at the pot. */
export function LayerCard({
  layer,
  index,
  count,
  trialId,
  studioId,
  fibreG,
  system,
  tempUnit,
  canEdit,
  canTime,
  waiting,
  warnings,
  cautions,
  actions,
}: {
  layer: LayerDto;
  index: number;
  count: number;
  trialId: string;
  studioId: string;
  fibreG: number;
  system: UnitSystem;
  tempUnit: TempUnit;
  canEdit: boolean;
  canTime: boolean;
  /** The layer has changes not yet on the server (or is not saved at all yet). */
  waiting: boolean;
  warnings: TrialWarning[];
  cautions: CautionKey[];
  actions: LayerActions;
}) {
  const [confirmDelete, setConfirmDelete] = useState(false);
  const unsaved = layer.id.startsWith("pending-");
  const l = layer;
  const heat = [l.temperatureC !== null ? temperature(l.temperatureC, tempUnit) : null, l.minutes !== null ? `${num(l.minutes)} min` : null]
    .filter(Boolean)
    .join(" for ");
  return (
    <article className="rounded-lg border border-rule bg-sheet" aria-labelledby={`layer-${l.id}`} data-layer-index={index}>
      <header className="flex items-baseline justify-between gap-2 border-b border-rule px-4 pt-3 pb-2">
        <h2 id={`layer-${l.id}`} className="text-xl">
          <span className="tabular text-ink-soft">{index + 1}.</span> {METHOD_LABELS[l.method]}
        </h2>
        {waiting && (
          <span className="rounded-full border border-caution/40 bg-caution-soft px-2 py-0.5 text-xs text-caution">
            {unsaved ? "Not sent yet" : "Changes waiting"}
          </span>
        )}
      </header>
      <div className="space-y-3 px-4 py-3">
        {l.dyes.length > 0 ? (
          <ul className="divide-y divide-rule" aria-label="Dyes">
            {l.dyes.map((d, i) => (
              <li key={`${d.dyeId}-${i}`}>
                <DyeLine dye={d} fibreG={fibreG} system={system} />
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-ink-soft">No dyes written down for this layer.</p>
        )}
        <dl className="divide-y divide-rule border-y border-rule">
          <Row label="Acid">{acidWords(l.acid, system)}</Row>
          {l.waterL !== null && (
            <Row label="Water">
              {volume(l.waterL * 1000, system)}
              {l.liquorRatio !== null && <span className="text-ink-soft"> → liquor ratio 1:{num(l.liquorRatio, 2)}</span>}
            </Row>
          )}
          {heat && <Row label="Heat">{heat}</Row>}
          <Row label="Setting">
            {SETTING_WORDS[l.setting.method]}
            {l.setting.method !== "none" && l.setting.minutes !== null && ` ${num(l.setting.minutes)} min`}
          </Row>
          {l.coverage !== null && <Row label="Coverage">about {Math.round(l.coverage * 100)} % of the fibre</Row>}
          {(l.rinseNote || l.bled !== null) && (
            <Row label="Rinse">
              {l.rinseNote}
              {l.bled !== null && <span className="text-ink-soft">{l.rinseNote ? " · " : ""}{l.bled ? "bled" : "ran clear"}</span>}
            </Row>
          )}
        </dl>
        {l.gradient && <GradientStrip gradient={l.gradient} hex={layerHex(l.dyes)} />}
        {canTime && !unsaved && <TimerStart trialId={trialId} layerId={l.id} presets={presetsFor(l)} />}
        <ObservationEditor text={l.observations} canEdit={canEdit && !unsaved} onSave={actions.onObservations} />
        <Warnings items={warnings} />
        <SafetyCautions context={trialId} kinds={cautions} dyes={l.dyes} />
      </div>
      {canEdit && (
        <footer className="flex flex-wrap items-center gap-2 border-t border-rule px-4 py-3">
          {unsaved ? (
            <p className="text-sm text-ink-soft">This layer is kept on this device until the connection returns.</p>
          ) : confirmDelete ? (
            <>
              <span className="text-sm">Delete layer {index + 1}?</span>
              <button type="button" className={buttonClass("danger")} onClick={actions.onDelete}>
                Delete
              </button>
              <button type="button" className={buttonClass("plain")} onClick={() => setConfirmDelete(false)}>
                Keep
              </button>
            </>
          ) : (
            <>
              <Link href={`/s/${studioId}/trials/${trialId}/layers/${l.id}`} className={buttonClass("plain")}>
                Edit
              </Link>
              <button type="button" className={buttonClass("plain", "w-11 px-0")} aria-label={`Move layer ${index + 1} up`} disabled={index === 0} onClick={() => actions.onMove(-1)}>
                ↑
              </button>
              <button type="button" className={buttonClass("plain", "w-11 px-0")} aria-label={`Move layer ${index + 1} down`} disabled={index === count - 1} onClick={() => actions.onMove(1)}>
                ↓
              </button>
              <button type="button" className={buttonClass("quiet")} onClick={actions.onDuplicate}>
                Duplicate
              </button>
              <button type="button" className={buttonClass("quiet", "ml-auto text-danger")} onClick={() => setConfirmDelete(true)}>
                Delete
              </button>
            </>
          )}
        </footer>
      )}
    </article>
  );
}
