// GET /api/studios/:studioId/activity[?kind=&actorId=&trialId=&cursor=&limit=] – the studio's activity, newest first
import { listActivity } from "@/lib/activity";
import { withStudio } from "@/lib/auth/with-studio";
import { activityQuery } from "@/lib/schemas/activity";

export const GET = withStudio<{ studioId: string }>(
  async ({ req, em, studio }) => {
    const q = activityQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
    return Response.json(await listActivity(em, studio, q));
  },
  { can: "activity.read" },
);
