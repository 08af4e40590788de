// PATCH /api/studios/:studioId/timers/:timerId – pause, resume, finish or cancel a step timer
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { timerActionInput } from "@/lib/schemas/timer";
import { actOnTimer } from "@/lib/timers";

export const PATCH = withStudio<{ studioId: string; timerId: string }>(
  async ({ req, em, studio, params }) => {
    if (!isUuid(params.timerId)) throw notFound("This timer");
    const input = timerActionInput.parse(await readJson(req));
    return Response.json(await actOnTimer(em, studio, params.timerId, input));
  },
  { can: "timer.use" },
);
