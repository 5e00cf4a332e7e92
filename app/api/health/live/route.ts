import { healthResponse, liveAnswer } from "@/lib/server/health";

export const dynamic = "force-dynamic";

// Liveness: the process answers. Touches no service, so it stays cheap under any load. In
// production scripts/serve.ts answers this path itself, with the same function, before Next.
export function GET() {
  return healthResponse(liveAnswer());
}
