import "server-only";
import { notFound, redirect } from "next/navigation";
import { MembershipSchema, type Role, type Studio } from "@/entities/studio";
import { getSessionUser, type SessionUser } from "@/lib/auth/session";
import { isUuid } from "@/lib/auth/with-studio";
import { getEm } from "@/lib/db";

export interface PageMembership {
  user: SessionUser;
  studio: Pick<Studio, "id" | "name">;
  role: Role;
}

/** For server pages: the signed-in user's membership of a studio, else sign-in or 404. */
export async function requireMembership(studioId: string, next?: string): Promise<PageMembership> {
  const user = await getSessionUser();
  if (!user) redirect(`/signin${next ? `?next=${encodeURIComponent(next)}` : ""}`);
  if (!isUuid(studioId)) notFound();
  const em = await getEm();
  const m = await em.findOne(MembershipSchema, { studio: studioId, user: user.id }, { populate: ["studio"] });
  if (!m) notFound();
  const s = m.studio.getEntity();
  return { user, studio: { id: s.id, name: s.name }, role: m.role };
}

export async function requireUser(next?: string): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect(`/signin${next ? `?next=${encodeURIComponent(next)}` : ""}`);
  return user;
}
