import { z } from "zod";

export const roleInput = z.enum(["owner", "dyer", "guest"], { message: "Choose owner, dyer or guest." });

export const studioInput = z.object({
  name: z.string().trim().min(2, "Give the studio a name of at least 2 characters.").max(120, "Keep the name under 120 characters."),
});

export const studioSettingsInput = studioInput.partial().extend({
  lotTolerance: z.number().min(0.2, "Tolerance must be at least 0.2.").max(10, "Tolerance above 10 would pass almost anything.").optional(),
  lotsForRepeatable: z.number().int().min(1, "At least one passing lot.").max(20, "At most 20 lots.").optional(),
  stockShelfLifeDays: z.number().int().min(1).max(730, "Two years is the longest shelf life we track.").optional(),
});

export const memberRoleInput = z.object({ role: roleInput });

export const invitationInput = z.object({
  email: z.string().trim().toLowerCase().email("Enter an e-mail address like name@example.com.").max(254),
  role: roleInput,
});

export const accountInput = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(120).optional(),
  unitSystem: z.enum(["metric", "us"], { message: "Choose metric or US kitchen measures." }).optional(),
  temperatureUnit: z.enum(["C", "F"], { message: "Choose °C or °F." }).optional(),
  mailEnabled: z.boolean().optional(),
});

export type StudioInput = z.infer<typeof studioInput>;
export type InvitationInput = z.infer<typeof invitationInput>;
export type AccountInput = z.infer<typeof accountInput>;
