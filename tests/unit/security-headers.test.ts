// The security headers as configured: next.config's fixed headers for every path, the
// Content-Security-Policy that proxy.ts sets per request (with a fresh nonce handed to Next on
// the request), and next-auth's secure cookies when the app is served over https.
import { afterEach, describe, expect, it, vi } from "vitest";
import { NextRequest } from "next/server";
import nextConfig, { apiContentSecurityPolicy, securityHeaders } from "../../next.config.mjs";
import { proxy } from "@/proxy";
import { contentSecurityPolicy } from "@/lib/security/csp";

afterEach(() => {
  vi.unstubAllEnvs();
  vi.resetModules();
});

const directives = (csp: string) => new Map(csp.split("; ").map((d) => [d.split(" ")[0], d.split(" ").slice(1)] as const));

describe("fixed headers (next.config)", () => {
  it("apply to every path with the agreed values", async () => {
    const rules = await nextConfig.headers!();
    expect(rules).toEqual([
      { source: "/:path*", headers: securityHeaders },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: apiContentSecurityPolicy }] },
    ]);
    const h = Object.fromEntries(securityHeaders.map((x) => [x.key, x.value]));
    expect(h["X-Frame-Options"]).toBe("DENY");
    expect(h["X-Content-Type-Options"]).toBe("nosniff");
    expect(h["Referrer-Policy"]).toBe("strict-origin-when-cross-origin");
    expect(h["Permissions-Policy"].split(", ")).toEqual(expect.arrayContaining(["camera=(self)", "microphone=()", "geolocation=()"]));
    // The pages' policy is per request (nonce), so it must not also come from here: two
    // policies would both apply and the fixed one would block Next's scripts.
    expect(Object.keys(h)).not.toContain("Content-Security-Policy");
  });

  it("give the API a fixed policy that runs no script and cannot be framed, and keep the API out of the proxy", async () => {
    const d = directives(apiContentSecurityPolicy);
    expect(d.get("default-src")).toEqual(["'none'"]);
    expect(d.has("script-src")).toBe(false); // falls back to default-src 'none'
    expect(d.get("frame-ancestors")).toEqual(["'none'"]);
    expect(d.get("form-action")).toEqual(["'self'"]);
    expect(d.get("base-uri")).toEqual(["'none'"]);
    // The proxy (nonce policy, sign-in redirect) runs for pages, not for /api.
    const { config } = await import("@/proxy");
    const matcher = new RegExp(`^${config.matcher[0]}$`);
    expect(matcher.test("/api/studios/x/trials")).toBe(false);
    expect(matcher.test("/api/auth/csrf")).toBe(false);
    expect(matcher.test("/s/x/trials")).toBe(true);
    expect(matcher.test("/signin")).toBe(true);
    expect(matcher.test("/apiary")).toBe(true);
    expect(nextConfig.poweredByHeader).toBe(false);
  });
});

describe("Content-Security-Policy (proxy)", () => {
  it("is set on the response and handed to Next on the request, with a new nonce each time", () => {
    const a = proxy(new NextRequest("http://127.0.0.1:3000/signin"));
    const b = proxy(new NextRequest("http://127.0.0.1:3000/signin"));
    const csp = a.headers.get("content-security-policy")!;
    const d = directives(csp);
    expect(d.get("default-src")).toEqual(["'self'"]);
    expect(d.get("frame-ancestors")).toEqual(["'none'"]);
    expect(d.get("object-src")).toEqual(["'none'"]);
    expect(d.get("base-uri")).toEqual(["'self'"]);
    expect(d.get("form-action")).toEqual(["'self'"]);
    expect(d.get("img-src")).toEqual(["'self'", "blob:", "data:"]);
    // The object store's origin, where the browser PUTs uploads (S3_ENDPOINT, default the local fake).
    expect(d.get("connect-src")).toEqual(["'self'", new URL(process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569").origin]);
    expect(d.get("style-src")).toEqual(["'self'", "'unsafe-inline'"]);
    const script = d.get("script-src")!;
    expect(script[0]).toBe("'self'");
    expect(script[1]).toMatch(/^'nonce-[A-Za-z0-9+/]{22}=='$/);
    expect(script.slice(2)).toEqual(["'strict-dynamic'"]);
    expect(b.headers.get("content-security-policy")).not.toBe(csp);
    // NextResponse.next({ request: { headers } }) passes overridden request headers on like this.
    expect(a.headers.get("x-middleware-request-content-security-policy")).toBe(csp);
    expect(d.has("upgrade-insecure-requests")).toBe(false);
  });

  it("signed out, a studio page redirects to sign-in and still carries the policy", () => {
    const res = proxy(new NextRequest("http://127.0.0.1:3000/s/123/trials"));
    expect(res.status).toBe(307);
    expect(res.headers.get("location")).toMatch(/\/signin\?next=%2Fs%2F123%2Ftrials$/);
    expect(res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
  });

  it("allows uploads to the configured object store, eval only in development, upgrades only over https", () => {
    vi.stubEnv("S3_ENDPOINT", "https://store.example.net:9000/some/path");
    vi.stubEnv("NEXTAUTH_URL", "https://notebook.example.net");
    const res = proxy(new NextRequest("https://notebook.example.net/signin"));
    const d = directives(res.headers.get("content-security-policy")!);
    expect(d.get("connect-src")).toEqual(["'self'", "https://store.example.net:9000"]);
    expect(d.has("upgrade-insecure-requests")).toBe(true);
    expect(res.headers.get("strict-transport-security")).toBe("max-age=31536000; includeSubDomains");
    expect(directives(contentSecurityPolicy({ nonce: "n", development: true })).get("script-src")).toContain("'unsafe-eval'");
  });
});

describe("session cookies", () => {
  it("next-auth is told to use Secure, __Secure- prefixed cookies when NEXTAUTH_URL is https, not over http", async () => {
    vi.stubEnv("NEXTAUTH_URL", "https://notebook.example.net");
    expect((await import("@/lib/auth/options")).authOptions.useSecureCookies).toBe(true);
    vi.resetModules();
    vi.stubEnv("NEXTAUTH_URL", "http://127.0.0.1:3000");
    expect((await import("@/lib/auth/options")).authOptions.useSecureCookies).toBe(false);
  });
});
