import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Membership, type Role, type Studio, MembershipSchema, StudioSchema } from "@/entities/studio";
import type { StudioInput } from "@/lib/schemas/studio";

export interface StudioDto {
  id: string;
  name: string;
  role: Role;
  lotTolerance: number;
  lotsForRepeatable: number;
  stockShelfLifeDays: number;
}

export function studioDto(studio: Studio, role: Role): StudioDto {
  return {
    id: studio.id,
    name: studio.name,
    role,
    lotTolerance: studio.lotTolerance,
    lotsForRepeatable: studio.lotsForRepeatable,
    stockShelfLifeDays: studio.stockShelfLifeDays,
  };
}

/** Every studio the user belongs to, with their role in each, by name. */
export async function listMyStudios(em: EntityManager, userId: string): Promise<StudioDto[]> {
  const memberships = await em.find(MembershipSchema, { user: userId }, { populate: ["studio"] });
  return memberships
    .map((m) => studioDto(m.studio.getEntity(), m.role))
    .sort((a, b) => a.name.localeCompare(b.name));
}

/** A new studio with its creator as owner. */
export async function createStudio(em: EntityManager, userId: string, input: StudioInput): Promise<StudioDto> {
  return em.transactional(async (tx) => {
    const studio = tx.create(StudioSchema, { name: input.name });
    tx.create(MembershipSchema, { studio, user: userId, role: "owner" });
    await tx.flush();
    return studioDto(studio, "owner");
  });
}

export async function updateStudio(
  em: EntityManager,
  studio: Studio,
  role: Role,
  input: Partial<Pick<Studio, "name" | "lotTolerance" | "lotsForRepeatable" | "stockShelfLifeDays">>,
): Promise<StudioDto> {
  em.assign(studio, input);
  await em.flush();
  return studioDto(studio, role);
}
