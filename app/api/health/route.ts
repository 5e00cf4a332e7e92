import { healthResponse, legacyHealthAnswer } from "@/lib/server/health";

export const dynamic = "force-dynamic";

// The readiness answer under its older address (deployments that probe /api/health keep working);
// /api/health/live and /api/health/ready are the two probes to use.
export async function GET() {
  return healthResponse(await legacyHealthAnswer());
}
