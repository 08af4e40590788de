import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";
import { contentSecurityPolicy, newNonce } from "@/lib/security/csp";

// Two jobs: every response gets the Content-Security-Policy with a fresh nonce (lib/security/csp.ts;
// Next reads the policy from the request and puts the nonce on its own scripts), and signed-out
// visitors are sent to sign-in. Every page and route still checks the session and studio role
// on the server itself. The fixed security headers are in next.config.mjs.
//
// The API does not come through here (see the matcher): its answers are JSON (and two small
// HTML forms) that run no script, so next.config.mjs gives them a fixed policy that allows no
// script at all, and every API request is spared this step (about half the cost of a cheap
// request, measured with npm run load).
const PUBLIC = ["/signin", "/invite", "/_next", "/favicon", "/fonts", "/unsubscribe"];

export function proxy(req: NextRequest) {
  // Read per request: the settings of the running server, not of the build.
  const appUrl = process.env.NEXTAUTH_URL ?? env.APP_URL;
  const csp = contentSecurityPolicy({
    nonce: newNonce(),
    s3Endpoint: process.env.S3_ENDPOINT ?? env.S3_ENDPOINT,
    appUrl,
    development: process.env.NODE_ENV === "development",
  });
  const res = route(req, csp);
  res.headers.set("Content-Security-Policy", csp);
  // Only meaningful (and only honoured by browsers) over https.
  if (appUrl?.startsWith("https://")) res.headers.set("Strict-Transport-Security", "max-age=31536000; includeSubDomains");
  return res;
}

function route(req: NextRequest, csp: string): NextResponse {
  const { pathname, search } = req.nextUrl;
  const signedIn =
    req.cookies.has("next-auth.session-token") || req.cookies.has("__Secure-next-auth.session-token");
  if (signedIn || PUBLIC.some((p) => pathname.startsWith(p))) {
    const headers = new Headers(req.headers);
    headers.set("Content-Security-Policy", csp);
    return NextResponse.next({ request: { headers } });
  }
  const url = req.nextUrl.clone();
  url.pathname = "/signin";
  url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
  return NextResponse.redirect(url);
}

export const config = { matcher: ["/((?!api/|_next/static|_next/image|.*\\.(?:png|svg|ico|woff2)$).*)"] };
