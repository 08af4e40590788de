// GET /api/studios/:studioId/timers – running and paused step timers (?trialId= for one trial's, all states); POST – start one
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { timerInput } from "@/lib/schemas/timer";
import { listTimers, startTimer } from "@/lib/timers";

type P = { studioId: string };

export const GET = withStudio<P>(
  async ({ req, em, studio }) => {
    const trialId = new URL(req.url).searchParams.get("trialId") ?? undefined;
    if (trialId !== undefined && !isUuid(trialId)) throw notFound("This trial");
    return Response.json(await listTimers(em, studio, { trialId }));
  },
  { can: "trial.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio, user }) => {
    const input = timerInput.parse(await readJson(req));
    return Response.json(await startTimer(em, studio, user.id, input), { status: 201 });
  },
  { can: "timer.use" },
);
