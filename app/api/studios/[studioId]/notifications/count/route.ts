// GET /api/studios/:studioId/notifications/count – { unread } for the bell
import { withStudio } from "@/lib/auth/with-studio";
import { unreadCount } from "@/lib/notifications";

export const GET = withStudio<{ studioId: string }>(
  async ({ em, studio, user }) => Response.json({ unread: await unreadCount(em, studio, user.id) }),
  { can: "studio.read" },
);
