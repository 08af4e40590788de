// PATCH /api/studios/:studioId/trials/:trialId/comments/:commentId – edit your comment (needs its version); DELETE[?version=] – remove it (yours, or any as owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { deleteComment, updateComment } from "@/lib/comments/service";
import { badRequest } from "@/lib/errors";
import { commentUpdate } from "@/lib/schemas/comment";

type P = { studioId: string; trialId: string; commentId: string };

export const PATCH = withStudio<P>(
  async ({ req, em, studio, user, role, params }) => {
    const input = commentUpdate.parse(await readJson(req));
    return Response.json(await updateComment(em, studio, user, { id: user.id, role }, params.trialId, params.commentId, input));
  },
  { can: "comment.write" },
);

export const DELETE = withStudio<P>(
  async ({ req, em, studio, user, role, params }) => {
    const raw = new URL(req.url).searchParams.get("version");
    const version = raw === null ? undefined : Number(raw);
    if (version !== undefined && !Number.isInteger(version)) throw badRequest("Check “version”: a whole number.", { version: "A whole number." });
    await deleteComment(em, studio, user, { id: user.id, role }, params.trialId, params.commentId, version);
    return new Response(null, { status: 204 });
  },
  { can: "comment.write" },
);
