// GET /api/studios/:studioId/colourways/:colourwayId/recipe?weight=800 – the recipe scaled to a lot's fibre weight
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { getColourway } from "@/lib/learning/colourways";
import { scaleColourwayRecipe } from "@/lib/learning/recipe";
import { recipeQuery } from "@/lib/schemas/colourway";

export const GET = withStudio<{ studioId: string; colourwayId: string }>(
  async ({ req, em, studio, params }) => {
    if (!isUuid(params.colourwayId)) throw notFound("This colourway");
    const { weight } = recipeQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
    return Response.json(scaleColourwayRecipe(await getColourway(em, studio, params.colourwayId), weight));
  },
  { can: "colourway.read" },
);
