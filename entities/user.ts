import { EntitySchema, type Opt } from "@mikro-orm/core";
import { baseProperties, type Base } from "./base";

export type UnitSystem = "metric" | "us";
export type TemperatureUnit = "C" | "F";

export interface User extends Base {
  email: string;
  name: string;
  passwordHash?: string | null;
  emailVerified?: Date | null;
  unitSystem: UnitSystem & Opt;
  temperatureUnit: TemperatureUnit & Opt;
  mailEnabled: boolean & Opt;
}

export const UserSchema = new EntitySchema<User>({
  name: "User",
  tableName: "users",
  properties: {
    ...baseProperties,
    email: { type: "string", length: 254, unique: true },
    name: { type: "string", length: 120 },
    passwordHash: { type: "string", nullable: true, hidden: true },
    emailVerified: { type: "datetime", nullable: true },
    unitSystem: { type: "string", length: 8, default: "metric" },
    temperatureUnit: { type: "string", length: 1, default: "C" },
    mailEnabled: { type: "boolean", default: true },
  },
});

/** One-time sign-in tokens for e-mail links (next-auth's verification tokens), stored hashed by next-auth. */
export interface VerificationToken {
  identifier: string;
  token: string;
  expires: Date;
}

export const VerificationTokenSchema = new EntitySchema<VerificationToken>({
  name: "VerificationToken",
  tableName: "verification_tokens",
  properties: {
    identifier: { type: "string", length: 254, primary: true },
    token: { type: "string", length: 255, primary: true },
    expires: { type: "datetime" },
  },
});
