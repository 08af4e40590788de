// GET /api/studios/:studioId/colour-search?L=&a=&b= | ?hex= – the studio's readings and colourways nearest in ΔE00
import { withStudio } from "@/lib/auth/with-studio";
import { searchByColour } from "@/lib/learning/colour-search";
import { colourSearchQuery } from "@/lib/schemas/colourway";

export const GET = withStudio<{ studioId: string }>(
  async ({ req, em, studio }) => {
    const q = colourSearchQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
    return Response.json(await searchByColour(em, studio, q));
  },
  { can: "trial.read" },
);
