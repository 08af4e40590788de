// POST /api/studios/:studioId/photos/:photoId/readings – measure swatch areas, calibrated by the card marked in the photo (owner, dyer)
import { isUuid, readJson, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { createReadings } from "@/lib/photos/readings";
import { readingInput } from "@/lib/schemas/photo";

export const POST = withStudio<{ studioId: string; photoId: string }>(
  async ({ req, em, studio, user, params }) => {
    if (!isUuid(params.photoId)) throw notFound("This photo");
    const input = readingInput.parse(await readJson(req));
    return Response.json(await createReadings(em, studio, user, params.photoId, input), { status: 201 });
  },
  { can: "photo.upload" },
);
