// GET /api/studios/:studioId/dyes – the studio's dyes (?q=&sort=&dir=&filters); POST – add one
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { searchParamsOf } from "@/lib/library/common";
import { createDye, listDyes } from "@/lib/library/dyes";
import { dyeInput, dyeListQuery } from "@/lib/schemas/library";

type P = { studioId: string };

export const GET = withStudio<P>(
  async ({ req, em, studio }) => Response.json(await listDyes(em, studio, dyeListQuery.parse(searchParamsOf(req)))),
  { can: "library.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio }) => {
    const input = dyeInput.parse(await readJson(req));
    return Response.json(await createDye(em, studio, input), { status: 201 });
  },
  { can: "library.edit" },
);
