import { z } from "zod";
import { notesDoc } from "./notes";

// Trials and their layers: one zod module shared by the forms (zodResolver) and the route handlers.
// Messages say what to type, in the words a dyer uses at the dye table.

export const TRIAL_STATUSES = ["planned", "in-progress", "done"] as const;
export const LAYER_METHODS = ["immersion", "kettle", "dip", "hand-paint", "speckle", "dry", "other"] as const;
export const AMOUNT_UNITS = ["dos", "ml", "g", "tsp", "tbsp", "cup", "floz"] as const;
/** Units that are volumes of a stock solution (so they need the stock's strength). */
export const VOLUME_UNITS: readonly AmountUnit[] = ["ml", "tsp", "tbsp", "cup", "floz"];
export const ACID_KINDS = ["vinegar", "citric", "none"] as const;
export const SETTING_METHODS = ["simmer", "steam", "microwave", "none"] as const;

export type TrialStatus = (typeof TRIAL_STATUSES)[number];
export type LayerMethod = (typeof LAYER_METHODS)[number];
export type AmountUnit = (typeof AMOUNT_UNITS)[number];

export const STATUS_LABELS: Record<TrialStatus, string> = { planned: "Planned", "in-progress": "In progress", done: "Done" };
export const METHOD_LABELS: Record<LayerMethod, string> = {
  immersion: "Immersion",
  kettle: "Kettle / low-water",
  dip: "Dip / gradient",
  "hand-paint": "Hand-paint",
  speckle: "Speckle",
  dry: "Dry application",
  other: "Other",
};

/** The most depth of shade we accept: 20 % owf is far beyond any black. */
export const MAX_DOS_PCT = 20;

const uuid = (message: string) => z.string({ message }).uuid(message);
const num = (message: string) => z.number({ message }).refine(Number.isFinite, message);

const title = z
  .string({ message: "Give the trial a title, e.g. “Moss dip, second try”." })
  .trim()
  .min(1, "Give the trial a title, e.g. “Moss dip, second try”.")
  .max(160, "Keep the title under 160 characters.");
const baseId = uuid("Choose a base from the library, or none.").nullable();
const fibreWeightG = num("Enter the dry fibre weight in grams, e.g. 100.")
  .refine((v) => v > 0, "Enter the dry fibre weight in grams, e.g. 100: it must be more than zero.")
  .refine((v) => v <= 20_000, "Enter the dry fibre weight in grams, at most 20 000 g (20 kg).");
const status = z.enum(TRIAL_STATUSES, { message: "Choose planned, in progress or done." });
const tags = z
  .array(
    z.string({ message: "A tag is a short word, e.g. “speckle”." }).trim().min(1, "Remove the empty tag.").max(40, "Keep each tag under 40 characters."),
    { message: "Tags are a list of short words." },
  )
  .max(20, "Use at most 20 tags.");
/** Rich notes: the notes editor's JSON document, checked against what that editor makes (notes.ts). */
const notes = notesDoc.nullable();
const version = z.number({ message: "Reload the trial: the saved version is missing." }).int("Reload the trial: the saved version is not valid.");

export const trialInput = z.object({
  title,
  baseId: baseId.optional(),
  fibreWeightG,
  status: status.optional(),
  tags: tags.optional(),
  notes: notes.optional(),
});

export const trialPatch = z.object({
  version,
  title: title.optional(),
  baseId: baseId.optional(),
  fibreWeightG: fibreWeightG.optional(),
  status: status.optional(),
  tags: tags.optional(),
  notes: notes.optional(),
});

export const copyInput = z.object({
  title: title.optional(),
  baseId: baseId.optional(),
  fibreWeightG: fibreWeightG.optional(),
});

const amount = z.object(
  {
    value: num("Enter the amount as a number, e.g. 2.5.").refine((v) => v >= 0, "An amount is zero or more.").refine((v) => v <= 20_000, "That amount is too large: check the unit."),
    unit: z.enum(AMOUNT_UNITS, { message: "Choose a unit: DOS %, ml, g, tsp, tbsp, cup or fl oz." }),
  },
  { message: "Enter the amount and its unit." },
);

export const layerDyeInput = z
  .object(
    {
      dyeId: uuid("Choose a dye from the library."),
      stockId: uuid("Choose a stock solution from the library, or none for powder.").nullable().optional(),
      amount,
    },
    { message: "Each dye needs a dye and an amount." },
  )
  .superRefine((d, ctx) => {
    if (d.amount.unit === "dos" && d.amount.value > MAX_DOS_PCT) {
      ctx.addIssue({ code: "custom", path: ["amount", "value"], message: `Depth of shade runs from 0 to ${MAX_DOS_PCT} %; 1 % is a medium shade.` });
    }
    if ((VOLUME_UNITS as readonly string[]).includes(d.amount.unit) && !d.stockId) {
      ctx.addIssue({
        code: "custom",
        path: ["stockId"],
        message: "Choose the stock solution you measured from: ml, tsp, tbsp, cup and fl oz are volumes of stock.",
      });
    }
  });

const acid = z.object(
  {
    kind: z.enum(ACID_KINDS, { message: "Choose vinegar, citric acid or none." }),
    amount: num("Enter the acid amount: ml of vinegar or g of citric acid.")
      .refine((v) => v >= 0 && v <= 10_000, "Enter the acid amount between 0 and 10 000 (ml of vinegar or g of citric acid).")
      .nullable()
      .optional(),
    ph: num("Enter the measured pH as a number, e.g. 4.5.").refine((v) => v >= 0 && v <= 14, "pH runs from 0 to 14; an acid dye bath is usually 4–6.").nullable().optional(),
  },
  { message: "Describe the acid: vinegar, citric acid or none." },
);

const setting = z.object(
  {
    method: z.enum(SETTING_METHODS, { message: "Choose simmer, steam, microwave or none." }),
    minutes: num("Enter the setting time in minutes, e.g. 20.").refine((v) => v >= 0 && v <= 600, "Enter the setting time in minutes, from 0 to 600.").nullable().optional(),
  },
  { message: "Describe the setting step: simmer, steam, microwave or none." },
);

const gradient = z
  .object(
    {
      sections: z.number({ message: "Enter how many sections were dipped, e.g. 4." }).int("Sections are a whole number, e.g. 4.").min(2, "A gradient has at least 2 sections.").max(12, "Use at most 12 sections."),
      depths: z.array(num("Each depth is a share from 0 to 1.").refine((v) => v >= 0 && v <= 1, "Each section's depth is a share from 0 (undyed) to 1 (full).")),
    },
    { message: "Describe the gradient: sections and a depth for each." },
  )
  .refine((g) => g.depths.length === g.sections, { path: ["depths"], message: "Give one depth for each section." });

// Without defaults, so a partial layer (PATCH) only carries what was sent; lib/trials fills defaults on create.
const layerShape = {
  method: z.enum(LAYER_METHODS, { message: "Choose how the dye goes on: immersion, kettle, dip, hand-paint, speckle, dry application or other." }),
  dyes: z.array(layerDyeInput, { message: "Dyes are a list." }).max(12, "Use at most 12 dyes in one layer."),
  acid,
  waterL: num("Enter the water in litres, e.g. 4.").refine((v) => v > 0 && v <= 500, "Enter the water in litres, more than 0 and at most 500.").nullable(),
  temperatureC: num("Enter the temperature in °C, e.g. 90.").refine((v) => v >= -10 && v <= 130, "Enter a temperature from −10 to 130 °C (steam is about 100 °C).").nullable(),
  minutes: num("Enter the time in minutes, e.g. 30.").refine((v) => v >= 0 && v <= 1440, "Enter the time in minutes, from 0 to 1440 (a day).").nullable(),
  setting,
  rinseNote: z.string({ message: "The rinse note is text." }).max(2000, "Keep the rinse note under 2000 characters."),
  bled: z.boolean({ message: "Say whether the rinse water bled: yes or no." }).nullable(),
  coverage: num("Enter the coverage as a share, e.g. 0.15.").refine((v) => v >= 0 && v <= 1, "Coverage is a share from 0 (none) to 1 (all the fibre), e.g. 0.15 for a light speckle.").nullable(),
  gradient: gradient.nullable(),
  observations: z.string({ message: "Observations are text." }).max(5000, "Keep the observations under 5000 characters."),
};

export const layerInput = z.object({
  method: layerShape.method,
  dyes: layerShape.dyes.optional(),
  acid: layerShape.acid.optional(),
  waterL: layerShape.waterL.optional(),
  temperatureC: layerShape.temperatureC.optional(),
  minutes: layerShape.minutes.optional(),
  setting: layerShape.setting.optional(),
  rinseNote: layerShape.rinseNote.optional(),
  bled: layerShape.bled.optional(),
  coverage: layerShape.coverage.optional(),
  gradient: layerShape.gradient.optional(),
  observations: layerShape.observations.optional(),
});

export const layerPatch = layerInput.partial().extend({ version });

export const layerOrderInput = z.object({
  layerIds: z
    .array(uuid("Each layer id must be a layer of this trial."), { message: "Send the layers in their new order." })
    .min(1, "Send the layers in their new order.")
    .refine((ids) => new Set(ids).size === ids.length, "Each layer may appear only once."),
});

/** A NUL cannot go into a PostgreSQL text parameter: refused here instead of failing in the query. */
const noNul = (s: string) => !s.includes("\u0000");
const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);
const opt = <T extends z.ZodType>(t: T) => z.preprocess(blankToUndefined, t.optional());
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the date as YYYY-MM-DD.").refine((s) => !Number.isNaN(Date.parse(s)), "That date does not exist.");

/** The trial list's search, filters, sort and page, as read from a query string. */
export const trialQuery = z.object({
  q: opt(z.string().trim().max(200, "Keep the search under 200 characters.").refine(noNul, "Remove the NUL character from the search.")),
  baseId: opt(uuid("Choose a base from the list.")),
  dyeId: opt(uuid("Choose a dye from the list.")),
  method: opt(z.enum(LAYER_METHODS, { message: "Choose a method from the list." })),
  tag: opt(z.string().trim().max(40, "Tags are under 40 characters.").refine(noNul, "Remove the NUL character from the tag.")),
  authorId: opt(uuid("Choose a person from the list.")),
  status: opt(status),
  from: opt(day),
  to: opt(day),
  sort: z.preprocess(blankToUndefined, z.enum(["updated", "created", "title"], { message: "Sort by updated, created or title." }).default("updated")),
  dir: z.preprocess(blankToUndefined, z.enum(["asc", "desc"], { message: "Sort ascending or descending." }).optional()),
  page: z.preprocess(blankToUndefined, z.coerce.number({ message: "The page is a number." }).int("The page is a whole number.").min(1, "Pages start at 1.").max(10_000, "That page is too far.").default(1)),
  pageSize: z.preprocess(blankToUndefined, z.coerce.number({ message: "The page size is a number." }).int("The page size is a whole number.").min(1, "Show at least 1 trial per page.").max(100, "Show at most 100 trials per page.").default(20)),
}).refine((v) => !v.from || !v.to || v.from <= v.to, { path: ["to"], message: "The end date comes before the start date." });

export type TrialInput = z.infer<typeof trialInput>;
export type TrialPatch = z.infer<typeof trialPatch>;
export type CopyInput = z.infer<typeof copyInput>;
export type LayerInput = z.infer<typeof layerInput>;
export type LayerPatch = z.infer<typeof layerPatch>;
export type LayerDyeInput = z.infer<typeof layerDyeInput>;
export type LayerOrderInput = z.infer<typeof layerOrderInput>;
export type TrialQuery = z.infer<typeof trialQuery>;

/** Reads the list's query string into a plain object for trialQuery. */
export function queryFromSearch(params: URLSearchParams): Record<string, string> {
  return Object.fromEntries(params.entries());
}
