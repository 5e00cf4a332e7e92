import { buildOpenApiDocument } from "@/lib/captures/openapi";
import { getEnv } from "@/lib/server/env";

/** Public: the description of the bench API, not its data. */
export function GET() {
  return Response.json(buildOpenApiDocument(getEnv().NEXTAUTH_URL), { headers: { "Cache-Control": "public, max-age=300" } });
}
