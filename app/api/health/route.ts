import { checkServices } from "@/lib/server/preflight";

export const dynamic = "force-dynamic";

// For load balancers and the deployment healthcheck: service names and up/down only, no addresses.
export async function GET() {
  const results = await checkServices();
  const ok = results.every((r) => r.ok);
  return Response.json({ ok, services: Object.fromEntries(results.map((r) => [r.service, r.ok ? "up" : "down"])) }, { status: ok ? 200 : 503 });
}
