// GET /api/studios/:studioId/trials/:trialId/photos – the trial's photos and readings
import { TrialSchema } from "@/entities/trial";
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { listPhotos } from "@/lib/photos/photos";
import { listReadings } from "@/lib/photos/readings";

export const GET = withStudio<{ studioId: string; trialId: string }>(
  async ({ em, studio, params }) => {
    // A trial of another studio (or none) is not found, rather than an empty list.
    if (!isUuid(params.trialId) || !(await em.count(TrialSchema, { id: params.trialId, studio }))) throw notFound("This trial");
    const [photos, readings] = [await listPhotos(em, studio, params.trialId), await listReadings(em, studio, params.trialId)];
    return Response.json({ photos, readings });
  },
  { can: "photo.read" },
);
