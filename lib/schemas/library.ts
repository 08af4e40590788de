import { z } from "zod";
import type { DyeClass, Fibre, WeightClass } from "@/entities/library";

// Input for the studio's libraries (yarn bases, dyes, stock solutions), shared by the client
// forms (zodResolver) and the route handlers. No defaults inside the shapes: a PATCH is the same
// shape made partial, and a default there would overwrite a field the caller did not send.

// The option lists repeat the entity's (entities/ pulls the ORM into a client bundle); the
// `satisfies` lines below fail to compile when the two drift apart.
export const FIBRE_OPTIONS = [
  "wool", "superwash wool", "merino", "nylon", "silk", "mohair", "alpaca", "cashmere", "yak",
  "cotton", "linen", "viscose", "bamboo", "acrylic", "polyester", "other",
] as const satisfies readonly Fibre[];
export const WEIGHT_CLASS_OPTIONS = ["lace", "fingering", "sport", "dk", "worsted", "aran", "bulky", "other"] as const satisfies readonly WeightClass[];
export const DYE_CLASS_OPTIONS = ["acid", "food", "reactive", "other"] as const satisfies readonly DyeClass[];
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : never) : never;
const _sameLists: [Same<(typeof FIBRE_OPTIONS)[number], Fibre>, Same<(typeof WEIGHT_CLASS_OPTIONS)[number], WeightClass>, Same<(typeof DYE_CLASS_OPTIONS)[number], DyeClass>] = [true, true, true];
void _sameLists;

export const DYE_CLASS_LABELS: Record<DyeClass, string> = {
  acid: "Acid",
  food: "Food colouring",
  reactive: "Fibre-reactive",
  other: "Other",
};
export const WEIGHT_CLASS_LABELS: Record<WeightClass, string> = {
  lace: "Lace", fingering: "Fingering", sport: "Sport", dk: "DK", worsted: "Worsted", aran: "Aran", bulky: "Bulky", other: "Other",
};
export const STOCK_DEFINITION_LABELS = { "to-volume": "made up to volume", "in-water": "in water" } as const;

const name = z
  .string({ message: "Give it a name." })
  .trim()
  .min(1, "Give it a name.")
  .max(120, "Keep the name under 120 characters.");
const notes = z.string({ message: "Notes must be text." }).max(4000, "Keep notes under 4000 characters.");
const version = z.number({ message: "Send the version you last saw." }).int().min(1, "Send the version you last saw.");
/** Optional text: blank means "none" (null); absent means "unchanged". */
const optionalText = (max: number, check?: { test: (s: string) => boolean; message: string }) =>
  z
    .string({ message: "Must be text." })
    .trim()
    .max(max, `Keep it under ${max} characters.`)
    .refine((s) => !s || !check || check.test(s), check?.message ?? "")
    .transform((s) => (s ? s : null))
    .nullable();

/* ---------- yarn bases ---------- */

export const fibrePart = z.object({
  fibre: z.enum(FIBRE_OPTIONS, { message: "Choose a fibre from the list." }),
  pct: z
    .number({ message: "Enter a percentage." })
    .gt(0, "Each fibre needs more than 0 %.")
    .max(100, "No fibre can be more than 100 %."),
});

/** Sum to within a hundredth of a percent, so 33.33 + 33.33 + 33.34 passes. */
export function fibreTotal(fibres: { pct: number }[]): number {
  return Math.round(fibres.reduce((s, f) => s + (Number.isFinite(f.pct) ? f.pct : 0), 0) * 100) / 100;
}

const fibres = z
  .array(fibrePart, { message: "List the fibres." })
  .min(1, "Add at least one fibre.")
  .max(8, "Eight fibres at most.")
  .superRefine((list, ctx) => {
    const total = fibreTotal(list);
    if (list.every((f) => Number.isFinite(f.pct)) && total !== 100) {
      ctx.addIssue({ code: "custom", message: `The fibres add up to ${total} %; they must make exactly 100 %.` });
    }
    const seen = new Set<string>();
    for (const f of list) {
      if (seen.has(f.fibre)) ctx.addIssue({ code: "custom", message: `${f.fibre} is listed twice; put its share in one row.` });
      seen.add(f.fibre);
    }
  });

const baseShape = z.object({
  name,
  fibres,
  superwash: z.boolean({ message: "Say whether the base is superwash." }),
  weightClass: z.enum(WEIGHT_CLASS_OPTIONS, { message: "Choose a weight class." }),
  metresPer100g: z
    .number({ message: "Enter metres per 100 g as a number, or leave it empty." })
    .gt(0, "Metres per 100 g must be more than 0.")
    .max(5000, "More than 5000 m per 100 g is not a yarn we know.")
    .nullable(),
  notes,
});

export const baseInput = baseShape.extend({
  superwash: baseShape.shape.superwash.optional(),
  metresPer100g: baseShape.shape.metresPer100g.optional(),
  notes: notes.optional(),
});
export const basePatch = baseShape.partial().extend({ version });

/* ---------- dyes ---------- */

const HTTP_URL = (s: string) => {
  try {
    const u = new URL(s);
    return (u.protocol === "http:" || u.protocol === "https:") && !!u.hostname;
  } catch {
    return false;
  }
};

const dyeShape = z.object({
  name,
  dyeClass: z.enum(DYE_CLASS_OPTIONS, { message: "Choose acid, food colouring, fibre-reactive or other." }),
  form: z.enum(["powder", "liquid"], { message: "Choose powder or liquid." }),
  // A Colour Index generic name is a class, a hue and a number ("Acid Red 1"); "C.I." is optional.
  colourIndexName: optionalText(60, {
    test: (s) => /^(C\.?\s?I\.?\s+)?[A-Za-z]+(\s[A-Za-z]+)?\s\d{1,4}(:\d{1,2})?$/.test(s),
    message: "Write a Colour Index generic name: class, hue and number, like “Acid Red 1”.",
  }),
  sdsUrl: optionalText(500, { test: HTTP_URL, message: "Paste the safety sheet's web address, starting with https://." }),
  displayHex: z
    .string({ message: "Pick a display colour." })
    .regex(/^#[0-9a-fA-F]{6}$/, "Pick a display colour as #rrggbb.")
    .transform((s) => s.toLowerCase())
    .nullable(),
  notes,
});

export const dyeInput = dyeShape.extend({
  colourIndexName: dyeShape.shape.colourIndexName.optional(),
  sdsUrl: dyeShape.shape.sdsUrl.optional(),
  displayHex: dyeShape.shape.displayHex.optional(),
  notes: notes.optional(),
});
export const dyePatch = dyeShape.partial().extend({ version });

/* ---------- stock solutions ---------- */

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;
function isRealDay(s: string): boolean {
  if (!ISO_DAY.test(s)) return false;
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

const stockShape = z.object({
  dyeId: z.string({ message: "Choose the dye." }).uuid("Choose the dye from the library."),
  concentrationPct: z
    .number({ message: "Enter the concentration in %." })
    .gt(0, "The concentration must be more than 0 %.")
    .max(25, "Above 25 % is not a stock solution; check the number."),
  definition: z.enum(["to-volume", "in-water"], { message: "Choose “made up to volume” or “in water”." }),
  volumeMl: z
    .number({ message: "Enter the volume in ml." })
    .gt(0, "The volume must be more than 0 ml.")
    .max(50_000, "More than 50 litres is not a stock jar; check the number."),
  mixedOn: z
    .string({ message: "Enter the day it was mixed." })
    .refine(isRealDay, "Enter the day it was mixed as a date.")
    // A day of slack for time zones: "today" somewhere may be tomorrow in UTC.
    .refine((s) => !isRealDay(s) || new Date(`${s}T00:00:00Z`).getTime() <= Date.now() + 86_400_000, "The mixing day cannot be in the future."),
  powderLot: z.string({ message: "The powder lot must be text." }).trim().max(60, "Keep the lot under 60 characters."),
  notes,
});

export const stockInput = stockShape.extend({
  powderLot: stockShape.shape.powderLot.optional(),
  notes: notes.optional(),
});
export const stockPatch = stockShape.partial().extend({ version });

/* ---------- list queries (GET …?q=&sort=&dir=) ---------- */

const flag = z.enum(["true", "false"], { message: "Use true or false." }).transform((s) => s === "true");
const dir = z.enum(["asc", "desc"], { message: "Use asc or desc." }).optional();
// A NUL cannot go into a PostgreSQL text parameter: refused here instead of failing in the query.
const q = z.string().trim().max(120, "Keep the search under 120 characters.").refine((s) => !s.includes("\u0000"), "Remove the NUL character from the search.").optional();

export const baseListQuery = z.object({
  q,
  fibre: z.enum(FIBRE_OPTIONS, { message: "Choose a fibre from the list." }).optional(),
  superwash: flag.optional(),
  weightClass: z.enum(WEIGHT_CLASS_OPTIONS, { message: "Choose a weight class." }).optional(),
  archived: flag.optional(),
  sort: z.enum(["name", "weightClass", "metres", "created"], { message: "Sort by name, weightClass, metres or created." }).optional(),
  dir,
});

export const dyeListQuery = z.object({
  q,
  dyeClass: z.enum(DYE_CLASS_OPTIONS, { message: "Choose acid, food, reactive or other." }).optional(),
  form: z.enum(["powder", "liquid"], { message: "Choose powder or liquid." }).optional(),
  archived: flag.optional(),
  sort: z.enum(["name", "dyeClass", "created"], { message: "Sort by name, dyeClass or created." }).optional(),
  dir,
});

export const stockListQuery = z.object({
  q,
  dyeId: z.string().uuid("Choose a dye from the library.").optional(),
  definition: z.enum(["to-volume", "in-water"], { message: "Choose to-volume or in-water." }).optional(),
  pastShelfLife: flag.optional(),
  archived: flag.optional(),
  sort: z.enum(["mixedOn", "dye", "concentration", "volume"], { message: "Sort by mixedOn, dye, concentration or volume." }).optional(),
  dir,
});

export type FibrePartInput = z.infer<typeof fibrePart>;
export type BaseInput = z.infer<typeof baseInput>;
export type BaseFormValues = z.input<typeof baseInput>;
export type BasePatch = z.infer<typeof basePatch>;
export type DyeInput = z.infer<typeof dyeInput>;
export type DyeFormValues = z.input<typeof dyeInput>;
export type DyePatch = z.infer<typeof dyePatch>;
export type StockInput = z.infer<typeof stockInput>;
export type StockFormValues = z.input<typeof stockInput>;
export type StockPatch = z.infer<typeof stockPatch>;
export type BaseListQuery = z.infer<typeof baseListQuery>;
export type DyeListQuery = z.infer<typeof dyeListQuery>;
export type StockListQuery = z.infer<typeof stockListQuery>;
