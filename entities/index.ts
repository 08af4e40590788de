// Every entity, listed by hand (the production build gives no file access for discovery).
import { InvitationSchema, MembershipSchema, StudioSchema } from "./studio";
import { UserSchema, VerificationTokenSchema } from "./user";

export const entities = [UserSchema, VerificationTokenSchema, StudioSchema, MembershipSchema, InvitationSchema];

export * from "./base";
export * from "./studio";
export * from "./user";
