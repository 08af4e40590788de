import "server-only";
import { createHmac, timingSafeEqual } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Notification, NotificationSchema } from "@/entities/comment";
import type { Studio } from "@/entities/studio";
import { UserSchema } from "@/entities/user";
import { afterCursor, encodeCursor, type Page } from "@/lib/activity";
import { env } from "@/lib/env";
import type { NotificationQuery } from "@/lib/schemas/activity";

// In-app notifications (per person and studio) and the signed unsubscribe link in every mail.

export interface NotificationDto {
  id: string;
  kind: string;
  summary: string;
  actor: { id: string; name: string } | null;
  trialId: string | null;
  commentId: string | null;
  /** The colourway a followed-activity notice is about (a lot, a colourway marked repeatable). */
  colourwayId: string | null;
  createdAt: string;
  readAt: string | null;
}

function notificationDto(n: Notification): NotificationDto {
  const a = n.actor?.getEntity();
  return {
    id: n.id,
    kind: n.kind,
    summary: n.summary,
    actor: a ? { id: a.id, name: a.name } : null,
    trialId: n.trial?.id ?? null,
    commentId: n.comment?.id ?? null,
    colourwayId: n.activity?.isInitialized() ? (n.activity.getEntity().colourwayId ?? null) : null,
    createdAt: n.createdAt.toISOString(),
    readAt: n.readAt?.toISOString() ?? null,
  };
}

export async function unreadCount(em: EntityManager, studio: Studio, userId: string): Promise<number> {
  return em.count(NotificationSchema, { studio, user: userId, readAt: null });
}

/** The caller's notifications in this studio, newest first, with the unread count. */
export async function listNotifications(
  em: EntityManager,
  studio: Studio,
  userId: string,
  q: NotificationQuery,
): Promise<Page<NotificationDto> & { unread: number }> {
  const rows = await em.find(
    NotificationSchema,
    { studio, user: userId, ...(q.unread === "1" ? { readAt: null } : {}), ...afterCursor(q.cursor) },
    { orderBy: [{ createdAt: "desc" }, { id: "desc" }], limit: q.limit + 1, populate: ["actor", "activity"] },
  );
  const items = rows.slice(0, q.limit);
  const last = items[items.length - 1];
  return {
    items: items.map(notificationDto),
    nextCursor: rows.length > q.limit && last ? encodeCursor(last.createdAt, last.id) : null,
    unread: await unreadCount(em, studio, userId),
  };
}

/** Marks the given notifications (or all of the caller's in this studio) read; returns the unread count. */
export async function markRead(em: EntityManager, studio: Studio, userId: string, ids?: string[]): Promise<number> {
  await em.nativeUpdate(
    NotificationSchema,
    { studio, user: userId, readAt: null, ...(ids ? { id: { $in: ids } } : {}) },
    { readAt: new Date() },
  );
  return unreadCount(em, studio, userId);
}

const sign = (userId: string) =>
  createHmac("sha256", env.NEXTAUTH_SECRET).update(`unsubscribe:${userId}`).digest("base64url");

/** A token that lets its holder turn off mail for one user, without signing in. */
export function unsubscribeToken(userId: string): string {
  return `${userId}.${sign(userId)}`;
}

export function unsubscribeUrl(userId: string): string {
  return `${env.APP_URL.replace(/\/$/, "")}/api/unsubscribe?token=${encodeURIComponent(unsubscribeToken(userId))}`;
}

/** The user id a token was made for, or null when the signature does not match. */
export function verifyUnsubscribeToken(token: string): string | null {
  const [userId, sig] = token.split(".");
  if (!userId || !sig || !/^[0-9a-f-]{36}$/i.test(userId)) return null;
  const want = Buffer.from(sign(userId));
  const got = Buffer.from(sig);
  return want.length === got.length && timingSafeEqual(want, got) ? userId : null;
}

/** Turns notification mail off for the token's user; false when the token is not valid. */
export async function unsubscribe(em: EntityManager, token: string): Promise<{ ok: boolean; email?: string }> {
  const userId = verifyUnsubscribeToken(token);
  if (!userId) return { ok: false };
  const user = await em.findOne(UserSchema, { id: userId });
  if (!user) return { ok: false };
  user.mailEnabled = false;
  await em.flush();
  return { ok: true, email: user.email };
}
