// POST /api/studios/:studioId/colourways/:colourwayId/lots – record a dye lot, judged against the target (owner, dyer)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { addLot } from "@/lib/learning/colourways";
import { lotInput } from "@/lib/schemas/colourway";

export const POST = withStudio<{ studioId: string; colourwayId: string }>(
  async ({ req, em, studio, user, params }) => {
    if (!isUuid(params.colourwayId)) throw notFound("This colourway");
    return Response.json(await addLot(em, studio, user, params.colourwayId, lotInput.parse(await readJson(req))), { status: 201 });
  },
  { can: "lot.edit" },
);
