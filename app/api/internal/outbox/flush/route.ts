// POST /api/internal/outbox/flush[?all=1] – sends due mail now (tests and development only; 404 elsewhere)
import { env } from "@/lib/env";
import { flushOutbox } from "@/lib/outbox";
import { toErrorResponse } from "@/lib/errors";

const enabled = () => (env.OUTBOX_FLUSH_ROUTE ? env.OUTBOX_FLUSH_ROUTE === "on" : env.NODE_ENV !== "production");

export async function POST(req: Request): Promise<Response> {
  if (!enabled()) return Response.json({ error: "Not found." }, { status: 404 });
  try {
    // ?all=1 treats everything queued as due, so a test need not wait for the batch window.
    const all = new URL(req.url).searchParams.get("all") === "1";
    return Response.json(await flushOutbox({ all }));
  } catch (e) {
    return toErrorResponse(e);
  }
}
