// GET /api/health – database, bucket and mail connections; 503 when any is down
import { checkHealth } from "@/lib/health";

export const dynamic = "force-dynamic";

export async function GET() {
  const health = await checkHealth();
  return Response.json(health, { status: health.ok ? 200 : 503 });
}
