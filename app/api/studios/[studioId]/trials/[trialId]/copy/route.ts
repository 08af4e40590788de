// POST /api/studios/:studioId/trials/:trialId/copy – start a new trial from this one's recipe
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { copyInput } from "@/lib/schemas/trial";
import { copyTrial } from "@/lib/trials/trials";

export const POST = withStudio<{ studioId: string; trialId: string }>(
  async ({ req, em, studio, user, params }) => {
    const input = copyInput.parse(await readJson(req));
    return Response.json(await copyTrial(em, studio, user.id, params.trialId, input), { status: 201 });
  },
  { can: "trial.edit" },
);
