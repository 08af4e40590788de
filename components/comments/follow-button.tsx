"use client";

import { useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { useFollow, useSetFollow } from "./use-comments";

/** Follow or stop following a trial: followers hear about its comments, layers and readings. */
export function FollowButton({ trialId }: { trialId: string }) {
  const { studioId } = useStudio();
  const status = useFollow(studioId, trialId);
  const set = useSetFollow(studioId, trialId);
  if (!status.data) return null;
  const following = status.data.following;
  return (
    <Button
      variant={following ? "plain" : "quiet"}
      aria-pressed={following}
      disabled={set.isPending}
      onClick={() => set.mutate(!following)}
      title={following ? "You hear about new comments, layers and readings here. Tap to stop." : "Hear about new comments, layers and readings here."}
    >
      {following ? "Following" : "Follow"}
    </Button>
  );
}
