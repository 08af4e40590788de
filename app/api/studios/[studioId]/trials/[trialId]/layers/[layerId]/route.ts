// PATCH /api/studios/:studioId/trials/:trialId/layers/:layerId – edit a layer (needs its version); DELETE – remove it
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { ensurePrediction } from "@/lib/learning/predictions";
import { layerPatch } from "@/lib/schemas/trial";
import { deleteLayer, updateLayer } from "@/lib/trials/layers";

type P = { studioId: string; trialId: string; layerId: string };

export const PATCH = withStudio<P>(
  async ({ req, em, studio, user, params }) => {
    const patch = layerPatch.parse(await readJson(req));
    const trial = await updateLayer(em, studio, params.trialId, params.layerId, patch);
    // A changed recipe on a layer not yet measured gets a fresh prediction.
    const recipe = ["method", "dyes", "coverage", "gradient", "uptake"].some((k) => k in patch);
    if (recipe) await ensurePrediction(em, studio, user, params.trialId, params.layerId, { refresh: true });
    return Response.json(trial);
  },
  { can: "trial.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => Response.json(await deleteLayer(em, studio, params.trialId, params.layerId)),
  { can: "trial.edit" },
);
