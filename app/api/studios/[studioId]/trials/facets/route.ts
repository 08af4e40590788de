// GET /api/studios/:studioId/trials/facets – the bases, dyes, tags and authors the list filters offer
import { withStudio } from "@/lib/auth/with-studio";
import { trialFacets } from "@/lib/trials/query";

export const GET = withStudio<{ studioId: string }>(async ({ em, studio }) => Response.json(await trialFacets(em, studio)), {
  can: "trial.read",
});
