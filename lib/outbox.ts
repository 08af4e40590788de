import "server-only";
import { createHmac } from "node:crypto";
import { LockMode } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type MailOutbox, MailOutboxSchema } from "@/entities/comment";
import { type User, UserSchema } from "@/entities/user";
import { escapeHtml } from "@/lib/auth/sign-in-mail";
import { getEm } from "@/lib/db";
import { env } from "@/lib/env";
import { enqueue } from "@/lib/jobs/boss";
import { type OutgoingMail, sendMail } from "@/lib/mail";
import { unsubscribeUrl } from "@/lib/notifications";

// Mail that waits in the database until it is due. Notification mail for one recipient is
// batched: the first item opens a window (MAIL_BATCH_SECONDS) and everything queued for that
// person until it closes leaves as one message. A failed send stays queued and is retried with
// a growing delay. flushOutbox runs as the "outbox-flush" job (lib/jobs): queued in the same
// transaction as the row for the time its batch is due, and every minute as a safety net.
// Two flushers never send the same row (rows are locked while sent); a mail the SMTP server
// accepted just before the database went away may be sent twice, never lost.

export const MAX_ATTEMPTS = 8;
const BACKOFF_MAX_SEC = 3600;
const BATCH_LIMIT = 200;

/** Seconds to wait before retry number `attempts` (30 s, 1 min, 2 min … at most an hour; MAIL_RETRY_SECONDS sets the first). */
export function backoffSeconds(attempts: number): number {
  return Math.min(BACKOFF_MAX_SEC, env.MAIL_RETRY_SECONDS * 2 ** Math.max(0, attempts - 1));
}

/** Queues the flush job for `at`, inside em's transaction when there is one. */
function wakeAt(em: EntityManager, at: Date) {
  return enqueue(em, "outbox-flush", {}, { startAfter: at });
}

export interface NotificationMailItem {
  user: User;
  subject: string;
  text: string;
  html: string;
}

/** Queues one notification for a recipient's next batch (persisted by the caller's flush). */
export async function enqueueNotificationMail(em: EntityManager, item: NotificationMailItem, now = new Date()) {
  if (!item.user.mailEnabled) return null;
  const batchKey = `notify:${item.user.id}`;
  // Join the recipient's open batch, if any: it goes out when its window closes.
  const open = await em.findOne(
    MailOutboxSchema,
    { batchKey, sentAt: null, attempts: { $lt: MAX_ATTEMPTS } },
    { orderBy: { sendAfter: "asc" } },
  );
  const sendAfter = open?.sendAfter ?? new Date(now.getTime() + env.MAIL_BATCH_SECONDS * 1000);
  // A new batch needs its flush; one that joins an open batch leaves with it.
  if (!open) await wakeAt(em, sendAfter);
  return em.create(MailOutboxSchema, {
    user: item.user,
    to: item.user.email,
    subject: item.subject,
    text: item.text,
    html: item.html,
    batchKey,
    sendAfter,
  });
}

/** Queues a single mail that is not batched (sent by the flush at `sendAfter`, default now). */
export async function enqueueMail(em: EntityManager, mail: OutgoingMail & { user?: User | null; sendAfter?: Date }) {
  const sendAfter = mail.sendAfter ?? new Date();
  await wakeAt(em, sendAfter);
  return em.create(MailOutboxSchema, {
    user: mail.user ?? null,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html ?? null,
    sendAfter,
  });
}

/** One message from a batch of rows (oldest first), with the unsubscribe footer. */
export function composeBatch(rows: MailOutbox[], user: User | null): OutgoingMail {
  const first = rows[0];
  const subject = rows.length === 1 ? first.subject : `${first.subject} (and ${rows.length - 1} more)`;
  const intro = rows.length === 1 ? "" : `${rows.length} things happened in your studios on Undertone:\n\n`;
  const footerLines = user
    ? [
        "You get this mail because you are a member of a studio on Undertone.",
        `Stop these mails: ${unsubscribeUrl(user.id)}`,
        `Or change it in your account: ${env.APP_URL.replace(/\/$/, "")}/account`,
      ]
    : [];
  const text = `${intro}${rows.map((r) => r.text).join("\n\n———\n\n")}${footerLines.length ? `\n\n--\n${footerLines.join("\n")}` : ""}`;
  const htmlParts = rows.map((r) => r.html ?? `<p>${escapeHtml(r.text).replace(/\n/g, "<br>")}</p>`);
  const footerHtml = user
    ? `<hr style="border:0;border-top:1px solid #ddd4c6;margin:24px 0 12px"><p style="color:#6b6259;font-size:13px">You get this mail because you are a member of a studio on Undertone. <a href="${escapeHtml(unsubscribeUrl(user.id))}">Stop these mails</a> or change it in <a href="${escapeHtml(env.APP_URL.replace(/\/$/, ""))}/account">your account</a>.</p>`
    : "";
  const html = `<div style="font-family:system-ui,sans-serif;color:#24201c;max-width:560px">${
    rows.length > 1 ? `<p>${rows.length} things happened in your studios on Undertone:</p>` : ""
  }${htmlParts.join('<hr style="border:0;border-top:1px solid #ddd4c6;margin:16px 0">')}${footerHtml}</div>`;
  return { to: first.to, subject, text, html };
}

export interface FlushResult {
  /** Messages handed to the SMTP server. */
  messages: number;
  /** Outbox rows those messages carried. */
  rows: number;
  /** Messages that failed and wait for a retry. */
  failed: number;
  /** Rows dropped because their recipient turned mail off. */
  dropped: number;
  /** When the earliest failed message is due again (null when none failed). */
  nextAttemptAt: Date | null;
}

/** A failure of the connection to the SMTP server rather than of one message. */
function serverUnreachable(e: unknown): boolean {
  const code = (e as { code?: string } | null)?.code ?? "";
  return ["ECONNECTION", "ETIMEDOUT", "ESOCKET", "EDNS", "ECONNREFUSED", "ECONNRESET", "EGREETING"].includes(code) || /ECONNREFUSED|ECONNRESET|ETIMEDOUT/.test(String(e));
}

export interface FlushOptions {
  now?: Date;
  /** Treat everything queued as due (tests and the development flush route). */
  all?: boolean;
  /** How to send one message (tests point this at another transport). */
  send?: (mail: OutgoingMail) => Promise<unknown>;
}

/** Sends every due batch once. Rows are locked while they are sent, so two flushers never double-send. */
export async function flushOutbox(opts: FlushOptions = {}): Promise<FlushResult> {
  const now = opts.now ?? new Date();
  const send = opts.send ?? sendMail;
  const em = await getEm();
  return em.transactional(async (tx) => {
    const result: FlushResult = { messages: 0, rows: 0, failed: 0, dropped: 0, nextAttemptAt: null };
    const lock = { lockMode: LockMode.PESSIMISTIC_PARTIAL_WRITE } as const;
    const open = { sentAt: null, attempts: { $lt: MAX_ATTEMPTS } };
    const due = await tx.find(
      MailOutboxSchema,
      opts.all ? open : { ...open, sendAfter: { $lte: now } },
      { orderBy: { sendAfter: "asc" }, limit: BATCH_LIMIT, ...lock },
    );
    // A due row takes every queued row of its batch with it, even those that joined later.
    const keys = [...new Set(due.map((r) => r.batchKey).filter((k): k is string => Boolean(k)))];
    const joined = keys.length
      ? await tx.find(MailOutboxSchema, { ...open, batchKey: { $in: keys }, id: { $nin: due.map((r) => r.id) } }, lock)
      : [];
    const groups = new Map<string, MailOutbox[]>();
    for (const r of [...due, ...joined]) {
      const k = r.batchKey ?? `single:${r.id}`;
      groups.set(k, [...(groups.get(k) ?? []), r]);
    }
    const userIds = [...new Set([...due, ...joined].map((r) => r.user?.id).filter((id): id is string => Boolean(id)))];
    const users = new Map((await tx.find(UserSchema, { id: { $in: userIds } })).map((u) => [u.id, u]));

    // Once the server is unreachable, the rest of this round waits with the same error.
    let down: string | null = null;
    for (const rows of groups.values()) {
      rows.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
      const user = rows[0].user ? (users.get(rows[0].user.id) ?? null) : null;
      if (user && !user.mailEnabled && rows[0].batchKey) {
        rows.forEach((r) => tx.remove(r));
        result.dropped += rows.length;
        continue;
      }
      try {
        if (down) throw new Error(down);
        await send(composeBatch(rows, user));
        for (const r of rows) r.sentAt = now;
        result.messages += 1;
        result.rows += rows.length;
      } catch (e) {
        const message = e instanceof Error ? e.message : String(e);
        if (serverUnreachable(e)) down = message;
        for (const r of rows) {
          r.attempts += 1;
          r.lastError = message.slice(0, 500);
          r.sendAfter = new Date(now.getTime() + backoffSeconds(r.attempts) * 1000);
          if (r.attempts < MAX_ATTEMPTS && (!result.nextAttemptAt || r.sendAfter < result.nextAttemptAt)) result.nextAttemptAt = r.sendAfter;
        }
        result.failed += 1;
      }
    }
    await tx.flush();
    return result;
  });
}

/** The bearer key for the flush route in production: an HMAC of the server's secret. */
export function flushKey(): string {
  return createHmac("sha256", env.NEXTAUTH_SECRET).update("undertone-outbox-flush").digest("hex");
}
