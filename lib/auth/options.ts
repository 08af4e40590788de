import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import bcrypt from "bcryptjs";
import { z } from "zod";
import { type User, UserSchema } from "@/entities/user";
import { getEm } from "@/lib/db";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail";
import { undertoneAdapter } from "./adapter";
import { clearEmail } from "./rate-limit";
import { signInMail } from "./sign-in-mail";

const credentials = z.object({ email: z.string().trim().toLowerCase().email(), password: z.string().min(1).max(200) });

/** The address next-auth builds its links from; the app's own address when it is not set. */
const authUrl = process.env.NEXTAUTH_URL ?? env.APP_URL;

export const authOptions: NextAuthOptions = {
  adapter: undertoneAdapter(),
  secret: env.NEXTAUTH_SECRET,
  // Served over https: cookies are Secure and __Secure-/__Host- prefixed (next-auth's default for
  // an https NEXTAUTH_URL, stated here so it does not depend on which variable is set).
  useSecureCookies: authUrl.startsWith("https://"),
  session: { strategy: "jwt", maxAge: 30 * 24 * 60 * 60 },
  pages: { signIn: "/signin", verifyRequest: "/signin/check-mail", error: "/signin" },
  providers: [
    CredentialsProvider({
      id: "password",
      name: "E-mail and password",
      credentials: { email: { type: "email" }, password: { type: "password" } },
      async authorize(raw) {
        const parsed = credentials.safeParse(raw);
        if (!parsed.success) return null;
        const em = await getEm();
        const user = await em.findOne(UserSchema, { email: parsed.data.email });
        if (!user?.passwordHash) return null;
        const ok = await bcrypt.compare(parsed.data.password, user.passwordHash);
        return ok ? { id: user.id, email: user.email, name: user.name } : null;
      },
    }),
    EmailProvider({
      server: env.SMTP_URL,
      from: env.MAIL_FROM,
      maxAge: 24 * 60 * 60,
      async sendVerificationRequest({ identifier, url }) {
        await sendMail({ to: identifier, ...signInMail(url) });
      },
    }),
  ],
  events: {
    // Someone who just signed in is not being guessed at: their own rate-limit counters start again.
    async signIn({ user }) {
      await clearEmail(user.email).catch((e) => console.error("rate limit: could not clear counters", e));
    },
  },
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.uid = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user && typeof token.uid === "string") session.user.id = token.uid;
      return session;
    },
    // next-auth's default throws on a callbackUrl that is not a URL (a 500 for a crafted form):
    // same rule (a path here, or an address on this site), anything else goes home.
    async redirect({ url, baseUrl }) {
      if (url.startsWith("/")) return `${baseUrl}${url}`;
      try {
        if (new URL(url).origin === baseUrl) return url;
      } catch {
        // not a URL at all
      }
      return baseUrl;
    },
  },
};
