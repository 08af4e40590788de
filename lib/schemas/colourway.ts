import { z } from "zod";

export const colourwayInput = z.object({
  trialId: z.string().uuid("Choose the trial whose result becomes the colourway."),
  readingId: z.string().uuid("Choose the reading that is the colourway's target colour."),
  name: z.string().trim().min(2, "Give the colourway a name of at least 2 characters.").max(120, "Keep the name under 120 characters."),
  description: z.string().trim().max(2000, "Keep the description under 2000 characters.").default(""),
});

export const colourwayPatch = z.object({
  version: z.number({ message: "Send the version you last saw." }).int().positive(),
  name: colourwayInput.shape.name.optional(),
  description: colourwayInput.shape.description.optional(),
  status: z.enum(["candidate", "repeatable", "retired"], { message: "Status is candidate, repeatable or retired." }).optional(),
});

export const lotInput = z.object({
  trialId: z.string().uuid("Choose the trial that dyed this lot."),
  code: z.string().trim().min(1, "Give the lot a code, e.g. 2026-12-A.").max(40, "Keep the lot code under 40 characters."),
  skeins: z.number({ message: "Enter how many skeins are in the lot." }).int("Whole skeins only.").min(1, "At least one skein.").max(500, "At most 500 skeins in one lot."),
  fibreWeightG: z.number({ message: "Enter the weighed dry fibre weight in grams." }).positive("The fibre weight must be above 0 g.").max(100_000, "Above 100 kg is not a studio lot."),
  readingId: z.string().uuid("That reading is not valid.").nullish(),
  notes: z.string().max(2000).default(""),
});

export const recipeQuery = z.object({
  weight: z.coerce.number({ message: "Give the lot's fibre weight in grams." }).positive("The fibre weight must be above 0 g.").max(100_000),
});

export const colourSearchQuery = z
  .object({
    L: z.coerce.number().min(0).max(100).optional(),
    a: z.coerce.number().min(-128).max(127).optional(),
    b: z.coerce.number().min(-128).max(127).optional(),
    hex: z.string().regex(/^#?[0-9a-fA-F]{6}$/, "A colour like #3a6b8c.").optional(),
    limit: z.coerce.number().int().min(1).max(50).default(10),
  })
  .refine((q) => q.hex || (q.L !== undefined && q.a !== undefined && q.b !== undefined), {
    message: "Give a colour: L, a and b, or a hex value.",
    path: ["hex"],
  });

export type ColourwayInput = z.infer<typeof colourwayInput>;
export type ColourwayPatch = z.infer<typeof colourwayPatch>;
export type LotInput = z.infer<typeof lotInput>;
