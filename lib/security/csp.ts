// The Content-Security-Policy of every page, built per request by proxy.ts with a fresh nonce.
//
// Scripts: Next's App Router writes inline <script> tags (the bootstrap and the streamed page
// data) and loads its chunks from them. proxy.ts hands Next the policy on the request, and Next
// puts its nonce on each of those tags; 'strict-dynamic' lets the nonced scripts load the chunks.
// No other script runs: not an injected <script>, not an inline handler. Every page is
// therefore rendered per request (app/layout.tsx awaits connection()): a page prerendered at
// build time would carry no nonce.
//
// Styles: 'unsafe-inline' stays. Swatches and charts colour themselves with style attributes,
// which a nonce cannot cover; CSS cannot run script, so this is the lesser risk.
//
// Connections: the browser PUTs photos straight to the object store with a presigned URL
// (lib/storage.ts presignPut), so the store's origin is allowed; photos are shown from the
// app's own routes, so images need only 'self' (plus blob:/data: for local previews).

export interface CspOptions {
  nonce: string;
  /** S3_ENDPOINT: where presigned uploads go. */
  s3Endpoint?: string;
  /** The app's public address (NEXTAUTH_URL / APP_URL): https adds upgrade-insecure-requests. */
  appUrl?: string;
  /** next dev: React rebuilds server error stacks with eval. */
  development?: boolean;
}

function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}

export function contentSecurityPolicy(o: CspOptions): string {
  const store = originOf(o.s3Endpoint);
  const directives: [string, ...string[]][] = [
    ["default-src", "'self'"],
    ["script-src", "'self'", `'nonce-${o.nonce}'`, "'strict-dynamic'", ...(o.development ? ["'unsafe-eval'"] : [])],
    ["style-src", "'self'", "'unsafe-inline'"],
    ["img-src", "'self'", "blob:", "data:"],
    ["font-src", "'self'"],
    ["connect-src", "'self'", ...(store ? [store] : [])],
    ["object-src", "'none'"],
    ["base-uri", "'self'"],
    ["form-action", "'self'"],
    ["frame-ancestors", "'none'"],
    ...(o.appUrl?.startsWith("https://") ? ([["upgrade-insecure-requests"]] as [string][]) : []),
  ];
  return directives.map((d) => d.join(" ")).join("; ");
}

/** 128 random bits, base64: unguessable and new for every response. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
