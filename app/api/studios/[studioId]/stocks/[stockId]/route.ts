// GET /api/studios/:studioId/stocks/:stockId – one stock solution; PATCH – edit it (send `version`); DELETE – archive it (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { archiveStock, getStock, updateStock } from "@/lib/library/stocks";
import { stockPatch } from "@/lib/schemas/library";

type P = { studioId: string; stockId: string };

export const GET = withStudio<P>(
  async ({ em, studio, params }) => Response.json(await getStock(em, studio, params.stockId)),
  { can: "library.read" },
);

export const PATCH = withStudio<P>(
  async ({ req, em, studio, params }) => {
    const patch = stockPatch.parse(await readJson(req));
    return Response.json(await updateStock(em, studio, params.stockId, patch));
  },
  { can: "library.edit" },
);

export const DELETE = withStudio<P>(
  async ({ em, studio, params }) => {
    await archiveStock(em, studio, params.stockId);
    return new Response(null, { status: 204 });
  },
  { can: "library.delete" },
);
