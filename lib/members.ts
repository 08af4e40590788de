import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Membership, type Role, type Studio, MembershipSchema, StudioSchema } from "@/entities/studio";
import { conflict, notFound } from "@/lib/errors";

export interface MemberDto {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

function memberDto(m: Membership): MemberDto {
  const u = m.user.getEntity();
  return { id: m.id, userId: u.id, name: u.name, email: u.email, role: m.role, joinedAt: m.createdAt.toISOString() };
}

const ROLE_ORDER: Record<Role, number> = { owner: 0, dyer: 1, guest: 2 };

export async function listMembers(em: EntityManager, studio: Studio): Promise<MemberDto[]> {
  const ms = await em.find(MembershipSchema, { studio }, { populate: ["user"] });
  return ms.map(memberDto).sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.name.localeCompare(b.name));
}

async function findMember(em: EntityManager, studio: Studio, memberId: string): Promise<Membership> {
  const m = await em.findOne(MembershipSchema, { id: memberId, studio }, { populate: ["user"] });
  if (!m) throw notFound("This member");
  return m;
}

/**
 * Locks the studio's owner rows so two owners cannot demote each other at the same moment.
 * Runs through `em.execute`, which joins the caller's transaction (a bare connection would
 * take the lock outside it and release it at once).
 */
async function ownerCount(em: EntityManager, studio: Studio): Promise<number> {
  const rows = await em.execute<{ id: string }[]>(
    `select id from memberships where studio_id = ? and role = 'owner' for update`,
    [studio.id],
  );
  return rows.length;
}

export async function changeRole(em: EntityManager, studio: Studio, memberId: string, role: Role): Promise<MemberDto> {
  return em.transactional(async (tx) => {
    const m = await findMember(tx, studio, memberId);
    if (m.role === "owner" && role !== "owner" && (await ownerCount(tx, studio)) <= 1) {
      throw conflict("A studio needs at least one owner. Make someone else an owner first.");
    }
    m.role = role;
    await tx.flush();
    return memberDto(m);
  });
}

export async function removeMember(em: EntityManager, studio: Studio, memberId: string): Promise<void> {
  await em.transactional(async (tx) => {
    const m = await findMember(tx, studio, memberId);
    if (m.role === "owner" && (await ownerCount(tx, studio)) <= 1) {
      throw conflict("A studio needs at least one owner. Make someone else an owner before removing this one.");
    }
    tx.remove(m);
    await tx.flush();
  });
}
