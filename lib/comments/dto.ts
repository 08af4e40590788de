import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import type { Comment } from "@/entities/comment";
import { MembershipSchema, type Role, type Studio } from "@/entities/studio";
import { can } from "@/lib/auth/permissions";
import { renderCommentHtml } from "./render";

// What the API returns for a comment. A removed comment keeps its place in the thread but
// carries neither its text nor its document.

export interface CommentDto {
  id: string;
  trialId: string;
  layerId: string | null;
  /** The layer's number in the trial, counting from 1 (positions count from 0), for "on layer 2". */
  layerNumber: number | null;
  photoId: string | null;
  author: { id: string; name: string };
  /** Sanitised HTML, safe to insert into the page. */
  html: string;
  /** The editor's document, for editing; null once removed. */
  body: unknown;
  mentions: { id: string; name: string }[];
  createdAt: string;
  editedAt: string | null;
  deletedAt: string | null;
  version: number;
  canEdit: boolean;
  canDelete: boolean;
}

export interface Viewer {
  id: string;
  role: Role;
}

/** Current names of the studio's members, by user id (for mentions). */
export async function memberNames(em: EntityManager, studio: Studio | string): Promise<Map<string, string>> {
  const ms = await em.find(MembershipSchema, { studio }, { populate: ["user"] });
  return new Map(ms.map((m) => [m.user.id, m.user.getEntity().name]));
}

export function commentDto(c: Comment, viewer: Viewer, names: Map<string, string>, authorName: string): CommentDto {
  const removed = Boolean(c.deletedAt);
  const own = c.author.id === viewer.id;
  return {
    id: c.id,
    trialId: c.trial.id,
    layerId: c.layer?.id ?? null,
    layerNumber: c.layer?.isInitialized() ? c.layer.getEntity().position + 1 : null,
    photoId: c.photo?.id ?? null,
    author: { id: c.author.id, name: authorName },
    html: removed ? "" : renderCommentHtml(c.body, names),
    body: removed ? null : c.body,
    mentions: removed ? [] : c.mentions.map((id) => ({ id, name: names.get(id) ?? "former member" })),
    createdAt: c.createdAt.toISOString(),
    editedAt: c.editedAt?.toISOString() ?? null,
    deletedAt: c.deletedAt?.toISOString() ?? null,
    version: c.version,
    canEdit: !removed && own,
    canDelete: !removed && (own || can(viewer.role, "comment.moderate")),
  };
}
