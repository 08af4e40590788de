// GET /api/studios/:studioId/cards/:cardId – one card; PUT – new values, readings measured again by a job (owner, dyer)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { getCard, updateCard } from "@/lib/photos/cards";
import { cardPatch } from "@/lib/schemas/photo";

type P = { studioId: string; cardId: string };

export const GET = withStudio<P>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.cardId)) throw notFound("This reference card");
    return Response.json(await getCard(em, studio, params.cardId));
  },
  { can: "photo.read" },
);

export const PUT = withStudio<P>(
  async ({ req, em, studio, params }) => {
    if (!isUuid(params.cardId)) throw notFound("This reference card");
    return Response.json(await updateCard(em, studio, params.cardId, cardPatch.parse(await readJson(req))));
  },
  { can: "card.edit" },
);
