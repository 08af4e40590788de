// GET /api/studios/:studioId/trials/:trialId/comments[?layerId=&photoId=] – the thread, oldest first; POST – write a comment
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { createComment, listComments } from "@/lib/comments/service";
import { badRequest } from "@/lib/errors";
import { commentInput } from "@/lib/schemas/comment";

type P = { studioId: string; trialId: string };

function uuidParam(url: URL, name: string): string | undefined {
  const v = url.searchParams.get(name);
  if (v === null || v === "") return undefined;
  if (!isUuid(v)) throw badRequest(`Check “${name}”: not a valid id.`, { [name]: "Not a valid id." });
  return v;
}

export const GET = withStudio<P>(
  async ({ req, em, studio, user, role, params }) => {
    const url = new URL(req.url);
    const opts = { layerId: uuidParam(url, "layerId"), photoId: uuidParam(url, "photoId") };
    return Response.json(await listComments(em, studio, { id: user.id, role }, params.trialId, opts));
  },
  { can: "comment.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio, user, role, params }) => {
    const input = commentInput.parse(await readJson(req));
    const dto = await createComment(em, studio, user, { id: user.id, role }, params.trialId, input);
    return Response.json(dto, { status: 201 });
  },
  { can: "comment.write" },
);
