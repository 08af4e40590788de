import "server-only";
import { UserSchema } from "@/entities/user";
import { getEm } from "@/lib/db";
import { sessionUserIdFromCookies } from "./session-token";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The signed-in user of this request, or null. The JWT only names the user: the row is read
 * each time, so a deleted account counts as signed out and a renamed one shows its new name.
 */
export async function getSessionUser(): Promise<SessionUser | null> {
  const id = await getSessionUserId();
  if (!id) return null;
  const em = await getEm();
  const u = await em.findOne(UserSchema, { id });
  return u ? { id: u.id, email: u.email, name: u.name } : null;
}

/**
 * The user id the session's JWT names, or null; nothing is read from the database. Callers must
 * still load the user (withStudio reads it together with the membership, in one query).
 */
export async function getSessionUserId(): Promise<string | null> {
  const id = await sessionUserIdFromCookies();
  return id && UUID.test(id) ? id : null;
}
