// GET /api/studios/:studioId/members – the studio's members and roles
import { withStudio } from "@/lib/auth/with-studio";
import { listMembers } from "@/lib/members";

export const GET = withStudio<{ studioId: string }>(async ({ em, studio }) => Response.json(await listMembers(em, studio)), {
  can: "member.read",
});
