// PUT /api/studios/:studioId/trials/:trialId/layer-order – put the layers in a new order
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { layerOrderInput } from "@/lib/schemas/trial";
import { reorderLayers } from "@/lib/trials/layers";

export const PUT = withStudio<{ studioId: string; trialId: string }>(
  async ({ req, em, studio, params }) => {
    const { layerIds } = layerOrderInput.parse(await readJson(req));
    return Response.json(await reorderLayers(em, studio, params.trialId, layerIds));
  },
  { can: "trial.edit" },
);
