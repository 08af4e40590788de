import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Comment, FollowSchema, type NotificationKind, NotificationSchema } from "@/entities/comment";
import { MembershipSchema, type Studio } from "@/entities/studio";
import type { Trial } from "@/entities/trial";
import type { User } from "@/entities/user";
import { escapeHtml } from "@/lib/auth/sign-in-mail";
import type { SessionUser } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { enqueueNotificationMail } from "@/lib/outbox";
import { excerpt } from "./render";

// Who hears about a comment: the people it mentions, the trial's author and the trial's
// followers, each once (a mention outranks the rest), never the writer, only current members.
// Each gets an in-app notification and, when they allow mail, an item in their next mail batch.

export interface CommentEvent {
  studio: Studio;
  trial: Trial;
  comment: Comment;
  actor: SessionUser;
  /** Members to notify as mentioned. */
  mentioned: string[];
  /** Also notify the trial's author and followers (a new comment, not an edit). */
  thread: boolean;
}

const RANK: Record<NotificationKind, number> = {
  mention: 0,
  "comment-on-own": 1,
  "comment-on-followed": 2,
  "followed-activity": 3,
};

function summaryFor(kind: NotificationKind, actor: string, title: string): string {
  const t = title.length > 120 ? `${title.slice(0, 119)}…` : title;
  if (kind === "mention") return `${actor} mentioned you on “${t}”`;
  if (kind === "comment-on-own") return `${actor} commented on your trial “${t}”`;
  return `${actor} commented on “${t}”`;
}

export function commentUrl(studioId: string, trialId: string, commentId: string): string {
  return `${env.APP_URL.replace(/\/$/, "")}/s/${studioId}/trials/${trialId}#comment-${commentId}`;
}

function mailFor(summary: string, studio: Studio, text: string, url: string) {
  const quote = excerpt(text, 400);
  return {
    subject: summary,
    text: `${summary} in ${studio.name}:\n\n“${quote}”\n\nOpen the trial to read and reply: ${url}`,
    html:
      `<p>${escapeHtml(summary)} in ${escapeHtml(studio.name)}:</p>` +
      `<blockquote style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #2e4a62;background:#fffdf8">${escapeHtml(quote)}</blockquote>` +
      `<p><a href="${escapeHtml(url)}">Open the trial to read and reply</a></p>`,
  };
}

export async function notifyForComment(em: EntityManager, e: CommentEvent): Promise<void> {
  const wanted = new Map<string, NotificationKind>();
  const want = (userId: string, kind: NotificationKind) => {
    const had = wanted.get(userId);
    if (!had || RANK[kind] < RANK[had]) wanted.set(userId, kind);
  };
  for (const id of e.mentioned) want(id, "mention");
  if (e.thread) {
    want(e.trial.author.id, "comment-on-own");
    const follows = await em.find(FollowSchema, { studio: e.studio, targetType: "trial", targetId: e.trial.id });
    for (const f of follows) want(f.user.id, "comment-on-followed");
  }
  wanted.delete(e.actor.id);
  if (wanted.size === 0) return;

  const members = await em.find(
    MembershipSchema,
    { studio: e.studio, user: { $in: [...wanted.keys()] } },
    { populate: ["user"] },
  );
  const url = commentUrl(e.studio.id, e.trial.id, e.comment.id);
  for (const m of members) {
    const user: User = m.user.getEntity();
    const kind = wanted.get(user.id)!;
    const summary = summaryFor(kind, e.actor.name, e.trial.title);
    em.create(NotificationSchema, {
      user,
      studio: e.studio,
      kind,
      actor: e.actor.id,
      trial: e.trial,
      comment: e.comment,
      summary,
    });
    await enqueueNotificationMail(em, { user, ...mailFor(summary, e.studio, e.comment.bodyText, url) });
  }
}
