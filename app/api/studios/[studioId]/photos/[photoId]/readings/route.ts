// POST /api/studios/:studioId/photos/:photoId/readings – measure swatch areas, calibrated by the card marked in the photo; refits profiles (owner, dyer)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { ensurePrediction } from "@/lib/learning/predictions";
import { refitProfiles } from "@/lib/learning/profiles";
import { createReadings } from "@/lib/photos/readings";
import { readingInput } from "@/lib/schemas/photo";

export const POST = withStudio<{ studioId: string; photoId: string }>(
  async ({ req, em, studio, user, params }) => {
    if (!isUuid(params.photoId)) throw notFound("This photo");
    const input = readingInput.parse(await readJson(req));
    const readings = await createReadings(em, studio, user, params.photoId, input);
    const layers = [...new Set(readings.map((r) => r.layerId).filter((id): id is string => !!id))];
    // A layer measured before anyone predicted it gets its prediction from the profiles as they
    // stand before this reading; then, as a new dyeing to learn from, the profiles are fitted again.
    for (const layerId of layers) await ensurePrediction(em, studio, user, readings[0].trialId, layerId);
    if (layers.length) await refitProfiles(em, studio);
    return Response.json(readings, { status: 201 });
  },
  { can: "photo.upload" },
);
