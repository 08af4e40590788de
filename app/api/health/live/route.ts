// GET /api/health/live – this instance is up and answering; no service is asked (a proxy in front of
// several instances uses it to route around a stopped one; /api/health checks the services too)
export const dynamic = "force-dynamic";

export function GET() {
  return Response.json({ ok: true }, { headers: { "cache-control": "no-store" } });
}
