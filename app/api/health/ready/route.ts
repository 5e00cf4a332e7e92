import { healthResponse, readyAnswer } from "@/lib/server/health";

export const dynamic = "force-dynamic";

// Readiness: 200 while PostgreSQL, Redis and the object store answer, else 503. Service names and
// states only, never addresses; the checks are cached for a few seconds (lib/server/readiness.ts).
// In production scripts/serve.ts answers this path itself, with the same function, before Next.
export async function GET() {
  return healthResponse(await readyAnswer());
}
