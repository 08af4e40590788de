// GET /api/studios/:studioId/notifications[?unread=1&cursor=&limit=] – the caller's notifications here, newest first, with the unread count
import { withStudio } from "@/lib/auth/with-studio";
import { listNotifications } from "@/lib/notifications";
import { notificationQuery } from "@/lib/schemas/activity";

export const GET = withStudio<{ studioId: string }>(
  async ({ req, em, studio, user }) => {
    const q = notificationQuery.parse(Object.fromEntries(new URL(req.url).searchParams));
    return Response.json(await listNotifications(em, studio, user.id, q));
  },
  { can: "studio.read" },
);
