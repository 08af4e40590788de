// GET /api/studios/:studioId/invitations – pending invitations (owner); POST – invite by e-mail with a role (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { inviteMember, listInvitations } from "@/lib/invitations";
import { invitationInput } from "@/lib/schemas/studio";

type P = { studioId: string };

export const GET = withStudio<P>(async ({ em, studio }) => Response.json(await listInvitations(em, studio)), {
  can: "invitation.manage",
});

export const POST = withStudio<P>(
  async ({ req, em, studio, user }) => {
    const input = invitationInput.parse(await readJson(req));
    return Response.json(await inviteMember(em, studio, user, input), { status: 201 });
  },
  { can: "invitation.manage" },
);
