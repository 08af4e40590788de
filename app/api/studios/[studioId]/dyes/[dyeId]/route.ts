// GET /api/studios/:studioId/dyes/:dyeId – one dye; PATCH – edit it (send `version`); DELETE – archive it (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { archiveDye, getDye, updateDye } from "@/lib/library/dyes";
import { dyePatch } from "@/lib/schemas/library";

type P = { studioId: string; dyeId: string };

export const GET = withStudio<P>(
  async ({ em, studio, params }) => Response.json(await getDye(em, studio, params.dyeId)),
  { can: "library.read" },
);

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    const patch = dyePatch.parse(await readJson(req));
    return Response.json(await updateDye(em, studio, params.dyeId, patch));
  },
  { can: "library.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => {
    await archiveDye(em, studio, params.dyeId);
    return new Response(null, { status: 204 });
  },
  { can: "library.delete" },
);
