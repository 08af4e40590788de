// Fixture people and studios for integration tests, written straight through the ORM.
// Every address carries the file's tag and a random part, so files and reruns never collide.
import { createHash, randomBytes, randomUUID } from "node:crypto";
import bcrypt from "bcryptjs";
import { type Role, InvitationSchema, MembershipSchema, StudioSchema } from "@/entities/studio";
import { UserSchema } from "@/entities/user";
import { getEm } from "@/lib/db";
import type { FakeSessionUser } from "./session";

export interface Person extends FakeSessionUser {
  password?: string;
}

/** A unique address for this test file; `local` names the person. */
export function address(tag: string, local: string): string {
  return `${local}-${randomUUID().slice(0, 8)}@${tag}.test`;
}

export async function makeUser(tag: string, local: string, opts: { password?: string; name?: string } = {}): Promise<Person> {
  const em = await getEm();
  const email = address(tag, local);
  const user = em.create(UserSchema, {
    email,
    name: opts.name ?? local[0].toUpperCase() + local.slice(1),
    // Cost 4 keeps fixtures fast; the app's own hashes (seed) use 10.
    passwordHash: opts.password ? await bcrypt.hash(opts.password, 4) : null,
    emailVerified: new Date(),
  });
  await em.flush();
  return { id: user.id, email: user.email, name: user.name, password: opts.password };
}

export interface StudioFixture {
  id: string;
  name: string;
  /** Membership id of each person, by user id. */
  memberships: Record<string, string>;
}

/** A studio with the given people in the given roles. */
export async function makeStudio(name: string, people: [Person, Role][]): Promise<StudioFixture> {
  const em = await getEm();
  const studio = em.create(StudioSchema, { name });
  const ms = people.map(([p, role]) => [p, em.create(MembershipSchema, { studio, user: p.id, role })] as const);
  await em.flush();
  return { id: studio.id, name, memberships: Object.fromEntries(ms.map(([p, m]) => [p.id, m.id])) };
}

/** Adds one person to a studio; returns the membership id. */
export async function addMember(studioId: string, person: Person, role: Role): Promise<string> {
  const em = await getEm();
  const m = em.create(MembershipSchema, { studio: studioId, user: person.id, role });
  await em.flush();
  return m.id;
}

/** The role a person holds in a studio now, or null. */
export async function roleOf(studioId: string, userId: string): Promise<Role | null> {
  const em = await getEm();
  const m = await em.findOne(MembershipSchema, { studio: studioId, user: userId });
  return m?.role ?? null;
}

/** A pending invitation written directly (no mail); returns its id and the raw token. */
export async function makeInvitation(
  studioId: string,
  inviter: Person,
  email: string,
  role: Role,
  opts: { expiresAt?: Date } = {},
): Promise<{ id: string; token: string }> {
  const em = await getEm();
  const token = randomBytes(32).toString("base64url");
  const inv = em.create(InvitationSchema, {
    studio: studioId,
    email,
    role,
    // The same hashing as lib/invitations.ts: only the SHA-256 of the token is stored.
    tokenHash: createHash("sha256").update(token).digest("hex"),
    invitedBy: inviter.id,
    expiresAt: opts.expiresAt ?? new Date(Date.now() + 86_400_000),
  });
  await em.flush();
  return { id: inv.id, token };
}
