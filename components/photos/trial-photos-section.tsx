"use client";

import { useStudio } from "@/components/studio/studio-context";
import { useTrial } from "@/components/trials/use-trials";
import { TrialPhotos } from "./trial-photos";

/** The photos and readings of the trial on its page, with the trial's layers to attach photos to. */
export function TrialPhotosSection({ trialId }: { trialId: string }) {
  const { studioId } = useStudio();
  const trial = useTrial(studioId, trialId);
  if (!trial.data) return null;
  return (
    <div className="mt-5">
      <TrialPhotos studioId={studioId} trialId={trialId} layers={trial.data.layers.map((l) => ({ id: l.id, position: l.position, method: l.method }))} />
    </div>
  );
}
