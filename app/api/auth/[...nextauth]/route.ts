// GET|POST /api/auth/* – next-auth: password and e-mail link sign-in
import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";

const handler = NextAuth(authOptions);
export { handler as GET, handler as POST };
