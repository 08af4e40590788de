// DELETE /api/studios/:studioId/photos/:photoId – remove a photo, its variants and readings (owner, dyer)
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { deletePhoto } from "@/lib/photos/photos";

export const DELETE = withStudio<{ studioId: string; photoId: string }>(
  async ({ em, studio, params }) => {
    if (!isUuid(params.photoId)) throw notFound("This photo");
    await deletePhoto(em, studio, params.photoId);
    return new Response(null, { status: 204 });
  },
  { can: "photo.upload" },
);
