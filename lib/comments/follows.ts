import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { ColourwaySchema } from "@/entities/colourway";
import { type FollowTarget, FollowSchema } from "@/entities/comment";
import type { Studio } from "@/entities/studio";
import { TrialSchema } from "@/entities/trial";
import { notFound } from "@/lib/errors";

// Following a trial (or a colourway): followers hear about new comments, layers and readings.
// Writing a comment follows the trial, so the writer hears the replies.

export interface FollowStatusDto {
  targetType: FollowTarget;
  targetId: string;
  following: boolean;
  followers: number;
}

export interface FollowDto {
  targetType: FollowTarget;
  targetId: string;
  title: string;
  since: string;
}

/** The title of a followable thing in this studio, or null when there is none. */
async function targetTitle(em: EntityManager, studio: Studio, type: FollowTarget, id: string): Promise<string | null> {
  if (type === "trial") {
    return (await em.findOne(TrialSchema, { id, studio }))?.title ?? null;
  }
  return (await em.findOne(ColourwaySchema, { id, studio }))?.name ?? null;
}

async function status(em: EntityManager, studio: Studio, userId: string, type: FollowTarget, id: string): Promise<FollowStatusDto> {
  const [mine, followers] = await Promise.all([
    em.count(FollowSchema, { studio, user: userId, targetType: type, targetId: id }),
    em.count(FollowSchema, { studio, targetType: type, targetId: id }),
  ]);
  return { targetType: type, targetId: id, following: mine > 0, followers };
}

async function checkTarget(em: EntityManager, studio: Studio, type: FollowTarget, id: string): Promise<void> {
  if ((await targetTitle(em, studio, type, id)) === null) throw notFound(type === "trial" ? "This trial" : "This colourway");
}

export async function followStatus(em: EntityManager, studio: Studio, userId: string, type: FollowTarget, id: string) {
  await checkTarget(em, studio, type, id);
  return status(em, studio, userId, type, id);
}

export async function follow(em: EntityManager, studio: Studio, userId: string, type: FollowTarget, id: string) {
  await checkTarget(em, studio, type, id);
  await insertFollow(em, studio, userId, type, id);
  return status(em, studio, userId, type, id);
}

export async function unfollow(em: EntityManager, studio: Studio, userId: string, type: FollowTarget, id: string) {
  await checkTarget(em, studio, type, id);
  await em.nativeDelete(FollowSchema, { studio, user: userId, targetType: type, targetId: id });
  return status(em, studio, userId, type, id);
}

/** Idempotent, and safe when two taps race: the unique key absorbs the second insert. */
async function insertFollow(em: EntityManager, studio: Studio, userId: string, type: FollowTarget, id: string) {
  await em
    .createQueryBuilder(FollowSchema)
    .insert({ id: randomUUID(), createdAt: new Date(), user: userId, studio: studio.id, targetType: type, targetId: id })
    .onConflict(["user", "targetType", "targetId"])
    .ignore()
    .execute();
}

/** Follows a trial for the person who just commented on it (inside the caller's transaction). */
export async function autoFollow(em: EntityManager, studio: Studio, userId: string, trialId: string): Promise<void> {
  await insertFollow(em, studio, userId, "trial", trialId);
}

/** What the caller follows in this studio, newest first. */
export async function listFollows(em: EntityManager, studio: Studio, userId: string): Promise<FollowDto[]> {
  const rows = await em.find(FollowSchema, { studio, user: userId }, { orderBy: { createdAt: "desc" }, limit: 200 });
  const trialIds = rows.filter((f) => f.targetType === "trial").map((f) => f.targetId);
  const trials = new Map((await em.find(TrialSchema, { id: { $in: trialIds }, studio })).map((t) => [t.id, t.title]));
  const out: FollowDto[] = [];
  for (const f of rows) {
    const title = f.targetType === "trial" ? (trials.get(f.targetId) ?? null) : await targetTitle(em, studio, f.targetType, f.targetId);
    if (title !== null) out.push({ targetType: f.targetType, targetId: f.targetId, title, since: f.createdAt.toISOString() });
  }
  return out;
}
