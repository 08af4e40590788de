// POST /api/studios/:studioId/trials/:trialId/layers/:layerId/prediction – predict the layer and record it (owner, dyer)
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { recordPrediction } from "@/lib/learning/predictions";

export const POST = withStudio<{ studioId: string; trialId: string; layerId: string }>(
  async ({ em, studio, user, params }) => {
    if (!isUuid(params.trialId) || !isUuid(params.layerId)) throw notFound("This layer");
    return Response.json(await recordPrediction(em, studio, user, params.trialId, params.layerId), { status: 201 });
  },
  { can: "prediction.run" },
);
