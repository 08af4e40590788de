import { EntitySchema, type Opt, type Ref } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";
import type { User } from "./user";

export const ROLES = ["owner", "dyer", "guest"] as const;
export type Role = (typeof ROLES)[number];

export interface Studio extends Base {
  name: string;
  /** CMC(2:1) tolerance for dye lots against a colourway target. */
  lotTolerance: number & Opt;
  /** Passing lots a colourway needs before an owner may mark it repeatable. */
  lotsForRepeatable: number & Opt;
  /** Days after which a stock solution gets an age warning. */
  stockShelfLifeDays: number & Opt;
}

export const StudioSchema = new EntitySchema<Studio>({
  name: "Studio",
  tableName: "studios",
  properties: {
    ...baseProperties,
    name: { type: "string", length: 120 },
    lotTolerance: { type: "double", default: 1.0 },
    lotsForRepeatable: { type: "integer", default: 2 },
    stockShelfLifeDays: { type: "integer", default: 60 },
  },
});

export interface Membership extends Base {
  studio: Ref<Studio>;
  user: Ref<User>;
  role: Role;
}

export const MembershipSchema = new EntitySchema<Membership>({
  name: "Membership",
  tableName: "memberships",
  uniques: [{ properties: ["studio", "user"] }],
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    user: { kind: "m:1", entity: "User", ref: true, deleteRule: "cascade" },
    role: { type: "string", length: 8 },
  },
});

export interface Invitation extends Base {
  studio: Ref<Studio>;
  email: string;
  role: Role;
  /** SHA-256 of the token sent by mail; the token itself is never stored. */
  tokenHash: string;
  invitedBy: Ref<User>;
  expiresAt: Date;
  acceptedAt?: Date | null;
  revokedAt?: Date | null;
}

export const InvitationSchema = new EntitySchema<Invitation>({
  name: "Invitation",
  tableName: "invitations",
  properties: {
    ...baseProperties,
    studio: { kind: "m:1", entity: "Studio", ref: true, deleteRule: "cascade" },
    email: { type: "string", length: 254 },
    role: { type: "string", length: 8 },
    tokenHash: { type: "string", length: 64, unique: true },
    invitedBy: { kind: "m:1", entity: "User", ref: true, deleteRule: "cascade" },
    expiresAt: { type: "datetime" },
    acceptedAt: { type: "datetime", nullable: true },
    revokedAt: { type: "datetime", nullable: true },
  },
});
