// DELETE /api/studios/:studioId/invitations/:invitationId – withdraw a pending invitation (owner)
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { revokeInvitation } from "@/lib/invitations";

export const DELETE = withStudio<{ studioId: string; invitationId: string }>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.invitationId)) throw notFound("This invitation");
    await revokeInvitation(em, studio, params.invitationId);
    return new Response(null, { status: 204 });
  },
  { can: "invitation.manage" },
);
