// GET /api/studios/:studioId/colourways/:colourwayId – one colourway; PATCH – name, description, status (repeatable/retired: owner)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { getColourway, updateColourway } from "@/lib/learning/colourways";
import { colourwayPatch } from "@/lib/schemas/colourway";

type P = { studioId: string; colourwayId: string };

export const GET = withStudio<P>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.colourwayId)) throw notFound("This colourway");
    return Response.json(await getColourway(em, studio, params.colourwayId));
  },
  { can: "colourway.read" },
);

export const PATCH = withStudio<P>(
  async ({ req, em, studio, role, user, params }) => {
    if (!isUuid(params.colourwayId)) throw notFound("This colourway");
    return Response.json(await updateColourway(em, studio, role, user, params.colourwayId, colourwayPatch.parse(await readJson(req))));
  },
  { can: "colourway.propose" },
);
