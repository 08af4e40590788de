// POST /api/studios/:studioId/trials/:trialId/layers – add a layer at the end (and record its prediction when one can be made)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { layerInput } from "@/lib/schemas/trial";
import { ensurePrediction } from "@/lib/learning/predictions";
import { addLayer } from "@/lib/trials/layers";

export const POST = withStudio<{ studioId: string; trialId: string }>(
  async ({ req, em, studio, user, params }) => {
    const input = layerInput.parse(await readJson(req));
    const trial = await addLayer(em, studio, user.id, params.trialId, input);
    // What the model expects of the new layer is kept, to compare with the reading later.
    const added = trial.layers.at(-1);
    if (added) await ensurePrediction(em, studio, user, params.trialId, added.id);
    return Response.json(trial, { status: 201 });
  },
  { can: "trial.edit" },
);
