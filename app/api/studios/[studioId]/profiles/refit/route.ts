// POST /api/studios/:studioId/profiles/refit – fit every dye profile again from the studio's measured dyeings (owner, dyer)
import { withStudio } from "@/lib/auth/with-studio";
import { refitProfiles } from "@/lib/learning/profiles";

export const POST = withStudio<{ studioId: string }>(async ({ em, studio }) => Response.json(await refitProfiles(em, studio)), {
  can: "prediction.run",
});
