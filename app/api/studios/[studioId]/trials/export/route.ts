// GET /api/studios/:studioId/trials/export – the filtered trial list as a CSV download
import { withStudio } from "@/lib/auth/with-studio";
import { queryFromSearch, trialQuery } from "@/lib/schemas/trial";
import { trialsCsv } from "@/lib/trials/csv";

export const GET = withStudio<{ studioId: string }>(
  async ({ req, em, studio }) => {
    const q = trialQuery.parse(queryFromSearch(new URL(req.url).searchParams));
    const day = new Date().toISOString().slice(0, 10);
    return new Response(await trialsCsv(em, studio, q), {
      headers: {
        "content-type": "text/csv; charset=utf-8",
        "content-disposition": `attachment; filename="trials-${day}.csv"`,
        "cache-control": "no-store",
      },
    });
  },
  { can: "trial.read" },
);
