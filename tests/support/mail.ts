// Reads the mail fake's HTTP API (scripts/mail-fake.ts) from tests: list, read, clear,
// and wait for a message to arrive.
import { env } from "../../lib/env";

export type FakeMessage = {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string | null;
  date: string;
};

const base = () => env.MAIL_FAKE_URL.replace(/\/$/, "");

async function call(path: string, init?: RequestInit) {
  const res = await fetch(`${base()}${path}`, init);
  if (!res.ok) throw new Error(`mail fake ${init?.method ?? "GET"} ${path}: HTTP ${res.status}`);
  return res.json();
}

/** Every stored message, oldest first; only those to `to` when given. */
export async function listMessages(to?: string): Promise<FakeMessage[]> {
  return call(`/messages${to ? `?to=${encodeURIComponent(to)}` : ""}`);
}

export async function getMessage(id: string): Promise<FakeMessage> {
  return call(`/messages/${encodeURIComponent(id)}`);
}

/** Deletes every stored message; returns how many there were. */
export async function clearMessages(): Promise<number> {
  return (await call("/messages", { method: "DELETE" })).deleted;
}

/** Polls until a message to `to` (matching `match`, if given) arrives; returns the newest such. */
export async function waitForMessage(
  to: string,
  opts: { timeoutMs?: number; match?: (m: FakeMessage) => boolean } = {},
): Promise<FakeMessage> {
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  for (;;) {
    const found = (await listMessages(to)).filter(opts.match ?? (() => true));
    if (found.length > 0) return found[found.length - 1];
    if (Date.now() > deadline) throw new Error(`no message to ${to} within ${opts.timeoutMs ?? 10_000} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The http(s) links in a message's text, in order. */
export function linksIn(message: FakeMessage): string[] {
  return message.text.match(/https?:\/\/[^\s<>"')\]]+/g) ?? [];
}
