import "server-only";
import { cookies } from "next/headers";
import { decode } from "next-auth/jwt";
import { authOptions } from "./options";

// Who a request's session cookie names, read straight from next-auth's JWT. next-auth's own
// getServerSession runs its whole request handler for this (options, providers, callbacks, and
// a fresh encryption of the session it then cannot set from a route handler); every studio
// route pays for the answer, so it is read here with next-auth's decode, and a token already
// decoded is remembered until it expires. The memo only saves work: the same token always
// decodes to the same user, so it holds nothing another server instance would need.

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const MEMO_SIZE = 2000;
const memo = new Map<string, { uid: string; expiresAt: number }>();

/** next-auth's cookie name: __Secure- prefixed when the app is served over https. */
export function sessionCookieName(): string {
  return `${authOptions.useSecureCookies ? "__Secure-" : ""}next-auth.session-token`;
}

/** The session token from this request's cookies; next-auth splits a long one into NAME.0, NAME.1, … */
async function sessionToken(): Promise<string | null> {
  const jar = await cookies();
  const name = sessionCookieName();
  const whole = jar.get(name)?.value;
  if (whole) return whole;
  const chunks = jar
    .getAll()
    .filter((c) => c.name.startsWith(`${name}.`) && /^\d+$/.test(c.name.slice(name.length + 1)))
    .sort((a, b) => Number(a.name.slice(name.length + 1)) - Number(b.name.slice(name.length + 1)));
  return chunks.length ? chunks.map((c) => c.value).join("") : null;
}

/** The user id in a session token, or null when it is missing, forged, expired or names no user id. */
export async function userIdFromToken(token: string, now = Date.now()): Promise<string | null> {
  const known = memo.get(token);
  if (known) {
    if (known.expiresAt > now) return known.uid;
    memo.delete(token);
    return null;
  }
  let payload: Awaited<ReturnType<typeof decode>>;
  try {
    payload = await decode({ token, secret: authOptions.secret! });
  } catch {
    return null; // not ours, changed, or sealed with another secret
  }
  const uid = payload?.uid;
  const exp = payload?.exp;
  if (typeof uid !== "string" || !UUID.test(uid) || typeof exp !== "number" || exp * 1000 <= now) return null;
  if (memo.size >= MEMO_SIZE) memo.delete(memo.keys().next().value!);
  memo.set(token, { uid, expiresAt: exp * 1000 });
  return uid;
}

/** The user id the signed-in session of this request names, or null. */
export async function sessionUserIdFromCookies(): Promise<string | null> {
  const token = await sessionToken();
  return token ? userIdFromToken(token) : null;
}
