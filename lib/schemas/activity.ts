import { z } from "zod";

// The studio's activity feed, notifications and follows: query and body shapes, shared by the
// pages' hooks and the route handlers.

/** Every kind of activity event. Add a kind here before recording it. */
export const ACTIVITY_KINDS = [
  "trial.created",
  "trial.copied",
  "layer.added",
  "photo.added",
  "reading.added",
  "prediction.made",
  "colourway.created",
  "colourway.repeatable",
  "lot.added",
  "comment.added",
  "member.joined",
] as const;
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];

/** Plain words for the feed's filter. */
export const ACTIVITY_KIND_LABELS: Record<ActivityKind, string> = {
  "trial.created": "New trials",
  "trial.copied": "Copied trials",
  "layer.added": "Layers",
  "photo.added": "Photos",
  "reading.added": "Readings",
  "prediction.made": "Predictions",
  "colourway.created": "Colourways",
  "colourway.repeatable": "Repeatable colourways",
  "lot.added": "Dye lots",
  "comment.added": "Comments",
  "member.joined": "People joining",
};

const cursor = z.string().max(200).optional();
const limit = z.coerce.number().int().min(1).max(100).default(30);

export const activityQuery = z.object({
  kind: z.enum(ACTIVITY_KINDS, { error: "Choose a kind of activity from the list." }).optional(),
  actorId: z.uuid("Choose a member.").optional(),
  trialId: z.uuid("Choose a trial.").optional(),
  cursor,
  limit,
});

export const notificationQuery = z.object({
  unread: z.enum(["1", "0"]).optional(),
  cursor,
  limit,
});

export const notificationsRead = z.object({
  /** The notifications to mark read; all of the caller's in this studio when absent. */
  ids: z.array(z.uuid()).max(200).optional(),
});

export const followTargetParams = z.object({
  targetType: z.enum(["trial", "colourway"], { error: "You can follow a trial or a colourway." }),
  targetId: z.uuid("That is not something you can follow."),
});

export type ActivityQuery = z.infer<typeof activityQuery>;
export type NotificationQuery = z.infer<typeof notificationQuery>;
export type FollowTargetParams = z.infer<typeof followTargetParams>;
