import { z } from "zod";

export const MAX_PHOTO_BYTES = 25 * 1024 * 1024;
export const ACCEPTED_PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif"] as const;

export const photoKindInput = z.enum(["base", "after-layer", "final", "before-wash", "after-wash"], {
  message: "Choose what the photo shows: base, after a layer, final, before wash or after wash.",
});

export const uploadInput = z
  .object({
    trialId: z.string().uuid("Choose the trial the photo belongs to."),
    layerId: z.string().uuid("That layer is not valid.").nullish(),
    kind: photoKindInput,
    contentType: z.enum(ACCEPTED_PHOTO_TYPES, { message: "Upload a JPEG, PNG, WebP or HEIC photo." }),
    bytes: z
      .number()
      .int()
      .positive("The file is empty.")
      .max(MAX_PHOTO_BYTES, "Photos can be at most 25 MB. Take it again at a lower resolution or share a smaller copy."),
  })
  .refine((v) => v.kind !== "after-layer" || v.layerId, {
    message: "Say which layer the photo shows.",
    path: ["layerId"],
  });

const point = z.object({ x: z.number().finite().min(0), y: z.number().finite().min(0) });
const rect = z.object({
  x: z.number().finite().min(0),
  y: z.number().finite().min(0),
  width: z.number().finite().min(4, "Mark a larger swatch area."),
  height: z.number().finite().min(4, "Mark a larger swatch area."),
});

export const readingInput = z.object({
  cardId: z.string().uuid("Choose a reference card.").nullish(),
  corners: z.array(point).length(4, "Mark all four corners of the card's patch area.").nullish(),
  regions: z
    .array(z.object({ label: z.string().trim().max(80).default(""), rect }))
    .min(1, "Mark at least one swatch area.")
    .max(8, "Mark at most eight swatch areas at a time."),
});

const patch = z.object({
  name: z.string().trim().max(40).default(""),
  L: z.number().min(0, "L* runs from 0 to 100.").max(100, "L* runs from 0 to 100."),
  a: z.number().min(-128, "a* must lie between −128 and 127.").max(127, "a* must lie between −128 and 127."),
  b: z.number().min(-128, "b* must lie between −128 and 127.").max(127, "b* must lie between −128 and 127."),
});

export const cardInput = z
  .object({
    name: z.string().trim().min(1, "Give the card a name.").max(120),
    rows: z.number().int().min(1).max(12, "At most 12 rows."),
    cols: z.number().int().min(1).max(12, "At most 12 columns."),
    patches: z.array(patch),
    measured: z.boolean().default(false),
    notes: z.string().max(2000).default(""),
  })
  .refine((c) => c.patches.length === c.rows * c.cols, {
    message: "The card needs one value for every patch (rows × columns).",
    path: ["patches"],
  });

export const cardPatch = z.object({ version: z.number().int().positive() }).and(cardInput);

export type UploadInput = z.infer<typeof uploadInput>;
export type ReadingInput = z.infer<typeof readingInput>;
export type CardInput = z.infer<typeof cardInput>;
