"use client";

import { useTrialPhotos } from "@/components/photos/use-photos";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { useTrial } from "@/components/trials/use-trials";
import { Button } from "@/components/ui/button";
import { Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { Chip, hexOf, labText, VERDICT_WORDS } from "./colour-bits";
import { MakeColourway } from "./make-colourway";
import { useComparison, useRecordPrediction } from "./use-colourways";

const TONE = { close: "text-ok", noticeable: "text-caution", far: "text-danger" } as const;

/** Predicted against measured for each layer of a trial, with a verdict in plain words. */
export function TrialComparison({ trialId }: { trialId: string }) {
  const { studioId } = useStudio();
  const canPredict = useCan("prediction.run");
  const trial = useTrial(studioId, trialId);
  const photos = useTrialPhotos(studioId, trialId);
  const basis = [
    ...(trial.data?.layers ?? []).map((l) => `${l.id}:${l.version}`),
    ...(photos.data?.readings ?? []).map((r) => r.id),
  ].join(",");
  const cmp = useComparison(studioId, trialId, basis);
  const record = useRecordPrediction(studioId, trialId);
  if (!trial.data || !cmp.data) return null;
  if (!trial.data.layers.length) return null;
  const byId = new Map(cmp.data.map((c) => [c.layerId, c]));

  return (
    <Sheet className="mt-5" aria-label="Predicted and measured">
      <SectionTitle>Predicted and measured</SectionTitle>
      {record.error && <Notice tone="caution" className="mb-3">{record.error.message}</Notice>}
      <ol className="space-y-4">
        {trial.data.layers.map((l, i) => {
          const c = byId.get(l.id);
          return (
            <li key={l.id} className="border-b border-rule pb-4 last:border-b-0" data-testid={`comparison-${i + 1}`}>
              <p className="font-medium">Layer {i + 1}</p>
              <div className="mt-2 grid grid-cols-2 gap-3">
                <div>
                  <p className="text-sm text-ink-soft">Predicted</p>
                  {c?.prediction ? (
                    <div className="mt-1 flex items-center gap-2">
                      <Chip lab={c.prediction.lab} size="h-12 w-12" label="Predicted colour" />
                      <span className="tabular font-mono text-xs text-ink-soft">{labText(c.prediction.lab)}</span>
                    </div>
                  ) : (
                    <p className="text-sm text-ink-faint">Not recorded</p>
                  )}
                  {c?.prediction && c.prediction.palette.length > 1 && (
                    <div className="mt-1 flex h-3 overflow-hidden rounded border border-rule">
                      {c.prediction.palette.map((e, k) => (
                        <span key={k} style={{ background: hexOf(e.lab), width: `${e.share * 100}%` }} />
                      ))}
                    </div>
                  )}
                </div>
                <div>
                  <p className="text-sm text-ink-soft">Measured</p>
                  {c?.measured ? (
                    <div className="mt-1 flex items-center gap-2">
                      <Chip lab={c.measured.lab} size="h-12 w-12" label="Measured colour" />
                      <span className="tabular font-mono text-xs text-ink-soft">{labText(c.measured.lab)}</span>
                    </div>
                  ) : (
                    <p className="text-sm text-ink-faint">No reading of this layer yet</p>
                  )}
                </div>
              </div>
              {c?.verdict && (
                <p className="mt-2" data-testid="verdict">
                  <span className={`font-medium ${TONE[c.verdict.verdict]}`}>{VERDICT_WORDS[c.verdict.verdict]}</span>
                  <span className="tabular text-ink-soft"> · ΔE00 {c.verdict.de00.toFixed(1)}</span>
                  {c.verdict.differences.length > 0 && <span className="text-ink-soft"> · measured is {c.verdict.differences.join(", ")}</span>}
                </p>
              )}
              {/* Once measured, a new prediction would come from profiles that have seen the result. */}
              {canPredict && !c?.measured && (
                <Button variant="plain" className="mt-2" disabled={record.isPending} onClick={() => record.mutate(l.id)}>
                  {c?.prediction ? "Predict again with today's profiles" : "Record a prediction"}
                </Button>
              )}
            </li>
          );
        })}
      </ol>
      <MakeColourway trialId={trialId} readings={photos.data?.readings ?? []} />
    </Sheet>
  );
}
