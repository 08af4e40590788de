// POST /api/studios/:studioId/trials/:trialId/layers – add a layer at the end
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { layerInput } from "@/lib/schemas/trial";
import { addLayer } from "@/lib/trials/layers";

export const POST = withStudio<{ studioId: string; trialId: string }>(
  async ({ req, em, studio, params }) => {
    const input = layerInput.parse(await readJson(req));
    return Response.json(await addLayer(em, studio, params.trialId, input), { status: 201 });
  },
  { can: "trial.edit" },
);
