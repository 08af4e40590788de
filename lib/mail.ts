import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env";

// Outgoing mail over SMTP (locally the fake from scripts/mail-fake.ts on 127.0.0.1:2525).
const cache = globalThis as unknown as { __undertoneMail?: Transporter };

/** nodemailer options from an smtp:// (plain, no STARTTLS) or smtps:// URL. */
export function smtpOptions(url: string) {
  const u = new URL(url);
  const secure = u.protocol === "smtps:";
  return {
    host: u.hostname,
    port: Number(u.port || (secure ? 465 : 25)),
    secure,
    ignoreTLS: !secure,
    ...(u.username ? { auth: { user: decodeURIComponent(u.username), pass: decodeURIComponent(u.password) } } : {}),
  };
}

/** The one SMTP transport for this process. */
export function mailTransport(): Transporter {
  // A mail server that is down or stalls fails the send in seconds; the outbox retries it later.
  cache.__undertoneMail ??= nodemailer.createTransport({
    ...smtpOptions(env.SMTP_URL),
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return cache.__undertoneMail;
}

export type OutgoingMail = { to: string; subject: string; text: string; html?: string };

/** Sends one message from MAIL_FROM; returns the SMTP message id. */
export async function sendMail(mail: OutgoingMail): Promise<string> {
  const info = await mailTransport().sendMail({ from: env.MAIL_FROM, ...mail });
  return info.messageId;
}

/** Throws unless the SMTP server accepts a connection. */
export async function checkMail(): Promise<void> {
  await mailTransport().verify();
}
