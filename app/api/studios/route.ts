// GET /api/studios – the caller's studios; POST /api/studios – create a studio, caller becomes owner
import { readJson, withUser } from "@/lib/auth/with-studio";
import { studioInput } from "@/lib/schemas/studio";
import { createStudio, listMyStudios } from "@/lib/studios";

export const GET = withUser(async ({ em, user }) => Response.json(await listMyStudios(em, user.id)));

export const POST = withUser(async ({ req, em, user }) => {
  const input = studioInput.parse(await readJson(req));
  return Response.json(await createStudio(em, user.id, input), { status: 201 });
});
