// GET /api/studios/:studioId/trials/:trialId/comparison – predicted against measured, layer by layer
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { compareTrial } from "@/lib/learning/predictions";

export const GET = withStudio<{ studioId: string; trialId: string }>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.trialId)) throw notFound("This trial");
    return Response.json(await compareTrial(em, studio, params.trialId));
  },
  { can: "trial.read" },
);
