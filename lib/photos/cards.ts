import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { ReferenceCardSchema, type ReferenceCard, type Studio } from "@/entities";
import { conflict, notFound } from "@/lib/errors";
import type { CardInput } from "@/lib/schemas/photo";
import { enqueue } from "@/lib/jobs/boss";
import { countStaleReadings } from "./readings";

export interface CardDto {
  id: string;
  name: string;
  rows: number;
  cols: number;
  patches: ReferenceCard["patches"];
  measured: boolean;
  notes: string;
  version: number;
  updatedAt: string;
}

export function cardDto(c: ReferenceCard): CardDto {
  return {
    id: c.id,
    name: c.name,
    rows: c.rows,
    cols: c.cols,
    patches: c.patches,
    measured: c.measured,
    notes: c.notes,
    version: c.version,
    updatedAt: c.updatedAt.toISOString(),
  };
}

export async function listCards(em: EntityManager, studio: Studio): Promise<CardDto[]> {
  return (await em.find(ReferenceCardSchema, { studio }, { orderBy: { name: "asc" } })).map(cardDto);
}

async function findCard(em: EntityManager, studio: Studio, id: string): Promise<ReferenceCard> {
  const c = await em.findOne(ReferenceCardSchema, { id, studio });
  if (!c) throw notFound("This reference card");
  return c;
}

export async function getCard(em: EntityManager, studio: Studio, id: string): Promise<CardDto> {
  return cardDto(await findCard(em, studio, id));
}

export async function createCard(em: EntityManager, studio: Studio, input: CardInput): Promise<CardDto> {
  const c = em.create(ReferenceCardSchema, { studio, ...input });
  await em.flush();
  return cardDto(c);
}

/**
 * New values for a card. The readings it calibrated are measured again by a job queued in the
 * same transaction (each photo is decoded again, which takes a while for many photos);
 * `recomputing` says how many wait for it, and each shows as being measured again until then.
 */
export async function updateCard(
  em: EntityManager,
  studio: Studio,
  id: string,
  input: CardInput & { version: number },
): Promise<CardDto & { recomputing: number }> {
  return em.transactional(async (tx) => {
    const c = await findCard(tx, studio, id);
    if (c.version !== input.version) {
      throw conflict("Someone else changed this card while you were editing. Reload to see their values, then apply yours again.");
    }
    const { version: _v, ...values } = input;
    tx.assign(c, values);
    await tx.flush();
    const recomputing = await countStaleReadings(tx, c);
    if (recomputing) await enqueue(tx, "card-readings-recompute", { cardId: c.id }, { singletonKey: c.id });
    return { ...cardDto(c), recomputing };
  });
}
