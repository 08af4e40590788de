// The demo studio's reference card: the invented demo layout with its nominal values.
import type { EntityManager } from "@mikro-orm/postgresql";
import { DEMO_CARD } from "../../colour/synthetic/card";
import { ReferenceCardSchema, type Studio } from "../../entities";

export async function seedCards(em: EntityManager, studio: Studio) {
  const name = "Studio card (demo layout)";
  const found = await em.findOne(ReferenceCardSchema, { studio, name });
  if (found) return found;
  return em.create(ReferenceCardSchema, {
    studio,
    name,
    rows: DEMO_CARD.rows,
    cols: DEMO_CARD.cols,
    patches: DEMO_CARD.patches.map((p) => ({ name: p.name, ...p.lab })),
    measured: false,
    notes: "Nominal values of the demo layout. Measure the printed card and enter its values before trusting readings.",
  });
}
