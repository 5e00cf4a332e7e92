import { getReadiness } from "@/lib/server/readiness";

export const dynamic = "force-dynamic";

// The readiness answer under its older address (deployments that probe /api/health keep working);
// /api/health/live and /api/health/ready are the two probes to use.
export async function GET() {
  const readiness = await getReadiness();
  return Response.json({ ok: readiness.ready, services: readiness.services }, { status: readiness.ready ? 200 : 503, headers: { "Cache-Control": "no-store" } });
}
