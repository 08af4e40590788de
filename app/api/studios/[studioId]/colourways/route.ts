// GET /api/studios/:studioId/colourways – colourways with their lots; POST – propose one from a trial's reading (owner, dyer)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { createColourway, listColourways } from "@/lib/learning/colourways";
import { colourwayInput } from "@/lib/schemas/colourway";

type P = { studioId: string };

export const GET = withStudio<P>(async ({ em, studio }) => Response.json(await listColourways(em, studio)), { can: "colourway.read" });

export const POST = withStudio<P>(
  async ({ req, em, studio, user }) =>
    Response.json(await createColourway(em, studio, user, colourwayInput.parse(await readJson(req))), { status: 201 }),
  { can: "colourway.propose" },
);
