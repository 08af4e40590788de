// Readings written straight through the ORM (with the photo row they hang on), for tests of what
// is computed from readings. The photo pipeline itself is tested in photos.test.ts.
import type { Lab } from "@/colour/types";
import { PhotoSchema, ReadingSchema, type PhotoKind } from "@/entities";
import { getEm } from "@/lib/db";

export async function makeReading(
  studioId: string,
  trialId: string,
  userId: string,
  lab: Lab,
  opts: { kind?: PhotoKind; layerId?: string | null } = {},
): Promise<string> {
  const em = await getEm();
  const photo = em.create(PhotoSchema, {
    studio: studioId,
    trial: trialId,
    layer: opts.layerId ?? null,
    kind: opts.kind ?? (opts.layerId ? "after-layer" : "base"),
    uploadedBy: userId,
    status: "ready",
    uploadKey: "test/none",
  });
  const r = em.create(ReadingSchema, {
    studio: studioId,
    trial: trialId,
    layer: opts.layerId ?? null,
    photo,
    modelVersion: 1,
    region: { x: 0, y: 0, width: 10, height: 10 },
    ...lab,
    palette: [{ ...lab, share: 1 }],
    createdBy: userId,
  });
  await em.flush();
  return r.id;
}
