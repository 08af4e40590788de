// GET /api/studios/:studioId/stocks – the studio's stock solutions (?q=&sort=&dir=&filters); POST – add one
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { searchParamsOf } from "@/lib/library/common";
import { createStock, listStocks } from "@/lib/library/stocks";
import { stockInput, stockListQuery } from "@/lib/schemas/library";

type P = { studioId: string };

export const GET = withStudio<P>(
  async ({ req, em, studio }) => Response.json(await listStocks(em, studio, stockListQuery.parse(searchParamsOf(req)))),
  { can: "library.read" },
);

export const POST = withStudio<P>(
  async ({ req, em, studio }) => {
    const input = stockInput.parse(await readJson(req));
    return Response.json(await createStock(em, studio, input), { status: 201 });
  },
  { can: "library.edit" },
);
