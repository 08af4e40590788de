// POST /api/studios/:studioId/trials/:trialId/layers/:layerId/duplicate – a copy of the layer right after it
import { withStudio } from "@/lib/auth/with-studio";
import { duplicateLayer } from "@/lib/trials/layers";

export const POST = withStudio<{ studioId: string; trialId: string; layerId: string }>(
  async ({ em, studio, user, params }) => Response.json(await duplicateLayer(em, studio, user.id, params.trialId, params.layerId), { status: 201 }),
  { can: "trial.edit" },
);
