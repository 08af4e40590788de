// POST /api/studios/:studioId/trials/:trialId/layers/:layerId/prediction – predict the layer and record it (owner, dyer); refused once the layer is measured and predicted
import { withStudio } from "@/lib/auth/with-studio";
import { requestPrediction } from "@/lib/learning/predictions";

export const POST = withStudio<{ studioId: string; trialId: string; layerId: string }>(
  async ({ em, studio, user, params }) =>
    Response.json(await requestPrediction(em, studio, user, params.trialId, params.layerId), { status: 201 }),
  { can: "prediction.run" },
);
