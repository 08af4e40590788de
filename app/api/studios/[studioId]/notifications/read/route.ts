// POST /api/studios/:studioId/notifications/read { ids? } – mark some (or all) of the caller's notifications read → { unread }
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { markRead } from "@/lib/notifications";
import { notificationsRead } from "@/lib/schemas/activity";

export const POST = withStudio<{ studioId: string }>(
  async ({ req, em, studio, user }) => {
    const { ids } = notificationsRead.parse(await readJson(req));
    return Response.json({ unread: await markRead(em, studio, user.id, ids) });
  },
  { can: "studio.read" },
);
