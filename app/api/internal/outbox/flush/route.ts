// POST /api/internal/outbox/flush[?all=1] – sends queued mail now; for tests and development (404 otherwise)
import { env } from "@/lib/env";
import { toErrorResponse } from "@/lib/errors";
import { flushOutbox, flushKey } from "@/lib/outbox";

// Open outside production. In production only with OUTBOX_FLUSH_ROUTE=on, or for a caller that
// proves it holds the server's secret (the browser tests do: they share NEXTAUTH_SECRET).
function allowed(req: Request): boolean {
  if (env.OUTBOX_FLUSH_ROUTE) return env.OUTBOX_FLUSH_ROUTE === "on";
  if (env.NODE_ENV !== "production") return true;
  return req.headers.get("authorization") === `Bearer ${flushKey()}`;
}

export async function POST(req: Request): Promise<Response> {
  if (!allowed(req)) return Response.json({ error: "Not found." }, { status: 404 });
  try {
    // ?all=1 treats everything queued as due, so a test need not wait for the batch window.
    const all = new URL(req.url).searchParams.get("all") === "1";
    return Response.json(await flushOutbox({ all }));
  } catch (e) {
    return toErrorResponse(e);
  }
}
