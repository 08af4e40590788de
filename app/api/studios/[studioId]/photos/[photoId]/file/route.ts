// GET /api/studios/:studioId/photos/:photoId/file?v=thumb|web|master – the image, to members of the studio only
import { isUuid, withStudio } from "@/lib/auth/with-studio";
import { notFound } from "@/lib/errors";
import { photoFile } from "@/lib/photos/photos";

const VARIANTS = ["thumb", "web", "master"] as const;

export const GET = withStudio<{ studioId: string; photoId: string }>(
  async ({ req, em, studio, params }) => {
    const v = new URL(req.url).searchParams.get("v") ?? "web";
    const variant = VARIANTS.find((x) => x === v);
    if (!isUuid(params.photoId) || !variant) throw notFound("This photo");
    const file = await photoFile(em, studio, params.photoId, variant);
    return new Response(new Uint8Array(file.body), {
      headers: { "content-type": file.contentType, "cache-control": "private, max-age=3600" },
    });
  },
  { can: "photo.read" },
);
