import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type ActivityEvent, ActivityEventSchema, FollowSchema, NotificationSchema } from "@/entities/comment";
import { MembershipSchema, type Role, type Studio } from "@/entities/studio";
import { type User, UserSchema } from "@/entities/user";
import { badRequest } from "@/lib/errors";
import type { ActivityKind, ActivityQuery } from "@/lib/schemas/activity";
import type { LayerMethod } from "@/lib/schemas/trial";

// The studio's activity feed. Features call recordActivity inside the unit of work that makes
// the thing (before their flush), so the event and the thing are stored together or not at all.

export interface ActivityInput {
  studio: Studio | string;
  /** Who did it; null for the system. */
  actor: User | string | null;
  kind: ActivityKind;
  /** A phrase that follows the actor's name: `added layer 2 (immersion) to “Seaglass”`. */
  summary: string;
  trialId?: string | null;
  layerId?: string | null;
  commentId?: string | null;
  colourwayId?: string | null;
  subjectId?: string | null;
  /**
   * Give followers of the trial or colourway an in-app notice (no mail). On by default except for
   * new and copied trials (nobody follows them yet), comments (they notify on their own, with
   * mail), people joining, and predictions (a look ahead that changes nothing on the trial).
   */
  notifyFollowers?: boolean;
}

// Words for summaries, shared by the features so the feed reads the same everywhere.

/** A title in the feed's quotation marks: “Sea glass”. */
export const quoted = (title: string) => `“${title}”`;

const METHOD_WORDS: Record<LayerMethod, string | null> = {
  immersion: "immersion",
  kettle: "kettle",
  dip: "dip",
  "hand-paint": "hand-paint",
  speckle: "speckle",
  dry: "dry application",
  other: null,
};

/** `layer 2 (dip)` from a 0-based position; "other" methods go unnamed. */
export function layerWords(position: number, method: LayerMethod): string {
  const m = METHOD_WORDS[method];
  return `layer ${position + 1}${m ? ` (${m})` : ""}`;
}

/** `a dyer`, `an owner`. */
export const roleWords = (role: Role) => ({ owner: "an owner", dyer: "a dyer", guest: "a guest" })[role];

/** `3 colours`, `a colour`. */
export const countWords = (n: number, one: string, many: string) => (n === 1 ? `a ${one}` : `${n} ${many}`);

const QUIET_KINDS: ActivityKind[] = ["trial.created", "trial.copied", "comment.added", "member.joined", "prediction.made"];
const MAX_SUMMARY = 300;

const idOf = (v: { id: string } | string) => (typeof v === "string" ? v : v.id);
const clip = (s: string) => (s.length <= MAX_SUMMARY ? s : `${s.slice(0, MAX_SUMMARY - 1)}…`);

/** Records one event (persisted by the caller's next flush) and notifies followers of its subject. */
export async function recordActivity(em: EntityManager, input: ActivityInput): Promise<ActivityEvent> {
  const studioId = idOf(input.studio);
  const actorId = input.actor ? idOf(input.actor) : null;
  const event = em.create(ActivityEventSchema, {
    id: randomUUID(),
    studio: studioId,
    actor: actorId,
    kind: input.kind,
    summary: clip(input.summary.trim()),
    trialId: input.trialId ?? null,
    layerId: input.layerId ?? null,
    commentId: input.commentId ?? null,
    colourwayId: input.colourwayId ?? null,
    subjectId: input.subjectId ?? null,
  });
  if (input.notifyFollowers ?? !QUIET_KINDS.includes(input.kind)) {
    await notifyFollowers(em, studioId, actorId, event);
  }
  return event;
}

async function notifyFollowers(em: EntityManager, studioId: string, actorId: string | null, event: ActivityEvent) {
  const targets = [
    ...(event.trialId ? [{ targetType: "trial" as const, targetId: event.trialId }] : []),
    ...(event.colourwayId ? [{ targetType: "colourway" as const, targetId: event.colourwayId }] : []),
  ];
  if (targets.length === 0) return;
  const follows = await em.find(FollowSchema, { studio: studioId, $or: targets });
  const userIds = [...new Set(follows.map((f) => f.user.id))].filter((id) => id !== actorId);
  if (userIds.length === 0) return;
  // Only people who are still members hear about it.
  const members = await em.find(MembershipSchema, { studio: studioId, user: { $in: userIds } });
  const actor = actorId ? await em.findOne(UserSchema, { id: actorId }) : null;
  const text = clip(`${actor?.name ?? "Someone"} ${event.summary}`);
  for (const m of members) {
    em.create(NotificationSchema, {
      user: m.user.id,
      studio: studioId,
      kind: "followed-activity",
      actor: actorId,
      trial: event.trialId ?? null,
      activity: event,
      summary: text,
    });
  }
}

export interface ActivityDto {
  id: string;
  kind: string;
  actor: { id: string; name: string } | null;
  summary: string;
  trialId: string | null;
  layerId: string | null;
  commentId: string | null;
  colourwayId: string | null;
  subjectId: string | null;
  createdAt: string;
}

export interface Page<T> {
  items: T[];
  nextCursor: string | null;
}

/** A keyset cursor over (createdAt, id), newest first. */
export function encodeCursor(createdAt: Date, id: string): string {
  return Buffer.from(`${createdAt.toISOString()}|${id}`).toString("base64url");
}

export function decodeCursor(cursor: string): { createdAt: Date; id: string } {
  const [iso, id] = Buffer.from(cursor, "base64url").toString("utf8").split("|");
  const createdAt = new Date(iso);
  if (!id || Number.isNaN(createdAt.getTime()) || !/^[0-9a-f-]{36}$/i.test(id)) {
    throw badRequest("That page link is not valid any more; start from the first page.", { cursor: "Not a valid cursor." });
  }
  return { createdAt, id };
}

/** The filter that continues after a cursor in newest-first order. */
export function afterCursor(cursor: string | undefined) {
  if (!cursor) return {};
  const c = decodeCursor(cursor);
  return { $or: [{ createdAt: { $lt: c.createdAt } }, { createdAt: c.createdAt, id: { $lt: c.id } }] };
}

/** The studio's activity, newest first, filtered by kind, actor or trial. */
export async function listActivity(em: EntityManager, studio: Studio, q: ActivityQuery): Promise<Page<ActivityDto>> {
  const where = {
    studio,
    ...(q.kind ? { kind: q.kind } : {}),
    ...(q.actorId ? { actor: q.actorId } : {}),
    ...(q.trialId ? { trialId: q.trialId } : {}),
    ...afterCursor(q.cursor),
  };
  const rows = await em.find(ActivityEventSchema, where, {
    orderBy: [{ createdAt: "desc" }, { id: "desc" }],
    limit: q.limit + 1,
    populate: ["actor"],
  });
  const items = rows.slice(0, q.limit);
  const last = items[items.length - 1];
  return {
    items: items.map((e) => {
      const a = e.actor?.getEntity();
      return {
        id: e.id,
        kind: e.kind,
        actor: a ? { id: a.id, name: a.name } : null,
        summary: e.summary,
        trialId: e.trialId ?? null,
        layerId: e.layerId ?? null,
        commentId: e.commentId ?? null,
        colourwayId: e.colourwayId ?? null,
        subjectId: e.subjectId ?? null,
        createdAt: e.createdAt.toISOString(),
      };
    }),
    nextCursor: rows.length > q.limit && last ? encodeCursor(last.createdAt, last.id) : null,
  };
}
