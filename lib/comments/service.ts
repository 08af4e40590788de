import "server-only";
import { randomUUID } from "node:crypto";
import type { EntityManager } from "@mikro-orm/postgresql";
import {
  ActivityEventSchema,
  type Comment,
  type CommentDoc,
  CommentSchema,
  MailOutboxSchema,
  NotificationSchema,
} from "@/entities/comment";
import { PhotoSchema } from "@/entities/photo";
import type { Studio } from "@/entities/studio";
import { LayerSchema, type Trial, TrialSchema } from "@/entities/trial";
import { recordActivity } from "@/lib/activity";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/session";
import { isUuid } from "@/lib/auth/with-studio";
import { badRequest, conflict, forbidden, notFound } from "@/lib/errors";
import { type CommentInput, type CommentUpdate, commentDoc, docText, mentionIds } from "@/lib/schemas/comment";
import { type CommentDto, commentDto, memberNames, type Viewer } from "./dto";
import { autoFollow } from "./follows";
import { notifyForComment } from "./notify";
import { excerpt } from "./render";

// Comments on a trial, one of its layers or one of its photos: list, write, edit, remove.

const MAX_THREAD = 500;

export async function findTrialIn(em: EntityManager, studio: Studio, trialId: string): Promise<Trial> {
  if (!isUuid(trialId)) throw notFound("This trial");
  const trial = await em.findOne(TrialSchema, { id: trialId, studio });
  if (!trial) throw notFound("This trial");
  return trial;
}

async function findComment(em: EntityManager, trial: Trial, commentId: string): Promise<Comment> {
  if (!isUuid(commentId)) throw notFound("This comment");
  const c = await em.findOne(CommentSchema, { id: commentId, trial }, { populate: ["author"] });
  if (!c) throw notFound("This comment");
  return c;
}

/** Checks the document and its mentions: each mentioned person must be a member of the studio. */
function checkBody(raw: unknown, names: Map<string, string>): { doc: CommentDoc; mentions: string[] } {
  const parsed = commentDoc.safeParse(raw);
  if (!parsed.success) {
    const message = parsed.error.issues[0]?.message ?? "Check the comment.";
    throw badRequest(message, { body: message });
  }
  const doc = parsed.data as CommentDoc;
  const mentions = mentionIds(doc);
  const strangers = mentions.filter((id) => !names.has(id));
  if (strangers.length > 0) {
    const message = "Only members of this studio can be mentioned. Remove the mention of someone outside it.";
    throw badRequest(message, { body: message });
  }
  // Mentions show the member's own name, whatever label the client sent.
  const fix = (n: unknown): void => {
    if (!n || typeof n !== "object") return;
    const node = n as { type?: string; attrs?: { id?: string; label?: string | null }; content?: unknown[] };
    if (node.type === "mention" && node.attrs?.id) node.attrs.label = names.get(node.attrs.id) ?? null;
    node.content?.forEach(fix);
  };
  fix(doc);
  return { doc, mentions };
}

/** The trial's comments, oldest first; only those on one layer or photo when asked. */
export async function listComments(
  em: EntityManager,
  studio: Studio,
  viewer: Viewer,
  trialId: string,
  opts: { layerId?: string; photoId?: string } = {},
): Promise<CommentDto[]> {
  const trial = await findTrialIn(em, studio, trialId);
  const where = {
    trial,
    ...(opts.layerId ? { layer: opts.layerId } : {}),
    ...(opts.photoId ? { photo: opts.photoId } : {}),
  };
  const [rows, names] = await Promise.all([
    em.find(CommentSchema, where, { orderBy: { createdAt: "asc" }, limit: MAX_THREAD, populate: ["author", "layer"] }),
    memberNames(em, studio),
  ]);
  return rows.map((c) => commentDto(c, viewer, names, c.author.getEntity().name));
}

export async function createComment(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  viewer: Viewer,
  trialId: string,
  input: CommentInput,
): Promise<CommentDto> {
  return em.transactional(async (tx) => {
    const trial = await findTrialIn(tx, studio, trialId);
    if (input.layerId && !(await tx.findOne(LayerSchema, { id: input.layerId, trial }))) {
      throw badRequest("That layer is not part of this trial.", { layerId: "Choose a layer of this trial." });
    }
    if (input.photoId && !(await tx.findOne(PhotoSchema, { id: input.photoId, trial }))) {
      throw badRequest("That photo is not part of this trial.", { photoId: "Choose a photo of this trial." });
    }
    const names = await memberNames(tx, studio);
    const { doc, mentions } = checkBody(input.body, names);
    const comment = tx.create(CommentSchema, {
      // The id is needed before the flush (activity, notification links); onCreate runs only at flush.
      id: randomUUID(),
      studio,
      trial,
      layer: input.layerId ?? null,
      photo: input.photoId ?? null,
      author: user.id,
      body: doc,
      bodyText: docText(doc),
      mentions,
    });
    await recordActivity(tx, {
      studio,
      actor: user.id,
      kind: "comment.added",
      summary: `commented on “${trial.title}”: ${excerpt(comment.bodyText, 100)}`,
      trialId: trial.id,
      layerId: input.layerId ?? null,
      commentId: comment.id,
    });
    await notifyForComment(tx, { studio, trial, comment, actor: user, mentioned: mentions, thread: true });
    await autoFollow(tx, studio, user.id, trial.id);
    await tx.flush();
    return commentDto(comment, viewer, names, user.name);
  });
}

/** Edits the author's own comment; people newly mentioned are notified. */
export async function updateComment(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  viewer: Viewer,
  trialId: string,
  commentId: string,
  input: CommentUpdate,
): Promise<CommentDto> {
  return em.transactional(async (tx) => {
    const trial = await findTrialIn(tx, studio, trialId);
    const comment = await findComment(tx, trial, commentId);
    if (comment.deletedAt) throw notFound("This comment");
    if (comment.author.id !== user.id) throw forbidden("Only the person who wrote a comment can edit it.");
    if (comment.version !== input.version) {
      throw conflict("This comment changed since you opened it. Reload to see the new text, then edit again.");
    }
    const names = await memberNames(tx, studio);
    const { doc, mentions } = checkBody(input.body, names);
    const added = mentions.filter((id) => !comment.mentions.includes(id));
    comment.body = doc;
    comment.bodyText = docText(doc);
    comment.mentions = mentions;
    comment.editedAt = new Date();
    await notifyForComment(tx, { studio, trial, comment, actor: user, mentioned: added, thread: false });
    await tx.flush();
    return commentDto(comment, viewer, names, comment.author.getEntity().name);
  });
}

/** Removes a comment (its author, or an owner): it stays in the thread as "removed". */
export async function deleteComment(
  em: EntityManager,
  studio: Studio,
  user: SessionUser,
  viewer: Viewer,
  trialId: string,
  commentId: string,
  version?: number,
): Promise<void> {
  await em.transactional(async (tx) => {
    const trial = await findTrialIn(tx, studio, trialId);
    const comment = await findComment(tx, trial, commentId);
    if (comment.deletedAt) return;
    if (comment.author.id !== user.id && !can(viewer.role, "comment.moderate")) {
      throw forbidden("You can remove your own comments; an owner can remove any.");
    }
    if (version !== undefined && comment.version !== version) {
      throw conflict("This comment changed since you opened it. Reload, then remove it again.");
    }
    comment.deletedAt = new Date();
    // Its unread notices and not-yet-sent mail go too: nobody should be sent what was taken back.
    await tx.nativeDelete(NotificationSchema, { comment, readAt: null });
    await tx.nativeDelete(MailOutboxSchema, { sentAt: null, text: { $like: `%#comment-${comment.id}%` } });
    await tx.nativeUpdate(ActivityEventSchema, { commentId: comment.id }, { summary: `commented on “${trial.title}” (removed)` });
    await tx.flush();
  });
}
