import { EntitySchema, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { Studio } from "./studio";
import type { Photo } from "./photo";
import type { Layer, Trial } from "./trial";
import type { User } from "./user";

// Talking about the work: comments, the notifications they cause, following, the studio's
// activity feed and the mail outbox that batches and retries notification mail.

/** The editor's JSON document (validated against an allowlist before it is stored). */
export type CommentDoc = { type: "doc"; content?: unknown[] };

export interface Comment extends Base {
  studio: Ref<Studio>;
  trial: Ref<Trial>;
  /** Set when the comment is about one layer of the trial. */
  layer?: Ref<Layer> | null;
  /** Set when the comment is about one photo of the trial. */
  photo?: Ref<Photo> | null;
  author: Ref<User>;
  body: CommentDoc;
  /** Plain text of `body`, for mail excerpts and search. */
  bodyText: string & Opt;
  /** User ids mentioned in `body`, each a member of the studio when written. */
  mentions: string[] & Opt;
  editedAt?: Date | null;
  deletedAt?: Date | null;
  updatedAt: Date & Opt;
  version: number & Opt;
}

export const CommentSchema = new EntitySchema<Comment>({
  name: "Comment",
  tableName: "comments",
  indexes: [{ properties: ["trial", "createdAt"] }, { properties: ["studio", "createdAt"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    trial: { kind: "m:1", entity: "Trial", ref: true, deleteRule: "cascade" },
    // A removed layer or photo leaves its comments on the trial.
    layer: { kind: "m:1", entity: "Layer", ref: true, nullable: true, deleteRule: "set null" },
    photo: { kind: "m:1", entity: "Photo", ref: true, nullable: true, deleteRule: "set null" },
    author: { kind: "m:1", entity: "User", ref: true, deleteRule: "cascade" },
    body: { type: "json" },
    bodyText: { type: "text", default: "" },
    mentions: { type: "json", default: "[]" },
    editedAt: { type: "datetime", nullable: true },
    deletedAt: { type: "datetime", nullable: true },
    updatedAt: { type: "datetime", onCreate: () => new Date(), onUpdate: () => new Date() },
    version: { type: "integer", version: true },
  },
});

export const NOTIFICATION_KINDS = ["mention", "comment-on-own", "comment-on-followed", "followed-activity"] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export interface Notification extends Base {
  user: Ref<User>;
  studio: Ref<Studio>;
  kind: NotificationKind;
  actor?: Ref<User> | null;
  trial?: Ref<Trial> | null;
  comment?: Ref<Comment> | null;
  /** The activity event behind a `followed-activity` notification. */
  activity?: Ref<ActivityEvent> | null;
  /** One line, written when the notification is made ("Ivo Brandt mentioned you on …"). */
  summary: string;
  readAt?: Date | null;
}

export const NotificationSchema = new EntitySchema<Notification>({
  name: "Notification",
  tableName: "notifications",
  indexes: [{ properties: ["user", "studio", "createdAt"] }],
  properties: {
    ...baseProperties,
    user: { kind: "m:1", entity: "User", ref: true, deleteRule: "cascade" },
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    kind: { type: "string", length: 24 },
    actor: { kind: "m:1", entity: "User", ref: true, nullable: true, deleteRule: "set null" },
    trial: { kind: "m:1", entity: "Trial", ref: true, nullable: true, deleteRule: "cascade" },
    comment: { kind: "m:1", entity: "Comment", ref: true, nullable: true, deleteRule: "cascade" },
    activity: { kind: "m:1", entity: "ActivityEvent", ref: true, nullable: true, deleteRule: "cascade" },
    summary: { type: "string", length: 300 },
    readAt: { type: "datetime", nullable: true },
  },
});

export const FOLLOW_TARGETS = ["trial", "colourway"] as const;
export type FollowTarget = (typeof FOLLOW_TARGETS)[number];

/** A member following a trial (or, once they exist, a colourway). No foreign key: the target varies. */
export interface Follow extends Base {
  user: Ref<User>;
  studio: Ref<Studio>;
  targetType: FollowTarget;
  targetId: string;
}

export const FollowSchema = new EntitySchema<Follow>({
  name: "Follow",
  tableName: "follows",
  uniques: [{ properties: ["user", "targetType", "targetId"] }],
  indexes: [{ properties: ["targetType", "targetId"] }],
  properties: {
    ...baseProperties,
    user: { kind: "m:1", entity: "User", ref: true, deleteRule: "cascade" },
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    targetType: { type: "string", length: 16 },
    targetId: { type: "uuid" },
  },
});

/**
 * One line in the studio's activity feed. Subject ids are plain uuids (no foreign keys), so the
 * feed keeps its history when a trial or comment is deleted; `summary` is written at the time.
 */
export interface ActivityEvent extends Base {
  studio: Ref<Studio>;
  actor?: Ref<User> | null;
  kind: string;
  trialId?: string | null;
  layerId?: string | null;
  commentId?: string | null;
  colourwayId?: string | null;
  /** The record the event made when it is none of the above (a reading, a lot…). */
  subjectId?: string | null;
  summary: string;
}

export const ActivityEventSchema = new EntitySchema<ActivityEvent>({
  name: "ActivityEvent",
  tableName: "activity_events",
  indexes: [{ properties: ["studio", "createdAt"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    actor: { kind: "m:1", entity: "User", ref: true, nullable: true, deleteRule: "set null" },
    kind: { type: "string", length: 32 },
    trialId: { type: "uuid", nullable: true },
    layerId: { type: "uuid", nullable: true },
    commentId: { type: "uuid", nullable: true },
    colourwayId: { type: "uuid", nullable: true },
    subjectId: { type: "uuid", nullable: true },
    summary: { type: "string", length: 300 },
  },
});

/**
 * Mail waiting to go out. Rows sharing a `batchKey` (one recipient's notifications) that are
 * due together leave as one message; a failed send is retried later with backoff.
 */
export interface MailOutbox extends Base {
  /** The recipient, when the mail is about a user (for the unsubscribe link and the mail setting). */
  user?: Ref<User> | null;
  to: string;
  subject: string;
  text: string;
  html?: string | null;
  batchKey?: string | null;
  sendAfter: Date;
  sentAt?: Date | null;
  attempts: number & Opt;
  lastError?: string | null;
}

export const MailOutboxSchema = new EntitySchema<MailOutbox>({
  name: "MailOutbox",
  tableName: "mail_outbox",
  indexes: [{ properties: ["sentAt", "sendAfter"] }, { properties: ["batchKey"] }],
  properties: {
    ...baseProperties,
    user: { kind: "m:1", entity: "User", ref: true, nullable: true, deleteRule: "cascade" },
    to: { type: "string", length: 254 },
    subject: { type: "string", length: 300 },
    text: { type: "text" },
    html: { type: "text", nullable: true },
    batchKey: { type: "string", length: 80, nullable: true },
    sendAfter: { type: "datetime" },
    sentAt: { type: "datetime", nullable: true },
    attempts: { type: "integer", default: 0 },
    lastError: { type: "string", length: 500, nullable: true },
  },
});
