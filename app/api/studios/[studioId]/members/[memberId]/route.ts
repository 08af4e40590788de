// PATCH /api/studios/:studioId/members/:memberId – change a role (owner); DELETE – remove a member (owner)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { changeRole, removeMember } from "@/lib/members";
import { memberRoleInput } from "@/lib/schemas/studio";

type P = { studioId: string; memberId: string };

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    if (!isUuid(params.memberId)) throw notFound("This member");
    const { role } = memberRoleInput.parse(await readJson(req));
    return Response.json(await changeRole(em, studio, params.memberId, role));
  },
  { can: "member.manage" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.memberId)) throw notFound("This member");
    await removeMember(em, studio, params.memberId);
    return new Response(null, { status: 204 });
  },
  { can: "member.manage" },
);
