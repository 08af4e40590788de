// POST /api/studios/:studioId/photos – start an upload: records a pending photo, returns a presigned PUT URL (owner, dyer)
import { readJson, withStudio } from "@/lib/auth/with-studio";
import { startUpload } from "@/lib/photos/photos";
import { uploadInput } from "@/lib/schemas/photo";

export const POST = withStudio<{ studioId: string }>(
  async ({ req, em, studio, user }) => {
    const input = uploadInput.parse(await readJson(req));
    return Response.json(await startUpload(em, studio, user, input), { status: 201 });
  },
  { can: "photo.upload" },
);
