import { NextResponse, type NextRequest } from "next/server";

// Only redirects signed-out visitors to sign-in; every page and route checks the session and
// studio role on the server itself.
const PUBLIC = ["/signin", "/invite", "/api", "/_next", "/favicon", "/fonts", "/unsubscribe"];

export function proxy(req: NextRequest) {
  const { pathname, search } = req.nextUrl;
  if (PUBLIC.some((p) => pathname.startsWith(p))) return NextResponse.next();
  const signedIn =
    req.cookies.has("next-auth.session-token") || req.cookies.has("__Secure-next-auth.session-token");
  if (signedIn) return NextResponse.next();
  const url = req.nextUrl.clone();
  url.pathname = "/signin";
  url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
  return NextResponse.redirect(url);
}

export const config = { matcher: ["/((?!_next/static|_next/image|.*\\.(?:png|svg|ico|woff2)$).*)"] };
