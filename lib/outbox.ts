import "server-only";
import { createHmac } from "node:crypto";
import { LockMode } from "@mikro-orm/core";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type MailOutbox, MailOutboxSchema } from "@/entities/comment";
import { type User, UserSchema } from "@/entities/user";
import { escapeHtml } from "@/lib/auth/sign-in-mail";
import { getEm } from "@/lib/db";
import { env } from "@/lib/env";
import { type OutgoingMail, sendMail } from "@/lib/mail";
import { unsubscribeUrl } from "@/lib/notifications";

// Mail that waits in the database until it is due. Notification mail for one recipient is
// batched: the first item opens a window (MAIL_BATCH_SECONDS) and everything queued for that
// person until it closes leaves as one message. A failed send stays queued and is retried with
// a growing delay. flushOutbox runs on a timer in each server process (instrumentation.ts).

export const MAX_ATTEMPTS = 8;
const BACKOFF_BASE_SEC = 30;
const BACKOFF_MAX_SEC = 3600;
const BATCH_LIMIT = 200;

/** Seconds to wait before retry number `attempts` (30 s, 1 min, 2 min … at most an hour). */
export function backoffSeconds(attempts: number): number {
  return Math.min(BACKOFF_MAX_SEC, BACKOFF_BASE_SEC * 2 ** Math.max(0, attempts - 1));
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

/** Queues a single mail that is not batched (sent on the next flush after `sendAfter`). */
export function enqueueMail(em: EntityManager, mail: OutgoingMail & { user?: User | null; sendAfter?: Date }) {
  return em.create(MailOutboxSchema, {
    user: mail.user ?? null,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html ?? null,
    sendAfter: mail.sendAfter ?? new Date(),
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
    const result: FlushResult = { messages: 0, rows: 0, failed: 0, dropped: 0 };
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

    for (const rows of groups.values()) {
      rows.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime());
      const user = rows[0].user ? (users.get(rows[0].user.id) ?? null) : null;
      if (user && !user.mailEnabled && rows[0].batchKey) {
        rows.forEach((r) => tx.remove(r));
        result.dropped += rows.length;
        continue;
      }
      try {
        await send(composeBatch(rows, user));
        for (const r of rows) r.sentAt = now;
        result.messages += 1;
        result.rows += rows.length;
      } catch (e) {
        const message = e instanceof Error ? e.message : String(e);
        for (const r of rows) {
          r.attempts += 1;
          r.lastError = message.slice(0, 500);
          r.sendAfter = new Date(now.getTime() + backoffSeconds(r.attempts) * 1000);
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

const timer = globalThis as unknown as { __undertoneOutboxTimer?: ReturnType<typeof setInterval> };

/** Seconds between flushes: a quarter of the batch window, between 1 and 30. */
export function flushIntervalSeconds(batchSeconds = env.MAIL_BATCH_SECONDS): number {
  return Math.min(30, Math.max(1, Math.floor(batchSeconds / 4)));
}

/** Starts the periodic flush once per process (Node runtime only). */
export function startOutboxTimer(): void {
  if (timer.__undertoneOutboxTimer) return;
  let busy = false;
  timer.__undertoneOutboxTimer = setInterval(async () => {
    if (busy) return;
    busy = true;
    try {
      const r = await flushOutbox();
      if (r.messages || r.failed) console.log(`outbox: sent ${r.messages} mail(s), ${r.failed} failed`);
    } catch (e) {
      console.error("outbox: flush failed", e);
    } finally {
      busy = false;
    }
  }, flushIntervalSeconds() * 1000);
  timer.__undertoneOutboxTimer.unref?.();
}
