import { HttpError } from "@/lib/auth/guards";
import { apiRoute } from "@/lib/dal/route-handler";
import { getTrendCsv } from "@/lib/dal/trends";
import { parseTrendQuery } from "@/lib/trends/query";

/** The trend on screen as CSV: the page's own query, one row per plotted point. */
export const GET = apiRoute(async (request: Request) => {
  const { query, errors } = parseTrendQuery(new URL(request.url).searchParams);
  if (!query) throw new HttpError(400, errors.join("; "));
  const { fileName, body } = await getTrendCsv(query);
  return new Response(body, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${fileName}"`,
      "cache-control": "private, no-store",
    },
  });
});
