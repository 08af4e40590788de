// GET /api/studios/:studioId/cards – the studio's reference cards; POST – define a card (owner, dyer)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { createCard, listCards } from "@/lib/photos/cards";
import { cardInput } from "@/lib/schemas/photo";

type P = { studioId: string };

export const GET = withStudio<P>(async ({ em, studio }) => Response.json(await listCards(em, studio)), { can: "photo.read" });

export const POST = withStudio<P>(
  async ({ req, em, studio }) => Response.json(await createCard(em, studio, cardInput.parse(await readJson(req))), { status: 201 }),
  { can: "card.edit" },
);
