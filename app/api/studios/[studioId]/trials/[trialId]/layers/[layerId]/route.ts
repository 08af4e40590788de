// PATCH /api/studios/:studioId/trials/:trialId/layers/:layerId – edit a layer (needs its version); DELETE – remove it
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { layerPatch } from "@/lib/schemas/trial";
import { deleteLayer, updateLayer } from "@/lib/trials/layers";

type P = { studioId: string; trialId: string; layerId: string };

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    const patch = layerPatch.parse(await readJson(req));
    return Response.json(await updateLayer(em, studio, params.trialId, params.layerId, patch));
  },
  { can: "trial.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => Response.json(await deleteLayer(em, studio, params.trialId, params.layerId)),
  { can: "trial.edit" },
);
