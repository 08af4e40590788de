// GET /api/studios/:studioId/profiles – the studio's dye profiles per fibre class, with their fit
import { withStudio } from "@/lib/auth/with-studio";
import { listProfiles } from "@/lib/learning/profiles";

export const GET = withStudio<{ studioId: string }>(async ({ em, studio }) => Response.json(await listProfiles(em, studio)), {
  can: "trial.read",
});
