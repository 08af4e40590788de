// The invented demo studio: Tidewrack Yarn Studio, three people, one per role.
import type { EntityManager } from "@mikro-orm/postgresql";
import bcrypt from "bcryptjs";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { type Membership, type Role, type Studio, MembershipSchema, StudioSchema } from "../../entities/studio";
import { type User, UserSchema } from "../../entities/user";

export const DEMO_STUDIO_NAME = "Tidewrack Yarn Studio";

export interface DemoAccount {
  email: string;
  name: string;
  password: string;
  role: Role;
}

export const demoAccounts: DemoAccount[] = JSON.parse(
  readFileSync(join(import.meta.dirname, "..", "demo-accounts.json"), "utf8"),
);

export interface DemoStudio {
  studio: Studio;
  users: Record<Role, User>;
}

/** Creates the demo studio and its members, or finds them when they exist already. */
export async function seedStudio(em: EntityManager): Promise<DemoStudio> {
  let studio = await em.findOne(StudioSchema, { name: DEMO_STUDIO_NAME });
  studio ??= em.create(StudioSchema, { name: DEMO_STUDIO_NAME });
  const users = {} as Record<Role, User>;
  for (const a of demoAccounts) {
    let user = await em.findOne(UserSchema, { email: a.email });
    if (!user) {
      user = em.create(UserSchema, {
        email: a.email,
        name: a.name,
        passwordHash: await bcrypt.hash(a.password, 10),
        emailVerified: new Date(),
      });
    }
    users[a.role] = user;
    const m = studio.id ? await em.findOne(MembershipSchema, { studio, user }) : null;
    if (!m) em.create(MembershipSchema, { studio, user, role: a.role });
  }
  await em.flush();
  return { studio, users };
}
