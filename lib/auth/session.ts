import "server-only";
import { getServerSession } from "next-auth";
import { authOptions } from "./options";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/** The signed-in user of this request, or null. */
export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const u = session?.user;
  if (!u?.id || !u.email) return null;
  return { id: u.id, email: u.email, name: u.name ?? u.email };
}
