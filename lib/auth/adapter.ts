import "server-only";
import type { Adapter, AdapterUser, VerificationToken as AdapterToken } from "next-auth/adapters";
import { type User, UserSchema, VerificationTokenSchema } from "@/entities/user";
import { getEm } from "@/lib/db";

// A small next-auth adapter over our own entities. Sessions are JWTs, so only the user and
// verification-token methods are used (e-mail links); OAuth accounts are not supported.
function toAdapterUser(u: User): AdapterUser {
  return { id: u.id, email: u.email, name: u.name, emailVerified: u.emailVerified ?? null };
}

export function undertoneAdapter(): Adapter {
  return {
    async createUser(data: Omit<AdapterUser, "id">) {
      const em = await getEm();
      const email = data.email.trim().toLowerCase();
      const user = em.create(UserSchema, {
        email,
        name: data.name?.trim() || email.split("@")[0],
        emailVerified: data.emailVerified ?? null,
      });
      await em.flush();
      return toAdapterUser(user);
    },
    async getUser(id) {
      const em = await getEm();
      const u = await em.findOne(UserSchema, { id });
      return u ? toAdapterUser(u) : null;
    },
    async getUserByEmail(email) {
      const em = await getEm();
      const u = await em.findOne(UserSchema, { email: email.trim().toLowerCase() });
      return u ? toAdapterUser(u) : null;
    },
    async getUserByAccount() {
      return null;
    },
    async updateUser(data) {
      const em = await getEm();
      const u = await em.findOneOrFail(UserSchema, { id: data.id });
      if (data.name) u.name = data.name;
      if (data.emailVerified !== undefined) u.emailVerified = data.emailVerified;
      await em.flush();
      return toAdapterUser(u);
    },
    async linkAccount() {
      throw new Error("Only e-mail and password sign-in are supported.");
    },
    async createVerificationToken(token) {
      const em = await getEm();
      em.create(VerificationTokenSchema, { ...token, identifier: token.identifier.toLowerCase() });
      await em.flush();
      return token;
    },
    async useVerificationToken({ identifier, token }) {
      const em = await getEm();
      const found = await em.findOne(VerificationTokenSchema, {
        identifier: identifier.toLowerCase(),
        token,
      });
      if (!found) return null;
      const copy = { ...found };
      await em.remove(found).flush();
      return copy;
    },
  };
}
