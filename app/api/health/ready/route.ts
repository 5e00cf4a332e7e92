import { getReadiness } from "@/lib/server/readiness";

export const dynamic = "force-dynamic";

// Readiness: 200 while PostgreSQL, Redis and the object store answer, else 503. Service names and
// states only, never addresses; the checks are cached for a few seconds (lib/server/readiness.ts).
export async function GET() {
  const readiness = await getReadiness();
  return Response.json(readiness, { status: readiness.ready ? 200 : 503, headers: { "Cache-Control": "no-store" } });
}
