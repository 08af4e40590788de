// GET /api/invitations/:token – what the link offers (no sign-in needed); POST – accept as the signed-in user
import { getEm } from "@/lib/db";
import { toErrorResponse } from "@/lib/errors";
import { withUser } from "@/lib/auth/with-studio";
import { acceptInvitation, previewInvitation } from "@/lib/invitations";

type Args = { params: Promise<{ token: string }> };

export async function GET(_req: Request, { params }: Args) {
  try {
    const { token } = await params;
    return Response.json(await previewInvitation(await getEm(), token));
  } catch (e) {
    return toErrorResponse(e);
  }
}

export const POST = withUser<{ token: string }>(async ({ em, user, params }) =>
  Response.json(await acceptInvitation(em, params.token, user)),
);
