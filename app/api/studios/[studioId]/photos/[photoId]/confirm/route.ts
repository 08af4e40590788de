// POST /api/studios/:studioId/photos/:photoId/confirm – check the uploaded bytes, write variants (owner, dyer)
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { confirmUpload } from "@/lib/photos/photos";

export const POST = withStudio<{ studioId: string; photoId: string }>(
  async ({ em, studio, user, params }) => {
    if (!isUuid(params.photoId)) throw notFound("This photo");
    return Response.json(await confirmUpload(em, studio, user, params.photoId));
  },
  { can: "photo.upload" },
);
