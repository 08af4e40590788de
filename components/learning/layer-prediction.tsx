"use client";

import { useMemo } from "react";
import { toModelLayer, profileMap, type PlannedLayer } from "@/colour/plan";
import { predictLayer, type LayerBase, type Prediction } from "@/colour/spectral/predict";
import type { Lab } from "@/colour/types";
import { useTrialPhotos } from "@/components/photos/use-photos";
import { useStudio } from "@/components/studio/studio-context";
import { useTrial } from "@/components/trials/use-trials";
import { PaletteBar, Swatch } from "@/components/ui/swatch";
import { Notice } from "@/components/ui/sheet";
import { fibreClassOf } from "./fibre-class";
import { hexOf, LabStrip } from "./colour-bits";
import { useProfiles } from "./use-profiles";

type Outcome =
  | { ok: true; prediction: Prediction; from: string }
  | { ok: false; reason: string };

/**
 * The predicted result of a planned layer, computed in the browser as the amounts change: over the
 * latest measured colour before it (the base's reading or an earlier layer's), chained through
 * unmeasured layers in between, with the studio's profiles for the base's fibre class.
 */
export function LayerPrediction({
  trialId,
  layer,
  layerId,
  baseLab,
  previousLayers,
}: {
  trialId: string;
  layer: PlannedLayer;
  /** The layer's id when it is saved, so its own reading is not used as its base. */
  layerId?: string;
  baseLab?: Lab | null;
  previousLayers?: (PlannedLayer & { id: string })[];
}) {
  const { studioId } = useStudio();
  const trial = useTrial(studioId, trialId);
  const photos = useTrialPhotos(studioId, trialId);
  const profilesQ = useProfiles(studioId);
  const fibreClass = fibreClassOf(trial.data?.base?.fibres);
  const earlier = previousLayers ?? trial.data?.layers.filter((l) => l.id !== layerId && (!layerId || l.position < (trial.data?.layers.find((x) => x.id === layerId)?.position ?? Infinity))) ?? [];

  const outcome = useMemo((): Outcome | null => {
    if (!profilesQ.data || (!baseLab && !photos.data)) return null;
    const list = profilesQ.data.filter((p) => p.fibreClass === fibreClass);
    const profiles = profileMap(list);
    const readings = photos.data?.readings ?? [];
    const baseReading = readings.find((r) => r.photoKind === "base");
    let state: LayerBase | undefined = baseLab ?? baseReading?.lab;
    let from = baseLab ? "the given colour" : "the base's reading";
    let start = 0;
    for (let j = earlier.length - 1; j >= 0; j--) {
      const r = [...readings].reverse().find((x) => x.layerId === earlier[j].id && x.photoKind === "after-layer");
      if (r) {
        state = r.lab;
        from = `layer ${j + 1}'s reading`;
        start = j + 1;
        break;
      }
    }
    if (!state) return { ok: false, reason: "Measure the undyed base first (a photo of the base with a reading): predictions start from it." };
    const names = new Map((trial.data?.layers ?? []).flatMap((l) => l.dyes.map((d) => [d.dyeId, d.dyeName] as const)));
    for (const p of profilesQ.data) names.set(p.dyeId, p.dyeName);
    const chain = [...earlier.slice(start), layer];
    let prediction: Prediction | undefined;
    for (const [i, l] of chain.entries()) {
      if (!l.dyes.some((d) => d.dosPct > 0)) return { ok: false, reason: "Add a dye with an amount to see the prediction." };
      const planned = toModelLayer(l, profiles);
      if (!planned.ok) {
        const who = planned.missing.map((id) => names.get(id) ?? "a dye").join(", ");
        const which = i === chain.length - 1 ? "" : ` (in layer ${start + i + 1})`;
        return { ok: false, reason: `No prediction: ${who}${which} has no profile on ${fibreClass} yet. Dye and measure a calibration sample first.` };
      }
      prediction = predictLayer(state!, planned.layer);
      state = prediction;
      if (i < chain.length - 1) from = `the predicted layer ${start + i + 1}`;
    }
    return { ok: true, prediction: prediction!, from };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [profilesQ.data, photos.data, baseLab, fibreClass, JSON.stringify(layer), JSON.stringify(earlier.map((l) => [l.id, l.method, l.dyes, l.coverage, l.gradient]))]);

  if (!outcome) return <p className="text-sm text-ink-soft">Working out the prediction…</p>;
  if (!outcome.ok) return <Notice tone="caution">{outcome.reason}</Notice>;
  const p = outcome.prediction;
  return (
    <section aria-label="Predicted result" data-testid="layer-prediction" className="space-y-3 rounded-md border border-rule bg-paper p-3">
      <h3 className="text-base font-medium">Predicted result</h3>
      <Swatch hex={hexOf(p.lab)} lab={p.lab} label={`Over ${outcome.from}`} />
      {p.palette.length > 1 && <PaletteBar palette={p.palette.map((e) => ({ hex: hexOf(e.lab), share: e.share }))} />}
      {p.gradient && <LabStrip labs={p.gradient} label="Predicted gradient along the skein" />}
      {p.notes.map((n) => (
        <p key={n} className="text-sm text-caution">
          {n}
        </p>
      ))}
    </section>
  );
}
