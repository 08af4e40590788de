// GET|POST /api/auth/* – next-auth: password and e-mail link sign-in. Password attempts
// (POST callback/password) and link requests (POST signin/email) are rate-limited first: 429.
import NextAuth from "next-auth";
import { clientIp, type LimitKind, normalEmail, refundAddress, takeAttempt, tooManyAttempts } from "@/lib/auth/rate-limit";
import { authOptions } from "@/lib/auth/options";
import { readBodyText } from "@/lib/auth/with-studio";
import { env } from "@/lib/env";
import { toErrorResponse } from "@/lib/errors";

const handler = NextAuth(authOptions);
type Ctx = { params: Promise<{ nextauth: string[] }> };

const LIMITED: Record<string, LimitKind> = { "callback/password": "password", "signin/email": "link" };

export { handler as GET };

export async function POST(req: Request, ctx: Ctx): Promise<Response> {
  const kind = LIMITED[(await ctx.params).nextauth.join("/")];
  if (!kind) return handler(req, ctx);
  const ip = clientIp(req.headers);
  let email: string | null;
  try {
    email = await emailOf(req);
  } catch (e) {
    return toErrorResponse(e); // a sign-in form of more than 64 kB: 413
  }
  const refusal = await takeAttempt(kind, { ip, email });
  if (refusal) return tooManyAttempts(refusal, env.APP_URL);
  const res: Response = await handler(req, ctx);
  // A password that worked is not a guess: give the attempt back to the client address.
  if (kind === "password" && signedIn(res)) await refundAddress(kind, ip);
  return res;
}

/** Far more than an e-mail, a password and next-auth's fields. */
const SIGN_IN_BODY_BYTES = 64_000;

/** The e-mail in the sign-in form (next-auth reads forms and JSON alike). */
async function emailOf(req: Request): Promise<string | null> {
  const text = await readBodyText(req.clone(), SIGN_IN_BODY_BYTES);
  if (!(req.headers.get("content-type") ?? "").includes("application/json")) return normalEmail(new URLSearchParams(text).get("email"));
  try {
    const body: unknown = JSON.parse(text);
    const email = body && typeof body === "object" ? (body as { email?: unknown }).email : null;
    return normalEmail(typeof email === "string" ? email : null);
  } catch {
    return null;
  }
}

function signedIn(res: Response): boolean {
  return res.headers.getSetCookie().some((c) => /^(__Secure-)?next-auth\.session-token=[^;]/.test(c));
}
