"use client";

import { useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { type FollowTarget, useFollow, useSetFollow } from "./use-comments";

const WHAT: Record<FollowTarget, string> = {
  trial: "new comments, layers and readings here",
  colourway: "new lots and changes to this colourway",
};

/** Follow or stop following a trial or a colourway: followers get a notification when something happens there. */
export function FollowButton({ trialId, colourwayId }: { trialId?: string; colourwayId?: string }) {
  const { studioId } = useStudio();
  const [type, id]: [FollowTarget, string] = colourwayId ? ["colourway", colourwayId] : ["trial", trialId ?? ""];
  const status = useFollow(studioId, type, id);
  const set = useSetFollow(studioId, type, id);
  if (!status.data) return null;
  const following = status.data.following;
  return (
    <Button
      variant={following ? "plain" : "quiet"}
      disabled={set.isPending}
      onClick={() => set.mutate(!following)}
      title={following ? `You hear about ${WHAT[type]}. Tap to stop.` : `Hear about ${WHAT[type]}.`}
    >
      {following ? "Following" : "Follow"}
    </Button>
  );
}
