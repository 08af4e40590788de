// Fixed security headers for every response. The pages' Content-Security-Policy is not here: it
// carries a per-request nonce, so proxy.ts sets it (lib/security/csp.ts says what it allows and why).
export const securityHeaders = [
  // Older browsers' form of frame-ancestors 'none': no site may frame Undertone.
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  // The camera is for swatch photos, on our own pages only; nothing else is used.
  {
    key: "Permissions-Policy",
    value: "camera=(self), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), browsing-topics=()",
  },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

// The API's policy, fixed: its answers are JSON, and the few HTML ones (unsubscribe, next-auth's
// own fallback pages) are a form with inline styles. No script, no frame, no plugin, nothing
// loaded from anywhere; forms post back to this site only.
export const apiContentSecurityPolicy =
  "default-src 'none'; style-src 'unsafe-inline'; img-src 'self' data:; form-action 'self'; base-uri 'none'; frame-ancestors 'none'";

/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: [
    "@mikro-orm/core",
    "@mikro-orm/knex",
    "@mikro-orm/postgresql",
    "@mikro-orm/migrations",
    "sharp",
    "pg-boss",
  ],
  poweredByHeader: false,
  async headers() {
    return [
      { source: "/:path*", headers: securityHeaders },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: apiContentSecurityPolicy }] },
    ];
  },
  // The build checks the app's own code; tests and scripts are checked by `npm run typecheck`.
  typescript: { tsconfigPath: "tsconfig.build.json" },
};
export default nextConfig;
