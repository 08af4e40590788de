// POST /api/studios/:studioId/photos/:photoId/readings – measure swatch areas, calibrated by the card marked in the photo; refits profiles (owner, dyer)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { refitProfiles } from "@/lib/learning/profiles";
import { createReadings } from "@/lib/photos/readings";
import { readingInput } from "@/lib/schemas/photo";

export const POST = withStudio<{ studioId: string; photoId: string }>(
  async ({ req, em, studio, user, params }) => {
    if (!isUuid(params.photoId)) throw notFound("This photo");
    const input = readingInput.parse(await readJson(req));
    const readings = await createReadings(em, studio, user, params.photoId, input);
    // A measured layer is a new dyeing to learn from: the studio's profiles are fitted again.
    if (readings.some((r) => r.layerId)) await refitProfiles(em, studio);
    return Response.json(readings, { status: 201 });
  },
  { can: "photo.upload" },
);
