// GET /api/studios/:studioId/trials/:trialId – one trial; PATCH – edit it (needs its version); DELETE – remove it (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { trialPatch } from "@/lib/schemas/trial";
import { deleteTrial, getTrial, updateTrial } from "@/lib/trials/trials";

type P = { studioId: string; trialId: string };

export const GET = withStudio<P>(async ({ em, studio, params }) => Response.json(await getTrial(em, studio, params.trialId)), {
  can: "trial.read",
});

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    const patch = trialPatch.parse(await readJson(req));
    return Response.json(await updateTrial(em, studio, params.trialId, patch));
  },
  { can: "trial.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => {
    await deleteTrial(em, studio, params.trialId);
    return new Response(null, { status: 204 });
  },
  { can: "trial.delete" },
);
