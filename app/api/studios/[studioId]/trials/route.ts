// GET /api/studios/:studioId/trials – search, filter, sort and page the trials; POST – start a trial
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { queryFromSearch, trialInput, trialQuery } from "@/lib/schemas/trial";
import { listTrials } from "@/lib/trials/query";
import { createTrial } from "@/lib/trials/trials";

type P = { studioId: string };

export const GET = withStudio<P>(
  async ({ req, em, studio }) => {
    const q = trialQuery.parse(queryFromSearch(new URL(req.url).searchParams));
    return Response.json(await listTrials(em, studio, q));
  },
  { can: "trial.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio, user }) => {
    const input = trialInput.parse(await readJson(req));
    return Response.json(await createTrial(em, studio, user.id, input), { status: 201 });
  },
  { can: "trial.edit" },
);
