// Every entity, listed by hand (the production build gives no file access for discovery).
import { InvitationSchema, MembershipSchema, StudioSchema } from "./studio";
import { UserSchema, VerificationTokenSchema } from "./user";
import { DyeSchema, StockSolutionSchema, YarnBaseSchema } from "./library";
import { LayerSchema, StepTimerSchema, TrialSchema } from "./trial";
import { PhotoSchema, ReadingSchema, ReferenceCardSchema } from "./photo";
import { ActivityEventSchema, CommentSchema, FollowSchema, MailOutboxSchema, NotificationSchema } from "./comment";
import { ColourwaySchema, DyeLotSchema, DyeProfileSchema, LayerPredictionSchema } from "./colourway";
import { RateLimitSchema } from "./security";

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
  PhotoSchema,
  ReferenceCardSchema,
  ReadingSchema,
  CommentSchema,
  NotificationSchema,
  FollowSchema,
  ActivityEventSchema,
  MailOutboxSchema,
  DyeProfileSchema,
  LayerPredictionSchema,
  ColourwaySchema,
  DyeLotSchema,
  RateLimitSchema,
];

export * from "./base";
export * from "./studio";
export * from "./user";
export * from "./library";
export * from "./trial";
export * from "./photo";
export * from "./comment";
export * from "./colourway";
export * from "./security";
