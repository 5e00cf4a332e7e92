import { errorResponse, HttpError } from "@/lib/auth/guards";
import { importProfileLookupSchema } from "@/lib/captures/import-profile";
import { requireSessionActor } from "@/lib/dal/actor";
import { importProfileFor } from "@/lib/dal/import-profiles";

/** The bench's import profile for a header layout: ?stationId=…&signature=… (404 when there is none). */
export async function GET(request: Request) {
  try {
    const actor = await requireSessionActor();
    const query = importProfileLookupSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) throw new HttpError(400, query.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; "));
    const profile = await importProfileFor(actor, query.data.stationId, query.data.signature);
    if (!profile) throw new HttpError(404, "No import profile for this header on this bench");
    return Response.json(profile);
  } catch (err) {
    return errorResponse(err);
  }
}
