// GET /api/studios/:studioId/bases/:baseId – one yarn base; PATCH – edit it (send `version`); DELETE – archive it (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { archiveBase, getBase, updateBase } from "@/lib/library/bases";
import { basePatch } from "@/lib/schemas/library";

type P = { studioId: string; baseId: string };

export const GET = withStudio<P>(
  async ({ em, studio, params }) => Response.json(await getBase(em, studio, params.baseId)),
  { can: "library.read" },
);

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    const patch = basePatch.parse(await readJson(req));
    return Response.json(await updateBase(em, studio, params.baseId, patch));
  },
  { can: "library.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => {
    await archiveBase(em, studio, params.baseId);
    return new Response(null, { status: 204 });
  },
  { can: "library.delete" },
);
