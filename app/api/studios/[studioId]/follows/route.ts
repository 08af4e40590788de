// GET /api/studios/:studioId/follows – what the caller follows in this studio
import { withStudio } from "@/lib/auth/with-studio";
import { listFollows } from "@/lib/comments/follows";

export const GET = withStudio<{ studioId: string }>(
  async ({ em, studio, user }) => Response.json(await listFollows(em, studio, user.id)),
  { can: "follow.use" },
);
