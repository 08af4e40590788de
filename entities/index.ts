// Every entity, listed by hand (the production build gives no file access for discovery).
import { InvitationSchema, MembershipSchema, StudioSchema } from "./studio";
import { UserSchema, VerificationTokenSchema } from "./user";
import { DyeSchema, StockSolutionSchema, YarnBaseSchema } from "./library";
import { LayerSchema, StepTimerSchema, TrialSchema } from "./trial";

export const entities = [
  UserSchema,
  VerificationTokenSchema,
  StudioSchema,
  MembershipSchema,
  InvitationSchema,
  YarnBaseSchema,
  DyeSchema,
  StockSolutionSchema,
  TrialSchema,
  LayerSchema,
  StepTimerSchema,
];

export * from "./base";
export * from "./studio";
export * from "./user";
export * from "./library";
export * from "./trial";
