// POST /api/studios/:studioId/trials/:trialId/layers/:layerId/prediction – predict the layer and record it (owner, dyer); refused once the layer is measured and predicted
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { LayerPredictionSchema, ReadingSchema } from "@/entities";
import { conflict, notFound } from "@/lib/errors";
import { recordPrediction } from "@/lib/learning/predictions";

export const POST = withStudio<{ studioId: string; trialId: string; layerId: string }>(
  async ({ em, studio, user, params }) => {
    if (!isUuid(params.trialId) || !isUuid(params.layerId)) throw notFound("This layer");
    const measured = await em.count(ReadingSchema, { studio, layer: params.layerId, photo: { kind: "after-layer" } });
    const predicted = await em.count(LayerPredictionSchema, { studio, layer: params.layerId });
    if (measured && predicted) {
      throw conflict("This layer is measured, so its prediction stays as it was made before the result was known.");
    }
    return Response.json(await recordPrediction(em, studio, user, params.trialId, params.layerId), { status: 201 });
  },
  { can: "prediction.run" },
);
