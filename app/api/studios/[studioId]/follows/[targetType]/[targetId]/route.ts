// GET /api/studios/:studioId/follows/:targetType/:targetId – does the caller follow it; PUT – follow; DELETE – stop following
import { withStudio } from "@/lib/auth/with-studio";
import { follow, followStatus, unfollow } from "@/lib/comments/follows";
import { notFound } from "@/lib/errors";
import { followTargetParams } from "@/lib/schemas/activity";

type P = { studioId: string; targetType: string; targetId: string };

function target(params: P) {
  const t = followTargetParams.safeParse(params);
  if (!t.success) throw notFound("This item");
  return t.data;
}

export const GET = withStudio<P>(
  async ({ em, studio, user, params }) => {
    const t = target(params);
    return Response.json(await followStatus(em, studio, user.id, t.targetType, t.targetId));
  },
  { can: "follow.use" },
);

export const PUT = withStudio<P>(
  async ({ em, studio, user, params }) => {
    const t = target(params);
    return Response.json(await follow(em, studio, user.id, t.targetType, t.targetId));
  },
  { can: "follow.use" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, user, params }) => {
    const t = target(params);
    return Response.json(await unfollow(em, studio, user.id, t.targetType, t.targetId));
  },
  { can: "follow.use" },
);
