// GET /api/studios/:studioId – one studio; PATCH – rename and studio settings (owner)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { studioSettingsInput } from "@/lib/schemas/studio";
import { studioDto, updateStudio } from "@/lib/studios";

type P = { studioId: string };

export const GET = withStudio<P>(async ({ studio, role }) => Response.json(studioDto(studio, role)), { can: "studio.read" });

export const PATCH = withStudio<P>(
  async ({ req, em, studio, role }) => {
    const input = studioSettingsInput.parse(await readJson(req));
    return Response.json(await updateStudio(em, studio, role, input));
  },
  { can: "studio.update" },
);
