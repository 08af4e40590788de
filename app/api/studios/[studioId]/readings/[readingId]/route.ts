// DELETE /api/studios/:studioId/readings/:readingId – remove a reading (owner, dyer)
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { deleteReading } from "@/lib/photos/readings";

export const DELETE = withStudio<{ studioId: string; readingId: string }>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.readingId)) throw notFound("This reading");
    await deleteReading(em, studio, params.readingId);
    return new Response(null, { status: 204 });
  },
  { can: "photo.upload" },
);
