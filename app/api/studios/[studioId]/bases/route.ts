// GET /api/studios/:studioId/bases – the studio's yarn bases (?q=&sort=&dir=&filters); POST – add one
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { searchParamsOf } from "@/lib/library/common";
import { createBase, listBases } from "@/lib/library/bases";
import { baseInput, baseListQuery } from "@/lib/schemas/library";

type P = { studioId: string };

export const GET = withStudio<P>(
  async ({ req, em, studio }) => Response.json(await listBases(em, studio, baseListQuery.parse(searchParamsOf(req)))),
  { can: "library.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio }) => {
    const input = baseInput.parse(await readJson(req));
    return Response.json(await createBase(em, studio, input), { status: 201 });
  },
  { can: "library.edit" },
);
